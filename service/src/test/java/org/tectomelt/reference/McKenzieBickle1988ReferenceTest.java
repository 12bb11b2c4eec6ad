package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.McKenzieBickle1988Peridotite;

/**
 * McKenzie, D. &amp; Bickle, M.J. (1988) J. Petrology 29(3), 625–679,
 * doi:10.1093/petrology/29.3.625: the identities of their melt-fraction polynomial and the
 * solidus at zero pressure, as listed in REFERENCES §2.2 (from memory there, widely reproduced).
 */
class McKenzieBickle1988ReferenceTest {

    private static final double C = 273.15;
    private final McKenzieBickle1988Peridotite mb = new McKenzieBickle1988Peridotite();

    @Test
    void meltFractionPolynomialIdentities() {
        // McKenzie & Bickle (1988), X(T′): X(−0.5) = 0, X(0.5) = 1 exactly; X(0) = 0.3936
        // (0.5 − 0.25 × 0.4256, exact in the polynomial's own digits).
        assertEquals(0.0, McKenzieBickle1988Peridotite.meltFractionAtReducedTemperature(-0.5), 1e-15);
        assertEquals(1.0, McKenzieBickle1988Peridotite.meltFractionAtReducedTemperature(0.5), 1e-15);
        assertEquals(0.3936, McKenzieBickle1988Peridotite.meltFractionAtReducedTemperature(0.0), 1e-15);
    }

    @Test
    void midpointBetweenSolidusAndLiquidusHolds39PercentMelt() {
        // McKenzie & Bickle (1988): T′ = 0 at (Ts + Tl)/2, so X = 0.3936 there at every pressure
        for (double p = 0; p <= 5; p += 1) {
            double mid = 0.5 * (mb.drySolidus(p * 1e9) + mb.dryLiquidus(p * 1e9));
            assertEquals(0.3936, mb.meltFraction(p * 1e9, mid, 0), 1e-12);
        }
    }

    @Test
    void solidusAtZeroPressureIsAbout1100C() {
        // McKenzie & Bickle (1988) via REFERENCES §2.2: Ts(0) ≈ 1100 °C. The implicit law gives
        // 1100 − 136 × 4.968e-4 × e^(…) = 1099.93 °C; tolerance 0.5 K for "≈ 1100".
        assertEquals(1100.0, mb.drySolidus(0) - C, 0.5);
        // liquidus at zero pressure: the constant term 1736.2 °C
        assertEquals(1736.2, mb.dryLiquidus(0) - C, 1e-9);
    }
}
