package org.tectomelt.engine.column;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.Lithology;
import org.tectomelt.engine.melting.MantleLithology;

/** Behaviour of the isentropic decompression column (engine unit tests: identities, limits, monotonicity). */
class DecompressionColumnTest {

    private static final double C = 273.15;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();

    private DecompressionColumn dry(double tpC) {
        return DecompressionColumn.of(katz, tpC + C, 0.0);
    }

    @Test
    void aColdMantleGivesAValidAnswerWithZeroMeltAndNoOnset() {
        ColumnResult r = dry(1050).solve();
        assertTrue(r.onset().isEmpty());
        assertTrue(r.top().isEmpty());
        assertFalse(r.melts());
        assertEquals(0.0, r.meltThickness(), 0.0);
        assertEquals(0.0, r.crustalThickness(), 0.0);
        assertEquals(0.0, r.maxMeltFraction(), 0.0);
        assertTrue(r.meanMeltingPressure().isEmpty());
        assertTrue(r.profile().isEmpty());
        assertTrue(r.warnings().get(0).contains("no melting"));
    }

    @Test
    void theOnsetLiesWhereTheAdiabatMeetsTheSolidus() {
        DecompressionColumn c = dry(1400);
        double p0 = c.onsetPressure().getAsDouble();
        assertEquals(c.solidus(p0), c.adiabatTemperature(p0), 1e-6);
        assertTrue(c.adiabatTemperature(p0 + 1e7) < c.solidus(p0 + 1e7), "below the onset the rock is solid");
        assertTrue(c.adiabatTemperature(p0 - 1e7) > c.solidus(p0 - 1e7), "above it the adiabat is supersolidus");
    }

    @Test
    void theProfileRunsFromTheOnsetToTheTopOnTheRequestedGrid() {
        ColumnResult r = dry(1350).withOutputStep(500).withLidDepth(10e3).solve();
        List<ProfilePoint> p = r.profile();
        ProfilePoint first = p.get(0);
        ProfilePoint last = p.get(p.size() - 1);
        assertEquals(r.onset().get().depth(), first.depth(), 1e-9);
        assertEquals(0.0, first.meltFraction(), 0.0);
        assertEquals(10e3, last.depth(), 1e-9);
        assertEquals(r.top().get().meltFraction(), last.meltFraction(), 1e-12);
        for (int i = 1; i < p.size() - 1; i++) {
            assertEquals(0.0, Math.IEEEremainder(p.get(i).depth(), 500), 1e-6, "grid depth " + p.get(i).depth());
            assertTrue(p.get(i).depth() < p.get(i - 1).depth());
            assertTrue(p.get(i).meltFraction() > p.get(i - 1).meltFraction(), "a dry column melts more on the way up");
            assertTrue(p.get(i).productivity() > 0);
        }
        assertEquals(1 + Math.floor(r.onset().get().depth() / 500) - 20 + 1, p.size(), 0.0);
    }

    @Test
    void theOutputStepDoesNotChangeTheAnswer() {
        ColumnResult coarse = dry(1400).withOutputStep(10e3).solve();
        ColumnResult fine = dry(1400).withOutputStep(100).solve();
        assertEquals(coarse.meltIntegral(), fine.meltIntegral(), 0.0);
        assertEquals(coarse.top().get().meltFraction(), fine.top().get().meltFraction(), 0.0);
    }

    @Test
    void meltThicknessFollowsTheUpwellingRegime() {
        ColumnResult passive = dry(1400).solve();
        ColumnResult active = dry(1400).withUpwelling(Upwelling.ACTIVE).solve();
        assertEquals(passive.meltIntegral(), passive.meltThickness(), 0.0);
        assertEquals(active.maxMeltFraction() * active.meltingHeight(), active.meltThickness(), 1e-9);
        assertEquals(passive.meltIntegral() / passive.meltingHeight(), passive.meanMeltFraction(), 1e-12);
        assertTrue(active.meltThickness() > passive.meltThickness());
        // crust = melt × ρs/ρc with ρs = 3300 (Katz et al. 2003) and ρc = 2900 kg/m³
        assertEquals(passive.meltThickness() * 3300 / 2900, passive.crustalThickness(), 1e-9);
    }

