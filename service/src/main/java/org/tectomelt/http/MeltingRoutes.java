package org.tectomelt.http;

import org.tectomelt.contract.Json;
import io.javalin.http.Context;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.tectomelt.Config;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.CrustalLithology;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.Lithology;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.melting.McKenzieBickle1988Peridotite;
import org.tectomelt.engine.melting.MeltCurve;
import org.tectomelt.engine.melting.SolidusCrossings;
import org.tectomelt.engine.melting.SolidusCrossings.PathPoint;
import org.tectomelt.engine.melting.ThermalProperties;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.units.Units;

/**
 * {@code GET /v1/lithologies}, {@code POST /v1/melt-fraction} and {@code POST /v1/solidus-crossings}:
 * the melting models, melt fraction at points, and where a path crosses solidus and liquidus.
 */
final class MeltingRoutes {

    /** Most points in a caller's melt curve. */
    static final int MAX_CURVE_POINTS = 1000;
    /** Temperature range accepted anywhere (°C). */
    static final double MIN_TEMPERATURE_C = -50, MAX_TEMPERATURE_C = 3000;
    /** Potential temperature range of an adiabat (°C). */
    static final double MIN_TP_C = 800, MAX_TP_C = 2000;
    /** Default deepest adiabat sample (km) and spacing (km). */
    static final double DEFAULT_ADIABAT_DEPTH_KM = 200, DEFAULT_ADIABAT_STEP_KM = 1;

    private MeltingRoutes() {
    }

    /**
     * Cheap routes: a batch holds at most {@code TECTOMELT_MAX_BATCH_POINTS} points (default 10,000,
     * about 1 µs each), a path at most {@code TECTOMELT_MAX_PROFILE_POINTS} samples (default 5,000).
     */
    static List<Route> routes(Config config) {
        int profile = config.maxProfilePoints();
        return List.of(
                Route.get("/v1/lithologies", MeltingRoutes::lithologies),
                Route.post("/v1/solidus-crossings", ctx -> solidusCrossings(ctx, profile)));
    }

    // ---- records -------------------------------------------------------------------------

    /** Thermal properties of a crustal lithology. */
    record ThermalPropertiesOut(double densityKgPerM3, double heatCapacityJPerKgK, double latentHeatJPerKg,
                                double conductivityWPerMK) {
    }

    /** One lithology of the catalogue. */
    record LithologyOut(String id, String name, String kind, boolean hydrous, List<Double> pressureRangeGPa,
                        double maxPressureGPa, double maxBulkWaterWtPct, boolean acceptsMeltCurve,
                        ThermalPropertiesOut thermalProperties, List<ModelInfo> citations) {
    }

    /** A point of a caller's melt curve. */
    record MeltCurvePoint(Double temperatureC, Double meltFraction) {
    }

    /** An adiabat path. */
    record AdiabatPath(Double potentialTemperatureC, Double maxDepthKm, Double depthStepKm) {
    }

    /** A sample of a caller's path. */
    record PathSample(Double depthKm, Double temperatureC) {
    }

    /** One of the path forms; {@code geotherm} is a {@code POST /v1/geotherm} request body. */
    record PathSpec(GeothermRoutes.GeothermRequest geotherm, AdiabatPath adiabat, List<PathSample> points) {
    }

    /** Request body of {@code /v1/solidus-crossings}. */
    record SolidusCrossingsRequest(String lithology, Double bulkWaterWtPct, List<MeltCurvePoint> meltCurve,
                                   PathSpec path, Double crustThicknessKm, Double crustDensityKgPerM3,
                                   Double mantleDensityKgPerM3) {
    }

    /** A crossing. */
    record CrossingOut(String curve, String direction, double depthKm, double pressureGPa, double temperatureC) {
    }

    /** The path at one sample. */
    record ProfileOut(double depthKm, double pressureGPa, double temperatureC, double solidusC, Double liquidusC,
                      double meltFraction) {
    }

    /** Response of {@code /v1/solidus-crossings}. */
    record SolidusCrossingsResponse(String lithology, List<CrossingOut> crossings, boolean meltPresent,
                                    double maxMeltFraction, List<ProfileOut> profile, List<String> warnings,
                                    List<ModelInfo> models) {
    }

    // ---- handlers ------------------------------------------------------------------------

