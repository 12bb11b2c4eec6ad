package org.tectomelt.engine.crust;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.BudgetExceededException;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.melting.MeltCurve;

class SillModelTest {

    private static final double KYR = 3.15576e10;
    private static final double YR = 3.15576e7;
    private static final double C0 = 273.15;
    /** A pelite-like curve for the tests (approximate values of REFERENCES §3.4, invented for the tests). */
    static final MeltCurve PELITE = new MeltCurve(new double[] {C0 + 750, C0 + 800, C0 + 850, C0 + 900, C0 + 1000},
            new double[] {0, 0.05, 0.25, 0.45, 0.6});
    static final Rock CRUST = new Rock(2750, 1050, 280_000, ConductivityLaw.constant(2.5), PELITE);
    static final Rock BASALT = new Rock(2900, 1100, 400_000, ConductivityLaw.constant(2.5),
            MeltingIntervals.linear(C0 + 1000, C0 + 1200));

    private static SillModel.Setup setup(Rock crust, Rock intrusion, InitialState initial, SillModel.Intrusions in,
                                         double column, double dz, double duration, double every, List<Double> profiles) {
        return new SillModel.Setup(crust, intrusion, initial, in, column, dz, duration, every, profiles, dz,
                SillModel.Numerics.DEFAULT);
    }

    /** A made-up linear initial state with heat production and heat flowing in at the base. */
    static final InitialState WARM = new InitialState() {
        @Override
        public double temperature(double z) {
            return C0 + 10 + 0.02 * z;
        }

        @Override
        public double heatProduction(double z) {
            return 1e-6 * Math.exp(-z / 10e3);
        }

        @Override
        public double surfaceTemperature() {
            return C0 + 10;
        }

        @Override
        public double basalHeatFlow(double z) {
            return 0.04;
        }
    };

    @Test
    void aColumnWithNothingToExchangeStaysAsItWas() {
        Rock inert = new Rock(2750, 1050, 280_000, ConductivityLaw.constant(2.5), PELITE);
        SillResult r = SillModel.run(setup(CRUST, inert, new InitialState.Uniform(C0 + 500),
                SillModel.Intrusions.single(100, 1000, C0 + 500), 3000, 10, 100 * KYR, 10 * KYR, List.of()));
        for (SillResult.Sample s : r.series()) {
            assertEquals(C0 + 500, s.maxTemperature(), 1e-9);
            assertEquals(C0 + 500, s.contactTemperature(), 1e-9);
            assertEquals(0, s.crustMeltThickness(), 0);
        }
    }

