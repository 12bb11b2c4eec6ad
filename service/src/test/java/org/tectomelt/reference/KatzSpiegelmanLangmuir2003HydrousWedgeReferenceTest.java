package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.settings.SubductionWedge;
import org.tectomelt.engine.settings.WedgeMelting;

/**
 * The subduction wedge against the hydrous melting relations of Katz, R.F., Spiegelman, M. &amp;
 * Langmuir, C.H. (2003) A new parameterization of hydrous mantle melting, Geochemistry,
 * Geophysics, Geosystems 4(9), 1073, doi:10.1029/2002GC000433, with the equations and the
 * Table 2 parameters as listed in REFERENCES.md §2.1 (parameters from memory there).
 *
 * <p>Three kinds of check: the dry limit against the values computed independently in
 * REFERENCES §2.1 [calc]; the water-saturated solidus against REFERENCES §2.1 [calc]; and the
 * hydrous melt fraction against an independent re-implementation of the §2.1 equations written
 * out in this test (plain bisection on F, sharing no code with the engine).
 */
class KatzSpiegelmanLangmuir2003HydrousWedgeReferenceTest {

    private static final double GPA = 1e9;
    private static final double C = 273.15;
    private final SubductionWedge wedge = SubductionWedge.katzPeridotite();

    /** The response's default grid: {@value SubductionWedge#CURVE_POINTS} points from 0 to {@code max}. */
    private static double[] grid(double max) {
        return SubductionWedge.evenWaterGrid(max, SubductionWedge.CURVE_POINTS);
    }

    private WedgeMelting at(double pGpa, double tC, double waterWtPct) {
        return wedge.evaluate(pGpa * GPA, tC + C, waterWtPct / 100, grid(0.05), OptionalDouble.empty());
    }

    @Test
    void zeroWaterEqualsTheDryModel() {
        // REFERENCES §2.1 [calc]: F(1 GPa, 1300 °C) = 0.1293, F(3 GPa, 1500 °C) = 0.1237 for the dry model
        // (Mcpx = 0.17); tolerance half the last printed digit.
        WedgeMelting one = at(1, 1300, 0);
        assertEquals(0.1293, one.state().meltFraction(), 5e-5);
        assertEquals(0.1237, at(3, 1500, 0).state().meltFraction(), 5e-5);
        // dry limit: no lowering, no water in the melt, the wet solidus is the dry one (Katz 2003: ΔT(0) = 0)
        assertEquals(0.0, one.solidusDepression(), 0.0);
        assertEquals(0.0, one.state().waterInMelt(), 0.0);
        assertEquals(one.state().drySolidus(), one.state().solidus(), 0.0);
        // Katz (2003) anhydrous solidus Ts = 1085.7 + 132.9 P − 5.1 P² (REFERENCES §2.1): 1213.5 °C at 1 GPa
        assertEquals(1213.5, one.state().drySolidus() - C, 1e-9);
    }

    @Test
    void theWaterSaturatedSolidusMatchesTheIndependentCalculation() {
        // REFERENCES §2.1 [calc]: Ts − K·Xsat^γ = 919, 922, 941, 963, 1001 °C at 1, 2, 3, 4, 6 GPa;
        // printed to 1 °C, so ±0.5 °C.
        double[][] expected = {{1, 919}, {2, 922}, {3, 941}, {4, 963}, {6, 1001}};
        for (double[] e : expected) {
            assertEquals(e[1], wedge.saturatedSolidus(e[0] * GPA) - C, 0.5, "P = " + e[0] + " GPa");
        }
    }