    @Test
    void theMeanPressureOfMeltingLiesInsideTheColumnAndDeeperForTheTriangle() {
        ColumnResult passive = dry(1400).solve();
        ColumnResult active = dry(1400).withUpwelling(Upwelling.ACTIVE).solve();
        double p0 = passive.onset().get().pressure();
        for (ColumnResult r : List.of(passive, active)) {
            double mean = r.meanMeltingPressure().getAsDouble();
            assertTrue(mean > 0 && mean < p0);
        }
        // the triangle weights deep melt by the many columns that pass through it
        assertTrue(passive.meanMeltingPressure().getAsDouble() > active.meanMeltingPressure().getAsDouble());
    }

    @Test
    void productivityDropsAtCpxExhaustionAndTheIntegrationRestartsExactlyThere() {
        ColumnResult r = dry(1500).withOutputStep(100).solve();
        List<ProfilePoint> p = r.profile();
        int k = -1;
        for (int i = 1; i < p.size(); i++) {
            if (p.get(i).meltFraction() > katz.cpxExhaustionFraction(p.get(i).pressure())
                    && p.get(i - 1).meltFraction() <= katz.cpxExhaustionFraction(p.get(i - 1).pressure())) {
                k = i;
            }
        }
        assertTrue(k > 0, "Tp = 1500 °C exhausts cpx on the way up");
        double before = p.get(k - 1).productivity();
        double after = p.get(k).productivity();
        assertTrue(after < 0.5 * before, "productivity falls at cpx exhaustion: " + before + " → " + after);
        // temperature stays continuous across the kink (no jump larger than the grid spacing implies)
        assertEquals(p.get(k - 1).temperature(), p.get(k).temperature(), 0.5);
        assertTrue(r.top().get().meltFraction() > katz.cpxExhaustionFraction(0.0));
    }

    @Test
    void waterStartsMeltingDeeperWithLowProductivityAndStaysInTheSystem() {
        double water = 2e-4;
        ColumnResult wet = DecompressionColumn.of(katz, 1350 + C, water).withOutputStep(500).solve();
        ColumnResult dry = dry(1350).solve();
        assertTrue(wet.onset().get().depth() > dry.onset().get().depth() + 20e3);
        ProfilePoint deep = wet.profile().get(5);
        assertTrue(deep.depth() > dry.onset().get().depth());
        assertTrue(deep.productivity() > 0 && deep.productivity() < 0.03e-9, "hydrous tail below 3 %/GPa");
        for (ProfilePoint q : wet.profile()) {
            if (q.meltFraction() > 0.01 && q.depth() > 1e3) {
                // batch melting: the bulk water stays in the system, X_melt (D + F(1 − D)) = Xbulk, D = 0.01
                assertEquals(water, q.waterInMelt() * (0.01 + q.meltFraction() * 0.99), 1e-9, "at " + q.depth());
            }
        }
    }

    @Test
    void thickerLidsMeltLessAndALidBelowTheOnsetMeltsNothing() {
        for (Upwelling u : Upwelling.values()) {
            double previous = Double.MAX_VALUE;
            for (double lid = 0; lid <= 90e3; lid += 10e3) {
                ColumnResult r = dry(1350).withUpwelling(u).withLidDepth(lid).solve();
                assertTrue(r.meltThickness() < previous || r.meltThickness() == 0, u + " lid " + lid);
                previous = r.meltThickness();
            }
        }
        ColumnResult capped = dry(1350).withLidDepth(90e3).solve();
        assertTrue(capped.onset().isPresent());
        assertTrue(capped.top().isEmpty());
        assertEquals(0.0, capped.meltThickness(), 0.0);
        assertTrue(capped.warnings().get(0).contains("deeper than the onset"));
    }

    @Test
    void aPotentialTemperatureMeltingBelowTheModelRangeIsRefused() {
        EngineException e = assertThrows(EngineException.class, () -> dry(1700).solve());
        assertTrue(e.getMessage().contains("deeper than the model reaches"));
    }

