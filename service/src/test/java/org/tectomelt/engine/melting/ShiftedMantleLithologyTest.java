package org.tectomelt.engine.melting;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.column.DecompressionColumn;

/** Moving a whole melting interval by ΔT (engine unit tests). */
class ShiftedMantleLithologyTest {

    private static final double GPA = 1e9;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();

    @Test
    void everyIsoplethMovesByTheShift() {
        MantleLithology hot = ShiftedMantleLithology.of(katz, 30);
        for (double p : new double[] {0.5, 2, 4}) {
            assertEquals(katz.drySolidus(p * GPA) + 30, hot.drySolidus(p * GPA), 1e-9);
            assertEquals(katz.solidus(p * GPA, 1e-3) + 30, hot.solidus(p * GPA, 1e-3), 1e-9);
            assertEquals(katz.liquidus(p * GPA, 0) + 30, hot.liquidus(p * GPA, 0), 1e-9);
            for (double f : new double[] {0.05, 0.2, 0.4}) {
                assertEquals(katz.temperatureAt(p * GPA, f, 1e-4) + 30, hot.temperatureAt(p * GPA, f, 1e-4), 1e-9);
            }
            double t = katz.drySolidus(p * GPA) + 80;
            assertEquals(katz.meltFraction(p * GPA, t, 0), hot.meltFraction(p * GPA, t + 30, 0), 1e-12);
            assertEquals(katz.melt(p * GPA, t, 0).meltFraction(), hot.melt(p * GPA, t + 30, 0).meltFraction(), 1e-12);
        }
        assertSame(katz, ShiftedMantleLithology.of(katz, 0));
        assertEquals(katz.id(), hot.id());
    }

    @Test
    void aLowerSolidusMeltsDeeperAndMore() {
        double tp = 1350 + 273.15;
        var base = DecompressionColumn.of(katz, tp, 0).solve();
        var cold = DecompressionColumn.of(ShiftedMantleLithology.of(katz, -40), tp, 0).solve();
        assertTrue(cold.onset().get().depth() > base.onset().get().depth());
        assertTrue(cold.crustalThickness() > base.crustalThickness());
    }

    @Test
    void shiftsBeyondTheRangeAreRefused() {
        assertThrows(EngineException.class, () -> new ShiftedMantleLithology(katz, 250));
        assertThrows(EngineException.class, () -> new ShiftedMantleLithology(katz, Double.NaN));
    }
}
