package org.tectomelt.engine.settings;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.McKenzieBickle1988Peridotite;

/** Identities, limits and numerics of the wedge calculation (engine unit tests). */
class SubductionWedgeTest {

    private static final double GPA = 1e9;
    private static final double C = 273.15;
    private final SubductionWedge wedge = SubductionWedge.katzPeridotite();

    /** The response's default grid: {@value SubductionWedge#CURVE_POINTS} points from 0 to {@code max}. */
    private static double[] grid(double max) {
        return SubductionWedge.evenWaterGrid(max, SubductionWedge.CURVE_POINTS);
    }
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();

    @Test
    void aLithologyThatIgnoresWaterIsRefused() {
        EngineException e = assertThrows(EngineException.class, () -> new SubductionWedge(new McKenzieBickle1988Peridotite()));
        assertTrue(e.getMessage().contains("peridotite-mckenzie-bickle1988"), e.getMessage());
    }

    @Test
    void atTheOnsetWaterTheWetSolidusIsTheTemperature() {
        for (double p : new double[] {1, 2, 3, 4.5, 6}) {
            for (double between : new double[] {0.02, 0.5, 0.98}) {
                double tsat = katz.saturatedSolidus(p * GPA);
                double t = tsat + between * (katz.drySolidus(p * GPA) - tsat);
                double w = wedge.waterForOnset(p * GPA, t).orElseThrow();
                assertTrue(w > 0, "between the saturated and the dry solidus some water is needed");
                assertEquals(t, katz.wetSolidus(p * GPA, w), 1e-6, "p=" + p + " T=" + t);
                assertEquals(0.0, katz.meltFraction(p * GPA, t, w * (1 - 1e-6)), 0.0, "no melt just below");
                assertTrue(katz.meltFraction(p * GPA, t, w * (1 + 1e-3)) > 0, "melt just above");
            }
        }
    }

    @Test
    void onsetIsZeroAboveTheDrySolidusAndAbsentBelowTheSaturatedSolidus() {
        double p = 2 * GPA;
        assertEquals(0.0, wedge.waterForOnset(p, katz.drySolidus(p)).orElseThrow(), 0.0);
        assertEquals(0.0, wedge.waterForOnset(p, katz.drySolidus(p) + 50).orElseThrow(), 0.0);
        assertTrue(wedge.waterForOnset(p, katz.saturatedSolidus(p)).isEmpty());
        assertTrue(wedge.waterForOnset(p, 700 + C).isEmpty());
        assertTrue(wedge.waterForOnset(p, katz.saturatedSolidus(p) + 1).isPresent());
    }

    @Test
    void theSaturatedSolidusIsTheModelsOwn() {
        for (double p = 0.5; p <= 8; p += 0.5) {
            assertEquals(katz.saturatedSolidus(p * GPA), wedge.saturatedSolidus(p * GPA), 1e-9);
        }
    }

    @Test
    void saturationWaterMarksWhereFreeFluidAppearsAndBalancesTheWater() {
        double p = 1 * GPA;
        double t = 1000 + C;
        double wSat = wedge.waterForSaturation(p, t).orElseThrow();
        assertFalse(katz.melt(p, t, wSat * (1 - 1e-9)).waterSaturated());
        assertTrue(katz.melt(p, t, wSat * (1 + 1e-9)).waterSaturated());
        // at saturation the melt holds Xsat and all the bulk water is dissolved: Xbulk = Xsat (D + F(1 − D))
        double f = katz.meltFraction(p, t, wSat);
        assertEquals(wSat, katz.waterSaturation(p) * (0.01 + f * 0.99), 1e-12);

        WedgeMelting m = wedge.evaluate(p, t, 0.03, grid(0.05), OptionalDouble.empty());
        assertTrue(m.state().waterSaturated());
        assertEquals(0.03 - wSat, m.freeFluid(), 1e-12);
        assertTrue(m.warnings().stream().anyMatch(s -> s.contains("free fluid")));
        // beyond saturation the melt fraction no longer changes
        assertEquals(f, m.state().meltFraction(), 1e-9);
    }

    @Test
    void saturationIsAbsentWhenTheAcceptedWaterCannotReachIt() {
        // 3 GPa, 1300 °C: F at saturation is about 0.7, so saturation needs ~19 wt% water, beyond the 5 wt% accepted
        assertTrue(wedge.waterForSaturation(3 * GPA, 1300 + C).isEmpty());
        WedgeMelting m = wedge.evaluate(3 * GPA, 1300 + C, 0.05, grid(0.05), OptionalDouble.empty());
        assertFalse(m.state().waterSaturated());
        assertEquals(0.0, m.freeFluid(), 0.0);
    }

