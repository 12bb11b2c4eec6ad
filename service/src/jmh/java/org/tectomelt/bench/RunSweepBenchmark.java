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
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.column.Upwelling;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.settings.MidOceanRidge;
import org.tectomelt.engine.settings.SlowSpreadingConductiveLid;
import org.tectomelt.engine.units.Units;
import org.tectomelt.http.App;
import org.tectomelt.operations.MidOceanRidgeOperation;
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

    /** The sweep's lithology, the spec's default for the ridge (checked in the set-up). */
    private static final String DEFAULT_LITHOLOGY = "peridotite-katz2003";

    private Evaluator.Prepared points;
    private final java.util.List<MidOceanRidge> ridges = new java.util.ArrayList<>();
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
        MantleLithology dry = Lithologies.mantleById(DEFAULT_LITHOLOGY).orElseThrow();
        for (int i = 0; i < size; i++) {
            var prepared = invoker.prepare(op, sweep.pointRequest(i));
            operations.add(prepared);
            var q = (MidOceanRidgeOperation.Request) prepared.request();
            if (!DEFAULT_LITHOLOGY.equals(q.lithology()) || q.bulkWaterWtPct() != 0 || q.meltingMode() != null
                    && !"batch".equals(q.meltingMode())) {
                throw new IllegalStateException("the sweep is no longer the dry default ridge: " + q);
            }
            ridges.add(new MidOceanRidge(MantleSource.of(dry), Units.celsiusToKelvin(q.potentialTemperatureC()), 0.0,
                    Units.mmPerYrToMPerS(q.fullSpreadingRateMmPerYr()), SlowSpreadingConductiveLid.standard()));
            // the engine's column must be the operation's: the same crust to the last digit
            double crust = Units.mToKm(engineColumn(i).crustalThickness());
            double answer = ((MidOceanRidgeOperation.Result) prepared.run(org.tectomelt.engine.Deadline.none()))
                    .crustalThicknessKm();
            if (crust != answer) {
                throw new IllegalStateException("point " + i + ": engine column " + crust + " km, operation " + answer);
            }
        }
    }

    /**
     * The same 2,000 columns in the engine alone: the mid-ocean ridge's passive column up to its
     * conductive lid (what {@code MidOceanRidge.solve} integrates), without the ridge's text, the
     * request, the operation or the output: the engine's column rate the issue compares a run with.
     */
    @Benchmark
    public void engineColumnsOf2000Points(Blackhole bh) {
        for (int i = 0; i < size; i++) {
            bh.consume(engineColumn(i));
        }
    }

    /** Point {@code i}'s ridge column, as {@code MidOceanRidge.solve} computes it. */
    ColumnResult engineColumn(int i) {
        MidOceanRidge r = ridges.get(i);
        double lid = r.cooling().lidDepth(r.fullSpreadingRate(), r.potentialTemperature());
        return r.source().column(r.potentialTemperature(), r.bulkWater()).withUpwelling(Upwelling.PASSIVE)
                .withLidDepth(lid).withOutputStep(MidOceanRidge.PROFILE_STEP).solve();
    }

    /** Points in the sweep. */
    int size() {
        return size;
    }

    /** Point {@code i} as a run's chunk computes it. */
    Object runPoint(int i) {
        return points.evaluate(i);
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