    @Test
    void everyCatalogueMantleLithologyDeclaresTheExponentOfItsMeltingLaw() {
        // the column integrates in u = F^(1/n): n must match the law, F ∝ (T − Ts)^n near the solidus
        for (Lithology l : Lithologies.all()) {
            if (!(l instanceof MantleLithology m)) {
                continue;
            }
            double p = 1.5e9;
            double ts = m.temperatureAt(p, 0, 0);
            double f1 = 1e-8;
            double f2 = 1e-6;
            double slope = Math.log(f2 / f1) / Math.log((m.temperatureAt(p, f2, 0) - ts) / (m.temperatureAt(p, f1, 0) - ts));
            assertEquals(m.branchExponent(false), slope, 0.02, l.id());
            double fx = m.exhaustionMeltFraction(p);
            if (fx < 1) {
                double tx = m.temperatureAt(p, fx, 0);
                double s2 = Math.log(f2 / f1)
                        / Math.log((m.temperatureAt(p, fx + f2, 0) - tx) / (m.temperatureAt(p, fx + f1, 0) - tx));
                assertEquals(m.branchExponent(true), s2, 0.02, l.id() + " after exhaustion");
            }
        }
    }

    @Test
    void everyCatalogueLithologyWithAnExhaustionPointContinuesItsSolidusBranchSmoothly() {
        // the column integrates the solidus branch past exhaustion until the event stops it there
        for (Lithology l : Lithologies.all()) {
            if (!(l instanceof MantleLithology m)) {
                continue;
            }
            for (double p = 0.5e9; p <= 6e9; p += 0.5e9) {
                double fx = m.exhaustionMeltFraction(p);
                if (fx >= 1) {
                    continue;
                }
                double d = 1e-3;
                double lo = m.temperatureOnBranch(p, fx - d, 0, false);
                double mid = m.temperatureOnBranch(p, fx, 0, false);
                double hi = m.temperatureOnBranch(p, fx + d, 0, false);
                assertEquals(m.temperatureAt(p, fx, 0), mid, 1e-9, l.id());
                assertEquals(m.temperatureAt(p, fx - d, 0), lo, 1e-9, l.id());
                assertTrue(Math.abs(hi - 2 * mid + lo) < 0.01 * (hi - lo), l.id() + " smooth at " + p);
                assertTrue(m.temperatureAt(p, fx + d, 0) - mid > 2 * (hi - mid), l.id() + ": the law itself kinks");
            }
        }
    }

    @Test
    void hydrousColumnsReachTheSurfaceWithFiniteNumbers() {
        // these once produced NaN on the last step, where σ² overshot the surface by a rounding error
        double[][] cases = {{1250, 5e-5}, {1300, 5e-4}, {1450, 5e-4}, {1500, 5e-5}, {1200, 1e-3}};
        for (double[] c : cases) {
            ColumnResult r = DecompressionColumn.of(katz, c[0] + C, c[1]).withOutputStep(100).solve();
            assertTrue(r.melts(), "Tp " + c[0]);
            for (ProfilePoint p : r.profile()) {
                assertTrue(Double.isFinite(p.productivity()) && Double.isFinite(p.temperature())
                        && p.meltFraction() >= 0 && p.meltFraction() <= 1, "Tp " + c[0] + " at " + p.depth());
            }
            assertTrue(Double.isFinite(r.meltThickness()) && r.meltThickness() > 0);
        }
    }

    @Test
    void aColdWetColumnThatFreezesOnDegassingEndsOnTheSolidAdiabat() {
        // the Katz et al. (2003) saturation limit vanishes at zero pressure: the last melt freezes
        DecompressionColumn c = DecompressionColumn.of(katz, 1050 + C, 5e-4).withOutputStep(100);
        ColumnResult r = c.solve();
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("freezes completely")));
        assertEquals(0.0, r.top().get().meltFraction(), 0.0);
        assertEquals(c.adiabatTemperature(0.0), r.top().get().temperature(), 1e-9);
        assertTrue(r.maxMeltFraction() > 0.01);
        ProfilePoint last = r.profile().get(r.profile().size() - 1);
        assertEquals(0.0, last.depth(), 0.0);
        assertEquals(0.0, last.meltFraction(), 0.0);
    }
}
