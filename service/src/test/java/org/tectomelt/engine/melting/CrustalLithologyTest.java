package org.tectomelt.engine.melting;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;

/** Crustal lithologies: default curves, the caller's curve, ranges and thermal properties. */
class CrustalLithologyTest {

    private static final double GPA = 1e9;
    private static final double C = 273.15;

    @Test
    void graniteCurvesDependOnPressureAndAreHeldOutsideTheAnchors() {
        CrustalLithology g = CrustalLithology.graniteWaterSaturated();
        assertEquals(650 + C, g.solidus(0.6 * GPA, 0), 1e-9);
        assertEquals(720 + C, g.liquidus(0.6 * GPA, 0), 1e-9);
        assertEquals(680 + C, g.solidus(0.05 * GPA, 0), 1e-9);
        assertEquals(620 + C, g.solidus(2.0 * GPA, 0), 1e-9);
        // linear F between solidus and liquidus
        assertEquals(0.5, g.meltFraction(0.6 * GPA, 685 + C, 0), 1e-12);
        MeltState s = g.melt(0.6 * GPA, 685 + C, 0);
        assertTrue(s.waterSaturated());
        assertTrue(Double.isNaN(s.drySolidus()), "no dry counterpart for a water-saturated curve");
        assertEquals(1, s.warnings().size(), "only the approximate-curve note inside the anchors");
        assertEquals(2, g.melt(0.1 * GPA, 700 + C, 0).warnings().size(), "outside the anchors: a range warning too");
    }

    @Test
    void curvesThatStopShortOfFullMeltingHaveNoLiquidus() {
        CrustalLithology pelite = CrustalLithology.metapelite();
        assertTrue(Double.isNaN(pelite.liquidus(GPA, 0)));
        assertTrue(Double.isNaN(pelite.melt(GPA, 950 + C, 0).liquidus()));
        assertEquals(0.60, pelite.meltFraction(GPA, 1100 + C, 0), 0);
        assertEquals(750 + C, pelite.solidus(GPA, 0), 0);
        assertEquals(pelite.solidus(GPA, 0), pelite.drySolidus(GPA), 0);
    }

    @Test
    void basaltIsAnIntrusionCrystallisingOver1200To1000C() {
        CrustalLithology b = CrustalLithology.basalt();
        assertEquals(Lithology.Kind.INTRUSION, b.kind());
        assertEquals(1000 + C, b.solidus(0.3 * GPA, 0), 0);
        assertEquals(1200 + C, b.liquidus(0.3 * GPA, 0), 0);
        assertEquals(0.5, b.meltFraction(0.3 * GPA, 1100 + C, 0), 1e-12);
        assertEquals(1100 + C, b.temperatureAt(0.3 * GPA, 0.5), 1e-9);
    }

    @Test
    void aCallersCurveReplacesTheDefaultAtEveryPressureWithoutNotes() {
        MeltCurve mine = new MeltCurve(new double[] {900 + C, 1000 + C}, new double[] {0.0, 0.8});
        CrustalLithology a = CrustalLithology.amphibolite().withCurve(mine);
        assertTrue(a.callerCurve());
        assertEquals("amphibolite", a.id());
        assertEquals(0.4, a.meltFraction(0.2 * GPA, 950 + C, 0), 1e-12);
        assertEquals(0.4, a.meltFraction(2.5 * GPA, 950 + C, 0), 1e-12);
        assertTrue(a.melt(2.5 * GPA, 950 + C, 0).warnings().isEmpty());
        assertEquals(CrustalLithology.amphibolite().thermalProperties(), a.thermalProperties());
        assertFalse(CrustalLithology.amphibolite().callerCurve());
    }

    @Test
    void thermalPropertiesAreTheStatedDefaults() {
        ThermalProperties granite = CrustalLithology.graniteWaterSaturated().thermalProperties();
        // Miao et al. (2014) granite law at 20 °C: 1/(0.24094 + 4.6019e-4 × 293.15) = 2.661 W/m/K
        assertEquals(2.661, granite.conductivity(), 0.001);
        ThermalProperties basalt = CrustalLithology.basalt().thermalProperties();
        // Miao et al. (2014) gabbro law at 20 °C: 1/(0.33727 + 3.5002e-4 × 293.15) = 2.273 W/m/K
        assertEquals(2.273, basalt.conductivity(), 0.001);
        assertEquals(350e3, basalt.latentHeat(), 0);
        assertEquals(basalt.conductivity() / (2900 * 1200), basalt.diffusivity(), 1e-15);
        ThermalProperties other = new ThermalProperties(2700, 1000, 300e3, 2.5);
        assertEquals(other, CrustalLithology.basalt().withThermalProperties(other).thermalProperties());
        assertThrows(EngineException.class, () -> new ThermalProperties(-1, 1000, 1, 1));
    }

    @Test
    void refusesWaterAndPressuresBeyondTheCrust() {
        CrustalLithology g = CrustalLithology.graniteWaterSaturated();
        assertThrows(EngineException.class, () -> g.melt(GPA, 900, 0.01));
        assertThrows(EngineException.class, () -> g.melt(3.5 * GPA, 900, 0));
        assertThrows(EngineException.class, () -> g.melt(-1, 900, 0));
    }
}
