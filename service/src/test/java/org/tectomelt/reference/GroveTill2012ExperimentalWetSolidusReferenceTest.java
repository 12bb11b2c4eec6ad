package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.WaterSaturatedPeridotiteSolidus;
import org.tectomelt.engine.settings.SubductionWedge;

/**
 * The experimental water-saturated peridotite solidus (Grove, Chatterjee, Parman &amp; Médard 2006, EPSL
 * 249, 74; Till, Grove &amp; Withers 2012, CMP 163, 669) and the wedge run on it, against:
 * <ul>
 *   <li>Till et al. (2012) [pub, REFERENCES §2.4]: nearly isothermal at 800–820 °C between 3 and 6 GPa;
 *       experimental brackets of about ±20 K (from memory);</li>
 *   <li>Grove et al. (2006), from memory: about 860 °C at 2 GPa, hotter towards 1 GPa;</li>
 *   <li>consequence: the Katz et al. (2003) saturated solidus is 130–190 K hotter at 3–6 GPa, so with the
 *       experimental curve less water starts melting at a fixed wedge temperature, and rock between the
 *       two curves (about 810–940 °C at 3 GPa) melts only with the experimental one.</li>
 * </ul>
 */
class GroveTill2012ExperimentalWetSolidusReferenceTest {

    private static final double GPA = 1e9;
    private static final double C = 273.15;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();
    private final Katz2003Peridotite experimental = katz.withExperimentalWetSolidus();

    @Test
    void theCurveMatchesTheExperimentsAt2To4GPa() {
        double tol = WaterSaturatedPeridotiteSolidus.EXPERIMENTAL_UNCERTAINTY_K;
        // Till et al. (2012): 800–820 °C from 3 to 6 GPa → midpoint 810 °C, half-width 10 K plus the ±20 K brackets
        for (double p : new double[] {3, 4, 5, 6}) {
            assertEquals(810, WaterSaturatedPeridotiteSolidus.temperature(p * GPA) - C, 10 + tol, "at " + p);
        }
        // Grove et al. (2006), from memory: about 860 °C at 2 GPa (±20 K brackets, ±30 K for the recollection)
        assertEquals(860, WaterSaturatedPeridotiteSolidus.temperature(2 * GPA) - C, 30);
        assertTrue(WaterSaturatedPeridotiteSolidus.temperature(1 * GPA) > WaterSaturatedPeridotiteSolidus.temperature(2 * GPA));
    }

    @Test
    void theWedgeLawReachesTheExperimentalCurveAndKeepsKatzsDryLaw() {
        for (double p : new double[] {2, 3, 4}) {
            assertEquals(WaterSaturatedPeridotiteSolidus.temperature(p * GPA), experimental.saturatedSolidus(p * GPA), 1e-9);
            assertEquals(katz.drySolidus(p * GPA), experimental.drySolidus(p * GPA), 0.0);
            assertEquals(katz.meltFraction(p * GPA, 1700, 0), experimental.meltFraction(p * GPA, 1700, 0), 0.0);
            double gap = katz.saturatedSolidus(p * GPA) - experimental.saturatedSolidus(p * GPA);
            // the difference the audit reported: 130–190 K at 3–6 GPa (REFERENCES §2.4: within ~200 K between groups)
            if (p >= 3) {
                assertTrue(gap > 120 && gap < 200, "gap at " + p + ": " + gap);
            }
        }
    }

    @Test
    void lessWaterStartsMeltingAtAFixedWedgeTemperature() {
        SubductionWedge k = new SubductionWedge(katz);
        SubductionWedge e = new SubductionWedge(experimental);
        for (double tC : new double[] {1000, 1100, 1200}) {
            double wk = k.waterForOnset(3 * GPA, tC + C).getAsDouble();
            double we = e.waterForOnset(3 * GPA, tC + C).getAsDouble();
            assertTrue(we < wk, tC + " °C: " + we + " vs " + wk);
            assertTrue(experimental.meltFraction(3 * GPA, tC + C, 0.005) > katz.meltFraction(3 * GPA, tC + C, 0.005));
        }
        // between the curves: Katz's rock cannot melt at 900 °C and 3 GPa, the experimental one can
        OptionalDouble none = k.waterForOnset(3 * GPA, 900 + C);
        assertTrue(none.isEmpty());
        assertTrue(e.waterForOnset(3 * GPA, 900 + C).isPresent());
    }
}
