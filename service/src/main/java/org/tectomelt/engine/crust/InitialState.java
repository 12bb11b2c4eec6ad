package org.tectomelt.engine.crust;

import org.tectomelt.engine.EngineException;

/**
 * The thermal state of the column before the first intrusion, and the boundary conditions that
 * keep it steady: the surface temperature is held fixed and the heat flow entering through the
 * base of the column is held at the initial state's own value. Without intrusions the column
 * would stay (to discretisation error) as it started.
 */
public interface InitialState {

    /** Temperature (K) at depth {@code z} (m). */
    double temperature(double z);

    /** Radiogenic heat production (W/m³) of the country rock at depth {@code z} (m). */
    double heatProduction(double z);

    /** Temperature (K) held at the top of the column (z = 0). */
    double surfaceTemperature();

    /** Heat flow (W/m², positive upward, into the column) through the base of the column at depth {@code z} (m). */
    double basalHeatFlow(double z);

    /**
     * True when the state is a steady geotherm: the sill model then starts from the discrete steady
     * state of its own grid for the same surface temperature, heat production and basal heat flow
     * (identical to the closed form to O(Δz²) with constant conductivity; the steady geotherm under
     * the conductivity law otherwise), so that the column does not drift before the sills act.
     */
    default boolean steady() {
        return false;
    }

    /**
     * A column at one temperature, without heat production: the top is held at that temperature and
     * the base is insulated. The textbook setting for a sill in country rock of uniform temperature.
     *
     * @param temperature temperature (K)
     */
    record Uniform(double temperature) implements InitialState {

        /** Validates the temperature. */
        public Uniform {
            if (!(temperature > 0) || !Double.isFinite(temperature)) {
                throw new EngineException("initial temperature must be above 0 K");
            }
        }

        @Override
        public double temperature(double z) {
            return temperature;
        }

        @Override
        public double heatProduction(double z) {
            return 0.0;
        }

        @Override
        public double surfaceTemperature() {
            return temperature;
        }

        @Override
        public double basalHeatFlow(double z) {
            return 0.0;
        }
    }
}
