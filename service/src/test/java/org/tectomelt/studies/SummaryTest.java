package org.tectomelt.studies;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;

/** Summary statistics against hand computation (Hyndman &amp; Fan 1996 definition 7 for percentiles). */
class SummaryTest {

    @Test
    void percentilesInterpolateBetweenOrderStatistics() {
        double[] x = {10, 9, 8, 7, 6, 5, 4, 3, 2, 1};
        Summary s = Summary.of("km", x, 3);
        // definition 7: h = (n − 1) p; p = 0.16 → h = 1.44 → 2 + 0.44 = 2.44 [calc]
        assertEquals(2.44, s.p16(), 1e-12);
        assertEquals(5.5, s.p50(), 1e-12);
        assertEquals(8.56, s.p84(), 1e-12);
        assertEquals(1.225, s.p2_5(), 1e-12);
        assertEquals(9.775, s.p97_5(), 1e-12);
        assertEquals(5.5, s.mean(), 1e-12);
        assertEquals(Math.sqrt(82.5 / 9), s.sd(), 1e-12, "sample sd with n − 1");
        assertEquals(s.sd() / Math.sqrt(10), s.meanStandardError(), 1e-12);
        assertEquals(List.of(1.0, 4.0, 7.0, 10.0), s.histogram().edges());
        assertEquals(List.of(3, 3, 4), s.histogram().counts(), "the last bin holds its upper edge");
        assertEquals("km", s.unit());
    }

    @Test
    void identicalValuesMakeOneBin() {
        Summary s = Summary.of("°C", new double[] {3, 3, 3});
        assertEquals(0, s.sd());
        assertEquals(List.of(3.0, 3.0), s.histogram().edges());
        assertEquals(List.of(3), s.histogram().counts());
    }
}
