package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.thermal.MantleAdiabat;
import org.tectomelt.engine.units.Units;

/**
 * The mantle adiabat T = Tp exp(α g z / cp) (McKenzie &amp; Bickle 1988; Turcotte &amp; Schubert
 * 2014, chapter 4) against REFERENCES §1.5: ≈ 0.47 K/km near the top with α = 3e-5, cp = 1000
 * [calc], and the 0.3–0.5 K/km commonly quoted (common practice).
 */
class MantleAdiabatReferenceTest {

    @Test
    void gradientNearTheTopIsAboutHalfAKelvinPerKilometre() {
        MantleAdiabat a = MantleAdiabat.of(Units.celsiusToKelvin(1350));
        double kPerKm = a.gradientAt(0) * 1e3;
        // REFERENCES §1.5 [calc]: ≈ 0.47 K/km (printed to 2 figures, "≈": ±0.02)
        assertEquals(0.47, kPerKm, 0.02);
        // common practice: 0.3–0.5 K/km
        assertEquals(0.4, kPerKm, 0.1);
    }

    @Test
    void temperatureAt100KmMatchesTheIntegratedAdiabat() {
        MantleAdiabat a = MantleAdiabat.of(Units.celsiusToKelvin(1350));
        // independent: 1623.15 K · exp(3e-5 · 9.81 · 1e5 / 1000) = 1671.6 K = 1398.5 °C
        assertEquals(1398.5, Units.kelvinToCelsius(a.temperatureAt(100e3)), 0.1);
    }
}
