package org.tectomelt.engine.settings;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.units.Units;

/** The water mass balance of the arc magma budget, checked by hand calculation. */
class ArcMagmaBudgetTest {

    @Test
    void aThousandKgPerMetrePerYearInFivePercentWaterMeltAtTwentyNineHundred() {
        // hand calculation: 1000 kg/m/yr / (0.05 × 2900 kg/m³) = 6.8966 m³ per m of arc per yr
        //                 = 6896.6 m³/yr per km of arc = 6.8966e-6 km³/yr/km
        ArcMagmaBudget b = new ArcMagmaBudget(Units.perYrToPerS(1000), 0.05, 2900);
        assertEquals(20000.0, Units.yrToS(b.meltMassRate()), 1e-9);            // kg of melt per m per yr
        assertEquals(6.896551724e-6, Units.m2PerSToKm3PerYrPerKm(b.meltVolumeRate()), 1e-15);
    }

    @Test
    void productionScalesWithTheFluxAndInverselyWithTheMeltWater() {
        double base = new ArcMagmaBudget(1e-4, 0.04, 2900).meltVolumeRate();
        assertEquals(2 * base, new ArcMagmaBudget(2e-4, 0.04, 2900).meltVolumeRate(), 1e-18);
        assertEquals(base / 2, new ArcMagmaBudget(1e-4, 0.08, 2900).meltVolumeRate(), 1e-18);
        assertEquals(0.0, new ArcMagmaBudget(0, 0.04, 2900).meltVolumeRate(), 0.0);
    }

    @Test
    void aMeltWithoutWaterOrANegativeFluxIsRefused() {
        assertThrows(EngineException.class, () -> new ArcMagmaBudget(1e-4, 0.0, 2900));
        assertThrows(EngineException.class, () -> new ArcMagmaBudget(-1, 0.05, 2900));
        assertThrows(EngineException.class, () -> new ArcMagmaBudget(1e-4, 0.05, 0));
        assertThrows(EngineException.class, () -> new ArcMagmaBudget(Double.NaN, 0.05, 2900));
    }
}
