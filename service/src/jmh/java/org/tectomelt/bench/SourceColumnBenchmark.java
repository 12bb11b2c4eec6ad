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
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.column.MeltingColumn;
import org.tectomelt.engine.column.MeltingMode;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.PertermannHirschmann2003Pyroxenite;

/**
 * Cost of the stepped source columns beside the batch ODE column they extend, all at Tp = 1350 °C
 * with output every 0.5 km, so the ratios are measured side by side. Targets: a two-lithology
 * column (10 % Pertermann &amp; Hirschmann 2003 pyroxenite in Katz et al. 2003 peridotite, melting from
 * about 150 km) under 1 ms; a fractional column within 1.5× of the batch column.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
public class SourceColumnBenchmark {

    private static final double TP = 1350 + 273.15;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();
    private final MeltingColumn batch = DecompressionColumn.of(katz, TP, 0.0).withOutputStep(500);
    private final MeltingColumn fractional = MantleSource.of(katz).withMode(MeltingMode.FRACTIONAL, 0)
            .column(TP, 0.0).withOutputStep(500);
    private final MeltingColumn twoLithology = MantleSource.of(katz)
            .withPyroxenite(new PertermannHirschmann2003Pyroxenite(), 0.1).column(TP, 0.0).withOutputStep(500);
    private final MeltingColumn hydrousFractional = MantleSource.of(katz).withMode(MeltingMode.FRACTIONAL, 0)
            .column(TP, 1e-4).withOutputStep(500);

    /** The batch ODE column (the reference of the 1.5× target). */
    @Benchmark
    public ColumnResult batchColumn() {
        return batch.solve();
    }

    /** Dry fractional melting of the same source. */
    @Benchmark
    public ColumnResult fractionalColumn() {
        return fractional.solve();
    }

    /** 10 % pyroxenite in peridotite, batch, in thermal equilibrium. */
    @Benchmark
    public ColumnResult twoLithologyColumn() {
        return twoLithology.solve();
    }

    /** Fractional melting with 100 ppm water (water stripped from the residue). */
    @Benchmark
    public ColumnResult hydrousFractionalColumn() {
        return hydrousFractional.solve();
    }
}
