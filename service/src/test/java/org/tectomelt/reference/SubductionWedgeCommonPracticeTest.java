package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.settings.SubductionWedge;
import org.tectomelt.engine.settings.WedgeMelting;
import org.tectomelt.engine.thermal.LithostaticColumn;

/**
 * Facts of the trade about flux melting in a mantle wedge (common practice, no single source),
 * checked on the wedge with the Katz et al. (2003) peridotite (G-cubed 4(9) 1073,
 * doi:10.1029/2002GC000433).
 */
class SubductionWedgeCommonPracticeTest {

    private static final double GPA = 1e9;
    private static final double C = 273.15;
    private final SubductionWedge wedge = SubductionWedge.katzPeridotite();

    /** The response's default grid: {@value SubductionWedge#CURVE_POINTS} points from 0 to {@code max}. */
    private static double[] grid(double max) {
        return SubductionWedge.evenWaterGrid(max, SubductionWedge.CURVE_POINTS);
    }

    @Test
    void mantleAt100KmAnd1300CIsSolidDryAndWellInsideTheMeltingFieldWithSlabWater() {
        // common practice (REFERENCES §1.6 [trade]): rock near 100 km depth at about 1300 °C is solid when dry
        double p = LithostaticColumn.mantleOnly().pressureAt(100e3);
        double t = 1300 + C;
        WedgeMelting dry = wedge.evaluate(p, t, 0.0, grid(0.02), OptionalDouble.empty());
        assertEquals(0.0, dry.state().meltFraction(), 0.0);
        assertTrue(dry.state().drySolidus() - t > 100,
                "dry solidus well above 1300 °C: " + (dry.state().drySolidus() - C));
        // common practice: the same rock melts readily once slab water is added (arc sources carry some tenths of
        // a wt% of water and more, from memory); "well inside" = the wet solidus lies hundreds of kelvin below it
        for (double water : new double[] {0.002, 0.005, 0.01, 0.02}) {
            WedgeMelting wet = wedge.evaluate(p, t, water, grid(0.02), OptionalDouble.empty());
            assertTrue(wet.state().meltFraction() > 0,
                    "melting at " + water * 100 + " wt%: " + wet.state().meltFraction());
            assertTrue(t - wet.state().solidus() > 200, "wet solidus far below 1300 °C at " + water * 100 + " wt%");
        }
        // and a few hundred ppm of water already suffice to start melting there
        assertTrue(wedge.waterForOnset(p, t).orElseThrow() < 0.001);
    }

    @Test
    void theWaterNeededForOnsetFallsAsTemperatureRises() {
        // common practice: the hotter the wedge, the less water it takes to start melting
        for (double pGpa : new double[] {1.5, 2, 3, 4, 5}) {
            double p = pGpa * GPA;
            double tsat = wedge.saturatedSolidus(p);
            double ts = wedge.lithology().drySolidus(p);
            double previous = Double.POSITIVE_INFINITY;
            for (double t = tsat + 1; t < ts; t += 10) {
                double w = wedge.waterForOnset(p, t).orElseThrow();
                assertTrue(w < previous, "P=" + pGpa + " GPa, T=" + (t - C) + " °C: " + w + " after " + previous);
                previous = w;
            }
            assertEquals(0.0, wedge.waterForOnset(p, ts).orElseThrow(), 0.0, "no water needed at the dry solidus");
        }
    }

    @Test
    void meltFractionRisesMonotonicallyWithWaterUpToSaturationAndThenStays() {
        // common practice: more water, more melt, until the melt is water-saturated and the rest is free fluid
        double p = 1 * GPA;
        double t = 1000 + C;
        double wSat = wedge.waterForSaturation(p, t).orElseThrow();
        double onset = wedge.waterForOnset(p, t).orElseThrow();
        List<WedgeMelting.CurvePoint> curve = wedge.waterCurve(p, t, SubductionWedge.evenWaterGrid(0.04, 201));
        double fSat = wedge.melt(p, t, wSat).meltFraction();
        for (int i = 1; i < curve.size(); i++) {
            WedgeMelting.CurvePoint a = curve.get(i - 1);
            WedgeMelting.CurvePoint b = curve.get(i);
            if (b.bulkWater() <= onset) {
                assertEquals(0.0, b.meltFraction(), 0.0);
            } else if (b.bulkWater() <= wSat) {
                assertTrue(b.meltFraction() > a.meltFraction(), "rising at " + b.bulkWater());
                assertTrue(!b.waterSaturated() || b.bulkWater() == wSat);
            } else {
                assertTrue(b.waterSaturated());
                assertEquals(fSat, b.meltFraction(), 1e-9, "constant beyond saturation at " + b.bulkWater());
            }
        }
        // at 3.2 GPa and 1300 °C saturation lies beyond the 5 wt% the model accepts: rising throughout
        List<WedgeMelting.CurvePoint> deep = wedge.waterCurve(3.2 * GPA, 1300 + C, grid(0.05));
        double deepOnset = wedge.waterForOnset(3.2 * GPA, 1300 + C).orElseThrow();
        for (int i = 1; i < deep.size(); i++) {
            if (deep.get(i).bulkWater() > deepOnset) {
                assertTrue(deep.get(i).meltFraction() > deep.get(i - 1).meltFraction());
            }
        }
    }
}
