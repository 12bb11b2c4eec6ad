package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.column.ProfilePoint;
import org.tectomelt.engine.column.SourceColumn;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.PertermannHirschmann2003Pyroxenite;

/**
 * A two-lithology mantle in thermal equilibrium, after Phipps Morgan (2001, G-cubed 2,
 * doi:10.1029/2000GC000049) and Shorttle, Maclennan &amp; Lambart (2014): the pyroxenite, with the
 * lower solidus, melts first and deepest; its latent heat cools the peridotite, which starts
 * shallower than alone; a few per cent of pyroxenite makes a disproportionate share of the melt
 * and more crust at the same potential temperature (Phipps Morgan 2001; Shorttle et al. 2014 —
 * from memory). With no pyroxenite the column is the peridotite's own.
 */
class PhippsMorgan2001TwoLithologyReferenceTest {

    private static final double C = 273.15;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();
    private final PertermannHirschmann2003Pyroxenite g2 = new PertermannHirschmann2003Pyroxenite();

    @Test
    void noPyroxeniteReproducesThePeridotiteColumnExactly() {
        ColumnResult alone = DecompressionColumn.of(katz, 1350 + C, 0).solve();
        ColumnResult mixed = MantleSource.of(katz).withPyroxenite(g2, 0.0).column(1350 + C, 0).solve();
        assertEquals(alone.crustalThickness(), mixed.crustalThickness(), 0.0);
        assertEquals(alone.onset(), mixed.onset());
        assertEquals(alone.profile(), mixed.profile());
        // and the stepped integrator itself agrees with the ODE column to 1e-4
        ColumnResult stepped = SourceColumn.of(MantleSource.of(katz), 1350 + C, 0).solve();
        assertEquals(1.0, stepped.crustalThickness() / alone.crustalThickness(), 1e-4);
    }

    @Test
    void crustGrowsWithThePyroxeniteFractionAtFixedTp() {
        double previous = DecompressionColumn.of(katz, 1350 + C, 0).solve().crustalThickness();
        for (double x : new double[] {0.02, 0.05, 0.1, 0.2}) {
            ColumnResult r = MantleSource.of(katz).withPyroxenite(g2, x).column(1350 + C, 0).solve();
            assertTrue(r.crustalThickness() > previous, "x = " + x);
            previous = r.crustalThickness();
            // Phipps Morgan (2001), Shorttle et al. (2014), from memory: the pyroxenite's share of the melt exceeds
            // its share of the source several times over
            assertTrue(r.lithologies().get(1).meltShare() > 2 * x, "share " + r.lithologies().get(1).meltShare());
        }
    }

    @Test
    void theEnergyBalanceClosesAlongTheColumn() {
        // the heat the solid adiabat would keep, cp ln(T_ad/T), equals the latent heat of both lithologies'
        // melt Σφ ΔS F less the work of the melt's larger expansion, ∫ F (αf/ρf − αs/ρs) dP (Katz et al. 2003's
        // balance cp dT/T − [F αf/ρf + (1 − F) αs/ρs] dP + ΔS dF = 0 integrated against the solid adiabat)
        SourceColumn col = SourceColumn.of(MantleSource.of(katz).withPyroxenite(g2, 0.1), 1350 + C, 0);
        ColumnResult r = col.solve();
        double th = (4e-5 / 3300);
        double tf = (6.8e-5 / 2900);
        double melted = 0;
        ProfilePoint prev = r.profile().get(0);
        for (ProfilePoint q : r.profile().subList(1, r.profile().size())) {
            // ∫ F (αf/ρf − αs/ρs) dP along the path, trapezoidal on the output points
            melted += 0.5 * (prev.meltFraction() + q.meltFraction()) * (tf - th) * (q.pressure() - prev.pressure());
            double lhs = 1000 * Math.log(col.adiabatTemperature(q.pressure()) / q.temperature());
            double rhs = 300 * q.meltFraction() - melted;
            assertEquals(lhs, rhs, 2e-3 * Math.max(rhs, 1e-3), "at " + q.depth());
            prev = q;
        }
    }
}