    @Test
    void theSchemeConservesEnergyWithStackingHeatProductionBasalHeatFlowAndVariableConductivity() {
        InitialState warm = WARM;
        Rock crust = new Rock(2750, 1050, 280_000, Miao2014Conductivity.GRANITE, PELITE);
        Rock gabbro = new Rock(2900, 1100, 400_000, Miao2014Conductivity.GABBRO, MeltingIntervals.linear(C0 + 1000, C0 + 1200));
        SillResult r = SillModel.run(setup(crust, gabbro, warm,
                new SillModel.Intrusions(200, 25e3, C0 + 1250, 5, 20 * KYR, SillModel.Stacking.OVER),
                40e3, 20, 200 * KYR, 10 * KYR, List.of()));
        // the criterion is 0.1 %; the scheme conserves to round-off
        assertTrue(r.summary().energyErrorFraction() < 1e-3, "energy error " + r.summary().energyErrorFraction());
        assertTrue(r.summary().energyErrorFraction() < 1e-9, "energy error " + r.summary().energyErrorFraction());
        assertEquals(5, r.summary().sillsEmplaced());
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("extrapolated")), r.warnings().toString());
    }

    @Test
    void theEnthalpyOfTheFinalProfileIsTheInitialEnthalpyPlusTheEmplacedSills() {
        // insulated base, disturbance far from the top: no heat crosses a boundary, so the column's
        // enthalpy, recomputed independently from the returned temperatures, must be conserved
        double t0 = C0 + 400;
        double column = 8000;
        double dz = 5;
        SillResult r = SillModel.run(setup(CRUST, BASALT, new InitialState.Uniform(t0),
                new SillModel.Intrusions(100, 6000, C0 + 1230, 3, 2 * KYR, SillModel.Stacking.UNDER),
                column, dz, 10 * KYR, 1 * KYR, List.of(10 * KYR)));
        SillResult.Profile p = r.profiles().get(0);
        double after = 0;
        for (int i = 0; i < p.depth().length; i++) {
            Rock rock = p.intrusion(i) ? BASALT : CRUST;
            after += rock.enthalpy(p.temperature()[i]) * dz;
        }
        double before = CRUST.enthalpy(t0) * column + 3 * 100 * BASALT.enthalpy(C0 + 1230);
        double moved = 3 * 100 * (BASALT.enthalpy(C0 + 1230) - BASALT.enthalpy(t0));
        assertEquals(before, after, 1e-6 * moved);
    }

    @Test
    void underAccretionPutsTheFreshSillAtTheBottomAndOverAccretionAtTheTop() {
        for (SillModel.Stacking stacking : SillModel.Stacking.values()) {
            SillResult r = SillModel.run(setup(CRUST, BASALT, new InitialState.Uniform(C0 + 400),
                    new SillModel.Intrusions(100, 1000, C0 + 1230, 3, 5 * KYR, stacking), 4000, 10, 10 * KYR, 1 * KYR,
                    List.of()));
            assertTrue(r.warnings().stream().anyMatch(w -> w.contains("only 2 of the 3")), r.warnings().toString());
            assertEquals(2, r.summary().sillsEmplaced());
        }
        for (SillModel.Stacking stacking : SillModel.Stacking.values()) {
            SillResult r = SillModel.run(setup(CRUST, BASALT, new InitialState.Uniform(C0 + 400),
                    new SillModel.Intrusions(100, 1000, C0 + 1230, 3, 5 * KYR, stacking), 4000, 10, 11 * KYR, 1 * KYR,
                    List.of(10 * KYR)));
            SillResult.Profile p = r.profiles().get(0); // just after the third emplacement
            int top = index(p, 1050);
            int bottom = index(p, 1250);
            assertTrue(p.intrusion(index(p, 1005)) && p.intrusion(index(p, 1295)) && !p.intrusion(index(p, 1305))
                    && !p.intrusion(index(p, 995)), "the stack fills 1000-1300 m");
            double fresh = C0 + 1230;
            if (stacking == SillModel.Stacking.UNDER) {
                assertEquals(fresh, p.temperature()[bottom], 1e-9);
                assertTrue(p.temperature()[top] < fresh - 10);
            } else {
                assertEquals(fresh, p.temperature()[top], 1e-9);
                assertTrue(p.temperature()[bottom] < fresh - 10);
            }
            assertEquals(4300, p.depth()[p.depth().length - 1] + 5, 1e-9, "the column grew by the three sills");
        }
    }

    /** The sample nearest {@code depth}. */
    private static int index(SillResult.Profile p, double depth) {
        int best = 0;
        for (int i = 1; i < p.depth().length; i++) {
            if (Math.abs(p.depth()[i] - depth) < Math.abs(p.depth()[best] - depth)) {
                best = i;
            }
        }
        return best;
    }

    @Test
    void belowTheMohoTheMantleNeitherMeltsNorCountsAsCrustAndSillsAtTheMohoPushItDown() {
        Rock mantle = new Rock(3300, 1000, 0, ConductivityLaw.constant(3.0), null);
        SillModel.Setup s = new SillModel.Setup(CRUST, BASALT, new InitialState.Uniform(C0 + 700),
                new SillModel.Intrusions(100, 3000, C0 + 1230, 2, 1 * KYR, SillModel.Stacking.UNDER), 5000, 10,
                3 * KYR, 1 * KYR, List.of(0.0, 3 * KYR), 10, SillModel.Numerics.DEFAULT, mantle, 3000);
        SillResult r = SillModel.run(s);
        SillResult.Profile end = r.profiles().get(1);
        for (int i = 0; i < end.depth().length; i++) {
            double z = end.depth()[i];
            SillResult.Material expected = z < 3000 ? SillResult.Material.CRUST
                    : z < 3200 ? SillResult.Material.INTRUSION : SillResult.Material.MANTLE;
            assertEquals(expected, end.material()[i], "at " + z + " m");
            if (expected == SillResult.Material.MANTLE) {
                assertEquals(0, end.meltFraction()[i], 0);
            }
        }
        // the mantle right under the sills is heated far above its 700 °C start but holds no melt, while the
        // crust above them melts
        assertTrue(r.summary().maxMantleTemperature() > C0 + 900, "mantle " + (r.summary().maxMantleTemperature() - C0));
        assertTrue(r.summary().peakCrustMeltThickness() > 0);
        assertTrue(r.summary().energyErrorFraction() < 1e-9);
        assertNull(SillModel.run(setup(CRUST, BASALT, new InitialState.Uniform(C0 + 700),
                SillModel.Intrusions.single(100, 1000, C0 + 1230), 3000, 10, 1 * KYR, 1 * KYR, List.of()))
                .summary().maxMantleTemperature());
    }

    @Test
    void aSymmetricSillInUniformRockKeepsASymmetricProfile() {
        SillResult r = SillModel.run(setup(CRUST, BASALT, new InitialState.Uniform(C0 + 300),
                SillModel.Intrusions.single(100, 2000, C0 + 1200), 4200, 5, 2 * KYR, 0.5 * KYR, List.of(0.5 * KYR)));
        SillResult.Profile p = r.profiles().get(0);
        int centreAbove = index(p, 2047.5);
        for (int k = 0; k < 100; k++) {
            assertEquals(p.temperature()[centreAbove - k], p.temperature()[centreAbove + 1 + k], 1e-6);
        }
    }

    @Test
    void seriesAndProfilesLandOnTheirTimes() {
        SillResult r = SillModel.run(setup(CRUST, BASALT, new InitialState.Uniform(C0 + 400),
                SillModel.Intrusions.single(100, 1000, C0 + 1230), 3000, 10, 10.5 * KYR, 1 * KYR,
                List.of(3.3 * KYR, 0.0)));
        assertEquals(12, r.series().size());
        for (int k = 0; k <= 10; k++) {
            assertEquals(k * KYR, r.series().get(k).time(), 1e-6);
        }
        assertEquals(10.5 * KYR, r.series().get(11).time(), 1e-6);
        assertEquals(0.0, r.profiles().get(0).time(), 0);
        assertEquals(3.3 * KYR, r.profiles().get(1).time(), 1e-6);
        assertEquals(310, r.profiles().get(0).depth().length, "3000 m of column and a 100 m sill in 10 m cells");
    }

    @Test
    void theCrustNextToAHotSillMeltsThenFreezesAgain() {
        SillResult r = SillModel.run(setup(CRUST, BASALT, new InitialState.Uniform(C0 + 650),
                SillModel.Intrusions.single(200, 2000, C0 + 1230), 5000, 5, 50 * KYR, 1 * KYR, List.of()));
        SillResult.Summary s = r.summary();
        assertNotNull(s.timeToFirstCrustMelt());
        assertNotNull(s.solidificationTime());
        assertTrue(s.peakCrustMeltThickness() > 1, "crust melt " + s.peakCrustMeltThickness());
        assertTrue(s.peakTime() > 0);
        SillResult.Sample last = r.series().get(r.series().size() - 1);
        assertEquals(0, last.crustMeltThickness(), 0, "the crust has frozen again");
        assertEquals(0, last.intrusionMeltFraction(), 0);
        assertTrue(s.energyErrorFraction() < 1e-9);
    }

    @Test
    void isothermalMeltingOfTheCrustIsHandled() {
        Rock crust = new Rock(2750, 1050, 280_000, ConductivityLaw.constant(2.5), MeltingIntervals.linear(C0 + 800, C0 + 800));
        SillResult r = SillModel.run(setup(crust, BASALT, new InitialState.Uniform(C0 + 700),
                SillModel.Intrusions.single(200, 2000, C0 + 1230), 4000, 5, 20 * KYR, 1 * KYR, List.of()));
        assertTrue(r.summary().peakCrustMeltThickness() > 0);
        assertTrue(r.summary().energyErrorFraction() < 1e-9);
        for (SillResult.Sample s : r.series()) {
            assertTrue(s.maxCrustMeltFraction() <= 1.0);
        }
    }

    @Test
    void aSillBelowItsSolidusAndACrustAboveItsSolidusAreFlagged() {
        SillResult r = SillModel.run(setup(CRUST, BASALT, new InitialState.Uniform(C0 + 820),
                SillModel.Intrusions.single(100, 1000, C0 + 950), 3000, 10, 5 * KYR, 1 * KYR, List.of()));
        assertEquals(0.0, r.summary().solidificationTime());
        assertEquals(0.0, r.summary().timeToFirstCrustMelt());
        assertEquals(2, r.warnings().stream().filter(w -> w.contains("below its solidus") || w.contains("from the start")).count());
    }

    @Test
    void geometryIsRoundedToWholeCellsWithAWarning() {
        SillResult r = SillModel.run(setup(CRUST, BASALT, new InitialState.Uniform(C0 + 400),
                SillModel.Intrusions.single(104, 1003, C0 + 1230), 3000, 10, 1 * KYR, 1 * KYR, List.of()));
        assertEquals(100, r.summary().emplacedThickness(), 1e-9);
        assertEquals(1000, r.summary().topDepth(), 1e-9);
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("whole cells")));
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("cell face")));
    }

    @Test
    void aCrustThatNeverMeltsHasNoPeakTimeAndNoFirstMelt() {
        SillResult r = SillModel.run(setup(CRUST, BASALT, new InitialState.Uniform(C0 + 100),
                SillModel.Intrusions.single(100, 1000, C0 + 1230), 3000, 10, 5 * KYR, 1 * KYR, List.of()));
        assertNull(r.summary().peakTime());
        assertNull(r.summary().timeToFirstCrustMelt());
        assertEquals(0, r.summary().peakCrustMeltThickness(), 0);
    }

    @Test
    void runawayRunsAreStoppedByTheWorkLimitsAndTheBoundIsALowerBound() {
        SillModel.Setup base = setup(CRUST, BASALT, new InitialState.Uniform(C0 + 400),
                new SillModel.Intrusions(100, 1000, C0 + 1230, 4, 2 * KYR, SillModel.Stacking.UNDER), 3000, 10,
                10 * KYR, 1 * KYR, List.of());
        SillResult r = SillModel.run(base);
        assertTrue(r.numerics().cellSteps() >= base.minimumCellSteps(),
                r.numerics().cellSteps() + " vs bound " + base.minimumCellSteps());
        SillModel.Setup fewSteps = new SillModel.Setup(base.crust(), base.intrusion(), base.initial(), base.intrusions(),
                base.columnDepth(), base.gridSpacing(), base.duration(), base.outputEvery(), List.of(), 10,
                new SillModel.Numerics(0.5, 20, Long.MAX_VALUE));
        assertThrows(SillModel.WorkLimitExceeded.class, () -> SillModel.run(fewSteps));
        SillModel.Setup littleWork = new SillModel.Setup(base.crust(), base.intrusion(), base.initial(), base.intrusions(),
                base.columnDepth(), base.gridSpacing(), base.duration(), base.outputEvery(), List.of(), 10,
                new SillModel.Numerics(0.5, 1_000_000, 10_000));
        assertThrows(SillModel.WorkLimitExceeded.class, () -> SillModel.run(littleWork));
    }

    @Test
    void aSpentDeadlineAbandonsTheRunBetweenTimeSteps() {
        SillModel.Setup s = setup(CRUST, BASALT, new InitialState.Uniform(C0 + 400),
                SillModel.Intrusions.single(100, 1000, C0 + 1230), 3000, 10, 10 * KYR, 1 * KYR, List.of());
        // a fake clock that advances one second per reading: the 5 s budget is spent after a few polls
        long[] now = {0};
        Deadline deadline = Deadline.after(Duration.ofSeconds(5), () -> now[0] += 1_000_000_000L);
        assertThrows(BudgetExceededException.class, () -> SillModel.run(s, deadline));
        assertEquals(6_000_000_000L, now[0], "polled once per time step until spent");
    }

    @Test
    void aRunLongerThanTheSillsLifetimeReportsItsSolidification() {
        SillResult r = SillModel.run(setup(CRUST, BASALT, new InitialState.Uniform(C0 + 400),
                SillModel.Intrusions.single(100, 1000, C0 + 1230), 3000, 5, 0.05 * KYR, 0.01 * KYR, List.of()));
        assertNull(r.summary().solidificationTime(), "a 100 m sill takes centuries, not 50 years");
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("still holds melt")));
        assertTrue(r.summary().energyErrorFraction() < 1e-9);
        assertTrue(r.series().get(1).time() > 9 * YR);
    }
}
