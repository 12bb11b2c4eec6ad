package org.tectomelt.engine.column;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.Katz2003Peridotite;

/**
 * A hydrous column whose melt reaches water saturation just below a top at zero pressure (Katz et
 * al. 2003: Xsat = χ1·P^λ + χ2·P falls to nothing at the surface). The law continued below
 * saturation equals the capped law wherever the melt is undersaturated; the column ends on the
 * capped law; and its answers do not depend on how the top metres were integrated beyond the
 * integrator's tolerance.
 */
class SaturatedTopTest {

    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();

    @Test
    void theContinuedLawIsTheCappedLawWhileUndersaturatedAndLowerBeyond() {
        double w = 2e-4;
        for (double pGpa : new double[] {3, 1, 0.1, 1e-3, 1e-5, 1e-7}) {
            double p = pGpa * 1e9;
            for (double f : new double[] {0.01, 0.1, 0.2}) {
                double capped = katz.temperatureOnBranch(p, f, w, false);
                double continued = katz.temperatureBelowSaturation(p, f, w, false);
                double margin = katz.waterSaturationMargin(p, f, w);
                if (margin >= 0) {
                    assertEquals(capped, continued, 1e-9, pGpa + " GPa, F " + f);
                } else {
                    // more water than the melt can hold: uncapped, the curve is lowered further
                    assertTrue(continued < capped, pGpa + " GPa, F " + f);
                }
            }
        }
        assertTrue(katz.waterSaturationMargin(3e9, 0.2, w) > 0, "undersaturated at depth");
        assertTrue(katz.waterSaturationMargin(1e3, 0.2, w) < 0, "saturated a few centimetres below the top");
        assertEquals(Double.POSITIVE_INFINITY, katz.waterSaturationMargin(1e3, 0.2, 0.0));
    }

    @Test
    void theColumnEndsOnTheCappedLawAndWarnsOfDegassing() {
        for (double w : new double[] {1e-4, 2e-4, 1e-3}) {
            ColumnResult r = DecompressionColumn.of(katz, 1350 + 273.15, w).solve();
            ColumnState top = r.top().orElseThrow();
            assertEquals(0.0, top.pressure());
            // the state at the top is on the capped (saturated) law
            assertEquals(katz.temperatureOnBranch(0.0, top.meltFraction(), w, false), top.temperature(), 1e-6,
                    "water " + w);
            assertTrue(r.warnings().stream().anyMatch(s -> s.contains("water-saturated at the top")), "water " + w);
        }
    }

    @Test
    void nearTheTopTheMeltFractionFollowsThePowerLawOfTheSaturatedSolidus() {
        // saturated: Xsat ≈ χ1·P^λ (λ = 0.6) and ΔT = K·X^γ (γ = 0.75) in the saturation and solidus-depression laws of Katz et al. (2003),
        // so close to P = 0 the solidus, and F with it, moves as P^(λγ) = P^0.45 (calc): F at a
        // lid a decade deeper differs from the top's by 10^0.45 = 2.82 times more
        double w = 1e-4;
        double fTop = DecompressionColumn.of(katz, 1320 + 273.15, w).solve().top().orElseThrow().meltFraction();
        double previous = Double.NaN;
        for (double lid : new double[] {1e-4, 1e-3, 1e-2}) {
            double f = DecompressionColumn.of(katz, 1320 + 273.15, w).withLidDepth(lid).solve().top().orElseThrow()
                    .meltFraction();
            double step = f - fTop;
            assertTrue(step > 0, "F rises below the top: lid " + lid);
            if (!Double.isNaN(previous)) {
                assertEquals(Math.pow(10, 0.45), step / previous, 0.15, "decade ratio at lid " + lid + " m");
            }
            previous = step;
        }
    }

    @Test
    void everyWaterContentDownToTracesSolvesAndMoreWaterNeverMakesLessMelt() {
        // a nearly dry melt saturates within nanometres of the top (the event lands on the top
        // itself); more water lowers the solidus, so the column melts no less (common practice)
        for (double tp : new double[] {1300, 1350, 1450}) {
            double previous = DecompressionColumn.of(katz, tp + 273.15, 0.0).solve().meltThickness();
            for (double w = 1e-12; w < 3e-4; w *= 1.5) {
                double melt = DecompressionColumn.of(katz, tp + 273.15, w).solve().meltThickness();
                assertTrue(melt >= previous * (1 - 1e-9), "Tp " + tp + ", water " + w + ": " + melt + " < " + previous);
                previous = melt;
            }
        }
    }

    @Test
    void aLidJustBelowTheSaturationPointChangesTheMeltByNoMoreThanTheLayerAboveIt() {
        // the melt made in the top metres is at most F × their thickness: the integration of that
        // layer (saturated, singular at P = 0) must not move the column's answer by more
        double w = 2e-4;
        ColumnResult open = DecompressionColumn.of(katz, 1350 + 273.15, w).solve();
        for (double lid : new double[] {5.0, 20.0, 100.0}) {
            ColumnResult lidded = DecompressionColumn.of(katz, 1350 + 273.15, w).withLidDepth(lid).solve();
            double diff = open.meltThickness() - lidded.meltThickness();
            assertTrue(diff >= 0 && diff <= open.maxMeltFraction() * lid + 1e-6,
                    "lid " + lid + " m: melt differs by " + diff + " m");
        }
    }
}
