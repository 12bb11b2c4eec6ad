package org.tectomelt.engine.crust;

import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.melting.MeltCurve;

/** Melt curves built from a solidus and a liquidus alone. */
public final class MeltingIntervals {

    /** Width (K) of the flat tail appended to an isothermal curve (MeltCurve needs two temperatures). */
    private static final double ISOTHERMAL_TAIL_K = 1.0;

    private MeltingIntervals() {
    }

    /**
     * Melt fraction rising linearly from 0 at the solidus to 1 at the liquidus; with equal solidus and
     * liquidus, the rock melts completely at that one temperature (isothermal melting, the Stefan case).
     *
     * @param solidus  solidus (K)
     * @param liquidus liquidus (K), not below the solidus
     */
    public static MeltCurve linear(double solidus, double liquidus) {
        if (!(liquidus >= solidus) || !Double.isFinite(solidus) || !Double.isFinite(liquidus)) {
            throw new EngineException("the liquidus must not be below the solidus");
        }
        if (liquidus == solidus) {
            return new MeltCurve(new double[] {solidus, solidus + ISOTHERMAL_TAIL_K}, new double[] {1.0, 1.0});
        }
        return new MeltCurve(new double[] {solidus, liquidus}, new double[] {0.0, 1.0});
    }
}
