package org.tectomelt.bench;

import java.time.Instant;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.infra.Blackhole;
import org.tectomelt.Config;
import org.tectomelt.contract.Json;
import org.tectomelt.http.App;
import org.tectomelt.runs.Evaluator;
import org.tectomelt.runs.RunRecord;
import org.tectomelt.runs.RunStatus;
import org.tectomelt.runs.sweep.Sweep;

/**
 * The single-core rate of the points of a run: the 2,000-point mid-ocean-ridge sweep of
 * {@code .ci/load/runs-bench.py} (Tp 1250–1550 °C in 200 steps × full spreading rate 10–100 mm/yr
 * in 10 steps, dry Katz et al. 2003 peridotite), each point computed exactly as a run's chunk
 * computes it (the spec's rules and defaults, the operation, the chosen output), on one thread and
 * without the database. The benchmark script compares a run's measured rate with this × cores.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class RunSweepBenchmark {

    /** The sweep, the same body the benchmark script posts. */
    public static final String SWEEP = "{\"operation\": \"mid-ocean-ridge\", \"request\": {},"
            + " \"sweep\": {\"potentialTemperatureC\": {\"from\": 1250, \"to\": 1550, \"steps\": 200},"
            + " \"fullSpreadingRateMmPerYr\": {\"from\": 10, \"to\": 100, \"steps\": 10}},"
            + " \"outputs\": [\"crustalThicknessKm\", \"meltProductionKm3PerYrPerKm\"]}";

    private Evaluator.Prepared points;
    private int size;
    private final java.util.List<org.tectomelt.contract.Invoker.Prepared<?, ?>> operations = new java.util.ArrayList<>();

    @Setup
    public void setUp() throws Exception {
        Config config = Config.defaults();
        Sweep sweep = Sweep.parse(Json.mapper().readTree(SWEEP),
                new org.tectomelt.contract.Invoker(org.tectomelt.contract.SpecContract.standard(),
                        org.tectomelt.operations.Operations.of(config)), 50_000);
        size = sweep.size();
        RunRecord run = new RunRecord("bench", Sweep.KIND, sweep.operation(), "bench", null, RunStatus.RUNNING,
                sweep.definition(), null, size, 200, 0, 0, Instant.now(), null, null, null);
        points = App.evaluator(config).prepare(run);
        var invoker = new org.tectomelt.contract.Invoker(org.tectomelt.contract.SpecContract.standard(),
                org.tectomelt.operations.Operations.of(config));
        var op = invoker.operations().named(sweep.operation()).orElseThrow();
        for (int i = 0; i < size; i++) {
            operations.add(invoker.prepare(op, sweep.pointRequest(i)));
        }
    }

    /** All 2,000 points, one after the other, as a run's chunk computes them. */
    @Benchmark
    public void sweepOf2000Points(Blackhole bh) {
        for (int i = 0; i < size; i++) {
            bh.consume(points.evaluate(i));
        }
    }

    /**
     * The same 2,000 points through the operation alone, their requests checked and bound
     * beforehand: the engine's columns and the operation's own rules, without the per-point
     * binding and the output text a run's point adds.
     */
    @Benchmark
    public void columnsOf2000Points(Blackhole bh) {
        org.tectomelt.engine.Deadline none = org.tectomelt.engine.Deadline.none();
        for (var p : operations) {
            bh.consume(p.run(none));
        }
    }
}
