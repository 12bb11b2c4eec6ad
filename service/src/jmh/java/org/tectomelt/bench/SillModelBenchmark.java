package org.tectomelt.bench;

import java.util.List;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.State;
import org.tectomelt.engine.crust.ConductivityLaw;
import org.tectomelt.engine.crust.InitialState;
import org.tectomelt.engine.crust.MeltingIntervals;
import org.tectomelt.engine.crust.Rock;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.crust.SillResult;
import org.tectomelt.engine.melting.MeltCurve;
import org.tectomelt.engine.units.Units;

/**
 * The sill model's performance case: 2 Myr, 20 stacked 500 m sills (one every 100 kyr), a 60 km
 * column at 10 m cells (7,000 cells at the end), output every 10 kyr.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class SillModelBenchmark {

    private static final double C0 = Units.ZERO_CELSIUS_K;

    private final SillModel.Setup setup = new SillModel.Setup(
            new Rock(2750, 1050, 280_000, ConductivityLaw.constant(2.5),
                    new MeltCurve(new double[] {C0 + 750, C0 + 800, C0 + 850, C0 + 900, C0 + 1000},
                            new double[] {0, 0.05, 0.25, 0.45, 0.6})),
            new Rock(2900, 1100, 400_000, ConductivityLaw.constant(2.5), MeltingIntervals.linear(C0 + 1000, C0 + 1200)),
            new InitialState.Uniform(C0 + 450),
            new SillModel.Intrusions(500, 30e3, C0 + 1230, 20, Units.kyrToS(100), SillModel.Stacking.UNDER),
            60e3, 10, Units.kyrToS(2000), Units.kyrToS(10), List.of(), 10, SillModel.Numerics.DEFAULT);

    /** The whole run. */
    @Benchmark
    public SillResult twentyStackedSillsOverTwoMyr() {
        return SillModel.run(setup);
    }
}
