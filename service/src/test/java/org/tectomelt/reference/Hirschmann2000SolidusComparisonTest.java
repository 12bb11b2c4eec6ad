package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Locale;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.McKenzieBickle1988Peridotite;

/**
 * Independent comparison of the dry peridotite solidus with the fit of Hirschmann, M.M. (2000)
 * Mantle solidus: experimental constraints and the effects of peridotite composition. G-cubed 1,
 * 2000GC000070, doi:10.1029/2000GC000070: T = −5.104 P² + 132.899 P + 1120.661 (°C, GPa, 0–10 GPa)
 * [pub, REFERENCES §2.3]. The models legitimately differ by tens of kelvin (different experiment
 * sets); the test prints the differences and bounds them, it does not tune anything.
 */
class Hirschmann2000SolidusComparisonTest {

    private static final double C = 273.15;

    private static double hirschmann(double p) {
        return -5.104 * p * p + 132.899 * p + 1120.661;
    }

    @Test
    void katz2003SitsAConstant35KBelowHirschmann2000() {
        Katz2003Peridotite katz = Katz2003Peridotite.fertile();
        for (double p = 0; p <= 8; p += 1) {
            double d = katz.drySolidus(p * 1e9) - C - hirschmann(p);
            System.out.printf(Locale.ROOT, "Katz 2003 − Hirschmann 2000 solidus at %.0f GPa: %+.2f K%n", p, d);
            // A2, A3 of Katz Table 2 coincide with Hirschmann's P and P² terms to their printed digits
            // (REFERENCES §2.1), so the difference is the constant-term offset 1085.7 − 1120.661 = −34.96 K,
            // drifting by under 0.5 K over 0–8 GPa from the rounding of A2 and A3.
            assertEquals(-34.96, d, 0.5, "P = " + p);
        }
    }

    @Test
    void mcKenzieBickle1988StaysWithinTensOfKelvinOfHirschmann2000() {
        McKenzieBickle1988Peridotite mb = new McKenzieBickle1988Peridotite();
        double worst = 0;
        for (double p = 0; p <= McKenzieBickle1988Peridotite.CALIBRATED_MAX_GPA; p += 0.5) {
            double d = mb.drySolidus(p * 1e9) - C - hirschmann(p);
            System.out.printf(Locale.ROOT, "McKenzie & Bickle 1988 − Hirschmann 2000 solidus at %.1f GPa: %+.1f K%n", p, d);
            worst = Math.max(worst, Math.abs(d));
        }
        // "tens of kelvin" (REFERENCES §2.3 and the issue): within ±50 K over the calibrated range;
        // observed −21 K at 0 GPa to +42 K near 4 GPa.
        assertEquals(0, worst, 50);
    }
}
