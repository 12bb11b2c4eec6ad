package org.tectomelt.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.Arrays;

/**
 * The 2,000 points of {@link RunSweepBenchmark} timed as thread CPU time, in alternating rounds in
 * one JVM: the engine's columns alone and each point as a run's chunk computes it. On a machine
 * shared with other jobs the wall time JMH reports includes the wait for a core; the CPU time much
 * less so. {@code .ci/load/runs-bench.py} sets the first beside the service's CPU time per run: the
 * share of the service's CPU that goes into the columns is the most a run can reach of the engine
 * rate × cores, even on free cores. Not a JMH benchmark; run with {@code mvn -B -q -Pbench -pl
 * service test-compile exec:exec -Dbench.main=org.tectomelt.bench.RunSweepCpuTime -Djmh.args="12"}.
 * Prints one line per round and the medians of the second half of the rounds (the first warm the JIT).
 */
public final class RunSweepCpuTime {

    private static volatile Object sink;

    private RunSweepCpuTime() {
    }

    /** Args: rounds (default 12). */
    public static void main(String[] args) throws Exception {
        int rounds = args.length > 0 ? Integer.parseInt(args[0]) : 12;
        RunSweepBenchmark b = new RunSweepBenchmark();
        b.setUp();
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        double[] engine = new double[rounds];
        double[] run = new double[rounds];
        for (int round = 0; round < rounds; round++) {
            long t0 = mx.getCurrentThreadCpuTime();
            for (int i = 0; i < b.size(); i++) {
                sink = b.engineColumn(i);
            }
            long t1 = mx.getCurrentThreadCpuTime();
            for (int i = 0; i < b.size(); i++) {
                sink = b.runPoint(i);
            }
            long t2 = mx.getCurrentThreadCpuTime();
            engine[round] = (t1 - t0) / 1e6;
            run[round] = (t2 - t1) / 1e6;
            System.out.printf("round %d: engine columns %.1f ms, run path %.1f ms (thread CPU per %d points)%n",
                    round + 1, engine[round], run[round], b.size());
        }
        System.out.printf("median of rounds %d-%d: engine columns %.1f ms, run path %.1f ms%n", rounds / 2 + 1, rounds,
                median(engine, rounds / 2), median(run, rounds / 2));
    }

    private static double median(double[] xs, int from) {
        double[] tail = Arrays.copyOfRange(xs, from, xs.length);
        Arrays.sort(tail);
        return tail[tail.length / 2];
    }
}
