package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.crust.ConductivityLaw;
import org.tectomelt.engine.crust.MeltingIntervals;
import org.tectomelt.engine.crust.Miao2014Conductivity;
import org.tectomelt.engine.melting.CrustalLithology;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.MeltCurve;
import org.tectomelt.engine.melting.ThermalProperties;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.units.Units;

/**
 * The rocks of the crustal heating operations (budget and sill): properties that default to the
 * named lithology's, a melt curve or a melting interval, a conductivity law. Ranges are the spec's.
 */
final class CrustalRocks {

    static final String LAW_CONSTANT = "constant";
    static final String LAW_GRANITE = "miao2014-granite";
    static final String LAW_GABBRO = "miao2014-gabbro";

    private CrustalRocks() {
    }

    /** One point of a user melt curve. */
    public record MeltPoint(Double temperatureC, Double meltFraction) {
    }

    /** One row of a user melt table F(T, P): a pressure and the melt curve there. */
    public record TableRow(Double pressureGPa, List<MeltPoint> meltCurve) {
    }

    /**
     * A user melt table F(T, P) from its rows ({@code meltTable[r].meltCurve[i]} and
     * {@code meltTable[r].pressureGPa} named in the violations); null after a violation.
     */
    static org.tectomelt.engine.melting.MeltTable meltTable(Rules rules, List<TableRow> rows) {
        double[] p = new double[rows.size()];
        List<MeltCurve> curves = new ArrayList<>(rows.size());
        boolean good = true;
        for (int r = 0; r < rows.size(); r++) {
            Rules rv = rules.at("meltTable", r);
            p[r] = rows.get(r).pressureGPa() * 1e9;
            if (r > 0 && !(p[r] > p[r - 1])) {
                rv.error("pressureGPa", "pressures must increase strictly from row to row");
                good = false;
            }
            MeltCurve c = meltCurve(rv, rows.get(r).meltCurve(), null);
            if (c == null) {
                good = false;
                continue;
            }
            if (c.fraction(0) != 0) {
                rv.at("meltCurve", 0).error("meltFraction", "each row must start at melt fraction 0, its solidus");
                good = false;
            } else if (!curves.isEmpty() && Math.abs(c.maxFraction() - curves.get(0).maxFraction()) > 1e-12) {
                rv.at("meltCurve", c.size() - 1).error("meltFraction", "every row must end at the same largest melt "
                        + "fraction (row 0 ends at " + Rules.format(curves.get(0).maxFraction()) + ")");
                good = false;
            }
            curves.add(c);
        }
        return good ? new org.tectomelt.engine.melting.MeltTable(p, curves) : null;
    }

    /** Solidus and liquidus of a linear (or, when equal, isothermal) melting interval. */
    public record MeltingInterval(Double solidusC, Double liquidusC) {
    }

    /**
     * One rock's density, heat capacity, latent heat and melt curve: the named lithology's defaults
     * under the request's explicit values, which are required when no lithology is named. The curve
     * is the request's {@code meltCurve} or {@code meltingInterval}, else the lithology's curve at
     * the given pressure.
     */
    record RockInput(CrustalLithology lithology, double density, double heatCapacity, double latentHeat,
                     MeltCurve curve, List<String> warnings, boolean usedLithology) {

        /** The lithology's citations, when it supplied anything. */
        List<ModelInfo> citations() {
            return usedLithology ? lithology.citations() : List.of();
        }
    }

    /** Reads one rock; violations are recorded under {@code rules}' prefix. */
    static RockInput read(Rules rules, String role, String lithologyId, Double density, Double heatCapacity,
                          Double latentHeat, List<MeltPoint> points, MeltingInterval interval, double pressure,
                          boolean conductivityGiven) {
        CrustalLithology lith = lithologyId == null ? null : Lithologies.crustalById(lithologyId).orElse(null);
        ThermalProperties defaults = lith == null ? null : lith.thermalProperties();
        double rho = property(rules, "densityKgPerM3", density, defaults == null ? null : defaults.density());
        double cp = property(rules, "heatCapacityJPerKgK", heatCapacity,
                defaults == null ? null : defaults.heatCapacity());
        double latent = property(rules, "latentHeatJPerKg", latentHeat, defaults == null ? null : defaults.latentHeat());
        MeltCurve curve = meltCurve(rules, points, interval);
        List<String> warnings = new ArrayList<>();
        boolean used = lith != null && (density == null || heatCapacity == null || latentHeat == null
                || !conductivityGiven || (points == null && interval == null));
        if (curve == null && points == null && interval == null && lith != null && rules.ok()) {
            curve = lith.curveAt(pressure);
            for (String w : lith.melt(pressure, curve.solidus(), 0).warnings()) {
                warnings.add(role + " (" + lith.id() + "): " + w);
            }
        }
        return new RockInput(lith, rho, cp, latent, curve, warnings, used);
    }

