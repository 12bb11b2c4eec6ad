package org.tectomelt.studies;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.regex.Pattern;

/**
 * Counts failed samples by reason, in the order of the samples (so the tally is the same for any
 * number of threads). A reason is counted by its wording with the sample's own numbers replaced by
 * "…" ("the adiabat of potential temperature … °C is above the solidus … at … GPa"), so the draws
 * that fail for one cause are one line whatever their values; years (a citation's 2003) are kept.
 * At most {@value #MAX_REASONS} distinct reasons are kept; further ones are counted under
 * {@value #OTHER}.
 */
final class FailureTally {

    /** Most distinct reasons listed. */
    static final int MAX_REASONS = 12;
    /** Key that gathers the reasons beyond {@link #MAX_REASONS}. */
    static final String OTHER = "other reasons";

    private final Map<String, Integer> reasons = new LinkedHashMap<>();
    private int count;

    /** Adds one failure. */
    void add(String reason) {
        count++;
        String key = reason == null || reason.isBlank() ? "no reason given" : kind(reason);
        if (!reasons.containsKey(key) && reasons.size() >= MAX_REASONS) {
            key = OTHER;
        }
        reasons.merge(key, 1, Integer::sum);
    }

    /** A number standing alone (not part of a word or a year such as a citation's). */
    private static final Pattern NUMBER = Pattern.compile(
            "(?<![\\w.])(?!(?:19|20)\\d\\d(?![\\w.]))[-−]?\\d+(?:\\.\\d+)?(?:[eE][-+]?\\d+)?(?![\\w.])");

    /** The reason's wording with its numbers replaced by "…". */
    static String kind(String reason) {
        return NUMBER.matcher(reason).replaceAll("…");
    }

    /** Tallies the non-null reasons of an array indexed by sample, in index order. */
    static FailureTally of(String[] reasonBySample) {
        FailureTally t = new FailureTally();
        for (String r : reasonBySample) {
            if (r != null) {
                t.add(r);
            }
        }
        return t;
    }

    int count() {
        return count;
    }

    Map<String, Integer> reasons() {
        return Collections.unmodifiableMap(new LinkedHashMap<>(reasons));
    }
}
