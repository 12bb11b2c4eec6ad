package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.thermal.Geotherm;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.thermal.MantleAdiabat;
import org.tectomelt.engine.thermal.PlateCooling;
import org.tectomelt.engine.thermal.PlateParameters;
import org.tectomelt.engine.units.Units;

/**
 * Loose checks against facts of the trade (REFERENCES §1.6 and §1.1, common practice): beneath
 * old ocean basins, rock near 100 km depth is solid at roughly 1300 °C (±100 °C), i.e. not above
 * about 1400 °C; and 1 GPa is reached at 30–33 km.
 */
class OceanicLithosphereCommonPracticeTest {

    @Test
    void oldPlateOnA1350CAdiabatIsAbout1300CAt100Km() {
        MantleAdiabat adiabat = MantleAdiabat.of(Units.celsiusToKelvin(1350));
        for (double myr : new double[] {80, 120, 160}) {
            Geotherm g = Geotherm.combined(new PlateCooling(PlateParameters.GDH1, Units.myrToS(myr)), adiabat);
            double t = Units.kelvinToCelsius(g.temperatureAt(100e3));
            // common practice: roughly 1300 °C near 100 km (±100 °C), so between 1200 and 1400 °C
            assertTrue(t >= 1200 && t <= 1400, myr + " Myr: " + t + " °C at 100 km");
            assertTrue(g.lithosphereBaseDepth().orElseThrow() <= 100e3, "the plate is entirely conductive above 100 km");
        }
    }

    @Test
    void oneGigapascalLiesNear31KmInTheOceanicMantleColumn() {
        double z = LithostaticColumn.mantleOnly().depthAt(1e9);
        // REFERENCES §1.1 [calc]: 30.9 km; common practice: 30–33 km per GPa
        assertEquals(30.9e3, z, 50);
        assertEquals(31.5e3, z, 1.5e3);
    }
}
