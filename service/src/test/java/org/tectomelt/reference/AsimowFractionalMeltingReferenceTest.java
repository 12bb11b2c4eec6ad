package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.column.MeltingMode;
import org.tectomelt.engine.column.ProfilePoint;
import org.tectomelt.engine.column.SourceColumn;
import org.tectomelt.engine.melting.Katz2003Peridotite;

/**
 * Fractional against batch melting in an isentropic column:
 * <ul>
 *   <li>Asimow, Hirschmann &amp; Stolper (1997, Phil. Trans. R. Soc. A 355, 255): isentropic fractional
 *       melting is slightly less productive than batch, the total extent of melting differing by a few
 *       per cent (from memory) — here within 8 % relative at every depth;</li>
 *   <li>Asimow &amp; Langmuir (2003, Nature 421, 815): with fractional extraction water leaves the
 *       residue with the first melts, so the low-F hydrous tail below the dry solidus is shorter and
 *       less productive than in batch melting (from memory);</li>
 *   <li>Shaw (1970, GCA 34, 237): the residue of fractional melting holds X0(1 − F)^(1/D − 1), falling
 *       monotonically (REFERENCES §4).</li>
 * </ul>
 */
class AsimowFractionalMeltingReferenceTest {

    private static final double C = 273.15;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();
    private final MantleSource batch = MantleSource.of(katz);
    private final MantleSource fractional = batch.withMode(MeltingMode.FRACTIONAL, 0);

    @Test
    void dryFractionalMeltingFollowsBatchWithinAFewPerCent() {
        for (double tpC : new double[] {1300, 1350, 1400}) {
            ColumnResult b = DecompressionColumn.of(katz, tpC + C, 0).solve();
            ColumnResult f = SourceColumn.of(fractional, tpC + C, 0).solve();
            List<ProfilePoint> pb = b.profile();
            List<ProfilePoint> pf = f.profile();
            assertEquals(pb.size(), pf.size());
            for (int i = 1; i < pb.size(); i++) {
                assertEquals(pb.get(i).depth(), pf.get(i).depth(), 1e-6);
                double fb = pb.get(i).meltFraction();
                double ff = pf.get(i).meltFraction();
                assertTrue(ff <= fb + 1e-6, "fractional is the less productive at " + pb.get(i).depth());
                assertEquals(fb, ff, 0.08 * fb + 1e-4, "Tp " + tpC + " at " + pb.get(i).depth());
            }
        }
    }

    @Test
    void strippingTheWaterShortensTheHydrousTail() {
        double tp = 1350 + C;
        double water = 1e-4;
        double zDry = DecompressionColumn.of(katz, tp, 0).onsetDepth().getAsDouble();
        ColumnResult b = SourceColumn.of(batch, tp, water).solve();
        ColumnResult f = SourceColumn.of(fractional, tp, water).solve();
        double atDryOnsetBatch = meltAt(b, Math.floor(zDry / 1e3) * 1e3);
        double atDryOnsetFrac = meltAt(f, Math.floor(zDry / 1e3) * 1e3);
        assertTrue(atDryOnsetBatch > 0 && atDryOnsetFrac > 0, "both melt below the dry solidus");
        assertTrue(atDryOnsetFrac < 0.9 * atDryOnsetBatch, atDryOnsetFrac + " vs " + atDryOnsetBatch);
        // the extra melt the water makes is smaller when it leaves with the melt
        double dryB = DecompressionColumn.of(katz, tp, 0).solve().meltThickness();
        double dryF = SourceColumn.of(fractional, tp, 0).solve().meltThickness();
        assertTrue(f.meltThickness() - dryF < b.meltThickness() - dryB);
    }

    @Test
    void theResiduesWaterFallsMonotonicallyAsShawsFractionalLawSays() {
        double x0 = 1.5e-4;
        List<ProfilePoint> p = SourceColumn.of(fractional, 1380 + C, x0).solve().profile();
        for (int i = 1; i < p.size(); i++) {
            assertTrue(p.get(i).residueWater() <= p.get(i - 1).residueWater());
            assertEquals(x0 * Math.pow(1 - p.get(i).meltFraction(), 99), p.get(i).residueWater(),
                    1e-9 * x0 + 1e-6 * p.get(i).residueWater());
        }
        assertTrue(p.get(p.size() - 1).residueWater() < 1e-3 * x0, "dried out by the top");
    }

    private static double meltAt(ColumnResult r, double depth) {
        return r.profile().stream().filter(q -> Math.abs(q.depth() - depth) < 1e-6).findFirst().orElseThrow()
                .meltFraction();
    }
}
