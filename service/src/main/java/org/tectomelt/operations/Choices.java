package org.tectomelt.operations;

import java.util.List;
import org.tectomelt.engine.melting.CrustalLithology;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.Lithology;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.melting.MeltCurve;
import org.tectomelt.engine.units.Units;

/**
 * Choices the spec cannot enumerate because the engine's catalogue decides them (lithology ids, what
 * a lithology accepts), shared by the operations.
 */
final class Choices {

    private Choices() {
    }

    /** A point of a caller's melt curve (range-checked by the spec; order checked here). */
    public record MeltCurvePoint(Double temperatureC, Double meltFraction) {
    }

    static List<String> mantleIds() {
        return Lithologies.all().stream().filter(MantleLithology.class::isInstance).map(Lithology::id).toList();
    }

    static List<String> crustalIds() {
        return Lithologies.all().stream().filter(CrustalLithology.class::isInstance).map(Lithology::id).toList();
    }

    /** The lithology named {@code id}, or null after recording a violation that lists the valid ids. */
    static Lithology lithology(Rules rules, String id) {
        Lithology l = id == null ? null : Lithologies.byId(id).orElse(null);
        if (l == null) {
            rules.error("lithology", "must be one of " + Lithologies.ids() + ", got '" + abbreviate(id) + "'");
        }
        return l;
    }

    /** The lithology named by the request, with the caller's melt curve where given; null after a violation. */
    static Lithology lithology(Rules rules, String id, List<MeltCurvePoint> curve) {
        Lithology l = lithology(rules, id);
        if (l == null || curve == null) {
            return l;
        }
        if (!(l instanceof CrustalLithology crustal)) {
            rules.error("meltCurve", "only crustal lithologies accept a melt curve (" + crustalIds() + "); '" + id
                    + "' is a published mantle parameterization");
            return null;
        }
        MeltCurve parsed = meltCurve(rules, curve);
        return parsed == null ? null : crustal.withCurve(parsed);
    }

    /** The mantle lithology named {@code id} (the spec fills its default); null after a violation. */
    static MantleLithology mantleLithology(Rules rules, String id) {
        Lithology l = Lithologies.byId(id).orElse(null);
        if (l instanceof MantleLithology m) {
            return m;
        }
        rules.error("lithology", "must be one of " + mantleIds() + ", got '" + abbreviate(id) + "'");
        return null;
    }

    /**
     * A caller's melt curve (ranges already checked by the spec): temperatures must increase
     * strictly, melt fractions must not decrease. Null after a violation.
     */
    static MeltCurve meltCurve(Rules rules, List<MeltCurvePoint> points) {
        double[] t = new double[points.size()];
        double[] f = new double[points.size()];
        for (int i = 0; i < points.size(); i++) {
            t[i] = points.get(i).temperatureC();
            f[i] = points.get(i).meltFraction();
            Rules at = rules.at("meltCurve", i);
            if (i > 0 && !(t[i] > t[i - 1])) {
                at.error("temperatureC", "must be greater than meltCurve[" + (i - 1)
                        + "].temperatureC (temperatures must increase strictly), got " + Rules.format(t[i]));
            }
            if (i > 0 && f[i] < f[i - 1]) {
                at.error("meltFraction", "must not be less than meltCurve[" + (i - 1)
                        + "].meltFraction (melt fraction must not decrease with temperature), got "
                        + Rules.format(f[i]));
            }
        }
        if (!rules.ok()) {
            return null;
        }
        for (int i = 0; i < t.length; i++) {
            t[i] = Units.celsiusToKelvin(t[i]);
        }
        return new MeltCurve(t, f);
    }

    /**
     * Bulk water (mass fraction) for a melting model: the spec bounds the field for every model; a
     * dry model takes none, a hydrous one at most its own maximum.
     */
    static double water(Rules rules, Lithology lithology, double wtPct) {
        if (lithology == null) {
            return 0;
        }
        if (!lithology.hydrous()) {
            rules.check(wtPct == 0, "bulkWaterWtPct", "'" + lithology.id() + "' takes no bulk water ("
                    + (lithology instanceof CrustalLithology ? "its melt curve already fixes the water conditions"
                    : "it is a dry model") + "): give 0 or leave it out, got " + Rules.format(wtPct));
            return 0;
        }
        rules.within("bulkWaterWtPct", wtPct, 0, Units.fractionToWtPct(lithology.maxBulkWater()));
        return Units.wtPctToFraction(wtPct);
    }

    /** Bulk water (mass fraction) of a mantle source for a column: 0 only for a dry-only model. */
    static double mantleWater(Rules rules, MantleLithology lithology, double wtPct) {
        if (lithology == null) {
            return 0;
        }
        double max = Units.fractionToWtPct(lithology.maxBulkWater());
        if (max == 0) {
            rules.check(wtPct == 0, "bulkWaterWtPct", "must be 0 for " + lithology.id()
                    + ", a dry-only melting model");
            return 0;
        }
        rules.within("bulkWaterWtPct", wtPct, 0, max);
        return Units.wtPctToFraction(wtPct);
    }

    static String abbreviate(String s) {
        return s == null ? "" : s.length() <= 40 ? s : s.substring(0, 40) + "…";
    }
}
