package org.tectomelt.studies;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.core.source64.SplitMix64;
import org.apache.commons.rng.core.source64.XoRoShiRo128PlusPlus;

/**
 * The generator of one Monte Carlo sample, made from (seed, sample index, stream) alone.
 *
 * <p>Each sample gets its own XoRoShiRo128++ generator (Blackman &amp; Vigna 2021, ACM Trans. Math.
 * Software 47(4), 36, doi:10.1145/3460772, from memory), seeded with two outputs of SplitMix64 started from a
 * hash of (seed, index, stream), the seeding Blackman &amp; Vigna recommend. Sample i's draws
 * therefore never depend on which thread computed it or in which order, so a study is
 * bit-identical for any number of threads (common practice for parallel Monte Carlo). Streams keep
 * independent kinds of draw apart (inputs, the observation of an inversion), so adding an
 * observation does not change the input draws of the same seed.
 */
public final class SampleRandom {

    /** Stream of the uncertain inputs' draws. */
    public static final int INPUTS = 0;
    /** Stream of the observation's draws (sampling inversion). */
    public static final int OBSERVATION = 1;

    private static final long GOLDEN = 0x9E3779B97F4A7C15L;

    private SampleRandom() {
    }

    /**
     * The generator of sample {@code index} of a study seeded with {@code seed}.
     *
     * @param seed   the study's seed (stored with the run, reported)
     * @param index  sample index, 0-based
     * @param stream which kind of draw ({@link #INPUTS}, {@link #OBSERVATION})
     */
    public static UniformRandomProvider forSample(long seed, long index, int stream) {
        long h = mix(mix(seed) ^ (index * GOLDEN)) ^ mix(stream + 0x632BE59BD9B4E019L);
        SplitMix64 seeder = new SplitMix64(h);
        return new XoRoShiRo128PlusPlus(seeder.nextLong(), seeder.nextLong());
    }

    /** The SplitMix64 finaliser (Steele, Lea &amp; Flood 2014): a bijective 64-bit mix. */
    static long mix(long z) {
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }
}
