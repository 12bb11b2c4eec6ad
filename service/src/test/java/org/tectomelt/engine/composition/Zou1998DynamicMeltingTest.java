package org.tectomelt.engine.composition;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * Dynamic melting (Zou 1998, forms in the class Javadoc, from memory): its limits — fractional
 * melting of Shaw (1970) as φ → 0, batch melting as the retained fraction grows to the total F — and
 * the modal form as the case P = D.
 */
class Zou1998DynamicMeltingTest {

    @Test
    void withNoRetainedMeltItIsShawsFractionalMelting() {
        for (double d : new double[] {0.001, 0.05, 0.3, 1.0, 3.0}) {
            for (double f : new double[] {0.01, 0.1, 0.25}) {
                assertEquals(Shaw1970.fractionalMelt(d, f), Zou1998DynamicMelting.melt(d, 0.0, f),
                        1e-12 * Shaw1970.fractionalMelt(d, f) + 1e-300);
                assertEquals(Shaw1970.accumulatedFractionalMelt(d, f), Zou1998DynamicMelting.accumulatedMelt(d, 0.0, f),
                        1e-12 * Shaw1970.accumulatedFractionalMelt(d, f));
                assertEquals(Shaw1970.fractionalMelt(d, 0.7 * d, f), Zou1998DynamicMelting.melt(d, 0.7 * d, 0.0, f),
                        1e-12 * Shaw1970.fractionalMelt(d, 0.7 * d, f) + 1e-300);
            }
        }
    }

    @Test
    void asTheRetainedFractionGrowsToTheTotalMeltFractionItBecomesBatchMelting() {
        double f = 0.15;
        for (double d : new double[] {0.001, 0.05, 0.3, 3.0}) {
            double batch = Shaw1970.batchMelt(d, f);
            double previousGap = Double.POSITIVE_INFINITY;
            for (double phi : new double[] {0.0, 0.05, 0.1, 0.14, 0.149, 0.1499}) {
                double x = Zou1998DynamicMelting.extractedFraction(phi, f);
                double gap = Math.abs(Zou1998DynamicMelting.melt(d, phi, x) / batch - 1);
                assertTrue(gap < previousGap, "approaches batch monotonically, D=" + d + " φ=" + phi);
                previousGap = gap;
            }
            // at φ = F nothing has left yet: exactly batch with F = φ
            assertEquals(batch, Zou1998DynamicMelting.melt(d, f, 0.0), 1e-12 * batch);
            assertEquals(Shaw1970.batchMelt(d, 0.6 * d, f), Zou1998DynamicMelting.melt(d, 0.6 * d, f, 0.0),
                    1e-12 * batch);
        }
    }

    @Test
    void theModalFormIsTheCasePEqualsD() {
        double d = 0.08;
        double phi = 0.01;
        double x = 0.12;
        double alpha = phi + (1 - phi) * d;
        // (1/α)(1 − X)^(1/α − 1), written out
        assertEquals(Math.pow(1 - x, 1 / alpha - 1) / alpha, Zou1998DynamicMelting.melt(d, phi, x), 1e-12);
        assertEquals((1 - Math.pow(1 - x, 1 / alpha)) / x, Zou1998DynamicMelting.accumulatedMelt(d, phi, x), 1e-12);
        assertEquals(0.01 + 0.99 * 0.12, Zou1998DynamicMelting.totalMeltFraction(phi, x), 1e-15);
    }
}
