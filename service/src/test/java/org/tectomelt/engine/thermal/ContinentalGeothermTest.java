package org.tectomelt.engine.thermal;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.thermal.ContinentalGeotherm.HeatProduction;

class ContinentalGeothermTest {

    private static ContinentalGeotherm geotherm(HeatProduction mode) {
        return ContinentalGeotherm.of(0.065, 0.6, 10e3, 2.5, 283.15, 38e3, mode);
    }

    @Test
    void gradientTimesConductivityIsTheLocalHeatFlowForBothModes() {
        for (HeatProduction mode : HeatProduction.values()) {
            ContinentalGeotherm g = geotherm(mode);
            for (double z = 500; z <= 100e3; z += 3.7e3) {
                double h = 0.5;
                double numeric = (g.temperatureAt(z + h) - g.temperatureAt(z - h)) / (2 * h);
                assertEquals(g.gradientAt(z), numeric, 1e-7, mode + " z = " + z);
            }
        }
    }

    @Test
    void heatFlowFallsFromQ0AtTheSurfaceToTheReducedHeatFlowAtDepth() {
        for (HeatProduction mode : HeatProduction.values()) {
            ContinentalGeotherm g = geotherm(mode);
            assertEquals(0.065, g.heatFlowAt(0), 1e-15);
            assertEquals(0.6 * 0.065, g.heatFlowAt(400e3), 1e-12);
            assertEquals(0.6 * 0.065, g.reducedHeatFlow(), 1e-15);
        }
    }

    @Test
    void integratedHeatProductionIsTheCrustalShareOfTheSurfaceHeatFlow() {
        for (HeatProduction mode : HeatProduction.values()) {
            ContinentalGeotherm g = geotherm(mode);
            double sum = 0;
            double dz = 10;
            for (double z = dz / 2; z < 400e3; z += dz) {
                sum += g.heatProductionAt(z) * dz;
            }
            assertEquals(0.4 * 0.065, sum, 1e-4 * 0.065, mode.name());
        }
    }

    @Test
    void twoLayerIsContinuousAtTheLayerBase() {
        ContinentalGeotherm g = geotherm(HeatProduction.TWO_LAYER);
        assertEquals(g.temperatureAt(10e3 - 1e-6), g.temperatureAt(10e3 + 1e-6), 1e-6);
    }

    @Test
    void withoutCrustalHeatProductionTheGeothermIsLinear() {
        ContinentalGeotherm g = ContinentalGeotherm.of(0.05, 1.0, 10e3, 2.5, 273.15, 35e3, HeatProduction.EXPONENTIAL);
        assertEquals(273.15 + 0.05 * 50e3 / 2.5, g.temperatureAt(50e3), 1e-9);
    }

    @Test
    void mohoTemperatureIsTheTemperatureAtTheCrustBase() {
        ContinentalGeotherm g = geotherm(HeatProduction.EXPONENTIAL);
        assertEquals(g.temperatureAt(38e3), g.mohoTemperature(), 0);
        assertEquals(283.15, g.temperatureAt(0), 0);
    }

    @Test
    void defaultsFactoryUsesTheDocumentedDefaults() {
        ContinentalGeotherm g = ContinentalGeotherm.of(0.05);
        assertEquals(0.6, g.reducedFraction());
        assertEquals(10e3, g.heatProductionScale());
        assertEquals(2.5, g.conductivity());
        assertEquals(273.15, g.surfaceTemperature());
        assertEquals(35e3, g.crustThickness());
        assertEquals(HeatProduction.EXPONENTIAL, g.heatProduction());
    }

    @Test
    void nonPhysicalInputsAreRefused() {
        assertThrows(EngineException.class, () -> ContinentalGeotherm.of(0.005));
        assertThrows(EngineException.class,
                () -> ContinentalGeotherm.of(0.05, 1.2, 10e3, 2.5, 273.15, 35e3, HeatProduction.EXPONENTIAL));
        assertThrows(EngineException.class,
                () -> ContinentalGeotherm.of(0.05, 0.6, 10e3, 0, 273.15, 35e3, HeatProduction.EXPONENTIAL));
        assertThrows(EngineException.class, () -> ContinentalGeotherm.of(0.05, 0.6, 10e3, 2.5, 273.15, 35e3, null));
    }
}
