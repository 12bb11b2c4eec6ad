package org.tectomelt.engine.thermal;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;

class MantleAdiabatTest {

    private final MantleAdiabat adiabat = MantleAdiabat.of(1623.15);

    @Test
    void atTheSurfaceTheTemperatureIsThePotentialTemperature() {
        assertEquals(1623.15, adiabat.temperatureAt(0), 0);
    }

    @Test
    void gradientIsAlphaGTOverCp() {
        double z = 150e3;
        assertEquals(3e-5 * 9.81 * adiabat.temperatureAt(z) / 1000, adiabat.gradientAt(z), 1e-15);
        double h = 1;
        assertEquals((adiabat.temperatureAt(z + h) - adiabat.temperatureAt(z - h)) / (2 * h), adiabat.gradientAt(z), 1e-9);
    }

    @Test
    void depthAndPotentialTemperatureInvertTheAdiabat() {
        double z = 123e3;
        double t = adiabat.temperatureAt(z);
        assertEquals(z, adiabat.depthAt(t), 1e-6);
        assertEquals(1623.15, adiabat.potentialTemperatureOf(t, z), 1e-9);
    }

    @Test
    void parametersAreParameters() {
        MantleAdiabat steep = new MantleAdiabat(1623.15, 4e-5, 1000, 9.81);
        assertEquals(4.0 / 3.0, steep.logGradient() / adiabat.logGradient(), 1e-12);
        assertThrows(EngineException.class, () -> new MantleAdiabat(1600, 0, 1000, 9.81));
        assertThrows(EngineException.class, () -> adiabat.depthAt(-1));
    }
}
