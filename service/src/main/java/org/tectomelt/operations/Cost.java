package org.tectomelt.operations;

/** How a request is served on a shared server. */
public enum Cost {
    /** Milliseconds, bounded by the caps: served at once. */
    CHEAP,
    /**
     * Can take more than about 50 ms at its caps: at most {@code TECTOMELT_HEAVY_CONCURRENCY} at
     * once, with the wall-clock budget {@code TECTOMELT_HEAVY_BUDGET_MS} handed to the engine.
     */
    HEAVY
}
