package org.tectomelt.engine.melting;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;

/** Identities, inversions and limits of the McKenzie &amp; Bickle (1988) parameterization (engine unit tests). */
class McKenzieBickle1988PeridotiteTest {

    private static final double GPA = 1e9;
    private static final double C = 273.15;
    private final McKenzieBickle1988Peridotite mb = new McKenzieBickle1988Peridotite();

    @Test
    void closedFormSolidusSatisfiesTheImplicitLawAndAgreesWithABracketingSolver() {
        for (double p = 0; p <= 10; p += 0.25) {
            double ts = mb.drySolidus(p * GPA) - C;
            double u = ts - 1100;
            // the implicit law itself: P = (Ts − 1100)/136 + 4.968e-4 exp[0.012 (Ts − 1100)]
            assertEquals(p, u / 136 + 4.968e-4 * Math.exp(1.2e-2 * u), 1e-12, "p=" + p);
            final double target = p;
            double brent = new BrentSolver(1e-10).solve(200,
                    x -> (x - 1100) / 136 + 4.968e-4 * Math.exp(1.2e-2 * (x - 1100)) - target, 900, 2100);
            assertEquals(brent, ts, 1e-8);
        }
    }

    @Test
    void lambertWInvertsWexpW() {
        for (double x : new double[] {1e-8, 1e-3, 0.1, 1, Math.E, 10, 1e3, 1e5}) {
            double w = McKenzieBickle1988Peridotite.lambertW(x);
            assertEquals(x, w * Math.exp(w), 1e-13 * Math.max(1, x));
        }
        assertEquals(1.0, McKenzieBickle1988Peridotite.lambertW(Math.E), 1e-15);
    }

    @Test
    void meltFractionRunsFromZeroAtTheSolidusToOneAtTheLiquidusAndIncreases() {
        for (double p = 0; p <= 5; p += 0.5) {
            double ts = mb.drySolidus(p * GPA);
            double tl = mb.dryLiquidus(p * GPA);
            assertEquals(0.0, mb.meltFraction(p * GPA, ts, 0), 1e-12);
            assertEquals(1.0, mb.meltFraction(p * GPA, tl, 0), 1e-12);
            double previous = 0;
            for (double t = ts; t <= tl; t += 5) {
                double f = mb.meltFraction(p * GPA, t, 0);
                assertTrue(f >= previous, "F must not fall with T");
                previous = f;
            }
        }
    }

    @Test
    void temperatureAtInvertsTheMeltFraction() {
        for (double p = 0; p <= 6; p += 0.6) {
            for (double f = 0; f <= 1.0; f += 0.05) {
                double t = mb.temperatureAt(p * GPA, f, 0);
                assertEquals(Math.min(f, 1), mb.meltFraction(p * GPA, t, 0), 1e-10, "p=" + p + " f=" + f);
            }
        }
        assertThrows(EngineException.class, () -> mb.temperatureAt(GPA, 1.5, 0));
    }

    @Test
    void meltStateCarriesTheCurvesAndNoWater() {
        MeltState s = mb.melt(2 * GPA, 1450 + C, 0);
        assertEquals(mb.drySolidus(2 * GPA), s.solidus(), 0);
        assertEquals(s.solidus(), s.drySolidus(), 0);
        assertEquals(mb.dryLiquidus(2 * GPA), s.liquidus(), 0);
        assertEquals(0.0, s.waterInMelt(), 0);
        assertTrue(s.meltFraction() > 0 && s.meltFraction() < 1);
    }

    @Test
    void refusesWaterAndPressuresItCannotComputeAndWarnsAboveItsCalibration() {
        assertThrows(EngineException.class, () -> mb.melt(GPA, 1500 + C, 0.001));
        assertThrows(EngineException.class, () -> mb.melt(-1, 1500 + C, 0));
        assertThrows(EngineException.class, () -> mb.melt(10.5 * GPA, 2000 + C, 0));
        assertEquals(1, mb.melt(7 * GPA, 1800 + C, 0).warnings().size());
        assertTrue(mb.melt(3 * GPA, 1500 + C, 0).warnings().isEmpty());
    }
}
