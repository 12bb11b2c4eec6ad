package org.tectomelt.engine.thermal;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.units.Units;

class PlateCoolingTest {

    private static final PlateParameters P = PlateParameters.GDH1;

    /** The half-space with the plate's own parameters. */
    private static HalfSpaceCooling halfSpace(double ageS) {
        return new HalfSpaceCooling(ageS, P.surfaceTemperature(), P.mantleTemperature(), P.conductivity(),
                P.diffusivity());
    }

    /** Direct summation with a fixed, very large number of terms, to check the truncation rule. */
    private static double bruteForce(double z, double ageS) {
        double a = P.plateThickness();
        double c = Math.PI * Math.PI * P.diffusivity() * ageS / (a * a);
        double sum = 0;
        for (int n = 1; n <= 20_000; n++) {
            sum += 2 / (Math.PI * n) * Math.sin(n * Math.PI * z / a) * Math.exp(-(double) n * n * c);
        }
        double dT = P.mantleTemperature() - P.surfaceTemperature();
        return P.surfaceTemperature() + dT * (z / a + sum);
    }

    @Test
    void youngPlateIsTheHalfSpace() {
        double age = Units.myrToS(2);
        PlateCooling plate = new PlateCooling(P, age);
        HalfSpaceCooling hs = halfSpace(age);
        for (double z = 0; z <= 60e3; z += 2e3) {
            assertEquals(hs.temperatureAt(z), plate.temperatureAt(z), 1e-6, "z = " + z);
        }
        assertEquals(hs.surfaceHeatFlow(), plate.surfaceHeatFlow(), 1e-9);
        double hsDepth = hs.seafloorDepth(P.thermalExpansivity(), P.mantleDensity(), P.waterDensity(), P.ridgeDepth());
        assertEquals(hsDepth, plate.seafloorDepth(), 1e-3);
    }

    @Test
    void oldPlateApproachesTheLinearSteadyState() {
        PlateCooling plate = new PlateCooling(P, Units.myrToS(200));
        double dT = P.mantleTemperature() - P.surfaceTemperature();
        // what is left of the transient is bounded by its first term, (2/π) e^{-π²κt/a²} ΔT (≈ 3.5 K here)
        double a = P.plateThickness();
        double firstTerm = 2 / Math.PI * Math.exp(-Math.PI * Math.PI * P.diffusivity() * Units.myrToS(200) / (a * a));
        for (double z = 0; z <= a; z += 5e3) {
            double linear = P.surfaceTemperature() + dT * z / a;
            assertEquals(linear, plate.temperatureAt(z), 1.01 * firstTerm * dT);
        }
        double steady = P.conductivity() * dT / a;
        // heat flow: the leading transient term is 2 e^{-π²κt/a²} of the steady value
        assertEquals(steady, plate.surfaceHeatFlow(), 1.01 * Math.PI * firstTerm * steady);
        assertTrue(plate.surfaceHeatFlow() > steady);
    }

    @Test
    void truncatedSeriesAgreesWithBruteForceSummation() {
        for (double myr : new double[] {0.01, 0.5, 5, 60, 150}) {
            double age = Units.myrToS(myr);
            PlateCooling plate = new PlateCooling(P, age);
            for (double z = 1e3; z < P.plateThickness(); z += 7e3) {
                assertEquals(bruteForce(z, age), plate.temperatureAt(z), 1e-6, myr + " Myr, z = " + z);
            }
        }
    }

    @Test
    void termCountFollowsTheToleranceNotAFixedNumber() {
        assertTrue(new PlateCooling(P, Units.myrToS(60)).terms() <= 5);
        assertTrue(new PlateCooling(P, Units.myrToS(0.01)).terms() > 100);
    }

    @Test
    void temperatureIsContinuousAtThePlateBaseAndTmBelow() {
        PlateCooling plate = new PlateCooling(P, Units.myrToS(30));
        assertEquals(P.mantleTemperature(), plate.temperatureAt(P.plateThickness() - 1e-3), 1e-3);
        assertEquals(P.mantleTemperature(), plate.temperatureAt(200e3), 0);
        assertEquals(P.surfaceTemperature(), plate.temperatureAt(0), 0);
    }

    @Test
    void surfaceHeatFlowIsConductivityTimesTheSurfaceGradient() {
        PlateCooling plate = new PlateCooling(P, Units.myrToS(40));
        double h = 1.0;
        double gradient = (plate.temperatureAt(h) - plate.temperatureAt(0)) / h;
        assertEquals(P.conductivity() * gradient, plate.surfaceHeatFlow(), 1e-4 * plate.surfaceHeatFlow());
    }

    @Test
    void thermalThicknessIsThe09IsothermAndStaysInsideThePlate() {
        PlateCooling plate = new PlateCooling(P, Units.myrToS(80));
        double dT = P.mantleTemperature() - P.surfaceTemperature();
        assertEquals(P.surfaceTemperature() + 0.9 * dT, plate.temperatureAt(plate.thermalThickness()), 1e-3);
        assertTrue(plate.thermalThickness() < P.plateThickness());
    }

    @Test
    void overridesChangeOnlyWhatTheyName() {
        PlateParameters thick = P.withPlateThickness(120e3).withMantleTemperature(Units.celsiusToKelvin(1400))
                .withSurfaceTemperature(Units.celsiusToKelvin(2)).withConductivity(3.0).withDiffusivity(1e-6);
        assertEquals(120e3, thick.plateThickness());
        assertEquals(Units.celsiusToKelvin(1400), thick.mantleTemperature());
        assertEquals(Units.celsiusToKelvin(2), thick.surfaceTemperature());
        assertEquals(3.0, thick.conductivity());
        assertEquals(1e-6, thick.diffusivity());
        assertEquals(P.thermalExpansivity(), thick.thermalExpansivity());
        assertEquals("GDH1", thick.name());
    }

    @Test
    void agesOutsideTheRangeAreRefused() {
        assertThrows(EngineException.class, () -> new PlateCooling(P, 0));
        assertThrows(EngineException.class, () -> new PlateCooling(P, -1));
        assertThrows(EngineException.class, () -> new PlateCooling(P, Units.myrToS(250)));
        assertThrows(EngineException.class, () -> P.withMantleTemperature(200));
    }
}
