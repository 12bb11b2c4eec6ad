package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.SolidusCrossings;
import org.tectomelt.engine.melting.SolidusCrossings.Crossing;
import org.tectomelt.engine.thermal.LithostaticColumn;

/**
 * Where the solid adiabat of a 1350 °C mantle meets the dry Katz et al. (2003) solidus, with
 * their Table 2 constants (αs = 4e-5 /K, ρs = 3300 kg/m³, cp = 1000 J/kg/K): REFERENCES §2.5
 * [calc] gives 2.661 GPa, ≈ 82 km and 1403 °C. The adiabat gradient is checked against the
 * commonly quoted 0.3–0.5 K/km (REFERENCES §1.5, common practice).
 */
class AdiabaticSolidusCrossingReferenceTest {

    @Test
    void tp1350MeetsTheKatzSolidusAt2661MPa() {
        // sampled every 10 km on purpose: the crossing must come from root finding, not a sample
        SolidusCrossings.Result r = SolidusCrossings.alongAdiabat(Katz2003Peridotite.fertile(), 0,
                LithostaticColumn.mantleOnly(), 1350 + 273.15, 200e3, 10e3);
        Crossing c = r.crossings().get(0);
        // REFERENCES §2.5 [calc]: printed to 1 MPa, 1 °C and 1 km
        assertEquals(2.661e9, c.pressure(), 1e6);
        assertEquals(1403, c.temperature() - 273.15, 0.5);
        assertEquals(82, c.depth() / 1e3, 0.5);
        assertEquals(SolidusCrossings.Direction.INTO_MELT, c.direction());
    }

    @Test
    void solidAdiabatGradientIsInTheCommonlyQuotedRange() {
        SolidusCrossings.Result r = SolidusCrossings.alongAdiabat(Katz2003Peridotite.fertile(), 0,
                LithostaticColumn.mantleOnly(), 1300 + 273.15, 60e3, 1e3);
        double top = r.profile().get(r.profile().size() - 1).temperature();
        double below = r.profile().get(r.profile().size() - 2).temperature();
        double kPerKm = below - top;
        // common practice: 0.3–0.5 K/km near the top of the mantle (REFERENCES §1.5)
        assertTrue(kPerKm >= 0.3 && kPerKm <= 0.7, "gradient " + kPerKm + " K/km");
    }
}
