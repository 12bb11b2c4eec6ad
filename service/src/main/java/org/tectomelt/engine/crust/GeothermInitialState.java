package org.tectomelt.engine.crust;

import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.thermal.ContinentalGeotherm;

/**
 * A steady continental geotherm ({@link ContinentalGeotherm}) as the sill model's initial state:
 * its temperatures, its radiogenic heat production, its surface temperature held at the top and its
 * heat flow at the column's base held there.
 *
 * @param geotherm the geotherm; its conductivity should be the crust's, or the column is not steady
 */
public record GeothermInitialState(ContinentalGeotherm geotherm) implements InitialState {

    /** Validates the geotherm. */
    public GeothermInitialState {
        if (geotherm == null) {
            throw new EngineException("a geotherm initial state needs a geotherm");
        }
    }

    @Override
    public double temperature(double z) {
        return geotherm.temperatureAt(z);
    }

    @Override
    public double heatProduction(double z) {
        return geotherm.heatProductionAt(z);
    }

    @Override
    public double surfaceTemperature() {
        return geotherm.surfaceTemperature();
    }

    @Override
    public double basalHeatFlow(double z) {
        return geotherm.heatFlowAt(z);
    }

    @Override
    public boolean steady() {
        return true;
    }
}
