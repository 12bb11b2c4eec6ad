package org.tectomelt.bench;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.composition.ColumnComposition;
import org.tectomelt.engine.composition.CompositionResult;
import org.tectomelt.engine.composition.Element;
import org.tectomelt.engine.column.MeltingMode;
import org.tectomelt.engine.melting.Katz2003Peridotite;

/**
 * Cost of the trace-element composition on top of a solved column: the 14 rare-earth elements along
 * a 300-point column (Katz et al. 2003 dry, Tp = 1450 °C, onset in the garnet field at about 4 GPa,
 * output every 415 m), integrated increment by increment and pooled as a passive regime. Target: under
 * 100 µs. The column itself is solved once in the setup; {@code column} times it alone for the ratio.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
public class CompositionBenchmark {

    private final DecompressionColumn column = DecompressionColumn.of(Katz2003Peridotite.fertile(), 1450 + 273.15, 0.0)
            .withOutputStep(415);
    private final ColumnComposition fractional = ColumnComposition.of(Element.rareEarths(), MeltingMode.FRACTIONAL, 0);
    private final ColumnComposition nearFractional = ColumnComposition.of(Element.rareEarths(),
            MeltingMode.NEAR_FRACTIONAL, 0.005);
    private ColumnResult solved;

    /** Solves the column once. */
    @Setup
    public void solve() {
        solved = column.solve();
        if (solved.profile().size() < 295 || solved.profile().size() > 305) {
            throw new IllegalStateException("expected about 300 points, got " + solved.profile().size());
        }
    }

    /** 14 REE, fractional melting, along the column and pooled (passive). */
    @Benchmark
    public CompositionResult.Pooled fractionalReeAlong300Points() {
        return fractional.along(solved).pooledPassive(Double.POSITIVE_INFINITY);
    }

    /** 14 REE, near-fractional melting with 0.5 % retained melt, along the column and pooled (passive). */
    @Benchmark
    public CompositionResult.Pooled nearFractionalReeAlong300Points() {
        return nearFractional.along(solved).pooledPassive(Double.POSITIVE_INFINITY);
    }

    /** The column alone, for the ratio measured side by side. */
    @Benchmark
    public ColumnResult columnAlone() {
        return column.solve();
    }
}
