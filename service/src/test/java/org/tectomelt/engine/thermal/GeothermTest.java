package org.tectomelt.engine.thermal;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.units.Units;

class GeothermTest {

    private final ContinentalGeotherm continental = ContinentalGeotherm.of(0.055);
    private final MantleAdiabat adiabat = MantleAdiabat.of(Units.celsiusToKelvin(1350));

    @Test
    void combinedGeothermIsConductiveAboveTheCrossingAndAdiabaticBelow() {
        Geotherm g = Geotherm.combined(continental, adiabat);
        double base = g.lithosphereBaseDepth().orElseThrow();
        assertEquals(continental.temperatureAt(base), adiabat.temperatureAt(base), 1e-3);
        assertEquals(continental.temperatureAt(base / 2), g.temperatureAt(base / 2), 0);
        assertEquals(adiabat.temperatureAt(base + 10e3), g.temperatureAt(base + 10e3), 0);
        assertTrue(continental.temperatureAt(base - 1e3) < adiabat.temperatureAt(base - 1e3));
        // continuous at the base
        assertEquals(g.temperatureAt(base - 1e-6), g.temperatureAt(base + 1e-6), 1e-3);
        assertEquals(3, g.models().size() + 1);
    }

    @Test
    void combinedPlateMeetsTheAdiabatInsideThePlate() {
        PlateCooling plate = new PlateCooling(PlateParameters.GDH1, Units.myrToS(60));
        double base = Geotherm.combined(plate, adiabat).lithosphereBaseDepth().orElseThrow();
        assertTrue(base > 40e3 && base < PlateParameters.GDH1.plateThickness(), "base " + base);
        assertEquals(plate.temperatureAt(base), adiabat.temperatureAt(base), 1e-3);
    }

    @Test
    void withoutAnAdiabatTheConductiveModelIsUsedEverywhere() {
        Geotherm g = Geotherm.conductive(continental);
        assertTrue(g.lithosphereBaseDepth().isEmpty());
        assertEquals(continental.temperatureAt(300e3), g.temperatureAt(300e3), 0);
        assertEquals(continental.models(), g.models());
    }

    @Test
    void theAdiabatAloneReachesTheSurface() {
        Geotherm g = Geotherm.adiabatic(adiabat);
        assertEquals(0.0, g.lithosphereBaseDepth().orElseThrow());
        assertEquals(adiabat.temperatureAt(0), g.temperatureAt(0), 0);
        assertEquals(java.util.List.of(MantleAdiabat.INFO), g.models());
    }

    @Test
    void aLithosphereThatNeverReachesTheAdiabatIsReportedNotPapered() {
        // the half-space interior (1300 °C) is colder than a 1350 °C adiabat at every depth
        HalfSpaceCooling cold = HalfSpaceCooling.of(Units.myrToS(50));
        assertTrue(Geotherm.lithosphereBase(cold, adiabat).isEmpty());
        assertThrows(EngineException.class, () -> Geotherm.combined(cold, adiabat));
    }

    @Test
    void theLowestMantleTemperatureThatMeetsTheAdiabatIsFoundByBisection() {
        double age = Units.myrToS(60);
        var lowest = Geotherm.lowestMeetingValue(tm -> new HalfSpaceCooling(age, 273.15, tm, 3.3, 1e-6),
                adiabat, Units.celsiusToKelvin(1300), Units.celsiusToKelvin(2000), 0.1);
        double tm = lowest.orElseThrow();
        assertTrue(Geotherm.lithosphereBase(new HalfSpaceCooling(age, 273.15, tm, 3.3, 1e-6), adiabat).isPresent());
        assertTrue(Geotherm.lithosphereBase(new HalfSpaceCooling(age, 273.15, tm - 0.2, 3.3, 1e-6), adiabat).isEmpty());
        assertTrue(Geotherm.lowestMeetingValue(tm2 -> new HalfSpaceCooling(age, 273.15, tm2, 3.3, 1e-6),
                adiabat, 1000, 1200, 1).isEmpty());
    }

    @Test
    void depthGridIncludesBothEnds() {
        assertEquals(301, Geotherm.pointCount(300e3, 1e3));
        assertArrayEquals(new double[] {0, 3e3, 6e3, 9e3, 10e3}, Geotherm.depths(10e3, 3e3), 1e-9);
        assertArrayEquals(new double[] {0, 0.1e3, 0.2e3, 0.3e3}, Geotherm.depths(0.3e3, 0.1e3), 1e-9);
        assertEquals(2, Geotherm.pointCount(5e3, 5e3));
        assertThrows(EngineException.class, () -> Geotherm.pointCount(0, 1));
    }
}
