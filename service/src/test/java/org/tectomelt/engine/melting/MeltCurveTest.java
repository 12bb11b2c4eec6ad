package org.tectomelt.engine.melting;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;

class MeltCurveTest {

    private final MeltCurve curve = new MeltCurve(new double[] {1000, 1050, 1100, 1200},
            new double[] {0.0, 0.2, 0.4, 1.0});

    @Test
    void interpolatesLinearlyAndClampsOutside() {
        assertEquals(0.0, curve.fractionAt(900), 0);
        assertEquals(0.1, curve.fractionAt(1025), 1e-12);
        assertEquals(0.7, curve.fractionAt(1150), 1e-12);
        assertEquals(1.0, curve.fractionAt(1300), 0);
    }

    @Test
    void temperatureAtInvertsFractionAt() {
        for (double f = 0.01; f < 1; f += 0.05) {
            assertEquals(f, curve.fractionAt(curve.temperatureAt(f)), 1e-12);
        }
        assertEquals(1000, curve.solidus(), 0);
        assertEquals(1200, curve.liquidus(), 0);
    }

    @Test
    void invalidCurvesAreRefused() {
        assertThrows(EngineException.class, () -> new MeltCurve(new double[] {1000, 1000}, new double[] {0, 1}));
        assertThrows(EngineException.class, () -> new MeltCurve(new double[] {1000, 1100}, new double[] {0.5, 0.2}));
        assertThrows(EngineException.class, () -> new MeltCurve(new double[] {1000, 1100}, new double[] {0, 1.2}));
        assertThrows(EngineException.class, () -> new MeltCurve(new double[] {1000}, new double[] {0}));
    }
}
