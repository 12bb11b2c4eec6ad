package org.tectomelt.engine.composition;

/** How melt leaves its residue while the mantle melts. */
public enum MeltingMode {
    /** Batch (equilibrium) melting: all the melt stays with its residue up to the top (Shaw 1970). */
    BATCH,
    /** Fractional (Rayleigh) melting: each increment of melt leaves at once (Shaw 1970). */
    FRACTIONAL,
    /**
     * Near-fractional (dynamic) melting: the residue keeps a melt mass fraction φ and every increment
     * beyond it leaves (Zou 1998).
     */
    NEAR_FRACTIONAL
}
