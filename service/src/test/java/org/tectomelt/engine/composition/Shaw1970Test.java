package org.tectomelt.engine.composition;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

/**
 * The closed forms of Shaw (1970) as printed (equations in the class Javadoc; REFERENCES §4 [pub]):
 * written-out values, the limits D → 0 and D = 1, non-modal → modal when P = D, and mass balance.
 */
class Shaw1970Test {

    private static final double[] DS = {1e-4, 0.01, 0.1, 0.5, 1.0, 2.0, 5.0};
    private static final double[] FS = {1e-9, 0.001, 0.05, 0.1, 0.2, 0.35};

    @Test
    void batchMeltIsOneOverDPlusFTimesOneMinusD() {
        // Shaw 1970: C_L/C0 = 1/(D + F(1 − D)); D = 0.1, F = 0.1 → 1/0.19, written out by hand
        assertEquals(1 / 0.19, Shaw1970.batchMelt(0.1, 0.1), 1e-14);
        assertEquals(1 / (2.0 + 0.2 * (1 - 2.0)), Shaw1970.batchMelt(2.0, 0.2), 1e-14);
    }

    @Test
    void fractionalFormsMatchTheirWrittenOutValues() {
        double d = 0.1;
        double f = 0.1;
        // (1/D)(1 − F)^(1/D − 1) = 10·0.9⁹, by hand
        assertEquals(10 * Math.pow(0.9, 9), Shaw1970.fractionalMelt(d, f), 1e-13);
        // (1 − F)^(1/D − 1) = 0.9⁹
        assertEquals(Math.pow(0.9, 9), Shaw1970.fractionalResidue(d, f), 1e-14);
        // [1 − (1 − F)^(1/D)]/F = (1 − 0.9¹⁰)/0.1
        assertEquals((1 - Math.pow(0.9, 10)) / 0.1, Shaw1970.accumulatedFractionalMelt(d, f), 1e-13);
        // non-modal instantaneous (1/D0)(1 − PF/D0)^(1/P − 1) with D0 = 0.2, P = 0.5, F = 0.2: 5·0.5¹
        assertEquals(5 * 0.5, Shaw1970.fractionalMelt(0.2, 0.5, 0.2), 1e-13);
    }

    @Test
    void nonModalFormsReduceToTheModalOnesWhenPEqualsD() {
        for (double d : DS) {
            for (double f : FS) {
                assertEquals(Shaw1970.batchMelt(d, f), Shaw1970.batchMelt(d, d, f), 1e-13 * Shaw1970.batchMelt(d, f));
                double modal = Math.pow(1 - f, 1 / d - 1) / d;
                assertEquals(modal, Shaw1970.fractionalMelt(d, d, f), 1e-11 * Math.max(modal, 1e-300), "D=" + d);
                assertEquals(Math.pow(1 - f, 1 / d - 1), Shaw1970.fractionalResidue(d, d, f),
                        1e-11 * Math.max(Math.pow(1 - f, 1 / d - 1), 1e-300));
                // [1 − (1 − F)^(1/D)]/F written without cancellation for tiny F
                double acc = -Math.expm1(Math.log1p(-f) / d) / f;
                assertEquals(acc, Shaw1970.accumulatedFractionalMelt(d, d, f), 1e-11 * acc);
            }
        }
    }

    @Test
    void aPerfectlyIncompatibleElementGoesAllIntoTheFirstMelt() {
        // D → 0: batch C_L = C0/F, accumulated fractional C̄_L = C0/F (REFERENCES §4 limits)
        for (double f : new double[] {0.01, 0.1, 0.3}) {
            assertEquals(1 / f, Shaw1970.batchMelt(1e-12, f), 1e-9 / f);
            assertEquals(1 / f, Shaw1970.accumulatedFractionalMelt(1e-12, f), 1e-9 / f);
            assertEquals(0.0, Shaw1970.fractionalResidue(1e-6, f), 1e-300);
        }
    }

    @Test
    void anElementWithDOfOneIsNotFractionated() {
        for (double f : FS) {
            assertEquals(1.0, Shaw1970.batchMelt(1.0, f), 1e-15);
            assertEquals(1.0, Shaw1970.fractionalMelt(1.0, f), 1e-15);
            assertEquals(1.0, Shaw1970.fractionalResidue(1.0, f), 1e-15);
            assertEquals(1.0, Shaw1970.accumulatedFractionalMelt(1.0, f), 1e-14);
        }
    }