    static void lithologies(Context ctx) {
        List<LithologyOut> out = new ArrayList<>();
        for (Lithology l : Lithologies.all()) {
            ThermalPropertiesOut thermal = null;
            if (l instanceof CrustalLithology c) {
                ThermalProperties t = c.thermalProperties();
                thermal = new ThermalPropertiesOut(t.density(), t.heatCapacity(), t.latentHeat(), t.conductivity());
            }
            out.add(new LithologyOut(l.id(), l.name(), kind(l), l.hydrous(),
                    List.of(Units.paToGpa(l.minPressure()), Units.paToGpa(l.maxPressure())),
                    Units.paToGpa(l.hardMaxPressure()), Units.fractionToWtPct(l.maxBulkWater()),
                    l instanceof CrustalLithology, thermal, l.citations()));
        }
        Responses.json(ctx, out);
    }

    static void solidusCrossings(Context ctx, int maxSamples) {
        SolidusCrossingsRequest req = Json.read(ctx.bodyAsBytes(), SolidusCrossingsRequest.class);
        Validation v = new Validation();
        Lithology lithology = lithology(v, req.lithology(), req.meltCurve());
        double water = water(v, lithology, req.bulkWaterWtPct());
        double crustKm = v.optional("crustThicknessKm", req.crustThicknessKm(), 0, 0, 100);
        double rhoC = v.optional("crustDensityKgPerM3", req.crustDensityKgPerM3(), LithostaticColumn.CRUST_DENSITY,
                2000, 3500);
        double rhoM = v.optional("mantleDensityKgPerM3", req.mantleDensityKgPerM3(), LithostaticColumn.MANTLE_DENSITY,
                2800, 4500);
        PathSpec path = req.path();
        if (!v.present("path", path)) {
            v.throwIfInvalid();
        }
        int forms = (path.geotherm() != null ? 1 : 0) + (path.adiabat() != null ? 1 : 0)
                + (path.points() != null ? 1 : 0);
        if (forms != 1) {
            v.error("path", "give exactly one of path.geotherm, path.adiabat or path.points");
        }
        if (path.geotherm() != null) {
            // generated clients send documented defaults; only a value that would change the column is refused
            String[] fields = {"crustThicknessKm", "crustDensityKgPerM3", "mantleDensityKgPerM3"};
            Double[] given = {req.crustThicknessKm(), req.crustDensityKgPerM3(), req.mantleDensityKgPerM3()};
            double[] defaults = {0, LithostaticColumn.CRUST_DENSITY, LithostaticColumn.MANTLE_DENSITY};
            for (int i = 0; i < fields.length; i++) {
                v.check(given[i] == null || given[i] == defaults[i], fields[i], "does not apply with path.geotherm: "
                        + "the geotherm brings its own pressure column (path.geotherm.lithosphere.crustThicknessKm for "
                        + "a continental one); leave it out");
            }
        }
        v.throwIfInvalid();
        LithostaticColumn column = new LithostaticColumn(Units.kmToM(crustKm), rhoC, rhoM, LithostaticColumn.G);
        double maxDepthKm = Math.min(Units.mToKm(LithostaticColumn.MAX_DEPTH_M),
                Math.floor(Units.mToKm(column.depthAt(lithology.hardMaxPressure())) * 10) / 10);
        List<ModelInfo> models = new ArrayList<>(lithology.citations());
        models.add(LithostaticColumn.INFO);
        SolidusCrossings.Result result;
        if (path.geotherm() != null) {
            Validation vg = v.at("path").at("geotherm");
            GeothermRoutes.BuiltGeotherm g = GeothermRoutes.build(vg, path.geotherm(), maxSamples);
            double[] depths = g.depths();
            double deepest = depths[depths.length - 1];
            if (g.column().pressureAt(deepest) > lithology.hardMaxPressure()) {
                double limitKm = Math.floor(Units.mToKm(g.column().depthAt(lithology.hardMaxPressure())) * 10) / 10;
                vg.error("maxDepthKm", String.format(Locale.ROOT, "reaches %.2f GPa at %s km, beyond the %s GPa up to "
                        + "which '%s' gives a number: give maxDepthKm of at most %s km",
                        Units.paToGpa(g.column().pressureAt(deepest)), Validation.format(Units.mToKm(deepest)),
                        Validation.format(Units.paToGpa(lithology.hardMaxPressure())), lithology.id(),
                        Validation.format(limitKm)));
                v.throwIfInvalid();
            }
            double[] temperatures = new double[depths.length];
            List<PathPoint> points = new ArrayList<>(depths.length);
            for (int i = 0; i < depths.length; i++) {
                temperatures[i] = g.geotherm().temperatureAt(depths[i]);
                points.add(new PathPoint(depths[i], temperatures[i]));
            }
            SolidusCrossings.Result r = SolidusCrossings.along(lithology, water, g.column(), points);
            List<String> warnings = new ArrayList<>(g.allWarnings(temperatures));
            warnings.addAll(r.warnings());
            result = new SolidusCrossings.Result(r.crossings(), r.profile(), r.meltPresent(), r.maxMeltFraction(),
                    warnings);
            models = new ArrayList<>(lithology.citations());
            models.addAll(g.models());
        } else if (path.adiabat() != null) {
            AdiabatPath a = path.adiabat();
            Validation va = v.at("path").at("adiabat");
            if (!(lithology instanceof MantleLithology mantle)) {
                v.at("path").error("adiabat", "an adiabat needs a mantle lithology (" + mantleIds()
                        + "): crustal lithologies carry no adiabat constants; give path.points instead");
                v.throwIfInvalid();
                return;
            }
            double tp = va.required("potentialTemperatureC", a.potentialTemperatureC(), MIN_TP_C, MAX_TP_C);
            double depth = va.optional("maxDepthKm", a.maxDepthKm(), Math.min(DEFAULT_ADIABAT_DEPTH_KM, maxDepthKm),
                    1, maxDepthKm);
            double step = va.optional("depthStepKm", a.depthStepKm(), DEFAULT_ADIABAT_STEP_KM, 0.01, 50);
            if (va.ok()) {
                va.cap("depthStepKm", Math.ceil(depth / step - 1e-9) + 1, maxSamples,
                        "the sample count (over " + Validation.format(depth) + " km at this step)",
                        "TECTOMELT_MAX_PROFILE_POINTS");
            }
            v.throwIfInvalid();
            if (mantle instanceof McKenzieBickle1988Peridotite) {
                models.add(Katz2003Peridotite.INFO);
            }
            result = SolidusCrossings.alongAdiabat(mantle, water, column, Units.celsiusToKelvin(tp),
                    Units.kmToM(depth), Units.kmToM(step));
        } else {
            List<PathSample> samples = v.at("path").list("points", path.points(), 2, maxSamples,
                    "TECTOMELT_MAX_PROFILE_POINTS");
            List<PathPoint> points = new ArrayList<>(samples.size());
            for (int i = 0; i < samples.size(); i++) {
                PathSample s = samples.get(i);
                if (s == null) {
                    v.at("path").error("points[" + i + "]", "must be an object with depthKm and temperatureC");
                    continue;
                }
                Validation at = v.at("path").at("points", i);
                double z = at.required("depthKm", s.depthKm(), 0, maxDepthKm);
                double t = at.required("temperatureC", s.temperatureC(), MIN_TEMPERATURE_C, MAX_TEMPERATURE_C);
                points.add(new PathPoint(Units.kmToM(z), Units.celsiusToKelvin(t)));
            }
            v.throwIfInvalid();
            result = SolidusCrossings.along(lithology, water, column, points);
        }
        Responses.json(ctx, response(lithology, result, models));
    }

