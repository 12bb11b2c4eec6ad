package org.tectomelt.engine.crust;

import org.tectomelt.engine.EngineException;

/** Thermal conductivity of a rock as a function of temperature. Implementations are immutable. */
public interface ConductivityLaw {

    /**
     * Conductivity (W/m/K) at temperature {@code temperatureK} (K).
     *
     * @param temperatureK temperature (K)
     */
    double at(double temperatureK);

    /** True when the conductivity does not depend on temperature (the solver then needs no iteration for it). */
    boolean isConstant();

    /** A temperature-independent conductivity (W/m/K). */
    static ConductivityLaw constant(double conductivity) {
        return new Constant(conductivity);
    }

    /**
     * A constant conductivity.
     *
     * @param conductivity conductivity (W/m/K), positive
     */
    record Constant(double conductivity) implements ConductivityLaw {

        /** Validates the value. */
        public Constant {
            if (!(conductivity > 0) || !Double.isFinite(conductivity)) {
                throw new EngineException("conductivity must be positive, got " + conductivity);
            }
        }

        @Override
        public double at(double temperatureK) {
            return conductivity;
        }

        @Override
        public boolean isConstant() {
            return true;
        }
    }
}
