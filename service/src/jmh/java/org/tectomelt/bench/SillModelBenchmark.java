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
import org.tectomelt.engine.crust.GeothermInitialState;
import org.tectomelt.engine.crust.MeltingIntervals;
import org.tectomelt.engine.crust.Rock;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.crust.SillResult;
import org.tectomelt.engine.melting.MeltCurve;
import org.tectomelt.engine.thermal.ContinentalGeotherm;
import org.tectomelt.engine.units.Units;

/**
 * The sill model's performance case: 2 Myr, 20 stacked 500 m sills (one every 100 kyr) at 30 km, a
 * 60 km column at 10 m cells (7,000 cells at the end) on a continental geotherm of 50 mW/m², output
 * every 10 kyr. The crust melts like an amphibolite (approximate curve of REFERENCES §3.4).
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class SillModelBenchmark {

    private static final double C0 = Units.ZERO_CELSIUS_K;

    private final SillModel.Setup setup = new SillModel.Setup(
            new Rock(2900, 1050, 280_000, ConductivityLaw.constant(2.5),
                    new MeltCurve(new double[] {C0 + 850, C0 + 900, C0 + 950, C0 + 1000, C0 + 1050},
                            new double[] {0, 0.12, 0.20, 0.30, 0.40})),
            new Rock(2900, 1100, 400_000, ConductivityLaw.constant(2.5), MeltingIntervals.linear(C0 + 1000, C0 + 1200)),
            new GeothermInitialState(ContinentalGeotherm.of(0.050)),
            new SillModel.Intrusions(500, 30e3, C0 + 1230, 20, Units.kyrToS(100), SillModel.Stacking.UNDER),
            60e3, 10, Units.kyrToS(2000), Units.kyrToS(10), List.of(), 10, SillModel.Numerics.DEFAULT);

    /** The whole run. */
    @Benchmark
    public SillResult twentyStackedSillsOverTwoMyr() {
        return SillModel.run(setup);
    }
}
