package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.HashSet;
import java.util.Locale;
import java.util.Set;
import java.util.SplittableRandom;
import java.util.UUID;
import org.junit.jupiter.api.Test;

/** The access log's cheap number formatting and the request ids. */
class RequestPlumbingTest {

    @Test
    void tenthsWritesWhatPercentPointOneFWrites() {
        SplittableRandom r = new SplittableRandom(7);
        int differ = 0;
        for (int i = 0; i < 200_000; i++) {
            float ms = (float) (i < 1000 ? i / 20.0 : Math.pow(10, r.nextDouble(-3, 6)));
            String expected = String.format(Locale.ROOT, "%.1f", ms);
            String got = RequestPlumbing.tenths(ms);
            if (!expected.equals(got)) {
                // only a decimal tie may round the other way: the two differ by one in the last digit
                assertEquals(Double.parseDouble(expected), Double.parseDouble(got), 0.1000001, ms + "");
                differ++;
            }
        }
        assertTrue(differ < 20, "ties rounded differently: " + differ);
        assertEquals("0.0", RequestPlumbing.tenths(0f));
        assertEquals("12.3", RequestPlumbing.tenths(12.34f));
        assertEquals("NaN", RequestPlumbing.tenths(Float.NaN));
    }

    @Test
    void requestIdsAreVersionFourUuidsAndDistinct() {
        Set<String> seen = new HashSet<>();
        for (int i = 0; i < 10_000; i++) {
            String id = RequestPlumbing.newRequestId();
            UUID u = UUID.fromString(id);
            assertEquals(4, u.version(), id);
            assertEquals(2, u.variant(), id);
            assertEquals(36, id.length());
            assertTrue(seen.add(id), "repeated id " + id);
        }
    }
}
