package org.tectomelt.bench;

import java.util.List;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.State;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.crust.ConductivityLaw;
import org.tectomelt.engine.crust.InitialState;
import org.tectomelt.engine.crust.MeltingIntervals;
import org.tectomelt.engine.crust.GeothermInitialState;
import org.tectomelt.engine.crust.Rock;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.crust.SillResult;
import org.tectomelt.engine.melting.CrustalLithology;
import org.tectomelt.engine.melting.MeltCurve;
import org.tectomelt.engine.melting.ThermalProperties;
import org.tectomelt.engine.thermal.ContinentalGeotherm;
import org.tectomelt.engine.units.Units;

/**
 * The sill model's performance cases.
 *
 * <p>The 20-sill case: 2 Myr, 20 stacked 500 m sills (one every 100 kyr, under-accreted at 30 km), a
 * 60 km column, output every 10 kyr. The crust is the catalogue's amphibolite down to a 40 km Moho, on
 * the steady continental geotherm of 50 mW/m²; the sills are the catalogue's basalt at 1230 °C. Run on
 * the uniform 10 m grid (7,000 cells at the end), on a graded grid with 10 m finest cells, and on the
 * default graded grid (finest cell {@code SillModel.resolvingSpacing(500)} = 1.25 m).
 *
 * <p>The stacked case at 10 mm/yr: 250 m sills every 25 kyr for 2 Myr (80 sills, 20 km of basalt),
 * under-accreted at 28 km in a 60 km column of crust at 450 °C (the page's invented scenario, with its
 * rock properties), output every 20 kyr, on the default graded grid (0.625 m finest cells), alone
 * and with the convergence check (a second run at twice the finest cell), and as the service runs it by
 * default: at the default tolerance of that cell ({@code SillModel.resolvingTolerance}, 0.125 K), checked one
 * level coarser and refined until converged ({@code SillModel.runRefined}).
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class SillModelBenchmark {

    private static final double C0 = Units.ZERO_CELSIUS_K;
    private static final double ONE_GPA = 1e9;

    private final SillModel.Setup setup = setup();
    private final SillModel.Setup gradedTen = setup.withGrid(SillModel.GridPlan.GRADED);
    private final SillModel.Setup gradedDefault = gradedTen.withGridSpacing(SillModel.resolvingSpacing(500));
    private final SillModel.Setup gradedResolved = gradedDefault.withTolerance(SillModel.resolvingTolerance(500,
            gradedDefault.gridSpacing()));
    private final SillModel.Setup stack = stackAtTenMmPerYr();
    private final SillModel.Setup stackResolved = stack.withTolerance(SillModel.resolvingTolerance(250,
            stack.gridSpacing()));

    private static SillModel.Setup stackAtTenMmPerYr() {
        MeltCurve pelite = new MeltCurve(new double[] {C0 + 750, C0 + 800, C0 + 850, C0 + 900, C0 + 1000},
                new double[] {0, 0.05, 0.25, 0.45, 0.6});
        Rock crust = new Rock(2750, 1050, 280_000, ConductivityLaw.constant(2.5), pelite);
        Rock basalt = new Rock(2900, 1100, 400_000, ConductivityLaw.constant(2.5),
                MeltingIntervals.linear(C0 + 1000, C0 + 1200));
        double thickness = 250;
        double interval = thickness / Units.mmPerYrToMPerS(10);
        return new SillModel.Setup(crust, basalt, new InitialState.Uniform(C0 + 450),
                new SillModel.Intrusions(thickness, 28e3, C0 + 1230, 80, interval, SillModel.Stacking.UNDER), 60e3,
                SillModel.resolvingSpacing(thickness), Units.kyrToS(2000), Units.kyrToS(20), List.of(), 100,
                SillModel.Numerics.DEFAULT, null, Double.POSITIVE_INFINITY, SillModel.GridPlan.GRADED);
    }

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

    /** The whole run on the uniform 10 m grid. */
    @Benchmark
    public SillResult twentyStackedSillsOverTwoMyr() {
        return SillModel.run(setup);
    }

    /** The same run on a graded grid with 10 m finest cells. */
    @Benchmark
    public SillResult twentyStackedSillsGradedTenMetreFinest() {
        return SillModel.run(gradedTen);
    }

    /** The same run on the default graded grid (1.25 m finest cells). */
    @Benchmark
    public SillResult twentyStackedSillsGradedDefault() {
        return SillModel.run(gradedDefault);
    }

    /** The 20-sill run as the service runs it without {@code gridSpacingM}: checked, refined until converged. */
    @Benchmark
    public SillResult twentyStackedSillsRefinedDefault() {
        return SillModel.runRefined(gradedResolved, 20_000, Deadline.none());
    }

    /** The stacked case at 10 mm/yr on the default graded grid. */
    @Benchmark
    public SillResult stackAtTenMmPerYrGradedDefault() {
        return SillModel.run(stack);
    }

    /** The stacked case at 10 mm/yr with the convergence check (two runs). */
    @Benchmark
    public SillResult stackAtTenMmPerYrWithConvergenceCheck() {
        return SillModel.runWithConvergenceCheck(stack, Deadline.none());
    }

    /** The stacked case at 10 mm/yr as the service runs it without {@code gridSpacingM}: refined until converged. */
    @Benchmark
    public SillResult stackAtTenMmPerYrRefinedDefault() {
        return SillModel.runRefined(stackResolved, 20_000, Deadline.none());
    }
}