    @Test
    void meltAndResidueTogetherHoldTheSource() {
        // F·C̄_L + (1 − F)·C_s = C0, modal and non-modal (P ≤ D0/F keeps every mineral), batch and fractional
        for (double d : DS) {
            for (double f : FS) {
                for (double p : new double[] {d, 0.5 * d, 1.5 * d}) {
                    if (p * f >= d) {
                        continue;
                    }
                    assertEquals(1.0, f * Shaw1970.accumulatedFractionalMelt(d, p, f)
                            + (1 - f) * Shaw1970.fractionalResidue(d, p, f), 1e-12);
                    assertEquals(1.0, f * Shaw1970.batchMelt(d, p, f) + (1 - f) * Shaw1970.batchResidue(d, p, f),
                            1e-12);
                }
            }
        }
    }

    @Test
    void theFirstDropIsTheSameInBatchAndFractionalMelting() {
        for (double d : DS) {
            assertEquals(1 / d, Shaw1970.batchMelt(d, 0.0), 1e-12 / d);
            assertEquals(1 / d, Shaw1970.fractionalMelt(d, 0.0), 1e-12 / d);
            assertEquals(1 / d, Shaw1970.accumulatedFractionalMelt(d, 0.0), 1e-12 / d);
        }
    }

    @Test
    void theSeriesForTheStepFactorsAgreeWithTheLibraryToRounding() {
        // the column's per-step factors use e^y and ln(1 + x)/x by series near 0 (cheaper than Math.exp and
        // Math.log): across and beyond the series' ranges they agree with the library forms within 2 ulp
        for (int i = -4000; i <= 4000; i++) {
            double y = i * 1e-4; // −0.4 … 0.4, the series below 1/8 in magnitude
            double expected = Math.exp(y);
            assertEquals(expected, Shaw1970.exp(y), 2 * Math.ulp(expected), "e^" + y);
            double x = i * 2.5e-5; // −0.1 … 0.1, the series below 0.01 in magnitude
            double l = x == 0 ? 1.0 : Math.log1p(x) / x;
            assertEquals(l, Shaw1970.log1pOverX(x), 4 * Math.ulp(l), "ln(1 + x)/x at " + x);
        }
        assertEquals(Math.exp(-30.0), Shaw1970.exp(-30.0), 0.0);
    }

    @Test
    void theTableDrivenExponentialHoldsToRoundingAcrossItsTableAndAtTheEdgesOfItsIntervals() {
        // e^y and e^y − 1 over every interval of the table (k/16 ± 1/32) to |y| = 4.5 and beyond it, within
        // 2 ulp of Math.exp and Math.expm1; e^y − 1 keeps all its digits for tiny arguments
        for (int i = -9000; i <= 9000; i++) {
            double y = i * 5e-4;
            assertEquals(Math.exp(y), Shaw1970.exp(y), 2 * Math.ulp(Math.exp(y)), "e^" + y);
            assertEquals(Math.expm1(y), Shaw1970.expm1(y), 2 * Math.ulp(Math.expm1(y)), "e^" + y + " − 1");
        }
        for (int k = -64; k <= 64; k++) {
            for (double y : new double[] {k / 16.0, Math.nextDown(k / 16.0 + 1 / 32.0), k / 16.0 - 1 / 32.0}) {
                assertEquals(Math.exp(y), Shaw1970.exp(y), 2 * Math.ulp(Math.exp(y)), "e^" + y);
                assertEquals(Math.expm1(y), Shaw1970.expm1(y), 2 * Math.ulp(Math.expm1(y)), "e^" + y + " − 1");
            }
        }
        for (double y : new double[] {1e-300, -1e-17, 3e-9, -2.5e-6, 1e-3}) {
            assertEquals(Math.expm1(y), Shaw1970.expm1(y), 2 * Math.ulp(Math.expm1(y)), "e^" + y + " − 1");
        }
        assertEquals(0.0, Shaw1970.expm1(0.0), 0.0);
        assertEquals(Math.expm1(-30.0), Shaw1970.expm1(-30.0), 0.0);
    }
}