    /**
     * The numerical slope against implicit differentiation of the Katz et al. (2003) relations,
     * written out here independently: G(F, w) = F − F_dry(T + K X^γ), X = w / (D + F(1 − D)), so
     * dF/dw = F_dry' ΔT' X_w / (1 − F_dry' ΔT' X_F), on both sides of cpx exhaustion.
     */
    @Test
    void theSlopeMatchesImplicitDifferentiationOfTheKatzRelations() {
        double[][] states = {{1.0, 1100, 0.003}, {2.0, 1250, 0.005}, {3.2, 1300, 0.005}, {3.0, 1350, 0.02},
            {1.0, 1300, 0.02}, {1.5, 1200, 0.0005}, {4.0, 1400, 0.01}};
        for (double[] s : states) {
            double p = s[0] * GPA;
            double t = s[1] + C;
            double w = s[2];
            double f = katz.meltFraction(p, t, w);
            assertTrue(f > 0 && f < 1, "melting: " + f);
            assertFalse(katz.melt(p, t, w).waterSaturated());
            double denom = 0.01 + f * 0.99;
            double x = w / denom;                                  // mass fraction
            double xPct = 100 * x;
            double dDeltaTdX = 43.0 * 0.75 * Math.pow(xPct, -0.25) * 100;   // K per unit mass fraction
            double ts = katz.drySolidus(p);
            double tl = katz.lherzoliteLiquidus(p);
            double tEff = t + 43.0 * Math.pow(xPct, 0.75);
            double tCpx = katz.cpxExhaustionTemperature(p);
            double fCpx = katz.cpxExhaustionFraction(p);
            double tq = katz.dryLiquidus(p);
            double dFdT = tEff < tCpx
                    ? 1.5 * Math.pow((tEff - ts) / (tl - ts), 0.5) / (tl - ts)
                    : (1 - fCpx) * 1.5 * Math.pow((tEff - tCpx) / (tq - tCpx), 0.5) / (tq - tCpx);
            double xW = 1 / denom;
            double xF = -w * 0.99 / (denom * denom);
            double analytic = dFdT * dDeltaTdX * xW / (1 - dFdT * dDeltaTdX * xF);
            double numeric = wedge.meltPerWater(p, t, w).orElseThrow();
            assertEquals(analytic, numeric, 1e-5 * analytic, "p=" + s[0] + " T=" + s[1] + " w=" + w);
        }
    }

    @Test
    void theSlopeIsZeroWhenSaturatedOrSolidAndUndefinedAtZeroWaterWhenMeltingDry() {
        assertEquals(0.0, wedge.meltPerWater(1 * GPA, 1000 + C, 0.03).orElseThrow(), 0.0);   // saturated
        assertEquals(0.0, wedge.meltPerWater(3 * GPA, 800 + C, 0.01).orElseThrow(), 0.0);    // below Tsat
        assertEquals(0.0, wedge.meltPerWater(3 * GPA, 1300 + C, 0.0).orElseThrow(), 0.0);    // solid dry
        assertEquals(0.0, wedge.meltPerWater(3 * GPA, 1300 + C, 1e-4).orElseThrow(), 0.0);   // below onset
        assertTrue(wedge.meltPerWater(1 * GPA, 1300 + C, 0.0).isEmpty());                    // melting dry
        assertTrue(wedge.meltPerWater(1 * GPA, 1300 + C, 1e-6).orElseThrow() > 0);
    }

    @Test
    void theSlopeDoesNotStraddleSaturation() {
        double p = 1 * GPA;
        double t = 1000 + C;
        double wSat = wedge.waterForSaturation(p, t).orElseThrow();
        double justBelow = wSat * (1 - 5e-5);                // saturation lies within the two forward steps
        double slope = wedge.meltPerWater(p, t, justBelow).orElseThrow();
        double wellBelow = wedge.meltPerWater(p, t, wSat * (1 - 1e-2)).orElseThrow();
        assertTrue(slope > 0);
        assertEquals(wellBelow, slope, 0.02 * wellBelow, "a smooth left-hand slope, not a blend with the flat part");
    }

