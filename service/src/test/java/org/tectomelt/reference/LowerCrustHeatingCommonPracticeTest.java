package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.crust.ConductivityLaw;
import org.tectomelt.engine.crust.GeothermInitialState;
import org.tectomelt.engine.crust.Rock;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.crust.SillResult;
import org.tectomelt.engine.melting.CrustalLithology;
import org.tectomelt.engine.melting.ThermalProperties;
import org.tectomelt.engine.thermal.ContinentalGeotherm;

/**
 * Common practice (REFERENCES §3.4, [trade]): a lower crust at 35–40 km on a normal continental
 * geotherm must be heated by several hundred kelvin before it starts to melt. Checked by running
 * the sill model: a basalt sill at 35 km on the steady continental geotherm with a surface heat
 * flow of 50 mW/m² (a stable continent, as in the worked geotherm of REFERENCES §1.4; the
 * continental mean, 65 mW/m², includes tectonically active regions, Pollack, Hurter &amp; Johnson
 * 1993) in an amphibolitic lower crust: the catalogue's amphibolite, whose dehydration
 * melting starts at 850 °C (Beard &amp; Lofgren 1991, at 0.3 GPa) with the approximate melt
 * fractions of REFERENCES §3.4 (from memory there, ±10 % absolute), and the catalogue's basalt.
 */
class LowerCrustHeatingCommonPracticeTest {

    private static final double C0 = 273.15;
    private static final double KYR = 3.15576e10;

    @Test
    void theLowerCrustMeltsOnlyWhereTheSillHeatedItBySeveralHundredKelvin() {
        CrustalLithology amphibolite = CrustalLithology.amphibolite();
        CrustalLithology basaltLith = CrustalLithology.basalt();
        ThermalProperties a = amphibolite.thermalProperties();
        ThermalProperties b = basaltLith.thermalProperties();
        double pressure = 1e9; // the curves do not depend on it; inside the amphibolite's calibration
        Rock crust = new Rock(a.density(), a.heatCapacity(), a.latentHeat(), ConductivityLaw.constant(a.conductivity()),
                amphibolite.curveAt(pressure));
        Rock basalt = new Rock(b.density(), b.heatCapacity(), b.latentHeat(), ConductivityLaw.constant(b.conductivity()),
                basaltLith.curveAt(pressure));
        assertEquals(C0 + 850, crust.meltCurve().solidus(), 1e-9, "amphibolite dehydration melting from 850 °C");
        // the geotherm with the amphibolite's conductivity, so that the column starts steady
        ContinentalGeotherm normal = ContinentalGeotherm.of(0.050, ContinentalGeotherm.REDUCED_FRACTION,
                ContinentalGeotherm.HEAT_PRODUCTION_SCALE, a.conductivity(), C0, 35e3,
                ContinentalGeotherm.HeatProduction.EXPONENTIAL);
        List<Double> times = List.of(0.0, 0.01 * KYR, 0.1 * KYR, 0.3 * KYR, 1 * KYR, 3 * KYR, 10 * KYR);
        SillResult r = SillModel.run(new SillModel.Setup(crust, basalt, new GeothermInitialState(normal),
                SillModel.Intrusions.single(500, 35e3, C0 + 1230), 45e3, 10, 10 * KYR, 1 * KYR, times, 10,
                SillModel.Numerics.DEFAULT));

        SillResult.Profile start = r.profiles().get(0);
        double coldest = Double.POSITIVE_INFINITY;
        double hottest = 0;
        for (int i = 0; i < start.depth().length; i++) {
            double z = start.depth()[i];
            if (!start.intrusion(i) && z >= 34e3 && z <= 40.5e3) {
                coldest = Math.min(coldest, start.temperature()[i]);
                hottest = Math.max(hottest, start.temperature()[i]);
            }
        }
        // the geotherm puts the lower crust near 540–620 °C
        assertTrue(coldest > C0 + 500 && hottest < C0 + 650, (coldest - C0) + " to " + (hottest - C0) + " °C");

        assertNotNull(r.summary().timeToFirstCrustMelt(), "the 1230 °C sill does melt its wall rock");
        assertTrue(r.warnings().stream().noneMatch(w -> w.contains("from the start")), "no melt before the sill");
        double leastHeatingOfMeltingRock = Double.POSITIVE_INFINITY;
        for (SillResult.Profile p : r.profiles()) {
            assertEquals(start.depth().length, p.depth().length, "one sill: the cells stay in place");
            for (int i = 0; i < p.depth().length; i++) {
                if (!p.intrusion(i) && p.meltFraction()[i] > 0) {
                    leastHeatingOfMeltingRock = Math.min(leastHeatingOfMeltingRock,
                            p.temperature()[i] - start.temperature()[i]);
                }
            }
        }
        // common practice: "several hundred kelvin": at least 200 K for the hottest part of the
        // 35–40 km range, about 300 K for its top, and every cell that melted in this run was heated by
        // at least 200 K
        assertTrue(leastHeatingOfMeltingRock >= 200, "least heating of melting crust " + leastHeatingOfMeltingRock + " K");
        assertTrue(C0 + 850 - hottest >= 200 && C0 + 850 - coldest >= 280,
                "heating needed from the geotherm to the solidus: " + (C0 + 850 - hottest) + " to "
                        + (C0 + 850 - coldest) + " K");
    }
}
