package org.tectomelt.bench;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.McKenzieBickle1988Peridotite;
import org.tectomelt.engine.melting.MeltState;

/**
 * Cost of one melt-fraction point. Targets: a dry point under 0.2 µs, a hydrous point under 2 µs.
 * Each invocation takes the next of 1024 points spread over 0.5–5 GPa (inside the calibrated range of
 * both peridotite models, so no warning text is built) and 1000–1800 °C (most
 * above the solidus), so the JIT cannot fold a constant input.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
public class MeltFractionBenchmark {

    private static final int N = 1024;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();
    private final McKenzieBickle1988Peridotite mb = new McKenzieBickle1988Peridotite();
    private final double[] p = new double[N];
    private final double[] t = new double[N];
    private int i;

    /** Fills the points deterministically. */
    @Setup
    public void points() {
        java.util.Random r = new java.util.Random(42);
        for (int k = 0; k < N; k++) {
            p[k] = (0.5 + 4.5 * r.nextDouble()) * 1e9;
            t[k] = 1000 + 273.15 + 800 * r.nextDouble();
        }
    }

    private int next() {
        i = (i + 1) & (N - 1);
        return i;
    }

    /** Katz et al. (2003), dry, melt fraction only. */
    @Benchmark
    public double katzDryMeltFraction() {
        int k = next();
        return katz.meltFraction(p[k], t[k], 0);
    }

    /** Katz et al. (2003), dry, full melt state (curves, warnings). */
    @Benchmark
    public MeltState katzDryMeltState() {
        int k = next();
        return katz.melt(p[k], t[k], 0);
    }

    /** Katz et al. (2003), 0.1 wt% bulk water: Brent root of F. */
    @Benchmark
    public double katzHydrousMeltFraction() {
        int k = next();
        return katz.meltFraction(p[k], t[k], 0.001);
    }

    /** Katz et al. (2003), 0.1 wt% bulk water, full melt state. */
    @Benchmark
    public MeltState katzHydrousMeltState() {
        int k = next();
        return katz.melt(p[k], t[k], 0.001);
    }

    /** McKenzie &amp; Bickle (1988), full melt state (closed-form solidus). */
    @Benchmark
    public MeltState mckenzieBickleMeltState() {
        int k = next();
        return mb.melt(p[k], t[k], 0);
    }
}
