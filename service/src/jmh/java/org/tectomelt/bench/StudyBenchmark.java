package org.tectomelt.bench;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.Json;
import org.tectomelt.engine.Deadline;
import org.tectomelt.operations.Operation;
import org.tectomelt.runs.study.OperationModel;
import org.tectomelt.studies.Distribution;
import org.tectomelt.studies.FieldRange;
import org.tectomelt.studies.MonteCarlo;
import org.tectomelt.studies.Observation;
import org.tectomelt.studies.PosteriorInversion;
import org.tectomelt.studies.StudyModel;
import org.tectomelt.studies.UncertainInputs;
import org.tectomelt.studies.Workers;

/**
 * Studies on the mid-ocean-ridge operation, through the operations' invocation path (spec check,
 * binding, run, outputs: what a run computes per sample), on {@code threads} threads.
 * Targets (2 cores): 10,000-sample forward Monte Carlo under 2 s; a 200-point posterior with 500
 * nuisance samples (100,000 columns) under 15 s.
 *
 * <p>Run: {@code mvn -B -q -Pbench -pl service test-compile exec:exec -Djmh.args="-f 1 -wi 1 -i 3 StudyBenchmark"}
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class StudyBenchmark {

    /** Threads computing the study. */
    @Param({"2"})
    public int threads;

    private ExecutorService pool;
    private Workers workers;
    private StudyModel ridge;
    private UncertainInputs forwardInputs;
    private UncertainInputs nuisance;

    /** The operation, the invented scenario and the pool. */
    @Setup(Level.Trial)
    public void setUp() throws Exception {
        Invoker invoker = Invoker.standard();
        Operation<?, ?> op = invoker.operation("mid-ocean-ridge");
        ObjectNode base = (ObjectNode) Json.mapper().readTree(
                "{\"potentialTemperatureC\": 1350, \"fullSpreadingRateMmPerYr\": 60}");
        ridge = new OperationModel(invoker, op, base, List.of("crustalThicknessKm"));
        Map<String, FieldRange> ranges = Map.of("potentialTemperatureC", FieldRange.closed(1000, 1800),
                "bulkWaterWtPct", FieldRange.closed(0, 5), "fullSpreadingRateMmPerYr", FieldRange.closed(1, 300));
        forwardInputs = UncertainInputs.of(Map.of(
                "potentialTemperatureC", new Distribution.Normal(1350, 25),
                "bulkWaterWtPct", new Distribution.Uniform(0, 0.02)), ranges, "uncertainty.inputs.");
        nuisance = UncertainInputs.of(Map.of("bulkWaterWtPct", new Distribution.Uniform(0, 0.02)), ranges,
                "uncertainty.inputs.");
        pool = Executors.newFixedThreadPool(Math.max(1, threads - 1));
        workers = Workers.on(pool, threads);
    }

    /** Stops the pool. */
    @TearDown(Level.Trial)
    public void tearDown() {
        pool.shutdownNow();
    }

    /** 10,000 samples: Tp ~ normal(1350, 25) °C, water ~ uniform(0, 0.02) wt%. */
    @Benchmark
    public MonteCarlo.Result forwardMonteCarlo10000Samples() {
        return MonteCarlo.run(ridge, forwardInputs, Map.of("crustalThicknessKm", "km"), 10_000, 42, workers,
                Deadline.none());
    }

    /** Tp from 7.1 ± 0.8 km of crust on 200 grid points over 1200–1600 °C, water marginalised by 500 draws. */
    @Benchmark
    public PosteriorInversion.Result posterior200Points500NuisanceSamples() {
        return PosteriorInversion.run(ridge, new PosteriorInversion.Setup("potentialTemperatureC",
                FieldRange.closed(1000, 1800), 1200, 1600, 200, Map.of("crustalThicknessKm", new Observation(7.1, 0.8)),
                nuisance, 500, 42), workers, Deadline.none());
    }
}