    // ---- helpers -------------------------------------------------------------------------

    private static SolidusCrossingsResponse response(Lithology lithology, SolidusCrossings.Result r,
                                                     List<ModelInfo> models) {
        List<CrossingOut> crossings = new ArrayList<>(r.crossings().size());
        for (SolidusCrossings.Crossing c : r.crossings()) {
            crossings.add(new CrossingOut(c.curve().name().toLowerCase(Locale.ROOT),
                    c.direction() == SolidusCrossings.Direction.INTO_MELT ? "into-melt" : "out-of-melt",
                    Units.mToKm(c.depth()), Units.paToGpa(c.pressure()), Units.kelvinToCelsius(c.temperature())));
        }
        List<ProfileOut> profile = new ArrayList<>(r.profile().size());
        for (SolidusCrossings.ProfilePoint p : r.profile()) {
            profile.add(new ProfileOut(Units.mToKm(p.depth()), Units.paToGpa(p.pressure()),
                    Units.kelvinToCelsius(p.temperature()), Units.kelvinToCelsius(p.solidus()), celsiusOrNull(p.liquidus()),
                    p.meltFraction()));
        }
        return new SolidusCrossingsResponse(lithology.id(), crossings, r.meltPresent(), r.maxMeltFraction(), profile,
                r.warnings(), List.copyOf(models));
    }

