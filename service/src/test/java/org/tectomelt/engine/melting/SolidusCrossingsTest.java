package org.tectomelt.engine.melting;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.melting.SolidusCrossings.Crossing;
import org.tectomelt.engine.melting.SolidusCrossings.Curve;
import org.tectomelt.engine.melting.SolidusCrossings.Direction;
import org.tectomelt.engine.melting.SolidusCrossings.PathPoint;
import org.tectomelt.engine.melting.SolidusCrossings.Result;
import org.tectomelt.engine.thermal.LithostaticColumn;

/** Crossing location by root finding between samples, directions, profile and warnings. */
class SolidusCrossingsTest {

    private static final double C = 273.15;
    private final LithostaticColumn mantle = LithostaticColumn.mantleOnly();
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();

    @Test
    void aCoarsePathHasItsCrossingLocatedBetweenSamplesNotAtOne() {
        // a straight line in depth–temperature, sampled every 40 km
        List<PathPoint> path = List.of(new PathPoint(0, 1200 + C), new PathPoint(40e3, 1300 + C),
                new PathPoint(80e3, 1400 + C), new PathPoint(120e3, 1500 + C));
        Result r = SolidusCrossings.along(katz, 0, mantle, path);
        assertEquals(1, r.crossings().size());
        Crossing c = r.crossings().get(0);
        // independent: solve 1200 + 100 z/40 km = Ts(ρ g z) for z in km
        double z = new BrentSolver(1e-12).solve(200,
                x -> 1200 + C + 100 * x / 40 - katz.drySolidus(3300 * 9.81 * x * 1e3), 0, 120) * 1e3;
        assertEquals(z, c.depth(), 1e-3);
        assertEquals(katz.drySolidus(c.pressure()), c.temperature(), 1e-6);
        assertTrue(Math.abs(c.depth() - 40e3) > 1e3 && Math.abs(c.depth() - 80e3) > 1e3, "not at a sample");
        // deeper along the path the line falls below the solidus: melt disappears
        assertEquals(Direction.OUT_OF_MELT, c.direction());
        assertEquals(Curve.SOLIDUS, c.curve());
    }

    @Test
    void reversingThePathReversesTheDirection() {
        List<PathPoint> path = List.of(new PathPoint(120e3, 1500 + C), new PathPoint(0, 1200 + C));
        Result r = SolidusCrossings.along(katz, 0, mantle, path);
        assertEquals(Direction.INTO_MELT, r.crossings().get(0).direction());
        assertTrue(r.meltPresent());
        assertEquals(r.profile().get(1).meltFraction(), r.maxMeltFraction(), 0);
    }

    @Test
    void aPathThroughTheWholeMeltingIntervalCrossesSolidusThenLiquidusInOrder() {
        CrustalLithology basalt = CrustalLithology.basalt();
        List<PathPoint> path = List.of(new PathPoint(10e3, 900 + C), new PathPoint(10e3, 1300 + C),
                new PathPoint(10e3, 950 + C));
        Result r = SolidusCrossings.along(basalt, 0, LithostaticColumn.mantleOnly(), path);
        assertEquals(4, r.crossings().size());
        assertEquals(Curve.SOLIDUS, r.crossings().get(0).curve());
        assertEquals(1000 + C, r.crossings().get(0).temperature(), 1e-6);
        assertEquals(Curve.LIQUIDUS, r.crossings().get(1).curve());
        assertEquals(1200 + C, r.crossings().get(1).temperature(), 1e-6);
        assertEquals(Direction.INTO_MELT, r.crossings().get(1).direction());
        assertEquals(Curve.LIQUIDUS, r.crossings().get(2).curve());
        assertEquals(Direction.OUT_OF_MELT, r.crossings().get(2).direction());
        assertEquals(Curve.SOLIDUS, r.crossings().get(3).curve());
        assertEquals(1.0, r.maxMeltFraction(), 0);
    }

    @Test
    void curvesWithoutLiquidusGiveOnlySolidusCrossings() {
        Result r = SolidusCrossings.along(CrustalLithology.metapelite(), 0, mantle,
                List.of(new PathPoint(33e3, 700 + C), new PathPoint(33e3, 1200 + C)));
        assertEquals(1, r.crossings().size());
        assertTrue(Double.isNaN(r.profile().get(1).liquidus()));
        assertEquals(0.60, r.maxMeltFraction(), 0);
    }

    @Test
    void aPathThatStaysSolidHasNoCrossingAndNoMelt() {
        Result r = SolidusCrossings.along(katz, 0, mantle,
                List.of(new PathPoint(0, 0 + C), new PathPoint(100e3, 1300 + C)));
        assertTrue(r.crossings().isEmpty());
        assertFalse(r.meltPresent());
        assertEquals(0.0, r.maxMeltFraction(), 0);
    }

    @Test
    void theAdiabatRunsFromDepthToTheSurfaceAndCarriesTheSolidAdiabatNote() {
        Result r = SolidusCrossings.alongAdiabat(katz, 0, mantle, 1350 + C, 200e3, 3e3);
        assertEquals(200e3, r.profile().get(0).depth(), 0);
        assertEquals(0.0, r.profile().get(r.profile().size() - 1).depth(), 0);
        assertEquals(1350 + C, r.profile().get(r.profile().size() - 1).temperature(), 1e-9);
        assertEquals(1, r.crossings().size());
        assertEquals(Direction.INTO_MELT, r.crossings().get(0).direction());
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("solid adiabat")));
    }

    @Test
    void samplesOutsideTheCalibrationAreSummarisedInOneWarning() {
        Result r = SolidusCrossings.along(katz, 0, mantle,
                List.of(new PathPoint(250e3, 1800 + C), new PathPoint(280e3, 1850 + C), new PathPoint(100e3, 1400 + C)));
        assertEquals(1, r.warnings().size());
        assertTrue(r.warnings().get(0).startsWith("2 of 3 path samples"), r.warnings().get(0));
    }

    @Test
    void refusesPathsTheModelCannotCompute() {
        assertThrows(EngineException.class, () -> SolidusCrossings.along(katz, 0, mantle,
                List.of(new PathPoint(0, 300), new PathPoint(400e3, 2000))));
        assertThrows(EngineException.class, () -> SolidusCrossings.along(katz, 0, mantle, List.of(new PathPoint(0, 300))));
        assertThrows(EngineException.class, () -> SolidusCrossings.adiabatPath(
                new SolidAdiabat(1600, katz.thermodynamics()), mantle, 200e3, 1.0));
    }
}
