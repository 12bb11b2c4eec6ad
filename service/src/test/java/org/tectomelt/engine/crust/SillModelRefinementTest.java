package org.tectomelt.engine.crust;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.function.BiFunction;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.melting.CrustalLithology;
import org.tectomelt.engine.melting.MeltTable;
import org.tectomelt.engine.melting.ThermalProperties;
import org.tectomelt.engine.thermal.ContinentalGeotherm;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.thermal.MantleAdiabat;

/**
 * The default resolution of the sill model, refined until converged ({@link SillModel#runRefined}), measured
 * against the criterion: halving the finest cell (and the time step with it) from the reported run
 * changes the reported times and melt thicknesses by under 1 %. Each case runs the default, then, on its own,
 * the reported run one level finer, and compares the two; nothing is taken from the refinement's own check.
 * The cases are those where the starting level (1/400 of the sill, 0.125 K) alone is not resolved: the time
 * to first crustal melt falls within hours to a few years of the emplacement, when the heated layer of crust
 * is a few metres thick (the threshold melt layer of 1 % of the sill, 2.5 m of ∫F dz, forms within about
 * 3 m of a 250 m sill's contact when the crust starts near its solidus).
 */
class SillModelRefinementTest {

    private static final double KYR = 3.15576e10;
    private static final double C0 = 273.15;
    /** The service's limits: 100,000 time steps, 10⁸ cell-steps, 20,000 cells. */
    private static final SillModel.Numerics SERVICE = new SillModel.Numerics(SillModel.RESOLVING_TOLERANCE_K,
            100_000, 100_000_000L);
    private static final int MAX_CELLS = 20_000;
    /** Limits for the independent finer run, one level beyond what the refinement ran. */
    private static final SillModel.Numerics GENEROUS = new SillModel.Numerics(SillModel.RESOLVING_TOLERANCE_K,
            1_000_000, Long.MAX_VALUE);

    /** A crust rock of the catalogue melting by its F(T, P) table, with its constant conductivity. */
    private static Rock tabled(CrustalLithology lithology, double referencePressure) {
        ThermalProperties p = lithology.thermalProperties();
        MeltTable table = lithology.meltTable();
        return Rock.withTable(p.density(), p.heatCapacity(), p.latentHeat(), ConductivityLaw.constant(p.conductivity()),
                table, referencePressure);
    }

    /** The catalogue's basalt with its curve at {@code pressure}. */
    private static Rock basalt(double pressure) {
        CrustalLithology b = CrustalLithology.basalt();
        ThermalProperties p = b.thermalProperties();
        return new Rock(p.density(), p.heatCapacity(), p.latentHeat(), ConductivityLaw.constant(p.conductivity()),
                b.curveAt(pressure));
    }

    /** One 250 m basalt sill at 1230 °C, 20 km deep in metapelite crust at {@code crustC}, 40 km column, 20 kyr. */
    private static BiFunction<Double, SillModel.Numerics, SillModel.Setup> metapeliteSill(double crustC,
                                                                                          boolean convects) {
        CrustalLithology pelite = CrustalLithology.metapelite();
        double top = 20e3;
        double pressure = LithostaticColumn.crustOnly(pelite.thermalProperties().density()).pressureAt(top);
        Rock crust = tabled(pelite, pressure);
        Rock sill = basalt(pressure);
        return (h, numerics) -> new SillModel.Setup(crust, sill, new InitialState.Uniform(C0 + crustC),
                SillModel.Intrusions.single(250, top, C0 + 1230), 40e3, h, 20 * KYR, 1 * KYR, List.of(), 100,
                numerics, null, Double.POSITIVE_INFINITY, SillModel.GridPlan.GRADED)
                .withConvection(convects ? SillModel.Convection.withLockAt(
                        SillModel.Convection.DEFAULT_LOCK_MELT_FRACTION) : null);
    }

