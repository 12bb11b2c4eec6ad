package org.tectomelt.engine.settings;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.units.Units;

/** The slow-spreading lid (engine unit tests). */
class SlowSpreadingConductiveLidTest {

    private static final double TP = 1330 + 273.15;
    private final SlowSpreadingConductiveLid lid = SlowSpreadingConductiveLid.standard();

    @Test
    void noLidAtOrAboveTheCriticalRateAndOneThatGrowsAsTheInverseRateBelow() {
        assertEquals(0.0, lid.lidDepth(Units.mmPerYrToMPerS(20), TP), 0.0);
        assertEquals(0.0, lid.lidDepth(Units.mmPerYrToMPerS(80), TP), 0.0);
        double l10 = lid.lidDepth(Units.mmPerYrToMPerS(10), TP);
        double l5 = lid.lidDepth(Units.mmPerYrToMPerS(5), TP);
        // (1/5 − 1/20) / (1/10 − 1/20) = 3
        assertEquals(3.0, l5 / l10, 1e-9);
        // κ/W at 10 mm/yr full rate: 1e-6 / (5 mm/yr) = 6.31 km; minus its value at 20 mm/yr, × ln(1330/25)
        double expected = (1e-6 / Units.mmPerYrToMPerS(5) - 1e-6 / Units.mmPerYrToMPerS(10)) * Math.log(1330 / 25.0);
        assertEquals(expected, l10, 1e-6);
    }

    @Test
    void theRidgeNamesTheModelThatRan() {
        Katz2003Peridotite katz = Katz2003Peridotite.fertile();
        MidOceanRidge.Result slow = new MidOceanRidge(katz, TP, 0, Units.mmPerYrToMPerS(8)).solve();
        MidOceanRidge.Result fast = new MidOceanRidge(katz, TP, 0, Units.mmPerYrToMPerS(40)).solve();
        assertEquals("slow-spreading-conductive-lid", slow.crustModel());
        assertEquals("infinite-stretching", fast.crustModel());
        assertTrue(slow.models().contains(SlowSpreadingConductiveLid.INFO));
        assertEquals(slow.conductiveLid(), slow.column().lidDepth(), 0.0);
        assertTrue(slow.crustalThickness() < fast.crustalThickness());
        assertEquals(0.0, fast.conductiveLid(), 0.0);
    }
}
