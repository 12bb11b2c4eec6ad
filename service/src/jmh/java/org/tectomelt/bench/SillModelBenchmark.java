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
import org.tectomelt.engine.crust.Rock;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.crust.SillResult;
import org.tectomelt.engine.melting.CrustalLithology;
import org.tectomelt.engine.melting.ThermalProperties;
import org.tectomelt.engine.thermal.ContinentalGeotherm;
import org.tectomelt.engine.units.Units;

/**
 * The sill model's performance case: 2 Myr, 20 stacked 500 m sills (one every 100 kyr, under-
 * accreted at 30 km), a 60 km column at 10 m cells (7,000 cells at the end), output every 10 kyr.
 * The crust is the catalogue's amphibolite down to a 40 km Moho, on the steady continental geotherm
 * of 50 mW/m²; the sills are the catalogue's basalt at 1230 °C.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class SillModelBenchmark {

    private static final double C0 = Units.ZERO_CELSIUS_K;
    private static final double ONE_GPA = 1e9;

    private final SillModel.Setup setup = setup();

    private static Rock rock(CrustalLithology lithology) {
        ThermalProperties p = lithology.thermalProperties();
        return new Rock(p.density(), p.heatCapacity(), p.latentHeat(), ConductivityLaw.constant(p.conductivity()),
                lithology.curveAt(ONE_GPA));
    }

    private static SillModel.Setup setup() {
        Rock crust = rock(CrustalLithology.amphibolite());
        Rock basalt = rock(CrustalLithology.basalt());
        double k = crust.conductivity().at(C0);
        Rock mantle = new Rock(3300, 1000, 0, crust.conductivity(), null);
        ContinentalGeotherm geotherm = ContinentalGeotherm.of(0.050, ContinentalGeotherm.REDUCED_FRACTION,
                ContinentalGeotherm.HEAT_PRODUCTION_SCALE, k, C0, 40e3, ContinentalGeotherm.HeatProduction.EXPONENTIAL);
        return new SillModel.Setup(crust, basalt, new GeothermInitialState(geotherm),
                new SillModel.Intrusions(500, 30e3, C0 + 1230, 20, Units.kyrToS(100), SillModel.Stacking.UNDER),
                60e3, 10, Units.kyrToS(2000), Units.kyrToS(10), List.of(), 10, SillModel.Numerics.DEFAULT,
                mantle, 40e3);
    }

    /** The whole run. */
    @Benchmark
    public SillResult twentyStackedSillsOverTwoMyr() {
        return SillModel.run(setup);
    }
}
