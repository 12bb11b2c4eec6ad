package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.CrustalLithology;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.Lithology;

/**
 * Water-saturated granite against Huang &amp; Wyllie (1973, Earth and Planetary Science Letters):
 * solidus 680 °C at 0.2 GPa and 620 °C at 1 GPa, liquidus 715 °C at 0.2 GPa and 725 °C at 1 GPa
 * [pub, REFERENCES §3.4].
 */
class HuangWyllie1973GraniteSolidusTest {

    private static final double C = 273.15;
    private final Lithology granite = Lithologies.byId("granite-water-saturated").orElseThrow();

    @Test
    void solidusAndLiquidusAtTheExperimentalPressures() {
        // Huang & Wyllie (1973) via REFERENCES §3.4; values printed to the degree
        assertEquals(680, granite.solidus(0.2e9, 0) - C, 0.5);
        assertEquals(620, granite.solidus(1.0e9, 0) - C, 0.5);
        assertEquals(715, granite.liquidus(0.2e9, 0) - C, 0.5);
        assertEquals(725, granite.liquidus(1.0e9, 0) - C, 0.5);
    }

    @Test
    void solidusLiesNear620To680CAtCrustalPressures() {
        // Huang & Wyllie (1973): the water-saturated solidus is near 620–680 °C at crustal pressures
        for (double p = 0.2; p <= 1.0001; p += 0.1) {
            double ts = granite.solidus(p * 1e9, 0) - C;
            assertTrue(ts >= 620 - 1e-9 && ts <= 680 + 1e-9, "P = " + p + ": " + ts);
            double mid = granite.meltFraction(p * 1e9, 700 + C, 0);
            assertTrue(mid > 0 && mid < 1, "700 °C lies inside the melting interval at " + p + " GPa");
        }
        assertTrue(((CrustalLithology) granite).waterSaturated());
    }
}
