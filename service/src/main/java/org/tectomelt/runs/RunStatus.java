package org.tectomelt.runs;

import java.util.Locale;

/** Where a run is in its life. */
public enum RunStatus {
    /** Accepted, no point computed yet. */
    QUEUED,
    /** At least one chunk started. */
    RUNNING,
    /** Every point computed (some may have recorded a problem). */
    SUCCEEDED,
    /** Every point recorded a problem, or the run could not be carried out at all. */
    FAILED,
    /** Stopped by its owner; the points computed before stay readable. */
    CANCELLED;

    /** The API and database spelling: lower case. */
    public String wire() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Parses {@link #wire()}. */
    public static RunStatus fromWire(String s) {
        return valueOf(s.toUpperCase(Locale.ROOT));
    }

    /** True for queued and running runs. */
    public boolean active() {
        return this == QUEUED || this == RUNNING;
    }
}
