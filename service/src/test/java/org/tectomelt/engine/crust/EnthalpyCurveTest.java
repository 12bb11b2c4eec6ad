package org.tectomelt.engine.crust;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.MeltCurve;

class EnthalpyCurveTest {

    private static final double RHO = 2800;
    private static final double C = 1100;
    private static final double L = 350_000;

    private static EnthalpyCurve curve(MeltCurve m, double latent) {
        return new EnthalpyCurve(new Rock(RHO, C, latent, ConductivityLaw.constant(2.5), m));
    }

    @Test
    void temperatureFromEnthalpyInvertsEnthalpyFromTemperatureAcrossAMeltingInterval() {
        EnthalpyCurve c = curve(MeltingIntervals.linear(1273.15, 1473.15), L);
        for (double t = 900; t <= 1700; t += 7.3) {
            double h = c.enthalpy(t);
            int s = c.segment(h);
            assertEquals(t, c.temperature(h, s), 1e-9);
            double f = Math.max(0, Math.min(1, (t - 1273.15) / 200));
            assertEquals(f, c.fraction(h, s, t), 1e-12);
        }
    }

    @Test
    void isothermalMeltingIsAFlatSegmentOfTheTemperature() {
        double tm = 1373.15;
        EnthalpyCurve c = curve(MeltingIntervals.linear(tm, tm), L);
        double solid = RHO * C * tm;
        double liquid = solid + RHO * L;
        int s = c.segment(0.5 * (solid + liquid));
        assertEquals(0.0, c.slope(s));
        assertEquals(tm, c.temperature(0.3 * solid + 0.7 * liquid, s), 1e-9);
        assertEquals(0.7, c.fraction(0.3 * solid + 0.7 * liquid, s, tm), 1e-9);
        assertEquals(solid, c.lower(s), 1e-3);
        assertEquals(liquid, c.upper(s), 1e-3);
        // at Tm the rock is taken as molten: its enthalpy is the top of the jump
        assertEquals(liquid, c.enthalpy(tm), 1e-3);
    }

    @Test
    void slopesAreThoseOfTheSensibleAndApparentHeatCapacities() {
        EnthalpyCurve c = curve(MeltingIntervals.linear(1000, 1200), L);
        assertEquals(1 / (RHO * C), c.slope(c.segment(c.enthalpy(900))), 1e-18);
        assertEquals(1 / (RHO * C + RHO * L / 200), c.slope(c.segment(c.enthalpy(1100))), 1e-18);
        assertEquals(1 / (RHO * C), c.slope(c.segment(c.enthalpy(1300))), 1e-18);
    }

    @Test
    void withoutLatentHeatTheMeltFractionStillFollowsTheCurve() {
        EnthalpyCurve c = curve(MeltingIntervals.linear(1000, 1200), 0);
        double h = c.enthalpy(1150);
        int s = c.segment(h);
        assertEquals(1150, c.temperature(h, s), 1e-9);
        assertEquals(0.75, c.fraction(h, s, 1150), 1e-12);
        assertEquals(0, c.knots());
    }

    @Test
    void aRockWithoutMeltCurveNeverMelts() {
        EnthalpyCurve c = curve(null, L);
        double h = c.enthalpy(2000);
        assertEquals(2000, c.temperature(h, c.segment(h)), 1e-9);
        assertEquals(0, c.fraction(h, c.segment(h), 2000));
        assertTrue(c.upper(c.segment(h)) == Double.POSITIVE_INFINITY);
    }
}