    private static Double celsiusOrNull(double kelvin) {
        return Double.isFinite(kelvin) ? Units.kelvinToCelsius(kelvin) : null;
    }

    private static String kind(Lithology l) {
        return l.kind().name().toLowerCase(Locale.ROOT);
    }

    private static List<String> mantleIds() {
        return Lithologies.all().stream().filter(MantleLithology.class::isInstance).map(Lithology::id).toList();
    }

    private static List<String> crustalIds() {
        return Lithologies.all().stream().filter(CrustalLithology.class::isInstance).map(Lithology::id).toList();
    }

    /** The lithology named by the request, with the caller's melt curve where given; null after an error. */
    private static Lithology lithology(Validation v, String id, List<MeltCurvePoint> curve) {
        String chosen = v.requiredChoice("lithology", id, Lithologies.ids());
        if (chosen == null || !v.ok()) {
            return null;
        }
        Lithology l = Lithologies.byId(chosen).orElseThrow();
        if (curve == null) {
            return l;
        }
        if (!(l instanceof CrustalLithology crustal)) {
            v.error("meltCurve", "only crustal lithologies accept a melt curve (" + crustalIds() + "); '" + chosen
                    + "' is a published mantle parameterization");
            return null;
        }
        MeltCurve parsed = meltCurve(v, curve);
        return parsed == null ? null : crustal.withCurve(parsed);
    }

    /** Validates and converts a caller's melt curve; null after an error. */
    static MeltCurve meltCurve(Validation v, List<MeltCurvePoint> curve) {
        List<MeltCurvePoint> points = v.list("meltCurve", curve, 2, MAX_CURVE_POINTS);
        if (!v.ok()) {
            return null;
        }
        double[] t = new double[points.size()];
        double[] f = new double[points.size()];
        for (int i = 0; i < points.size(); i++) {
            MeltCurvePoint pt = points.get(i);
            if (pt == null) {
                v.error("meltCurve[" + i + "]", "must be an object with temperatureC and meltFraction");
                continue;
            }
            Validation at = v.at("meltCurve", i);
            t[i] = at.required("temperatureC", pt.temperatureC(), MIN_TEMPERATURE_C, MAX_TEMPERATURE_C);
            f[i] = at.required("meltFraction", pt.meltFraction(), 0, 1);
            if (i > 0 && Double.isFinite(t[i]) && Double.isFinite(t[i - 1]) && !(t[i] > t[i - 1])) {
                at.error("temperatureC", "must be greater than meltCurve[" + (i - 1)
                        + "].temperatureC (temperatures must increase strictly), got " + Validation.format(t[i]));
            }
            if (i > 0 && Double.isFinite(f[i]) && Double.isFinite(f[i - 1]) && f[i] < f[i - 1]) {
                at.error("meltFraction", "must not be less than meltCurve[" + (i - 1)
                        + "].meltFraction (melt fraction must not decrease with temperature), got "
                        + Validation.format(f[i]));
            }
        }
        if (!v.ok()) {
            return null;
        }
        for (int i = 0; i < t.length; i++) {
            t[i] = Units.celsiusToKelvin(t[i]);
        }
        return new MeltCurve(t, f);
    }

    /** Bulk water (mass fraction) within what the lithology allows. */
    private static double water(Validation v, Lithology lithology, Double wtPct) {
        if (lithology == null) {
            return 0;
        }
        if (!lithology.hydrous()) {
            if (wtPct != null && wtPct != 0) {
                v.error("bulkWaterWtPct", "'" + lithology.id() + "' takes no bulk water ("
                        + (lithology instanceof CrustalLithology ? "its melt curve already fixes the water conditions"
                        : "it is a dry model") + "): give 0 or leave it out, got " + Validation.format(wtPct));
            }
            return 0;
        }
        double max = Units.fractionToWtPct(lithology.maxBulkWater());
        return Units.wtPctToFraction(v.optional("bulkWaterWtPct", wtPct, 0, 0, max));
    }
}
