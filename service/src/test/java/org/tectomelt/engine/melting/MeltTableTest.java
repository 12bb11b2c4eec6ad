package org.tectomelt.engine.melting;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;

class MeltTableTest {

    private static final double C0 = 273.15;
    private static final double GPA = 1e9;

    /** An invented two-row table: the same curve shifted 100 K between 0.5 and 1.5 GPa. */
    private static MeltTable shifted() {
        MeltCurve low = new MeltCurve(new double[] {C0 + 700, C0 + 800, C0 + 900}, new double[] {0, 0.3, 0.5});
        MeltCurve high = new MeltCurve(new double[] {C0 + 800, C0 + 900, C0 + 1000}, new double[] {0, 0.3, 0.5});
        return new MeltTable(new double[] {0.5 * GPA, 1.5 * GPA}, List.of(low, high));
    }

    @Test
    void betweenRowsTheIsoplethsMoveLinearlyWithPressure() {
        MeltTable t = shifted();
        MeltCurve mid = t.curveAt(1.0 * GPA);
        assertEquals(C0 + 750, mid.solidus(), 1e-9);
        assertEquals(0.3, mid.fractionAt(C0 + 850), 1e-12);
        assertEquals(0.15, mid.fractionAt(C0 + 800), 1e-12);
        assertEquals(0.5, mid.fractionAt(C0 + 2000), 0);
        // the rows themselves, and the nearest row beyond the table
        assertEquals(0.3, t.fractionAt(C0 + 800, 0.5 * GPA), 1e-12);
        assertEquals(0.3, t.fractionAt(C0 + 800, 0.1 * GPA), 1e-12);
        assertEquals(0.0, t.fractionAt(C0 + 800, 2.0 * GPA), 0);
    }

    @Test
    void theInterpolatedFractionIsContinuousInPressureAndMonotoneInTemperature() {
        MeltTable t = MeltTable.resource("/melting/metapelite-fluid-absent.tsv");
        for (double p = 0.5 * GPA; p <= 1.5 * GPA; p += 0.01 * GPA) {
            double prev = -1;
            for (double tc = 650; tc <= 1100; tc += 5) {
                double f = t.fractionAt(C0 + tc, p);
                assertTrue(f >= prev, "monotone in T at " + p / GPA + " GPa, " + tc + " °C");
                // continuity: a small step in pressure moves F by little (≤ 1 % per 10 MPa here)
                assertEquals(f, t.fractionAt(C0 + tc, p + 0.01 * GPA), 0.01, "at " + p / GPA + " GPa, " + tc + " °C");
                prev = f;
            }
        }
    }

    @Test
    void theMeanCurveOverALayerIsTheAverageOfTheCurves() {
        MeltTable t = shifted();
        MeltCurve mean = t.meanOver(0.5 * GPA, 1.5 * GPA, 10);
        double expected = 0;
        for (int k = 0; k < 10; k++) {
            expected += t.fractionAt(C0 + 850, (0.55 + 0.1 * k) * GPA);
        }
        assertEquals(expected / 10, mean.fractionAt(C0 + 850), 1e-12);
    }

    @Test
    void badTablesAreRefusedNamingTheRow() {
        MeltCurve a = new MeltCurve(new double[] {C0 + 700, C0 + 800}, new double[] {0, 0.5});
        MeltCurve b = new MeltCurve(new double[] {C0 + 700, C0 + 800}, new double[] {0, 0.4});
        EngineException e = assertThrows(EngineException.class,
                () -> new MeltTable(new double[] {0.5 * GPA, 1 * GPA}, List.of(a, b)));
        assertTrue(e.getMessage().contains("row 1"), e.getMessage());
        e = assertThrows(EngineException.class, () -> new MeltTable(new double[] {1 * GPA, 1 * GPA}, List.of(a, a)));
        assertTrue(e.getMessage().contains("row 1") && e.getMessage().contains("increase"), e.getMessage());
        MeltCurve startsMolten = new MeltCurve(new double[] {C0 + 700, C0 + 800}, new double[] {0.1, 0.5});
        assertThrows(EngineException.class, () -> new MeltTable(new double[] {1 * GPA}, List.of(startsMolten)));
        assertTrue(shifted().covers(0.5 * GPA, 1.5 * GPA));
        assertTrue(!shifted().covers(0, 1.5 * GPA));
    }
}