    @Test
    void theCurveRunsFromZeroToTheMaximumAndAgreesWithTheModel() {
        double p = 3 * GPA;
        double t = 1300 + C;
        List<WedgeMelting.CurvePoint> curve = wedge.waterCurve(p, t, grid(0.02));
        assertEquals(101, curve.size());
        assertEquals(0.0, curve.get(0).bulkWater(), 0.0);
        assertEquals(0.02, curve.get(100).bulkWater(), 0.0);
        for (WedgeMelting.CurvePoint c : curve) {
            assertEquals(katz.meltFraction(p, t, c.bulkWater()), c.meltFraction(), 0.0);
        }
        assertThrows(EngineException.class, () -> wedge.waterCurve(p, t, SubductionWedge.evenWaterGrid(0.06, 11)));
        assertThrows(EngineException.class, () -> wedge.waterCurve(p, t, new double[] {0.01, -0.001}));
    }

    @Test
    void theBudgetNeedsAFluxAndAMeltThatHoldsWater() {
        double flux = 1e4 / 3.15576e7;
        WedgeMelting melting = wedge.evaluate(3 * GPA, 1300 + C, 0.005, grid(0.01), OptionalDouble.of(flux));
        ArcMagmaBudget b = melting.budget().orElseThrow();
        assertEquals(melting.state().waterInMelt(), b.meltWater(), 0.0);
        assertEquals(2900.0, b.meltDensity(), 0.0);

        assertTrue(wedge.evaluate(3 * GPA, 1300 + C, 0.005, grid(0.01), OptionalDouble.empty()).budget().isEmpty());
        WedgeMelting solid = wedge.evaluate(3 * GPA, 900 + C, 0.005, grid(0.01), OptionalDouble.of(flux));
        assertTrue(solid.budget().isEmpty());
        assertTrue(solid.warnings().stream().anyMatch(s -> s.contains("no magma budget")));
        WedgeMelting dry = wedge.evaluate(1 * GPA, 1300 + C, 0.0, grid(0.01), OptionalDouble.of(flux));
        assertTrue(dry.budget().isEmpty());
    }

    @Test
    void theSolidusDepressionIsDryMinusWet() {
        WedgeMelting m = wedge.evaluate(2 * GPA, 1200 + C, 0.001, grid(0.01), OptionalDouble.empty());
        assertEquals(katz.drySolidus(2 * GPA) - katz.wetSolidus(2 * GPA, 0.001), m.solidusDepression(), 1e-9);
        assertTrue(m.solidusDepression() > 0);
    }

    @Test
    void itRefusesWhatTheModelCannotCompute() {
        assertThrows(EngineException.class,
                () -> wedge.evaluate(11 * GPA, 1500 + C, 0.01, grid(0.02), OptionalDouble.empty()));
        assertThrows(EngineException.class,
                () -> wedge.evaluate(3 * GPA, 1500 + C, 0.06, grid(0.05), OptionalDouble.empty()));
    }

    @Test
    void aWedgeAboveItsDrySolidusMeltsWithoutAddedWaterAndGetsNoFluxBudget() {
        // 1 GPa, 1300 °C is above the dry solidus of Katz et al. (2003), Table 2 (about 1213 °C at 1 GPa)
        double p = 1 * GPA;
        assertTrue(1300 + C > katz.drySolidus(p));
        WedgeMelting m = wedge.evaluate(p, 1300 + C, 1e-6, grid(0.01), OptionalDouble.of(1e4 / 3.15576e7));
        assertEquals(0.0, m.waterForOnset().orElseThrow(), 0.0);
        assertTrue(m.budget().isEmpty(), "the slab's water does not make this melt: no budget from the flux");
        assertTrue(m.warnings().stream().anyMatch(w -> w.contains("melts without added water")), m.warnings()::toString);
    }

    @Test
    void vanishingWaterAboveTheDrySolidusGivesFiniteNumbersOnly() {
        // the attack that once gave a 500: almost no pressure, 1300 °C, 1e-310 wt% water (a subnormal)
        double p = 3.2e-2;   // 1e-9 km of mantle: about 0.03 Pa
        for (double water : new double[] {1e-312, Double.MIN_VALUE, 1e-20, 1e-13}) {
            WedgeMelting m = wedge.evaluate(p, 1300 + C, water, grid(0.01), OptionalDouble.of(1e6 / 3.15576e7));
            assertTrue(Double.isFinite(m.state().meltFraction()) && m.state().meltFraction() > 0);
            assertTrue(m.meltPerWater().isEmpty() || Double.isFinite(m.meltPerWater().getAsDouble()), "water " + water);
            assertTrue(m.budget().isEmpty(), "no budget divides the flux by a vanishing melt water content");
        }
    }
}
