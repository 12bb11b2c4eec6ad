package org.tectomelt.engine.column;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.MantleThermodynamics;
import org.tectomelt.engine.melting.McKenzieBickle1988Peridotite;
import org.tectomelt.engine.melting.PertermannHirschmann2003Pyroxenite;

/** The stepped column of a mantle source (engine unit tests: identities, limits, monotonicity). */
class SourceColumnTest {

    private static final double C = 273.15;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();
    private final PertermannHirschmann2003Pyroxenite g2 = new PertermannHirschmann2003Pyroxenite();
    private final MantleSource peridotite = MantleSource.of(katz);

    @Test
    void oneLithologyInBatchMatchesTheOdeColumn() {
        for (double tpC : new double[] {1300, 1350, 1450}) {
            ColumnResult ode = DecompressionColumn.of(katz, tpC + C, 0.0).solve();
            ColumnResult step = SourceColumn.of(peridotite, tpC + C, 0.0).solve();
            assertEquals(ode.onset().get().depth(), step.onset().get().depth(), 1e-6);
            assertEquals(1.0, step.meltThickness() / ode.meltThickness(), 1e-4, "Tp " + tpC);
            assertEquals(ode.top().get().meltFraction(), step.top().get().meltFraction(), 1e-5);
            assertEquals(ode.top().get().temperature(), step.top().get().temperature(), 0.01);
            assertEquals(1.0, step.meanMeltingPressure().getAsDouble() / ode.meanMeltingPressure().getAsDouble(), 1e-4);
        }
        // hydrous, and under a lid, actively
        ColumnResult ode = DecompressionColumn.of(katz, 1400 + C, 2e-4).withLidDepth(40e3)
                .withUpwelling(Upwelling.ACTIVE).solve();
        ColumnResult step = SourceColumn.of(peridotite, 1400 + C, 2e-4).withLidDepth(40e3)
                .withUpwelling(Upwelling.ACTIVE).solve();
        assertEquals(1.0, step.meltThickness() / ode.meltThickness(), 1e-3);
    }

    @Test
    void aSingleBatchSourceRunsTheOdeColumnItself() {
        MeltingColumn c = peridotite.column(1350 + C, 0.0);
        assertInstanceOf(DecompressionColumn.class, c);
        MeltingColumn zero = peridotite.withPyroxenite(g2, 0.0).column(1350 + C, 0.0);
        assertInstanceOf(DecompressionColumn.class, zero);
        assertEquals(DecompressionColumn.of(katz, 1350 + C, 0.0).solve().crustalThickness(),
                zero.solve().crustalThickness(), 0.0);
        assertInstanceOf(SourceColumn.class, peridotite.withPyroxenite(g2, 0.1).column(1350 + C, 0.0));
        assertInstanceOf(SourceColumn.class, peridotite.withMode(MeltingMode.FRACTIONAL, 0).column(1350 + C, 0.0));
    }

    @Test
    void batchEntropyIsConservedAlongAMixedColumn() {
        // with αf/ρf = αs/ρs and one cp the balance integrates to Σφ ΔS F = cp ln(T_adiabat / T)
        MantleThermodynamics th = new MantleThermodynamics(1000, 300, 4e-5, 4e-5 * 2900 / 3300, 3300, 2900);
        MantleSource s = new MantleSource(new Fixed(katz, th), new Fixed(g2, th), 0.15, MeltingMode.BATCH, 0);
        SourceColumn col = SourceColumn.of(s, 1400 + C, 0.0).withOutputStep(2000);
        ColumnResult r = col.solve();
        for (ProfilePoint q : r.profile()) {
            double lhs = 300 * q.meltFraction();
            double rhs = 1000 * Math.log(col.adiabatTemperature(q.pressure()) / q.temperature());
            assertEquals(lhs, rhs, 1e-6, "at " + q.depth());
        }
    }

    @Test
    void fractionalEntropyIsConservedWithTheMeltCarryingItsOwn() {
        // residue of mass 1 − F keeps its entropy while the melt leaves with ΔS more:
        // (1 − F)(cp dlnT − a dP) + ΔS dF = 0 integrates to T = T_adiabat (1 − F)^(ΔS/cp) for constant a
        MantleThermodynamics th = new MantleThermodynamics(1000, 300, 4e-5, 4e-5 * 2900 / 3300, 3300, 2900);
        MantleSource s = MantleSource.of(new Fixed(katz, th)).withMode(MeltingMode.FRACTIONAL, 0);
        SourceColumn col = SourceColumn.of(s, 1400 + C, 0.0).withOutputStep(2000);
        for (ProfilePoint q : col.solve().profile()) {
            double expected = col.adiabatTemperature(q.pressure()) * Math.pow(1 - q.meltFraction(), 0.3);
            assertEquals(expected, q.temperature(), 2e-3, "at " + q.depth());
        }
    }

    @Test
    void crustGrowsWithThePyroxeniteFractionAndThePeridotiteStartsShallower() {
        double previous = 0;
        double peridotiteOnset = Double.MAX_VALUE;
        for (double x : new double[] {0.0, 0.05, 0.1, 0.2, 0.3}) {
            ColumnResult r = peridotite.withPyroxenite(g2, x).column(1350 + C, 0.0).solve();
            assertTrue(r.crustalThickness() > previous, "x = " + x);
            previous = r.crustalThickness();
            double zPer = r.lithologies().get(0).onset().get().depth();
            assertTrue(zPer <= peridotiteOnset + 1e-6, "the pyroxenite's latent heat cools the peridotite");
            peridotiteOnset = zPer;
            if (x > 0) {
                LithologyMelting px = r.lithologies().get(1);
                assertEquals(x, px.massFraction(), 0.0);
                assertTrue(px.onset().get().depth() > zPer);
                assertEquals(1.0, r.lithologies().get(0).meltShare() + px.meltShare(), 1e-12);
                assertTrue(px.meltShare() > x, "the pyroxenite melts more than its share");
            }
        }
    }