    /** A number that defaults to the lithology's value, or is required when there is none. */
    private static double property(Rules rules, String name, Double value, Double fallback) {
        if (value != null) {
            return value;
        }
        if (fallback != null) {
            return fallback;
        }
        rules.error(name, "is required when no lithology is named");
        return Double.NaN;
    }

    /** A rock of a request that may give its melting as a curve or as an interval. */
    interface CurveFields {
        List<MeltPoint> meltCurve();

        MeltingInterval meltingInterval();
    }

    /**
     * The one rule between a rock's curve fields that can be checked on any body, for the crust and
     * the intrusion of a heating request (either may be absent): not both.
     */
    static void checkOneCurve(Rules rules, CurveFields crust, CurveFields intrusion) {
        checkOneCurve(rules.at("crust"), crust);
        checkOneCurve(rules.at("intrusion"), intrusion);
    }

    private static void checkOneCurve(Rules rules, CurveFields rock) {
        if (rock != null) {
            rules.check(rock.meltCurve() == null || rock.meltingInterval() == null, "meltingInterval",
                    "give meltCurve or meltingInterval, not both");
        }
    }

    /** {@code meltCurve} or {@code meltingInterval} of one rock (at most one of them); null when neither. */
    static MeltCurve meltCurve(Rules rules, List<MeltPoint> points, MeltingInterval interval) {
        if (points != null && interval != null) {
            rules.error("meltingInterval", "give meltCurve or meltingInterval, not both");
            return null;
        }
        if (interval != null) {
            double ts = interval.solidusC();
            double tl = interval.liquidusC();
            if (!rules.at("meltingInterval").check(tl >= ts, "liquidusC", "must not be below solidusC ("
                    + Rules.format(ts) + ")")) {
                return null;
            }
            return MeltingIntervals.linear(Units.celsiusToKelvin(ts), Units.celsiusToKelvin(tl));
        }
        if (points == null) {
            return null;
        }
        double[] t = new double[points.size()];
        double[] f = new double[points.size()];
        boolean good = true;
        for (int i = 0; i < points.size(); i++) {
            t[i] = points.get(i).temperatureC();
            f[i] = points.get(i).meltFraction();
            Rules pv = rules.at("meltCurve", i);
            if (i > 0 && !(t[i] > t[i - 1])) {
                pv.error("temperatureC", "temperatures must increase strictly along the curve");
                good = false;
            }
            if (i > 0 && f[i] < f[i - 1]) {
                pv.error("meltFraction", "melt fraction must not decrease with temperature");
                good = false;
            }
        }
        if (!good) {
            return null;
        }
        double[] tk = new double[t.length];
        for (int i = 0; i < t.length; i++) {
            tk[i] = Units.celsiusToKelvin(t[i]);
        }
        return new MeltCurve(tk, f);
    }

    /** Conductivity law of a rock from its request fields (the spec fills the law's default); null after a violation. */
    static ConductivityLaw law(Rules rules, String law, Double conductivity, CrustalLithology lith) {
        if (!LAW_CONSTANT.equals(law) && conductivity != null) {
            rules.error("conductivityWPerMK", "give it only with conductivityLaw 'constant'; the law '" + law
                    + "' sets the conductivity");
            return null;
        }
        if (LAW_GRANITE.equals(law)) {
            return Miao2014Conductivity.GRANITE;
        }
        if (LAW_GABBRO.equals(law)) {
            return Miao2014Conductivity.GABBRO;
        }
        double k = property(rules, "conductivityWPerMK", conductivity,
                lith == null ? null : lith.thermalProperties().conductivity());
        return Double.isNaN(k) ? null : ConductivityLaw.constant(k);
    }

    /**
     * Lithostatic pressure (Pa) at depth {@code z} (m) within a crust of the given density, else the
     * named lithology's, else the engine's default crust density.
     */
    static double crustPressure(String lithologyId, Double density, double z) {
        CrustalLithology lith = lithologyId == null ? null : Lithologies.crustalById(lithologyId).orElse(null);
        double rho = density != null ? density
                : lith != null ? lith.thermalProperties().density() : LithostaticColumn.CRUST_DENSITY;
        return LithostaticColumn.crustOnly(rho).pressureAt(z);
    }

    /** Adds each citation not yet listed. */
    static void addAll(List<ModelInfo> models, List<ModelInfo> more) {
        for (ModelInfo m : more) {
            if (!models.contains(m)) {
                models.add(m);
            }
        }
    }
}
