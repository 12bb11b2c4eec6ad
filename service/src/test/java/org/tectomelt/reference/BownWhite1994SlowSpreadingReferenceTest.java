package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.settings.MidOceanRidge;
import org.tectomelt.engine.units.Units;

/**
 * Oceanic crust against full spreading rate with the slow-spreading conductive lid, against the
 * published shape (Bown &amp; White 1994, EPSL 121, 435; White, Minshull, Bickle &amp; Robinson 2001, J.
 * Petrology 42; Dick, Lin &amp; Schouten 2003, Nature 426 — all from memory, REFERENCES §6): about
 * 6–7 km and independent of rate above about 20 mm/yr, a few km near 10 mm/yr, thin below about
 * 5 mm/yr. Potential temperature 1310 °C, where the Katz et al. (2003) column makes normal crust at
 * fast spreading.
 */
class BownWhite1994SlowSpreadingReferenceTest {

    private static final double TP = 1310 + 273.15;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();

    private double crustKm(double fullMmPerYr) {
        return new MidOceanRidge(katz, TP, 0, Units.mmPerYrToMPerS(fullMmPerYr)).solve().crustalThickness() / 1e3;
    }

    @Test
    void normalCrustAboveAbout20MmPerYrIndependentOfRate() {
        // White et al. (1992; 2001), from memory: 6–7 km; "about" taken as ±0.5 km
        for (double u : new double[] {20, 40, 80, 150}) {
            assertEquals(6.5, crustKm(u), 1.0, "at " + u + " mm/yr");
        }
        assertEquals(crustKm(20), crustKm(150), 1e-9);
    }

    @Test
    void aFewKmNear10MmPerYrAndThinAtUltraslowRates() {
        double c10 = crustKm(10);
        // Bown & White (1994), Dick et al. (2003), from memory: "a few km" near 10 mm/yr
        assertTrue(c10 >= 2 && c10 <= 5.5, "10 mm/yr: " + c10);
        // thin (below ~2 km) at about 5 mm/yr and nothing at 2 mm/yr
        assertTrue(crustKm(5) < 2.0, "5 mm/yr: " + crustKm(5));
        assertEquals(0.0, crustKm(2), 0.05);
        double previous = 0;
        for (double u = 2; u <= 20; u += 1) {
            double c = crustKm(u);
            assertTrue(c >= previous, "crust grows with the rate at " + u);
            previous = c;
        }
    }
}
