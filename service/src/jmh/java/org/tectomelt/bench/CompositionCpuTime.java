package org.tectomelt.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.MeltingMode;
import org.tectomelt.engine.composition.ColumnComposition;
import org.tectomelt.engine.composition.Element;
import org.tectomelt.engine.melting.Katz2003Peridotite;

/**
 * The work of {@link CompositionBenchmark} timed as thread CPU time (not wall time), the composition and the
 * column alone side by side in one JVM: on a machine shared with other jobs the wall time of a JMH run
 * measures the queue for the cores more than the code, the thread's CPU time much less so. Not a JMH
 * benchmark; run with {@code mvn -B -q -Pbench -pl service test-compile exec:exec
 * -Dbench.main=org.tectomelt.bench.CompositionCpuTime -Djmh.args="3000 5"}.
 * Prints one line per round; the first rounds warm the JIT up.
 */
public final class CompositionCpuTime {

    private static volatile Object sink;

    private CompositionCpuTime() {
    }

    /** Args: repetitions per round (default 3000), rounds (default 5). */
    public static void main(String[] args) {
        int reps = args.length > 0 ? Integer.parseInt(args[0]) : 3000;
        int rounds = args.length > 1 ? Integer.parseInt(args[1]) : 5;
        DecompressionColumn column = DecompressionColumn.of(Katz2003Peridotite.fertile(), 1450 + 273.15, 0.0)
                .withOutputStep(415);
        ColumnComposition fractional = ColumnComposition.of(Element.rareEarths(), MeltingMode.FRACTIONAL, 0);
        ColumnComposition nearFractional = ColumnComposition.of(Element.rareEarths(), MeltingMode.NEAR_FRACTIONAL,
                0.005);
        ColumnResult solved = column.solve();
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        System.out.printf("%d profile points, %d repetitions per round, load average %.2f%n", solved.profile().size(),
                reps, ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage());
        for (int round = 1; round <= rounds; round++) {
            long t0 = mx.getCurrentThreadCpuTime();
            for (int i = 0; i < reps; i++) {
                sink = fractional.along(solved).pooledPassive(Double.POSITIVE_INFINITY);
            }
            long t1 = mx.getCurrentThreadCpuTime();
            for (int i = 0; i < reps; i++) {
                sink = nearFractional.along(solved).pooledPassive(Double.POSITIVE_INFINITY);
            }
            long t2 = mx.getCurrentThreadCpuTime();
            for (int i = 0; i < reps; i++) {
                sink = column.solve();
            }
            long t3 = mx.getCurrentThreadCpuTime();
            System.out.printf("round %d: fractional %.1f µs, near-fractional %.1f µs, column alone %.1f µs (thread CPU per call)%n",
                    round, (t1 - t0) / 1e3 / reps, (t2 - t1) / 1e3 / reps, (t3 - t2) / 1e3 / reps);
        }
    }
}
