package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.MantleThermodynamics;
import org.tectomelt.engine.melting.McKenzieBickle1988Peridotite;

/**
 * The passive (ridge) column with the McKenzie &amp; Bickle (1988, J. Petrology 29, 625,
 * doi:10.1093/petrology/29.3.625) melting law, dry, melting up to the surface, against:
 * <ul>
 *   <li>White &amp; McKenzie (1989, JGR 94, 7685, doi:10.1029/JB094iB06p07685): about 100 °C hotter
 *       doubles the melt and 200 °C hotter can quadruple it [pub, REFERENCES §2.2];</li>
 *   <li>normal oceanic crust is 6–7 km thick (Chen 1992, GRL 19, 753: about 6 km [pub]; White,
 *       McKenzie &amp; O'Nions 1992, JGR 97, 19683: 7.1 ± 0.8 km, from memory), which McKenzie &amp;
 *       Bickle obtain near Tp = 1280 °C (about 7 km, from memory; REFERENCES §2.2).</li>
 * </ul>
 * The lithology runs with McKenzie &amp; Bickle's own cp = 1.0 kJ/kg/K and ΔS = 250 J/kg/K (from
 * memory) and the Katz et al. (2003) expansivities and densities (MB88's not recalled with
 * confidence); the tolerances are the "about" of the sources.
 */
class McKenzieBickle1988DecompressionColumnReferenceTest {

    private static final double C = 273.15;
    private final McKenzieBickle1988Peridotite mb = new McKenzieBickle1988Peridotite();

    private double melt(double tpC) {
        return DecompressionColumn.of(mb, tpC + C, 0.0).solve().meltThickness();
    }

    @Test
    void crustNear1280CIsWithinAFewKmOfNormalOceanicCrust() {
        ColumnResult r = DecompressionColumn.of(mb, 1280 + C, 0.0).solve();
        // Chen (1992); White et al. (1992, from memory): 6–7 km; "within a few km" → 3 km either side
        assertTrue(r.crustalThickness() > 6e3 - 3e3 && r.crustalThickness() < 7e3 + 3e3,
                "crust " + r.crustalThickness());
        // McKenzie & Bickle (1988, from memory): about 7 km of melt at Tp = 1280 °C
        assertEquals(7e3, r.meltThickness(), 3e3);
    }

    @Test
    void theirOwnEntropyOfFusionBringsTheColumnCloserToTheirHeadline() {
        // McKenzie & Bickle (1988, from memory): cp = 1.0 kJ/kg/K, ΔS = 250 J/kg/K
        assertEquals(250.0, mb.thermodynamics().entropyOfFusion(), 0.0);
        assertEquals(1000.0, mb.thermodynamics().heatCapacity(), 0.0);
        ColumnResult own = DecompressionColumn.of(mb, 1280 + C, 0.0).solve();
        ColumnResult katzConstants = DecompressionColumn.of(mb, 1280 + C, 0.0)
                .withThermodynamics(Katz2003Peridotite.THERMODYNAMICS).solve();
        // White, McKenzie & O'Nions (1992, from memory): 7.1 ± 0.8 km of normal oceanic crust
        assertEquals(7.1e3, own.crustalThickness(), 0.8e3, "crust " + own.crustalThickness());
        // McKenzie & Bickle (1988, from memory): about 7 km of melt; "about" taken as ±1.5 km (20 %)
        assertEquals(7e3, own.meltThickness(), 1.5e3, "melt " + own.meltThickness());
        // the smaller ΔS leaves more heat for melting: more melt than with Katz's 300 J/kg/K
        assertTrue(own.meltThickness() > katzConstants.meltThickness() * 1.05,
                own.meltThickness() + " vs " + katzConstants.meltThickness());
    }

    @Test
    void theUnrecalledExpansivityMovesTheCrustLittle() {
        // the constants kept from Katz et al. (2003) matter far less than ΔS: αs from 4.0e-5 to 3.0e-5 /K
        MantleThermodynamics th = mb.thermodynamics();
        MantleThermodynamics lowAlpha = new MantleThermodynamics(th.heatCapacity(), th.entropyOfFusion(), 3.0e-5,
                th.meltExpansivity(), th.solidDensity(), th.meltDensity());
        double a = DecompressionColumn.of(mb, 1280 + C, 0.0).solve().crustalThickness();
        double b = DecompressionColumn.of(mb, 1280 + C, 0.0).withThermodynamics(lowAlpha).solve().crustalThickness();
        assertEquals(1.0, b / a, 0.05, a + " vs " + b);
    }

    @Test
    void about100CHotterDoublesTheMeltAnd200CHotterAboutQuadruplesIt() {
        double h1280 = melt(1280);
        double h1380 = melt(1380);
        double h1480 = melt(1480);
        // White & McKenzie (1989): "about double" for +100 °C → 2 ± 0.5
        assertEquals(2.0, h1380 / h1280, 0.5);
        // White & McKenzie (1989): +200 °C "can quadruple" → 4 ± 1
        assertEquals(4.0, h1480 / h1280, 1.0);
        assertTrue(h1480 > h1380 && h1380 > h1280);
    }

    @Test
    void theMeltingLawStartsLinearlySoTheColumnNeedsNoSingularStart() {
        // X(T′) has a finite slope at the solidus: the column integrates in u = F (n = 1)
        assertEquals(1.0, mb.branchExponent(false), 0.0);
        ColumnResult r = DecompressionColumn.of(mb, 1330 + C, 0.0).withOutputStep(500).solve();
        assertTrue(r.profile().get(0).productivity() > 0, "finite productivity right at the solidus");
    }
}
