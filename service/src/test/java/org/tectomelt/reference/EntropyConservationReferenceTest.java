package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.ProfilePoint;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.melting.McKenzieBickle1988Peridotite;
import org.tectomelt.engine.melting.MantleThermodynamics;

/**
 * Total entropy is conserved along the column. Source: the entropy balance behind the isentropic
 * productivity of Katz et al. (2003, G-cubed 4(9) 1073, doi:10.1029/2002GC000433),
 * cp dT/T − [F αf/ρf + (1 − F) αs/ρs] dP + ΔS dF = 0, after Asimow, Hirschmann &amp; Stolper
 * (1997, Phil. Trans. R. Soc. A 355, 255, doi:10.1098/rsta.1997.0010). With αf/ρf = αs/ρs it
 * integrates exactly to F·ΔS = cp·ln(T_adiabat/T) with T_adiabat = Tp·exp(αs P/(ρs cp)), so the
 * integrated column must satisfy it at every depth within the integrator tolerance.
 */
class EntropyConservationReferenceTest {

    private static final double C = 273.15;

    private static void assertEntropyConserved(double tpC, double water) {
        assertEntropyConserved(Katz2003Peridotite.fertile(), tpC, water);
    }

    private static void assertEntropyConserved(MantleLithology katz, double tpC, double water) {
        MantleThermodynamics th = katz.thermodynamics();
        MantleThermodynamics equal = new MantleThermodynamics(th.heatCapacity(), th.entropyOfFusion(),
                th.solidExpansivity(), th.solidExpansivity(), th.solidDensity(), th.solidDensity());
        DecompressionColumn c = DecompressionColumn.of(katz, tpC + C, water).withThermodynamics(equal)
                .withOutputStep(500).withLidDepth(water > 0 ? 2e3 : 0);
        ColumnResult r = c.solve();
        assertTrue(r.profile().size() > 100);
        for (ProfilePoint p : r.profile()) {
            double latent = p.meltFraction() * th.entropyOfFusion();
            double sensible = th.heatCapacity() * Math.log(c.adiabatTemperature(p.pressure()) / p.temperature());
            // F ΔS reaches ~100 J/kg/K; relative tolerance 1e-6 is 100× the integrator's 1e-8
            assertEquals(latent, sensible, 1e-6 * Math.max(latent, 1.0), "at " + p.depth() + " m, Tp " + tpC);
        }
    }

    @Test
    void dryColumnConservesEntropy() {
        assertEntropyConserved(1350, 0.0);
    }

    @Test
    void hotColumnConservesEntropyAcrossCpxExhaustion() {
        assertEntropyConserved(1550, 0.0);
    }

    @Test
    void hydrousColumnConservesEntropy() {
        assertEntropyConserved(1350, 2e-4);
    }

    @Test
    void aColumnWithTheMcKenzieBickleLawConservesEntropy() {
        assertEntropyConserved(new McKenzieBickle1988Peridotite(), 1380, 0.0);
    }
}
