package org.tectomelt.studies;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.apache.commons.rng.UniformRandomProvider;
import org.junit.jupiter.api.Test;

/**
 * Each family's draws against its closed-form mean and sd (common practice formulas; truncated
 * normal moments from Johnson, Kotz &amp; Balakrishnan 1994, Continuous Univariate Distributions
 * vol. 1, §13.10, from memory), within three standard errors (REFERENCES §5), and the support
 * checks against a field's range.
 */
class DistributionTest {

    private static final int N = 40_000;

    private static double[] draws(Distribution d, long seed) {
        double[] x = new double[N];
        for (int i = 0; i < N; i++) {
            x[i] = d.sample(SampleRandom.forSample(seed, i, SampleRandom.INPUTS));
        }
        return x;
    }

    private static void assertMoments(Distribution d, double mean, double sd) {
        assertEquals(mean, d.mean(), 1e-9 * Math.max(1, Math.abs(mean)), d + ": closed-form mean");
        assertEquals(sd, d.sd(), 1e-9 * Math.max(1, sd), d + ": closed-form sd");
        Summary s = Summary.of("1", draws(d, 11));
        assertEquals(mean, s.mean(), 3 * sd / Math.sqrt(N), d + ": sample mean within 3 standard errors");
        // sd of the sample sd ≈ sd/√(2n) for near-normal shapes; 5 % covers the heavier lognormal tail
        assertEquals(sd, s.sd(), Math.max(3 * sd / Math.sqrt(2.0 * N), 0.05 * sd), d + ": sample sd");
    }

    @Test
    void everyFamilyDrawsWithItsClosedFormMoments() {
        assertMoments(new Distribution.Normal(1350, 25), 1350, 25);
        assertMoments(new Distribution.Uniform(0, 0.02), 0.01, 0.02 / Math.sqrt(12));
        // triangular: mean (a+b+c)/3, variance (a²+b²+c²−ab−ac−bc)/18
        assertMoments(new Distribution.Triangular(0, 5, 15), 20.0 / 3, Math.sqrt((0 + 25 + 225 - 0 - 0 - 75) / 18.0));
        // lognormal: mean exp(μ+σ²/2), variance (exp(σ²)−1) exp(2μ+σ²)
        double mu = Math.log(40);
        double sig = 0.3;
        assertMoments(new Distribution.LogNormal(mu, sig), Math.exp(mu + sig * sig / 2),
                Math.sqrt(Math.expm1(sig * sig)) * Math.exp(mu + sig * sig / 2));
        // truncated to [μ, ∞) effectively: half-normal mean μ + σ√(2/π), sd σ√(1 − 2/π)
        assertMoments(new Distribution.TruncatedNormal(0, 1, 0, 40), Math.sqrt(2 / Math.PI),
                Math.sqrt(1 - 2 / Math.PI));
    }

    @Test
    void truncatedNormalStaysInsideItsBoundsInTheBodyAndDeepInATail() {
        for (Distribution.TruncatedNormal t : List.of(new Distribution.TruncatedNormal(1350, 25, 1300, 1400),
                new Distribution.TruncatedNormal(0, 1, 5, 6), new Distribution.TruncatedNormal(0, 1, 8, 8.05),
                new Distribution.TruncatedNormal(0, 1, -0.1, 0.2), new Distribution.TruncatedNormal(0, 1, -7, -6))) {
            double[] x = draws(t, 5);
            Summary s = Summary.of("1", x);
            assertTrue(s.min() >= t.min() && s.max() <= t.max(), t + " stays in bounds: " + s.min() + " " + s.max());
            assertEquals(t.mean(), s.mean(), 3 * t.sd() / Math.sqrt(N) + 1e-12, t + ": mean within 3 SE");
        }
        // the upper tail beyond 5: mean ≈ 5 + 1/5.19 (Mills ratio φ(5)/Q(5) = 5.1865, from the normal table [calc])
        assertEquals(5.1865, new Distribution.TruncatedNormal(0, 1, 5, 40).mean(), 1e-3);
    }

    @Test
    void aNormalWhoseFourSdLeaveTheRangeIsRefusedSuggestingTheTruncatedForm() {
        FieldRange range = FieldRange.closed(0, 5);
        List<InputProblem> p = new Distribution.Normal(0.5, 0.2).problems("uncertainty.inputs.bulkWaterWtPct", range);
        assertEquals(1, p.size());
        assertEquals("uncertainty.inputs.bulkWaterWtPct", p.get(0).field());
        assertTrue(p.get(0).message().contains("truncatedNormal") && p.get(0).message().contains("[0, 5]"),
                p.get(0).message());
        assertTrue(new Distribution.Normal(1, 0.2).problems("x", range).isEmpty(), "1 ± 0.8 fits in [0, 5]");
    }

    @Test
    void boundedFamiliesMustStayInsideTheRange() {
        FieldRange range = new FieldRange(0.0, true, 300.0, false); // (0, 300]
        assertTrue(new Distribution.Uniform(0, 10).problems("f", range).isEmpty(), "a bound on an exclusive limit");
        assertEquals("f", new Distribution.Uniform(-1, 10).problems("f", range).get(0).field());
        assertEquals("f", new Distribution.Triangular(0, 5, 301).problems("f", range).get(0).field());
        assertEquals("f", new Distribution.TruncatedNormal(150, 50, 100, 400).problems("f", range).get(0).field());
        assertEquals("f.triangular.mode", new Distribution.Triangular(0, 20, 10).problems("f", range).get(0).field());
        assertEquals("f.uniform.max", new Distribution.Uniform(10, 10).problems("f", range).get(0).field());
        assertEquals("f.normal.sd", new Distribution.Normal(10, 0).problems("f", range).get(0).field());
        assertEquals("f", new Distribution.LogNormal(Math.log(100), 1).problems("f", range).get(0).field(),
                "exp(μ + 4σ) = 5460 leaves (0, 300]");
        assertTrue(new Distribution.LogNormal(Math.log(100), 0.2).problems("f", range).isEmpty());
    }

    @Test
    void aSamplesDrawsDependOnlyOnSeedAndIndex() {
        UniformRandomProvider a = SampleRandom.forSample(42, 17, SampleRandom.INPUTS);
        UniformRandomProvider b = SampleRandom.forSample(42, 17, SampleRandom.INPUTS);
        assertEquals(a.nextLong(), b.nextLong());
        assertTrue(SampleRandom.forSample(42, 17, SampleRandom.OBSERVATION).nextLong()
                != SampleRandom.forSample(42, 17, SampleRandom.INPUTS).nextLong(), "streams differ");
        assertTrue(SampleRandom.forSample(42, 18, 0).nextLong() != SampleRandom.forSample(42, 17, 0).nextLong());
        assertTrue(SampleRandom.forSample(43, 17, 0).nextLong() != SampleRandom.forSample(42, 17, 0).nextLong());
    }
}