    /**
     * The README's stack: 250 m basalt sills under-accreted at 25 km at 5 mm/yr (one every 50 kyr) for 1 Myr,
     * metapelite crust to a 35 km Moho on the steady continental geotherm of 65 mW/m², a non-melting mantle
     * below, 60 km column.
     */
    private static SillModel.Setup readmeStack(double h, SillModel.Numerics numerics) {
        CrustalLithology pelite = CrustalLithology.metapelite();
        ThermalProperties p = pelite.thermalProperties();
        double top = 25e3;
        double pressure = LithostaticColumn.crustOnly(p.density()).pressureAt(top);
        Rock crust = tabled(pelite, pressure);
        ConductivityLaw k = crust.conductivity();
        Rock mantle = new Rock(LithostaticColumn.MANTLE_DENSITY, MantleAdiabat.HEAT_CAPACITY, 0, k, null);
        ContinentalGeotherm geotherm = ContinentalGeotherm.of(0.065, ContinentalGeotherm.REDUCED_FRACTION,
                ContinentalGeotherm.HEAT_PRODUCTION_SCALE, k.at(C0), C0, 35e3,
                ContinentalGeotherm.HeatProduction.EXPONENTIAL);
        double interval = 250 / (5e-3 / 3.15576e7);
        return new SillModel.Setup(crust, basalt(pressure), new GeothermInitialState(geotherm),
                new SillModel.Intrusions(250, top, C0 + 1230, 20, interval, SillModel.Stacking.UNDER), 60e3, h,
                1000 * KYR, 250 * KYR, List.of(), 100, numerics, mantle, 35e3, SillModel.GridPlan.GRADED);
    }

    /** The 50 m sill of the verification: at 28 km in crust at 450 °C, 60 km column, 2 kyr. */
    private static SillModel.Setup fiftyMetreSill(double h, SillModel.Numerics numerics) {
        return new SillModel.Setup(SillModelTest.CRUST, SillModelTest.BASALT, new InitialState.Uniform(C0 + 450),
                SillModel.Intrusions.single(50, 28e3, C0 + 1230), 60e3, h, 2 * KYR, 0.05 * KYR, List.of(), 100,
                numerics, null, Double.POSITIVE_INFINITY, SillModel.GridPlan.GRADED);
    }

    /**
     * Runs the default (finest cell {@link SillModel#resolvingSpacing}, refined until converged), then the
     * reported run one level finer on its own, and holds every reported time and melt thickness of the
     * default to within 1 % of that finer run. Returns the default's result.
     */
    private static SillResult assertTheDefaultIsConverged(String what, double thickness,
                                                          BiFunction<Double, SillModel.Numerics, SillModel.Setup> at) {
        SillModel.Setup start = at.apply(SillModel.resolvingSpacing(thickness), SERVICE);
        SillResult r = SillModel.runRefined(start, MAX_CELLS, Deadline.none());
        assertNotNull(r.convergence(), what);
        assertTrue(r.convergence().converged(), what + ": " + r.convergence() + " " + r.warnings());
        SillResult.Numerics used = r.numerics();
        // the reported run is the starting level refined k times: spacing / 2^k, tolerance / 4^k
        int k = r.convergence().refinements();
        assertEquals(SillModel.resolvingSpacing(thickness) / (1 << k), used.gridSpacing(), 1e-12, what);
        assertEquals(SillModel.RESOLVING_TOLERANCE_K / (1 << (2 * k)), used.toleranceK(), 1e-15, what);
        // measured: the same case one level finer (half the finest cell, a quarter of the tolerance)
        SillModel.Setup finer = at.apply(used.gridSpacing(), GENEROUS).withTolerance(used.toleranceK()).finer();
        SillResult.Summary half = SillModel.run(finer).summary();
        SillResult.Summary got = r.summary();
        // issue criterion: halving the spacing changes the reported times and melt thicknesses by under 1 %
        assertWithinOnePercent(what + ": time to first crustal melt", half.timeToFirstCrustMelt(),
                got.timeToFirstCrustMelt());
        assertWithinOnePercent(what + ": solidification time", half.solidificationTime(), got.solidificationTime());
        assertWithinOnePercent(what + ": peak crust melt", half.peakCrustMeltThickness(), got.peakCrustMeltThickness());
        if (got.lockUpTime() != null) {
            assertWithinOnePercent(what + ": lock-up time", half.lockUpTime(), got.lockUpTime());
        }
        assertTrue(got.energyErrorFraction() < 1e-10, what + ": energy " + got.energyErrorFraction());
        return r;
    }

