package org.tectomelt.engine.melting;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;

/** The pyroxenite law's identities, inverse and range (engine unit tests). */
class PertermannHirschmann2003PyroxeniteTest {

    private static final double GPA = 1e9;
    private final PertermannHirschmann2003Pyroxenite g2 = new PertermannHirschmann2003Pyroxenite();

    @Test
    void meltFractionRunsFromZeroAtTheSolidusToOneAtTheLiquidus() {
        for (double p : new double[] {1, 2, 3, 5}) {
            assertEquals(0.0, g2.meltFraction(p * GPA, g2.drySolidus(p * GPA), 0), 0.0);
            assertEquals(1.0, g2.meltFraction(p * GPA, g2.dryLiquidus(p * GPA), 0), 1e-12);
            assertEquals(0.0, g2.meltFraction(p * GPA, g2.drySolidus(p * GPA) - 10, 0), 0.0);
        }
        // a + b = 1 and F(T′ = 0.5) = a/4 + b/2
        assertEquals(0.7368 / 4 + 0.2632 / 2, PertermannHirschmann2003Pyroxenite.meltFractionAtReducedTemperature(0.5),
                1e-15);
    }

    @Test
    void temperatureAtInvertsTheLawAndFRisesWithTemperature() {
        double p = 2.5 * GPA;
        double previous = -1;
        for (double f = 0; f <= 1.0 + 1e-12; f += 0.05) {
            double t = g2.temperatureAt(p, Math.min(f, 1), 0);
            assertEquals(Math.min(f, 1), g2.meltFraction(p, t, 0), 1e-12);
            assertTrue(t > previous);
            previous = t;
        }
    }

    @Test
    void itIsDryAndWarnsOutsideItsAnchoredRange() {
        assertFalse(g2.hydrous());
        assertEquals(0.0, g2.maxBulkWater(), 0.0);
        assertThrows(EngineException.class, () -> g2.melt(2 * GPA, 1500, 0.001));
        assertThrows(EngineException.class, () -> g2.melt(9 * GPA, 2000, 0));
        assertTrue(g2.melt(2.5 * GPA, 1600, 0).warnings().isEmpty());
        assertFalse(g2.melt(5 * GPA, 1800, 0).warnings().isEmpty());
        assertEquals(1.0, g2.branchExponent(false), 0.0);
        assertEquals(1.0, g2.exhaustionMeltFraction(2 * GPA), 0.0);
    }

    @Test
    void theColumnDeclarationsHold() {
        // finite dF/dT at the solidus: dF/dT′ = b there, so n = 1 is the right branch exponent
        double p = 2 * GPA;
        double ts = g2.drySolidus(p);
        double dT = 1e-3;
        double slope = g2.meltFraction(p, ts + dT, 0) / dT;
        assertEquals(0.2632 / (g2.dryLiquidus(p) - ts), slope, 1e-6);
    }
}
