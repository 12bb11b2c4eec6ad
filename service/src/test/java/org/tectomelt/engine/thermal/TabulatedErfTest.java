package org.tectomelt.engine.thermal;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.special.Erf;
import org.junit.jupiter.api.Test;

class TabulatedErfTest {

    @Test
    void agreesWithCommonsMathWithin1e10Everywhere() {
        double worst = 0;
        for (double x = -7; x <= 7; x += 0.000731) {
            worst = Math.max(worst, Math.abs(TabulatedErf.erf(x) - Erf.erf(x)));
        }
        assertTrue(worst < 1e-10, "largest difference " + worst);
    }

    @Test
    void isExactAtTheTablePointsAndOneBeyondTheTable() {
        assertEquals(Erf.erf(0.5), TabulatedErf.erf(0.5), 0);
        assertEquals(0.0, TabulatedErf.erf(0), 0);
        assertEquals(1.0, TabulatedErf.erf(6), 0);
        assertEquals(1.0, TabulatedErf.erf(1e300), 0);
        assertEquals(-1.0, TabulatedErf.erf(Double.NEGATIVE_INFINITY), 0);
        assertTrue(Double.isNaN(TabulatedErf.erf(Double.NaN)));
    }
}