    private static void assertWithinOnePercent(String what, Double finer, Double reported) {
        assertNotNull(finer, what);
        assertNotNull(reported, what);
        assertEquals(finer, reported, 0.01 * Math.abs(finer), what);
    }

    /** The change between a run and its coarser partner, computed here from two independent runs. */
    private static double firstMeltChange(SillModel.Setup s) {
        double fine = SillModel.run(s).summary().timeToFirstCrustMelt();
        double coarse = SillModel.run(s.coarser()).summary().timeToFirstCrustMelt();
        return Math.abs(fine - coarse) / fine;
    }

    @Test
    void theFiftyMetreSillIsConvergedByDefault() {
        assertTheDefaultIsConverged("50 m sill", 50, SillModelRefinementTest::fiftyMetreSill);
    }

    @Test
    void aSillInMetapeliteNearItsSolidusIsRefinedUntilConverged() {
        var at = metapeliteSill(650, false);
        SillResult r = assertTheDefaultIsConverged("250 m sill in 650 °C metapelite", 250, at);
        // the starting level alone does not pass (its first-melt time moves by several per cent against
        // the level coarser), so the refinement did the work
        assertTrue(firstMeltChange(at.apply(SillModel.resolvingSpacing(250), SERVICE)) > 0.01);
        assertTrue(r.convergence().refinements() >= 1, r.convergence().toString());
        // the pair reported: the coarser run is the level before, and its answers are given
        SillResult.Convergence c = r.convergence();
        assertEquals(2 * r.numerics().gridSpacing(), c.coarseSpacing(), 1e-12);
        assertEquals(4 * r.numerics().toleranceK(), c.coarseTolerance(), 1e-15);
        assertEquals(Math.abs(r.summary().timeToFirstCrustMelt() - c.coarse().timeToFirstCrustMelt())
                / Math.max(r.summary().timeToFirstCrustMelt(), c.coarse().timeToFirstCrustMelt()),
                c.timeToFirstCrustMeltChange(), 1e-12);
    }

    @Test
    void aSillInMetapeliteAtSevenHundredDegreesIsRefinedUntilConverged() {
        assertTheDefaultIsConverged("250 m sill in 700 °C metapelite", 250, metapeliteSill(700, false));
    }

    @Test
    void aConvectingSillIsRefinedUntilConverged() {
        SillResult r = assertTheDefaultIsConverged("convecting 250 m sill in 650 °C metapelite", 250,
                metapeliteSill(650, true));
        assertNotNull(r.summary().lockUpTime());
        assertNotNull(r.convergence().lockUpTimeChange());
    }

    @Test
    void theReadmeStackIsRefinedUntilConverged() {
        SillResult r = assertTheDefaultIsConverged("README stack", 250, SillModelRefinementTest::readmeStack);
        assertEquals(20, r.summary().sillsEmplaced());
    }

    @Test
    void theRefinementStopsAtItsBudgetAndSaysSo() {
        // a work limit that leaves room for the first pair only: not converged, reported with its reason
        var at = metapeliteSill(650, false);
        SillModel.Setup start = at.apply(SillModel.resolvingSpacing(250), SERVICE);
        long first = SillModel.run(start).numerics().cellSteps();
        SillModel.Setup tight = at.apply(SillModel.resolvingSpacing(250),
                new SillModel.Numerics(SillModel.RESOLVING_TOLERANCE_K, 100_000, 2 * first));
        SillResult r = SillModel.runRefined(tight, MAX_CELLS, Deadline.none());
        assertEquals(0, r.convergence().refinements());
        assertTrue(!r.convergence().converged(), r.convergence().toString());
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("not converged") && w.contains("work limits")),
                r.warnings().toString());
        // a run of 0.5 K is checked at the same tolerance (the grid alone), as before
        SillModel.Setup old = fiftyMetreSill(SillModel.resolvingSpacing(50), SillModel.Numerics.DEFAULT);
        assertEquals(SillModel.Numerics.DEFAULT.toleranceK(), old.coarser().numerics().toleranceK(), 0);
        assertEquals(2 * old.gridSpacing(), old.coarser().gridSpacing(), 0);
    }
}
