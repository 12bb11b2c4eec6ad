package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Locale;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.settings.SubductionWedge;

/**
 * The model's water-saturated peridotite solidus against the experiments of Till, C.B., Grove,
 * T.L. &amp; Withers, A.C. (2012) The beginnings of hydrous mantle wedge melting, Contributions to
 * Mineralogy and Petrology 163, 669–688 (REFERENCES.md §2.4 [pub]: nearly isothermal at
 * 800–820 °C between 3 and 6 GPa). Other experimental groups place the water-saturated solidus
 * up to about 200 °C hotter (REFERENCES §2.4, from memory).
 *
 * <p>The model (Katz et al. 2003, the solidus lowered by water-saturated melt) is not tuned to
 * these experiments. This test reports its offset from the band and checks that the offset keeps
 * its documented size and sign: hotter than the experiments, by less than the spread between
 * experimental groups. The numbers are also quoted in api-spec/openapi.yaml.
 */
class TillGroveWithers2012WaterSaturatedSolidusTest {

    /** Till et al. (2012) band, °C (REFERENCES §2.4 [pub]). */
    private static final double BAND_LOW_C = 800;
    private static final double BAND_HIGH_C = 820;
    /** Spread between experimental groups, K (REFERENCES §2.4, from memory). */
    private static final double INTERLABORATORY_SPREAD_K = 200;

    private final SubductionWedge wedge = SubductionWedge.katzPeridotite();

    private double modelC(double pGpa) {
        return wedge.saturatedSolidus(pGpa * 1e9) - 273.15;
    }

    @Test
    void theModelIsHotterThanTheExperimentsByLessThanTheSpreadBetweenLaboratories() {
        StringBuilder report = new StringBuilder("water-saturated solidus, model vs Till et al. (2012) 800-820 °C:\n");
        for (double p = 3; p <= 6; p += 0.5) {
            double model = modelC(p);
            double offsetFromMiddle = model - 0.5 * (BAND_LOW_C + BAND_HIGH_C);
            report.append(String.format(Locale.ROOT, "  %.1f GPa: model %.1f °C, offset %+.1f K from 810 °C%n",
                    p, model, offsetFromMiddle));
            // Till et al. (2012) band [pub]: the model lies above it at every pressure from 3 to 6 GPa
            assertTrue(model > BAND_HIGH_C, report.toString());
            // other laboratories up to ~200 °C hotter (REFERENCES §2.4, from memory): the model stays within that
            assertTrue(model - BAND_HIGH_C < INTERLABORATORY_SPREAD_K, report.toString());
        }
        System.out.print(report);
    }

    @Test
    void theOffsetQuotedInTheSpecIsTheModelsOwn() {
        // Non-regression of the numbers the spec quotes (offset from the 810 °C middle of the Till et al. band):
        // +131 K at 3 GPa and +191 K at 6 GPa; the spec prints whole kelvin, so ±0.5 K.
        assertEquals(131, modelC(3) - 810, 0.5);
        assertEquals(191, modelC(6) - 810, 0.5);
    }

    @Test
    void theExperimentsAreNearlyIsothermalWhileTheModelRisesWithPressure() {
        // Till et al. (2012) [pub]: 800–820 °C from 3 to 6 GPa, a change of at most 20 K.
        double rise = modelC(6) - modelC(3);
        // the model's own rise over the same range, reported: about 60 K (941 → 1001 °C from 3 to 6 GPa,
        // REFERENCES §2.1 [calc]; ±0.5 K because those values are printed to 1 °C)
        assertTrue(rise > BAND_HIGH_C - BAND_LOW_C, "model rise " + rise + " K");
        assertEquals(60.1, rise, 0.5);
    }
}
