package org.tectomelt.engine.melting;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;

/** Identities and limits of the Katz et al. (2003) parameterization (engine unit tests). */
class Katz2003PeridotiteTest {

    private static final double GPA = 1e9;
    private static final double C = 273.15;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();

    @Test
    void meltFractionIsZeroAtTheSolidusAndOneAtTheLiquidus() {
        for (double p = 0; p <= 8; p += 0.5) {
            assertEquals(0.0, katz.meltFraction(p * GPA, katz.drySolidus(p * GPA), 0), 1e-12);
            assertEquals(1.0, katz.meltFraction(p * GPA, katz.dryLiquidus(p * GPA), 0), 1e-12);
        }
    }

    @Test
    void meltFractionIsContinuousAcrossCpxExhaustion() {
        for (double p = 0; p <= 8; p += 0.5) {
            double tCpx = katz.cpxExhaustionTemperature(p * GPA);
            double fCpx = katz.cpxExhaustionFraction(p * GPA);
            assertEquals(fCpx, katz.meltFraction(p * GPA, tCpx - 1e-7, 0), 1e-7);
            assertEquals(fCpx, katz.meltFraction(p * GPA, tCpx + 1e-7, 0), 1e-7);
        }
    }

    @Test
    void temperatureAtInvertsTheMeltFractionDryAndWet() {
        for (double water : new double[] {0, 1e-4, 5e-3}) {
            for (double p = 0.2; p <= 6; p += 0.7) {
                for (double f = 0.01; f < 1; f += 0.07) {
                    double t = katz.temperatureAt(p * GPA, f, water);
                    assertEquals(f, katz.meltFraction(p * GPA, t, water), 1e-9, "p=" + p + " f=" + f + " w=" + water);
                }
            }
        }
    }

    @Test
    void zeroWaterEqualsTheDryModel() {
        for (double t = 1100; t <= 1800; t += 50) {
            MeltState wet = katz.melt(2 * GPA, t + C, 0.0);
            assertEquals(katz.dryMeltFraction(2 * GPA, t + C), wet.meltFraction(), 0.0);
            assertEquals(wet.drySolidus(), wet.solidus(), 0.0);
            assertEquals(0.0, wet.waterInMelt(), 0.0);
        }
    }

    @Test
    void waterLowersTheSolidusMonotonicallyUntilSaturationCapsIt() {
        double p = 3 * GPA;
        double previous = katz.drySolidus(p);
        for (double w = 1e-5; w <= 0.02; w *= 1.5) {
            double s = katz.wetSolidus(p, w);
            assertTrue(s <= previous, "solidus must not rise with water");
            assertTrue(s >= katz.saturatedSolidus(p) - 1e-9, "saturation caps the lowering");
            previous = s;
        }
        assertEquals(katz.saturatedSolidus(p), katz.wetSolidus(p, 0.02), 1e-9);
    }

    @Test
    void waterPartitionsIntoTheMeltAndIsConserved() {
        double p = 1.5 * GPA;
        double bulk = 0.001;
        MeltState s = katz.melt(p, 1250 + C, bulk);
        assertTrue(s.meltFraction() > 0 && s.meltFraction() < 1);
        assertFalse(s.waterSaturated());
        // mass balance with D = 0.01: Xbulk = X (D + F (1 − D))
        assertEquals(bulk, s.waterInMelt() * (0.01 + s.meltFraction() * 0.99), 1e-12);
    }

    @Test
    void refusesPressuresItCannotComputeAndWarnsOutsideItsCalibration() {
        assertThrows(EngineException.class, () -> katz.melt(-1, 1500, 0));
        assertThrows(EngineException.class, () -> katz.melt(11 * GPA, 2000, 0));
        assertThrows(EngineException.class, () -> katz.melt(1 * GPA, 1500, 0.2));
        assertEquals(1, katz.melt(9 * GPA, 2000, 0).warnings().size());
        assertTrue(katz.melt(3 * GPA, 1500, 0).warnings().isEmpty());
    }
}
