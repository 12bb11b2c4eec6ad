package org.tectomelt.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.column.MeltingColumn;
import org.tectomelt.engine.column.MeltingMode;
import org.tectomelt.engine.melting.Katz2003Peridotite;

/**
 * The batch and fractional columns of {@link SourceColumnBenchmark} timed as thread CPU time, in
 * alternating rounds in one JVM: on a machine shared with other jobs the wall time measures the queue
 * for the cores, the thread's CPU time much less so. Not a JMH benchmark; run with {@code mvn -B -q
 * -Pbench -pl service test-compile exec:exec -Dbench.main=org.tectomelt.bench.SourceColumnCpuTime
 * -Djmh.args="20000 8"}. Prints one line per round; the first rounds warm the JIT up.
 */
public final class SourceColumnCpuTime {

    private static volatile Object sink;

    private SourceColumnCpuTime() {
    }

    /** Args: repetitions per round (default 20000), rounds (default 8). */
    public static void main(String[] args) {
        int reps = args.length > 0 ? Integer.parseInt(args[0]) : 20_000;
        int rounds = args.length > 1 ? Integer.parseInt(args[1]) : 8;
        double tp = 1350 + 273.15;
        Katz2003Peridotite katz = Katz2003Peridotite.fertile();
        MeltingColumn batch = DecompressionColumn.of(katz, tp, 0.0).withOutputStep(500);
        MeltingColumn fractional = MantleSource.of(katz).withMode(MeltingMode.FRACTIONAL, 0).column(tp, 0.0)
                .withOutputStep(500);
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        System.out.printf("%d repetitions per round, load average %.2f%n", reps,
                ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage());
        for (int round = 1; round <= rounds; round++) {
            long t0 = mx.getCurrentThreadCpuTime();
            for (int i = 0; i < reps; i++) {
                sink = batch.solve();
            }
            long t1 = mx.getCurrentThreadCpuTime();
            for (int i = 0; i < reps; i++) {
                sink = fractional.solve();
            }
            long t2 = mx.getCurrentThreadCpuTime();
            double b = (t1 - t0) / 1e3 / reps;
            double f = (t2 - t1) / 1e3 / reps;
            System.out.printf("round %d: batch %.1f µs, fractional %.1f µs, ratio %.2f (thread CPU per call)%n",
                    round, b, f, f / b);
        }
    }
}
