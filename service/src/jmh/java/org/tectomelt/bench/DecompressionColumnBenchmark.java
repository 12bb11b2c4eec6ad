package org.tectomelt.bench;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.State;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.melting.Katz2003Peridotite;

/**
 * Cost of one isentropic decompression column in the engine: Katz et al. (2003) peridotite, dry,
 * Tp = 1350 °C, no lid, output every 0.5 km (about 165 profile points). Target: under 200 µs.
 * Also a column hot enough to exhaust cpx (one restart of the integration) and a hydrous one.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
public class DecompressionColumnBenchmark {

    private final DecompressionColumn dry = DecompressionColumn.of(Katz2003Peridotite.fertile(), 1350 + 273.15, 0.0)
            .withOutputStep(500);
    private final DecompressionColumn hot = DecompressionColumn.of(Katz2003Peridotite.fertile(), 1550 + 273.15, 0.0)
            .withOutputStep(500);
    private final DecompressionColumn wet = DecompressionColumn.of(Katz2003Peridotite.fertile(), 1350 + 273.15, 1e-4)
            .withOutputStep(500).withLidDepth(6e3);

    /** Dry column, Tp = 1350 °C, 0.5 km output steps: the figure the target refers to. */
    @Benchmark
    public ColumnResult dryColumnHalfKmSteps() {
        return dry.solve();
    }

    /** Dry column, Tp = 1550 °C: cpx is exhausted on the way up, the integration restarts once. */
    @Benchmark
    public ColumnResult hotColumnWithCpxExhaustion() {
        return hot.solve();
    }

    /** 100 ppm water, melting stopped under 6 km of crust. */
    @Benchmark
    public ColumnResult hydrousColumnUnderCrust() {
        return wet.solve();
    }
}
