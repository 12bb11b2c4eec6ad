package org.tectomelt.runs;

import java.math.BigInteger;
import java.sql.PreparedStatement;
import java.sql.SQLException;
import java.util.Arrays;

/**
 * Which points of a run each chunk holds. A run of {@code n} points cut into chunks of
 * {@code size} holds in chunk {@code k} the positions {@code [k·size, min((k+1)·size, n))}, and
 * position {@code p} is the point of index {@code (a·p) mod n}, with {@code a} the integer nearest
 * to {@code n(√5 − 1)/2} that shares no factor with {@code n} (a golden-ratio, or Fibonacci,
 * lattice: Knuth 1998, The Art of Computer Programming vol. 3, §6.4, multiplicative hashing
 * by the golden ratio, from memory).
 *
 * <p>Why not contiguous ranges of indexes: a sweep's point cost follows its axes (a hotter
 * mantle melts over a taller column), so contiguous chunks of one run cost unlike amounts (the
 * four chunks of 500 points of the benchmark's ridge sweep, potential temperature the outer axis,
 * took 21, 30, 31–55 and 53–65 ms) and the thread holding the dear one finishes the run alone. Multiplication by {@code a} is a bijection of {@code 0..n-1} (a and n
 * coprime), and the multiples of a golden-ratio fraction spread evenly over the circle at every
 * length (the three-distance theorem: Sós 1958, Świerczkowski 1958; from memory), so every
 * chunk samples every axis across its whole range, and the partial results of a running run fill
 * the whole sweep coarsely instead of one end of it.
 *
 * <p>The layout is a function of the run's stored {@code total_points} and {@code chunk_size}
 * alone. Any such layout is a partition of the indexes, and the save skips a point already stored
 * (the primary key refuses it; {@link RunStore#save}), so a run queued under another layout (an
 * earlier release's contiguous ranges) is still completed exactly once per point; a chunk that
 * db-scheduler had not run before computes again, once, the points of its range that the earlier
 * chunks stored.
 */
final class ChunkLayout {

    private final int total;
    private final int size;
    private final long multiplier;
    private final long inverse;

    ChunkLayout(int totalPoints, int chunkSize) {
        if (totalPoints < 1 || chunkSize < 1) {
            throw new IllegalArgumentException("a run has at least one point and one point per chunk");
        }
        this.total = totalPoints;
        this.size = chunkSize;
        this.multiplier = multiplier(totalPoints);
        this.inverse = BigInteger.valueOf(multiplier).modInverse(BigInteger.valueOf(totalPoints)).longValue();
    }

    /** The integer nearest {@code n(√5 − 1)/2} coprime with {@code n} (1 for n ≤ 2). */
    static long multiplier(int n) {
        if (n <= 2) {
            return 1;
        }
        double golden = n * 0.6180339887498949;
        long below = (long) Math.floor(golden);
        boolean belowFirst = golden - below <= below + 1 - golden;
        for (long d = 0; ; d++) {
            // floor - d and ceil + d, the nearer first: the candidates in order of distance
            long lo = below - d;
            long hi = below + 1 + d;
            for (long a : belowFirst ? new long[] {lo, hi} : new long[] {hi, lo}) {
                if (a >= 1 && a < n && BigInteger.valueOf(a).gcd(BigInteger.valueOf(n)).intValue() == 1) {
                    return a;
                }
            }
        }
    }

    /** Chunks of the run. */
    int chunks() {
        return (total + size - 1) / size;
    }

    /** First position of chunk {@code k}. */
    int from(int chunk) {
        return chunk * size;
    }

    /** One past the last position of chunk {@code k}. */
    int to(int chunk) {
        return Math.min(total, (chunk + 1) * size);
    }

    /**
     * The indexes chunk {@code k} holds, ascending: computed in that order, neighbouring points of
     * the sweep follow each other (the same branches of the engine, warm caches) and the stored
     * rows go into the primary key's index in order.
     */
    int[] indexes(int chunk) {
        int[] out = new int[to(chunk) - from(chunk)];
        for (int p = from(chunk); p < to(chunk); p++) {
            out[p - from(chunk)] = index(p);
        }
        Arrays.sort(out);
        return out;
    }

    /** The point index at {@code position}. */
    int index(int position) {
        return (int) (multiplier * position % total);
    }

    /** The position of the point {@code index}. */
    int position(int index) {
        return (int) (inverse * index % total);
    }

    /** The chunk holding the point {@code index}. */
    int chunkOf(int index) {
        return position(index) / size;
    }

    /**
     * SQL of the position of the index in column {@code column}, for both databases; its two
     * bigint parameters are bound by {@link #bindPosition}.
     */
    static String positionSql(String column) {
        return "mod(cast(" + column + " as bigint) * ?, ?)";
    }

    /** Binds the parameters of {@link #positionSql} at {@code first} and {@code first + 1}. */
    void bindPosition(PreparedStatement ps, int first) throws SQLException {
        ps.setLong(first, inverse);
        ps.setLong(first + 1, total);
    }
}
