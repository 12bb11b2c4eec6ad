package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.thermal.ContinentalGeotherm;
import org.tectomelt.engine.thermal.ContinentalGeotherm.HeatProduction;
import org.tectomelt.engine.units.Units;

/**
 * The steady continental geotherm against the closed forms of Turcotte &amp; Schubert (2014,
 * <i>Geodynamics</i>, 3rd ed., chapter 4): exponential heat production
 * T = T0 + qm z/k + (ρH0 hr²/k)(1 − e^(−z/hr)) with q0 = qm + ρH0 hr, and the two-layer
 * alternative. Worked values are REFERENCES §1.4, computed there independently [calc], for
 * T0 = 0 °C, k = 2.5 W/m/K, hr = D = 10 km, qm = 0.6 q0, q0 = 50 mW/m².
 */
class TurcotteSchubertContinentalGeothermReferenceTest {

    private static ContinentalGeotherm referenceCase(HeatProduction mode, double q0, double k) {
        return ContinentalGeotherm.of(q0, 0.6, 10e3, k, Units.celsiusToKelvin(0), 35e3, mode);
    }

    private static double celsiusAt(ContinentalGeotherm g, double km) {
        return Units.kelvinToCelsius(g.temperatureAt(Units.kmToM(km)));
    }

    @Test
    void exponentialModelGives309And498C() {
        ContinentalGeotherm g = referenceCase(HeatProduction.EXPONENTIAL, 0.050, 2.5);
        // REFERENCES §1.4 [calc]: 309 °C at 20 km, 498 °C at 35 km; printed to 1 °C
        assertEquals(309, celsiusAt(g, 20), 0.5);
        assertEquals(498, celsiusAt(g, 35), 0.5);
        assertEquals(498, Units.kelvinToCelsius(g.mohoTemperature()), 0.5);
    }

    @Test
    void exponentialModelEqualsTheClosedFormAtEveryDepth() {
        // Turcotte & Schubert chapter 4 closed form, written out independently here
        double q0 = 0.050;
        double qm = 0.6 * q0;
        double k = 2.5;
        double hr = 10e3;
        double rhoH0 = (q0 - qm) / hr;
        ContinentalGeotherm g = referenceCase(HeatProduction.EXPONENTIAL, q0, k);
        for (double z = 0; z <= 200e3; z += 2.5e3) {
            double closed = 273.15 + qm * z / k + rhoH0 * hr * hr / k * (1 - Math.exp(-z / hr));
            assertEquals(closed, g.temperatureAt(z), 1e-9, "z = " + z);
        }
    }

    @Test
    void twoLayerModelGives280And460C() {
        ContinentalGeotherm g = referenceCase(HeatProduction.TWO_LAYER, 0.050, 2.5);
        // REFERENCES §1.4 [calc]: 280 °C at 20 km, 460 °C at 35 km; printed to 1 °C
        assertEquals(280, celsiusAt(g, 20), 0.5);
        assertEquals(460, celsiusAt(g, 35), 0.5);
    }

    @Test
    void temperatureRiseScalesExactlyWithQ0OverK() {
        // REFERENCES §1.4: T − T0 depends on q0/k only (k = 3, q0 = 60 equals k = 2.5, q0 = 50)
        for (HeatProduction mode : HeatProduction.values()) {
            ContinentalGeotherm a = referenceCase(mode, 0.050, 2.5);
            ContinentalGeotherm b = referenceCase(mode, 0.060, 3.0);
            for (double z = 0; z <= 150e3; z += 5e3) {
                assertEquals(a.temperatureAt(z), b.temperatureAt(z), 1e-9, mode + " z = " + z);
            }
        }
    }
}
