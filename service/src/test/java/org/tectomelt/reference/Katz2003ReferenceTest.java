package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.MeltState;

/**
 * Katz, R.F., Spiegelman, M. &amp; Langmuir, C.H. (2003) A new parameterization of hydrous mantle
 * melting. G-cubed 4(9), 1073, doi:10.1029/2002GC000433: the curve polynomials and parameters of
 * their Table 2 (as listed in REFERENCES §2.1, from memory there), the identities of their
 * equations, and the worked dry values computed independently in REFERENCES §2.1 [calc].
 */
class Katz2003ReferenceTest {

    private static final double GPA = 1e9;
    private static final double C = 273.15;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();

    @Test
    void curvePolynomialsReproduceTable2() {
        // Katz et al. (2003) Table 2 via REFERENCES §2.1 (from memory): A1..3, B1..3, C1..3.
        // At 0 GPa the curves are the constant terms; at 1 and 2 GPa A1 + A2 P + A3 P² etc.
        assertEquals(1085.7, katz.drySolidus(0) - C, 1e-9);
        assertEquals(1475.0, katz.lherzoliteLiquidus(0) - C, 1e-9);
        assertEquals(1780.0, katz.dryLiquidus(0) - C, 1e-9);
        assertEquals(1085.7 + 132.9 * 2 - 5.1 * 4, katz.drySolidus(2 * GPA) - C, 1e-9);
        assertEquals(1475.0 + 80.0 * 2 - 3.2 * 4, katz.lherzoliteLiquidus(2 * GPA) - C, 1e-9);
        assertEquals(1780.0 + 45.0 * 2 - 2.0 * 4, katz.dryLiquidus(2 * GPA) - C, 1e-9);
        // Table 2: r1 = 0.50, r2 = 0.08 /GPa, Mcpx = 0.17 → F_cpx-out = 0.17 / (0.5 + 0.08 P)
        assertEquals(0.17 / 0.66, katz.cpxExhaustionFraction(2 * GPA), 1e-12);
        // Table 2: χ1 = 12, χ2 = 1, λ = 0.6 → Xsat(1 GPa) = 13 wt%
        assertEquals(0.13, katz.waterSaturation(GPA), 1e-12);
        // Table 2: K = 43, γ = 0.75 → ΔT(1 wt%) = 43 K
        assertEquals(43.0, Katz2003Peridotite.solidusDepression(0.01), 1e-12);
    }

    @Test
    void workedDryMeltFractionsOfReferencesSection21() {
        // REFERENCES §2.1 [calc], independent numpy script, Mcpx = 0.17; printed to 4 decimals,
        // so the tolerance is half the last printed digit.
        assertEquals(0.1293, katz.meltFraction(GPA, 1300 + C, 0), 5e-5);
        assertEquals(0.1237, katz.meltFraction(3 * GPA, 1500 + C, 0), 5e-5);
        // at 2 GPa T_cpx-out = 1449.0 °C; recomputing by hand gives 1331.1 + (0.17/0.66)^(2/3) × 291.1
        // = 1448.95 °C, so the printed value is rounded to the degree: tolerance 0.5 K
        assertEquals(1449.0, katz.cpxExhaustionTemperature(2 * GPA) - C, 0.5);
        MeltState past = katz.melt(2 * GPA, 1450 + C, 0);
        assertEquals(0.2577, past.meltFraction(), 5e-5);
        assertTrue(past.cpxExhausted(), "1450 °C sits just past cpx exhaustion at 2 GPa (REFERENCES §2.1)");
    }

    @Test
    void saturatedSolidusOfReferencesSection21() {
        // REFERENCES §2.1 [calc]: Ts − K·Xsat^γ = 919, 922, 941, 963, 1001 °C at 1, 2, 3, 4, 6 GPa,
        // printed to the degree: tolerance 0.5 K.
        double[] p = {1, 2, 3, 4, 6};
        double[] t = {919, 922, 941, 963, 1001};
        for (int i = 0; i < p.length; i++) {
            assertEquals(t[i], katz.saturatedSolidus(p[i] * GPA) - C, 0.5, "P = " + p[i] + " GPa");
        }
    }

    @Test
    void identitiesOfTheMeltFractionLaw() {
        // Katz et al. (2003) eqs. for F: F = 0 on the solidus, F = F_cpx-out at T_cpx-out,
        // F = 1 on the liquidus, continuous across cpx exhaustion; with and without water.
        for (double water : new double[] {0, 0.001}) {
            for (double p = 0.5; p <= 6; p += 0.5) {
                double pa = p * GPA;
                assertEquals(0.0, katz.meltFraction(pa, katz.wetSolidus(pa, water), water), 1e-9);
                assertEquals(1.0, katz.meltFraction(pa, katz.wetLiquidus(pa, water), water), 1e-9);
            }
        }
        for (double p = 0.5; p <= 6; p += 0.5) {
            double pa = p * GPA;
            double tCpx = katz.cpxExhaustionTemperature(pa);
            assertEquals(katz.cpxExhaustionFraction(pa), katz.meltFraction(pa, tCpx, 0), 1e-12);
            assertEquals(katz.meltFraction(pa, tCpx - 1e-6, 0), katz.meltFraction(pa, tCpx + 1e-6, 0), 1e-6);
        }
    }

    @Test
    void waterLowersTheSolidusMonotonicallyAndSaturationCapsTheLowering() {
        // Katz et al. (2003) §3: ΔT = K X^γ grows with water until the melt is saturated.
        for (double p = 1; p <= 6; p += 1) {
            double pa = p * GPA;
            double previous = katz.drySolidus(pa);
            for (double w = 1e-4; w <= 0.05; w += 1e-4) {
                double s = katz.wetSolidus(pa, w);
                assertTrue(s <= previous + 1e-12, "solidus rose with water at P = " + p);
                assertTrue(s >= katz.saturatedSolidus(pa) - 1e-9, "lowered past saturation at P = " + p);
                previous = s;
            }
            assertEquals(katz.saturatedSolidus(pa), katz.wetSolidus(pa, 0.05), 1e-9);
        }
    }
}
