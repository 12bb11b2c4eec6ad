package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.crust.ConductivityLaw;
import org.tectomelt.engine.crust.GeothermInitialState;
import org.tectomelt.engine.crust.MeltingIntervals;
import org.tectomelt.engine.crust.Rock;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.crust.SillResult;
import org.tectomelt.engine.melting.MeltCurve;
import org.tectomelt.engine.thermal.ContinentalGeotherm;

/**
 * Common practice (REFERENCES §3.4, [trade]): a lower crust at 35–40 km on a normal continental
 * geotherm must be heated by several hundred kelvin before it starts to melt. Checked by running
 * the sill model: a basalt sill at 35 km on the steady continental geotherm with a surface heat
 * flow of 60 mW/m² (a stable continent; the continental mean is 65 mW/m², Pollack, Hurter &amp;
 * Johnson 1993) in an amphibolitic lower crust, whose dehydration melting starts near 850 °C
 * (Beard &amp; Lofgren 1991, at 0.3 GPa) with the approximate melt fractions of REFERENCES §3.4
 * (from memory there, ±10 % absolute).
 */
class LowerCrustHeatingCommonPracticeTest {

    private static final double C0 = 273.15;
    private static final double KYR = 3.15576e10;

    @Test
    void theLowerCrustMeltsOnlyWhereTheSillHeatedItBySeveralHundredKelvin() {
        MeltCurve amphibolite = new MeltCurve(
                new double[] {C0 + 850, C0 + 900, C0 + 950, C0 + 1000, C0 + 1050},
                new double[] {0, 0.12, 0.20, 0.30, 0.40});
        Rock crust = new Rock(2900, 1050, 280_000, ConductivityLaw.constant(2.5), amphibolite);
        Rock basalt = new Rock(2900, 1100, 400_000, ConductivityLaw.constant(2.5),
                MeltingIntervals.linear(C0 + 1000, C0 + 1200));
        ContinentalGeotherm normal = ContinentalGeotherm.of(0.060);
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
        // the geotherm puts the lower crust near 600–700 °C, some 150–250 K below the amphibolite solidus
        assertTrue(coldest > C0 + 550 && hottest < C0 + 700, (coldest - C0) + " to " + (hottest - C0) + " °C");

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
        // common practice: "several hundred kelvin" — at least 150 K for the hottest part of the
        // 35–40 km range, and in this run every melting cell was heated by more than that
        assertTrue(leastHeatingOfMeltingRock >= 150, "least heating of melting crust " + leastHeatingOfMeltingRock + " K");
        assertTrue(C0 + 850 - hottest >= 150 && C0 + 850 - coldest >= 250,
                "heating needed from the geotherm to the solidus: " + (C0 + 850 - hottest) + " to "
                        + (C0 + 850 - coldest) + " K");
    }
}
