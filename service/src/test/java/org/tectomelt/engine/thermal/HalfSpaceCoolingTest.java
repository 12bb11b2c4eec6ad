package org.tectomelt.engine.thermal;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.units.Units;

class HalfSpaceCoolingTest {

    private final HalfSpaceCooling at60 = HalfSpaceCooling.of(Units.myrToS(60));

    @Test
    void surfaceIsAtT0AndDepthApproachesTm() {
        assertEquals(HalfSpaceCooling.SURFACE_TEMPERATURE, at60.temperatureAt(0), 0);
        assertEquals(HalfSpaceCooling.SURFACE_TEMPERATURE, at60.temperatureAt(-5), 0);
        assertEquals(HalfSpaceCooling.MANTLE_TEMPERATURE, at60.temperatureAt(1000e3), 1e-9);
    }

    @Test
    void temperatureRisesMonotonicallyWithDepth() {
        double previous = at60.temperatureAt(0);
        for (double z = 1e3; z <= 400e3; z += 1e3) {
            double t = at60.temperatureAt(z);
            assertTrue(t >= previous, "not monotonic at " + z);
            previous = t;
        }
    }

    @Test
    void surfaceHeatFlowIsConductivityTimesTheSurfaceGradient() {
        double h = 1.0;
        double gradient = (at60.temperatureAt(h) - at60.temperatureAt(0)) / h;
        assertEquals(HalfSpaceCooling.CONDUCTIVITY * gradient, at60.surfaceHeatFlow(), 1e-6);
    }

    @Test
    void thermalThicknessIsThe09Isotherm() {
        double t0 = at60.surfaceTemperature();
        double expected = t0 + 0.9 * (at60.mantleTemperature() - t0);
        // the profile's erf is tabulated to 1e-10, i.e. 1.3e-7 K of ΔT
        assertEquals(expected, at60.temperatureAt(at60.thermalThickness()), 2e-7);
    }

    @Test
    void heatFlowFallsAndDepthGrowsAsTheSquareRootOfAge() {
        HalfSpaceCooling at15 = HalfSpaceCooling.of(Units.myrToS(15));
        assertEquals(2.0, at15.surfaceHeatFlow() / at60.surfaceHeatFlow(), 1e-12);
        double dr = HalfSpaceCooling.RIDGE_DEPTH;
        assertEquals(2.0, (at60.seafloorDepth() - dr) / (at15.seafloorDepth() - dr), 1e-12);
        assertEquals(2.0, at60.thermalThickness() / at15.thermalThickness(), 1e-12);
    }

    @Test
    void agesOutsideTheRangeAreRefused() {
        assertThrows(EngineException.class, () -> HalfSpaceCooling.of(0));
        assertThrows(EngineException.class, () -> HalfSpaceCooling.of(-Units.myrToS(1)));
        assertThrows(EngineException.class, () -> HalfSpaceCooling.of(Units.myrToS(201)));
        assertThrows(EngineException.class, () -> new HalfSpaceCooling(Units.myrToS(10), 300, 290, 3.3, 1e-6));
    }
}
