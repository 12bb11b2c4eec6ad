package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Locale;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.Katz2003Peridotite;

/**
 * The water-saturated peridotite solidus of Katz et al. (2003) against experiments: Till, C.B.,
 * Grove, T.L. &amp; Withers, A.C. (2012) The beginnings of hydrous mantle wedge melting. Contrib.
 * Mineral. Petrol. 163, 669–688 (DOI from memory: 10.1007/s00410-011-0692-6): nearly isothermal
 * at 800–820 °C between 3 and 6 GPa [pub, REFERENCES §2.4]. Other experimental groups place it up
 * to about 200 °C hotter [from memory, REFERENCES §2.4], so the check is a band from 800 to
 * 1020 °C. The model's offset from Till et al. is printed, not tuned.
 */
class Till2012WaterSaturatedSolidusTest {

    @Test
    void saturatedSolidusLiesInTheExperimentalBandAndItsOffsetIsReported() {
        Katz2003Peridotite katz = Katz2003Peridotite.fertile();
        for (double p = 3; p <= 6; p += 0.5) {
            double t = katz.saturatedSolidus(p * 1e9) - 273.15;
            System.out.printf(Locale.ROOT,
                    "Katz 2003 water-saturated solidus at %.1f GPa: %.0f °C, %+.0f K from Till et al. 2012 (800–820 °C)%n",
                    p, t, t - 810);
            // band: Till et al. (2012) 800–820 °C, other groups up to ~200 K hotter (REFERENCES §2.4)
            assertTrue(t >= 800 && t <= 1020, "P = " + p + " GPa: " + t + " °C");
        }
        // The model is hotter than Till et al. throughout (REFERENCES §2.1 [calc]: 941–1001 °C):
        // the parameterization leans to the hotter experiments.
        assertTrue(katz.saturatedSolidus(3e9) - 273.15 > 820);
    }
}
