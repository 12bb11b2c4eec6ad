package org.tectomelt.bench;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.State;
import org.tectomelt.engine.thermal.LithostaticColumn;

/** Cost of the lithostatic column: 300 depths, as for a 300-point geotherm. */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
public class PressureBenchmark {

    private final LithostaticColumn column = new LithostaticColumn(35e3, 2800, 3300, 9.81);

    /** 300 pressures from 0 to 299 km. */
    @Benchmark
    public double pressureAt300Depths() {
        double sum = 0;
        for (int i = 0; i < 300; i++) {
            sum += column.pressureAt(i * 1e3);
        }
        return sum;
    }
}
