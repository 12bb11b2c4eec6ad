package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.settings.ContinentalRift;
import org.tectomelt.engine.settings.MidOceanRidge;
import org.tectomelt.engine.units.Units;

/**
 * Rift melting after instantaneous uniform stretching. Sources: McKenzie (1978, EPSL 40, 25,
 * doi:10.1016/0012-821X(78)90071-7) for the stretched geometry, a lithosphere a thinned to a/β;
 * White &amp; McKenzie (1989, JGR 94, 7685, doi:10.1029/JB094iB06p07685) for melting beneath it:
 * melt grows strongly with β and with Tp, and sea-floor spreading is the limit β → ∞ [pub, as
 * summarised in REFERENCES §2.6].
 */
class WhiteMcKenzie1989RiftMeltingReferenceTest {

    private static final double C = 273.15;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();

    @Test
    void uniformStretchingThinsLithosphereAndCrustByBeta() {
        // McKenzie (1978): every layer of the lithosphere thins by the same factor β
        ContinentalRift.Result r = new ContinentalRift(katz, 1330 + C, 2.5, 125e3, 32e3, 0.0).solve();
        assertEquals(50e3, r.lidDepth(), 1e-9);
        assertEquals(12.8e3, r.stretchedCrust(), 1e-9);
    }

    @Test
    void meltGrowsWithStretchingAndWithPotentialTemperature() {
        // White & McKenzie (1989): melt thickness rises steeply with β and with Tp
        double[] tps = {1280, 1330, 1380, 1430, 1480};
        double[] betas = {1.5, 2, 3, 5, 10};
        double[][] h = new double[tps.length][betas.length];
        for (int i = 0; i < tps.length; i++) {
            for (int j = 0; j < betas.length; j++) {
                h[i][j] = new ContinentalRift(katz, tps[i] + C, betas[j], 100e3, 30e3, 0.0).solve().meltThickness();
                if (j > 0) {
                    assertTrue(h[i][j] >= h[i][j - 1] && (h[i][j - 1] == 0 || h[i][j] > h[i][j - 1]),
                            "β at Tp " + tps[i]);
                }
                if (i > 0) {
                    assertTrue(h[i][j] >= h[i - 1][j] && (h[i - 1][j] == 0 || h[i][j] > h[i - 1][j]),
                            "Tp at β " + betas[j]);
                }
            }
        }
        // "strongly": at β = 10, 200 K hotter gives several times the melt
        assertTrue(h[4][4] > 3 * h[0][4]);
    }

    @Test
    void infiniteStretchingTendsToTheRidge() {
        // White & McKenzie (1989): sea-floor spreading is the β → ∞ limit of stretching
        double ridge = new MidOceanRidge(katz, 1330 + C, 0.0, Units.mmPerYrToMPerS(50)).solve().column().meltIntegral();
        double rift = new ContinentalRift(katz, 1330 + C, 1000, 100e3, 30e3, 0.0).solve().meltThickness();
        assertEquals(ridge, rift, 0.005 * ridge);
    }
}
