package org.tectomelt.engine.column;

/**
 * How melt leaves (or stays with) its residue as the mantle rises, after the usual end-members
 * (Asimow, Hirschmann &amp; Stolper 1997; Asimow &amp; Langmuir 2003):
 */
public enum MeltingMode {
    /** The melt stays with its residue to the top of the column: one closed system. */
    BATCH("batch"),
    /** Every increment of melt leaves the residue at once, with its water and its entropy. */
    FRACTIONAL("fractional"),
    /**
     * The residue keeps a small retained melt fraction φ (of the residue plus melt) in equilibrium
     * with it; melt beyond φ leaves at once. φ = 0 is fractional melting; batch until F reaches φ.
     */
    NEAR_FRACTIONAL("near-fractional");

    /** Largest retained melt fraction accepted for near-fractional melting. */
    public static final double MAX_RETAINED_MELT_FRACTION = 0.1;

    private final String apiName;

    MeltingMode(String apiName) {
        this.apiName = apiName;
    }

    /** The name used by the API: batch, fractional, near-fractional. */
    public String apiName() {
        return apiName;
    }
}