    @Test
    void theProfileCarriesEveryLithologysMeltFraction() {
        ColumnResult r = peridotite.withPyroxenite(g2, 0.2).column(1350 + C, 0.0).solve();
        for (ProfilePoint q : r.profile()) {
            assertEquals(2, q.meltFractions().size());
            assertEquals(0.8 * q.meltFractions().get(0) + 0.2 * q.meltFractions().get(1), q.meltFraction(), 1e-12);
        }
        assertEquals(0.0, r.profile().get(0).meltFraction(), 0.0);
        assertEquals(0.0, r.profile().get(r.profile().size() - 1).depth(), 0.0);
    }

    @Test
    void fractionalMeltingIsALittleLessProductiveThanBatchAndNearFractionalLiesBetween() {
        ColumnResult batch = SourceColumn.of(peridotite, 1350 + C, 0.0).solve();
        ColumnResult frac = SourceColumn.of(peridotite.withMode(MeltingMode.FRACTIONAL, 0), 1350 + C, 0.0).solve();
        ColumnResult near = SourceColumn.of(peridotite.withMode(MeltingMode.NEAR_FRACTIONAL, 0.02), 1350 + C, 0.0)
                .solve();
        assertEquals(batch.onset().get().depth(), frac.onset().get().depth(), 0.0);
        double fb = batch.top().get().meltFraction();
        double ff = frac.top().get().meltFraction();
        double fn = near.top().get().meltFraction();
        assertTrue(ff < fn && fn < fb, ff + " < " + fn + " < " + fb);
        assertEquals(1.0, ff / fb, 0.08);
        List<ProfilePoint> p = frac.profile();
        for (int i = 1; i < p.size(); i++) {
            assertTrue(p.get(i).meltFraction() >= p.get(i - 1).meltFraction(), "extracted melt never returns");
        }
    }

    @Test
    void theResiduesWaterFallsMonotonicallyAndFollowsTheFractionalLaw() {
        double x0 = 2e-4;
        ColumnResult r = SourceColumn.of(peridotite.withMode(MeltingMode.FRACTIONAL, 0), 1350 + C, x0).solve();
        List<ProfilePoint> p = r.profile();
        assertEquals(x0, p.get(0).residueWater(), 0.0);
        for (int i = 1; i < p.size(); i++) {
            assertTrue(p.get(i).residueWater() <= p.get(i - 1).residueWater(), "at " + p.get(i).depth());
            // Shaw (1970): the residue of fractional melting holds X0 (1 − F)^(1/D − 1)
            double expected = x0 * Math.pow(1 - p.get(i).meltFraction(), 1 / 0.01 - 1);
            assertEquals(expected, p.get(i).residueWater(), 1e-9 * x0 + 1e-6 * expected);
        }
    }

    @Test
    void badSourcesAreRefused() {
        assertThrows(EngineException.class, () -> new MantleSource(katz, g2, 1.2, MeltingMode.BATCH, 0));
        assertThrows(EngineException.class, () -> new MantleSource(katz, g2, -0.1, MeltingMode.BATCH, 0));
        assertThrows(EngineException.class, () -> new MantleSource(katz, null, 0, MeltingMode.NEAR_FRACTIONAL, 0.2));
        assertThrows(EngineException.class, () -> new MantleSource(katz, null, 0, MeltingMode.BATCH, 0.01));
        assertThrows(EngineException.class, () -> new MantleSource(katz, katz, 0.1, MeltingMode.BATCH, 0));
        // a dry-only law cannot carry water, in any mode
        assertThrows(EngineException.class, () -> SourceColumn.of(MantleSource.of(new McKenzieBickle1988Peridotite())
                .withMode(MeltingMode.FRACTIONAL, 0), 1350 + C, 1e-4));
    }

    /** A lithology with other thermodynamic constants (for the closed-form identities). */
    private record Fixed(org.tectomelt.engine.melting.MantleLithology base, MantleThermodynamics th)
            implements org.tectomelt.engine.melting.MantleLithology {
        @Override public MantleThermodynamics thermodynamics() { return th; }
        @Override public double temperatureAt(double p, double f, double w) { return base.temperatureAt(p, f, w); }
        @Override public org.tectomelt.engine.ModelInfo info() { return base.info(); }
        @Override public String name() { return base.name(); }
        @Override public Kind kind() { return base.kind(); }
        @Override public boolean hydrous() { return base.hydrous(); }
        @Override public double minPressure() { return base.minPressure(); }
        @Override public double maxPressure() { return base.maxPressure(); }
        @Override public double hardMaxPressure() { return base.hardMaxPressure(); }
        @Override public double maxBulkWater() { return base.maxBulkWater(); }
        @Override public double drySolidus(double p) { return base.drySolidus(p); }
        @Override public double meltFraction(double p, double t, double w) { return base.meltFraction(p, t, w); }
        @Override public org.tectomelt.engine.melting.MeltState melt(double p, double t, double w) {
            return base.melt(p, t, w);
        }
        @Override public double waterPartition() { return base.waterPartition(); }
    }
}