    @Test
    void theSolidusLoweringIsKTimesTheIncipientMeltWaterToTheGamma() {
        // Katz (2003) hydrous relations (REFERENCES §2.1): incipient melt (F = 0) carries X = Xbulk / D;
        // 0.05 wt% bulk water, D = 0.01 → X = 5 wt% (below Xsat = 26.2 wt% at 3 GPa),
        // ΔT = 43 × 5^0.75 = 143.78 K (hand calculation)
        WedgeMelting m = at(3, 1200, 0.05);
        assertEquals(43.0 * Math.pow(5.0, 0.75), m.solidusDepression(), 1e-9);
        assertEquals(143.78, m.solidusDepression(), 0.01);
    }

    @Test
    void hydrousMeltFractionAndMeltWaterMatchAnIndependentImplementation() {
        double[][] states = {
            // P (GPa), T (°C), bulk water (wt%)
            {1.0, 1100, 0.3}, {2.0, 1200, 0.5}, {3.24, 1300, 0.5}, {3.0, 1300, 2.0}, {1.0, 1000, 2.0},
            {5.0, 1250, 1.0}, {1.5, 1350, 0.1}, {0.5, 1150, 0.2}};
        for (double[] s : states) {
            double[] ref = independentKatz(s[0], s[1], s[2]);
            WedgeMelting m = at(s[0], s[1], s[2]);
            String where = "P=" + s[0] + " T=" + s[1] + " water=" + s[2];
            // both solve the same equations to ≤ 1e-12; 1e-9 leaves room for the different root finders
            assertEquals(ref[0], m.state().meltFraction(), 1e-9, where);
            assertEquals(ref[1], m.state().waterInMelt() * 100, 1e-7, where);
            assertTrue(ref[0] > 0, "each state was chosen inside the melting field: " + where);
            if (ref[1] < ref[2] - 1e-9) {
                // unsaturated: the melt holds Xbulk / (D + F(1 − D)) (mass balance of Katz 2003)
                assertFalse(m.state().waterSaturated(), where);
                assertEquals(s[2] / (0.01 + ref[0] * 0.99), ref[1], 1e-9, where);
            } else {
                assertTrue(m.state().waterSaturated(), where);
            }
        }
    }

    /**
     * Katz et al. (2003) hydrous melting from the REFERENCES §2.1 equations, written out here: returns
     * {F, water in melt (wt%), Xsat (wt%)}. P in GPa, T in °C, bulk water in wt%.
     */
    private static double[] independentKatz(double p, double t, double bulkWtPct) {
        double ts = 1085.7 + 132.9 * p - 5.1 * p * p;
        double tl = 1475.0 + 80.0 * p - 3.2 * p * p;
        double tq = 1780.0 + 45.0 * p - 2.0 * p * p;
        double fc = Math.min(1.0, 0.17 / (0.50 + 0.08 * p));
        double tc = Math.pow(fc, 1 / 1.5) * (tl - ts) + ts;
        double xsat = 12.0 * Math.pow(p, 0.6) + 1.0 * p;
        java.util.function.DoubleUnaryOperator fdry = temp -> {
            if (temp <= ts) {
                return 0.0;
            }
            if (temp < tc) {
                return Math.pow((temp - ts) / (tl - ts), 1.5);
            }
            if (temp >= tq) {
                return 1.0;
            }
            return fc + (1 - fc) * Math.pow((temp - tc) / (tq - tc), 1.5);
        };
        java.util.function.DoubleUnaryOperator xmelt = f -> Math.min(bulkWtPct / (0.01 + f * 0.99), xsat);
        double lo = 0;
        double hi = 1;
        if (fdry.applyAsDouble(t + 43.0 * Math.pow(xmelt.applyAsDouble(0), 0.75)) <= 0) {
            return new double[] {0, 0, xsat};
        }
        for (int i = 0; i < 200; i++) {
            double mid = 0.5 * (lo + hi);
            double g = mid - fdry.applyAsDouble(t + 43.0 * Math.pow(xmelt.applyAsDouble(mid), 0.75));
            if (g < 0) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        double f = 0.5 * (lo + hi);
        return new double[] {f, xmelt.applyAsDouble(f), xsat};
    }
}
