package org.tectomelt.engine.settings;

import java.util.Locale;
import java.util.OptionalDouble;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.units.Units;

/**
 * The same wedge point with the water-saturated solidus of Katz et al. (2003) and with the
 * experimental one (Grove et al. 2006; Till et al. 2012, {@link
 * org.tectomelt.engine.melting.WaterSaturatedPeridotiteSolidus}), so a response can state the
 * difference and what it changes: the water needed to start melting and the melt at the given water.
 * SI units: K, mass fractions.
 *
 * @param katzSaturatedSolidus         Katz et al. (2003) saturated solidus (K)
 * @param experimentalSaturatedSolidus the experimental saturated solidus (K)
 * @param katzWaterForOnset            least bulk water for melting with Katz's curve; empty when none melts
 * @param experimentalWaterForOnset    the same with the experimental curve
 * @param katzMeltFraction             melt fraction at the given water with Katz's curve
 * @param experimentalMeltFraction     the same with the experimental curve
 */
public record WetSolidusComparison(double katzSaturatedSolidus, double experimentalSaturatedSolidus,
                                   OptionalDouble katzWaterForOnset, OptionalDouble experimentalWaterForOnset,
                                   double katzMeltFraction, double experimentalMeltFraction) {

    /** Both curves at pressure {@code p} (Pa), temperature {@code t} (K) and bulk water (mass fraction). */
    public static WetSolidusComparison at(Katz2003Peridotite source, double p, double t, double bulkWater) {
        Katz2003Peridotite katz = new Katz2003Peridotite(source.cpxMode(), Katz2003Peridotite.WetSolidus.KATZ2003);
        Katz2003Peridotite exp = katz.withExperimentalWetSolidus();
        SubductionWedge a = new SubductionWedge(katz);
        SubductionWedge b = new SubductionWedge(exp);
        return new WetSolidusComparison(katz.saturatedSolidus(p), exp.saturatedSolidus(p), a.waterForOnset(p, t),
                b.waterForOnset(p, t), katz.meltFraction(p, t, bulkWater), exp.meltFraction(p, t, bulkWater));
    }

    /** Katz's saturated solidus minus the experimental one (K): positive where the experiments melt colder. */
    public double difference() {
        return katzSaturatedSolidus - experimentalSaturatedSolidus;
    }

    /** The difference and its consequences, in words. */
    public String describe() {
        return String.format(Locale.ROOT, "water-saturated solidus: Katz et al. (2003) %.0f °C, experimental (Grove et "
                        + "al. 2006; Till et al. 2012) %.0f °C, %.0f K %s; water to start melting here: %s with Katz's "
                        + "curve, %s with the experimental one; melt fraction at the given water: %.3g vs %.3g",
                Units.kelvinToCelsius(katzSaturatedSolidus), Units.kelvinToCelsius(experimentalSaturatedSolidus),
                Math.abs(difference()), difference() >= 0 ? "colder in the experiments" : "hotter in the experiments",
                water(katzWaterForOnset), water(experimentalWaterForOnset), katzMeltFraction, experimentalMeltFraction);
    }

    private static String water(OptionalDouble w) {
        return w.isPresent() ? String.format(Locale.ROOT, "%.3g wt%%", Units.fractionToWtPct(w.getAsDouble()))
                : "none (at or below the saturated solidus)";
    }
}
