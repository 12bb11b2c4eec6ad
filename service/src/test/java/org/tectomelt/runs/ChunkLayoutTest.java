package org.tectomelt.runs;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.math.BigInteger;
import java.util.BitSet;
import org.junit.jupiter.api.Test;

/** Which points each chunk of a run holds ({@link ChunkLayout}). */
class ChunkLayoutTest {

    @Test
    void everyIndexIsInExactlyOneChunkAtItsPosition() {
        for (int n = 1; n <= 700; n++) {
            for (int size : new int[] {1, 3, 7, 125, 500}) {
                ChunkLayout layout = new ChunkLayout(n, size);
                BitSet seen = new BitSet();
                int positions = 0;
                for (int k = 0; k < layout.chunks(); k++) {
                    assertTrue(layout.to(k) - layout.from(k) >= 1 && layout.to(k) - layout.from(k) <= size);
                    for (int p = layout.from(k); p < layout.to(k); p++) {
                        int i = layout.index(p);
                        assertTrue(i >= 0 && i < n, "index in range");
                        assertFalse(seen.get(i), "index " + i + " of " + n + " held twice");
                        seen.set(i);
                        assertEquals(p, layout.position(i));
                        assertEquals(k, layout.chunkOf(i));
                        positions++;
                    }
                }
                assertEquals(n, positions);
                for (int k = 0; k < layout.chunks(); k++) {
                    int[] held = layout.indexes(k);
                    assertEquals(layout.to(k) - layout.from(k), held.length);
                    for (int j = 0; j < held.length; j++) {
                        assertEquals(k, layout.chunkOf(held[j]));
                        assertTrue(j == 0 || held[j - 1] < held[j], "ascending");
                    }
                }
                assertEquals(n, seen.cardinality(), "n = " + n + ", size = " + size);
            }
        }
    }

    @Test
    void theMultiplierIsTheCoprimeIntegerNearestTheGoldenFraction() {
        assertEquals(1, ChunkLayout.multiplier(1));
        assertEquals(1, ChunkLayout.multiplier(2));
        // 2,000 x 0.618 = 1236.07; 1236 shares 4 with 2,000, 1237 is prime
        assertEquals(1237, ChunkLayout.multiplier(2_000));
        for (int n = 3; n <= 5_000; n++) {
            long a = ChunkLayout.multiplier(n);
            assertEquals(1, BigInteger.valueOf(a).gcd(BigInteger.valueOf(n)).intValue(), "coprime with " + n);
            double golden = n * (Math.sqrt(5) - 1) / 2;
            for (long b = 1; b < n; b++) {
                if (Math.abs(b - golden) < Math.abs(a - golden) - 1e-9) {
                    assertTrue(BigInteger.valueOf(b).gcd(BigInteger.valueOf(n)).intValue() > 1,
                            b + " is nearer for " + n + " and coprime");
                }
            }
        }
    }

    @Test
    void largeRunsDoNotOverflow() {
        ChunkLayout layout = new ChunkLayout(10_000_000, 1_000);
        for (int p : new int[] {0, 1, 4_999_999, 9_999_999}) {
            int i = layout.index(p);
            assertTrue(i >= 0 && i < 10_000_000);
            assertEquals(p, layout.position(i));
        }
    }

    @Test
    void noPointsOrNoChunkSizeIsRefused() {
        assertThrows(IllegalArgumentException.class, () -> new ChunkLayout(0, 10));
        assertThrows(IllegalArgumentException.class, () -> new ChunkLayout(10, 0));
    }

    /**
     * The reason for the layout: a 200 x 10 sweep whose point cost grows along the outer axis (as
     * a ridge's does with potential temperature) cut into four chunks of 500. Contiguous chunks
     * cost 1 : 3 : 5 : 7 of the outer index; these cost alike within a percent. And an inner axis
     * of as many values as there are chunks (the worst case of striding by the chunk count) is
     * spread over every chunk too.
     */
    @Test
    void chunksOfASweepWhoseCostFollowsAnAxisCostAlike() {
        ChunkLayout layout = new ChunkLayout(2_000, 500);
        double[] outer = new double[layout.chunks()];
        for (int k = 0; k < layout.chunks(); k++) {
            for (int p = layout.from(k); p < layout.to(k); p++) {
                outer[k] += 1 + layout.index(p) / 10;   // cost ~ the outer axis' step
            }
        }
        double mean = java.util.Arrays.stream(outer).average().orElseThrow();
        for (double c : outer) {
            assertEquals(1.0, c / mean, 0.01, "chunk cost against the mean");
        }
        for (int k = 0; k < layout.chunks(); k++) {
            int[] inner = new int[4];
            for (int p = layout.from(k); p < layout.to(k); p++) {
                inner[layout.index(p) % 4]++;
            }
            for (int v : inner) {
                assertEquals(125, v, 2, "each of four inner values in chunk " + k);
            }
        }
    }
}
