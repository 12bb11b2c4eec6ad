package org.tectomelt.engine.thermal;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;

class LithostaticColumnTest {

    private final LithostaticColumn column = new LithostaticColumn(35e3, 2800, 3300, 9.81);

    @Test
    void depthAndPressureAreInverses() {
        for (double z = 0; z <= 300e3; z += 7.3e3) {
            assertEquals(z, column.depthAt(column.pressureAt(z)), 1e-6);
        }
    }

    @Test
    void pressureIsContinuousAtTheMoho() {
        assertEquals(column.pressureAt(35e3 - 1e-6), column.pressureAt(35e3 + 1e-6), 1.0);
    }

    @Test
    void gradientIsRhoGInEachLayer() {
        assertEquals(2800 * 9.81 * 1e3, column.pressureAt(11e3) - column.pressureAt(10e3), 1e-6);
        assertEquals(3300 * 9.81 * 1e3, column.pressureAt(101e3) - column.pressureAt(100e3), 1e-6);
    }

    @Test
    void nonPhysicalLayersAreRefused() {
        assertThrows(EngineException.class, () -> new LithostaticColumn(-1, 2800, 3300, 9.81));
        assertThrows(EngineException.class, () -> new LithostaticColumn(0, 0, 3300, 9.81));
    }
}
