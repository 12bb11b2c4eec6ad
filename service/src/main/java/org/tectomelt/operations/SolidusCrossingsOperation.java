package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.tectomelt.Config;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.Lithology;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.melting.McKenzieBickle1988Peridotite;
import org.tectomelt.engine.melting.SolidusCrossings;
import org.tectomelt.engine.melting.SolidusCrossings.PathPoint;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.units.Units;

/**
 * {@code solidus-crossings}: where a path (a geotherm, an adiabat, or the caller's points) crosses
 * a lithology's solidus and liquidus, with the melt fraction along it. Cheap.
 */
public final class SolidusCrossingsOperation
        implements Operation<SolidusCrossingsOperation.Request, SolidusCrossingsOperation.Result> {

    /** An adiabat path (the spec fills {@code maxDepthKm} and {@code depthStepKm}). */
    public record AdiabatPath(Double potentialTemperatureC, Double maxDepthKm, Double depthStepKm) {
    }

    /** A sample of a caller's path. */
    public record PathSample(Double depthKm, Double temperatureC) {
    }

    /** Exactly one path form; {@code geotherm} is a {@code geotherm} request. */
    public record PathSpec(GeothermOperation.Request geotherm, AdiabatPath adiabat, List<PathSample> points) {
    }

    /** Request. */
    public record Request(String lithology, Double bulkWaterWtPct, List<Choices.MeltCurvePoint> meltCurve,
                          PathSpec path, Double crustThicknessKm, Double crustDensityKgPerM3,
                          Double mantleDensityKgPerM3) {
    }

    /** A crossing. */
    public record CrossingOut(String curve, String direction, double depthKm, double pressureGPa,
                              double temperatureC) {
    }

    /** The path at one sample. */
    public record ProfileOut(double depthKm, double pressureGPa, double temperatureC, double solidusC,
                             Double liquidusC, double meltFraction) {
    }

    /** Crossings, and the path sampled. */
    public record Result(String lithology, List<CrossingOut> crossings, boolean meltPresent, double maxMeltFraction,
                         List<ProfileOut> profile, List<String> warnings, List<ModelInfo> models) {
    }

    private final int maxSamples;

    SolidusCrossingsOperation(Config config) {
        this.maxSamples = config.maxProfilePoints();
    }

    @Override
    public String name() {
        return "solidus-crossings";
    }

    @Override
    public String path() {
        return "/v1/solidus-crossings";
    }

    @Override
    public Class<Request> requestType() {
        return Request.class;
    }

    @Override
    public Cost costClass() {
        return Cost.CHEAP;
    }

    @Override
    public List<Cap> caps() {
        return List.of(new Cap("path.points", maxSamples, "TECTOMELT_MAX_PROFILE_POINTS"));
    }

    @Override
    public String rows() {
        return "profile";
    }

    @Override
    public List<Input> inputs() {
        return List.of(
                new Input("bulkWaterWtPct", "wt%", "bulk water (hydrous models)", true),
                new Input("path.adiabat.potentialTemperatureC", "°C", "potential temperature of an adiabat path", true),
                new Input("path.geotherm.potentialTemperatureC", "°C", "potential temperature of a geotherm path",
                        true),
                new Input("crustThicknessKm", "km", "crust thickness of the column", true));
    }

    @Override
    public List<Output<Result>> outputs() {
        return List.of(
                new Output<>("maxMeltFraction", "1", "largest melt fraction along the path", Result::maxMeltFraction),
                new Output<>("firstSolidusCrossingDepthKm", "km", "depth of the first solidus crossing",
                        r -> r.crossings().stream().filter(c -> c.curve().equals("solidus")).findFirst()
                                .map(CrossingOut::depthKm).orElse(null)));
    }

    @Override
    public void check(Request q, Rules rules) {
        Lithology lithology = Choices.lithology(rules, q.lithology(), q.meltCurve());
        Choices.water(rules, lithology, q.bulkWaterWtPct());
        PathSpec path = q.path();   // exactly one form: the spec says so (minProperties = maxProperties = 1)
        if (path.geotherm() != null) {
            // generated clients send documented defaults; only a value that would change the column is refused
            String[] fields = {"crustThicknessKm", "crustDensityKgPerM3", "mantleDensityKgPerM3"};
            Double[] given = {q.crustThicknessKm(), q.crustDensityKgPerM3(), q.mantleDensityKgPerM3()};
            double[] mantleOnly = {0, LithostaticColumn.CRUST_DENSITY, LithostaticColumn.MANTLE_DENSITY};
            for (int i = 0; i < fields.length; i++) {
                rules.check(given[i] == null || given[i] == mantleOnly[i], fields[i], "does not apply with "
                        + "path.geotherm: the geotherm brings its own pressure column "
                        + "(path.geotherm.lithosphere.crustThicknessKm for a continental one); leave it out");
            }
        }
        if (lithology != null && path.points() != null) {
            double maxDepthKm = maxDepthKm(lithology, column(q));
            for (int i = 0; i < path.points().size(); i++) {
                PathSample s = path.points().get(i);
                if (s != null && s.depthKm() != null) {
                    rules.at("path").at("points", i).within("depthKm", s.depthKm(), 0, maxDepthKm);
                }
            }
        }
    }

    private static LithostaticColumn column(Request q) {
        return new LithostaticColumn(Units.kmToM(q.crustThicknessKm()), q.crustDensityKgPerM3(),
                q.mantleDensityKgPerM3(), LithostaticColumn.G);
    }

    /** The deepest depth (km, to 0.1 km) at which the lithology still gives a number in this column. */
    private static double maxDepthKm(Lithology lithology, LithostaticColumn column) {
        return Math.min(Units.mToKm(LithostaticColumn.MAX_DEPTH_M),
                Math.floor(Units.mToKm(column.depthAt(lithology.hardMaxPressure())) * 10) / 10);
    }

    @Override
    public Result run(Request q, Deadline deadline) {
        Rules rules = new Rules();
        check(q, rules);
        rules.throwIfBroken();
        Lithology lithology = Choices.lithology(rules, q.lithology(), q.meltCurve());
        double water = Choices.water(rules, lithology, q.bulkWaterWtPct());
        PathSpec path = q.path();
        LithostaticColumn column = column(q);
        double maxDepthKm = maxDepthKm(lithology, column);
        List<ModelInfo> models = new ArrayList<>(lithology.citations());
        models.add(LithostaticColumn.INFO);
        SolidusCrossings.Result result;
        Rules at = rules.at("path");
        if (path.geotherm() != null) {
            Rules rg = at.at("geotherm");
            GeothermOperation.Built g = GeothermOperation.build(rg, path.geotherm(), maxSamples);
            double[] depths = g.depths();
            double deepest = depths[depths.length - 1];
            if (g.column().pressureAt(deepest) > lithology.hardMaxPressure()) {
                double limitKm = Math.floor(Units.mToKm(g.column().depthAt(lithology.hardMaxPressure())) * 10) / 10;
                rg.error("maxDepthKm", String.format(Locale.ROOT, "reaches %.2f GPa at %s km, beyond the %s GPa up to "
                        + "which '%s' gives a number: give maxDepthKm of at most %s km",
                        Units.paToGpa(g.column().pressureAt(deepest)), Rules.format(Units.mToKm(deepest)),
                        Rules.format(Units.paToGpa(lithology.hardMaxPressure())), lithology.id(),
                        Rules.format(limitKm)));
                rules.throwIfBroken();
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
            Rules ra = at.at("adiabat");
            if (!(lithology instanceof MantleLithology mantle)) {
                throw new OperationException(at.path("adiabat"), "an adiabat needs a mantle lithology ("
                        + Choices.mantleIds() + "): crustal lithologies carry no adiabat constants; give path.points "
                        + "instead");
            }
            double depth = a.maxDepthKm();
            double step = a.depthStepKm();
            if (ra.within("maxDepthKm", depth, 1, maxDepthKm)) {
                ra.cap("depthStepKm", Math.ceil(depth / step - 1e-9) + 1, maxSamples,
                        "the sample count (over " + Rules.format(depth) + " km at this step)",
                        "TECTOMELT_MAX_PROFILE_POINTS");
            }
            rules.throwIfBroken();
            if (mantle instanceof McKenzieBickle1988Peridotite) {
                models.add(Katz2003Peridotite.INFO);
            }
            result = SolidusCrossings.alongAdiabat(mantle, water, column,
                    Units.celsiusToKelvin(a.potentialTemperatureC()), Units.kmToM(depth), Units.kmToM(step));
        } else {
            List<PathSample> samples = path.points();
            List<PathPoint> points = new ArrayList<>(samples.size());
            for (int i = 0; i < samples.size(); i++) {
                PathSample s = samples.get(i);   // depth within the lithology's reach: checked above
                points.add(new PathPoint(Units.kmToM(s.depthKm()), Units.celsiusToKelvin(s.temperatureC())));
            }
            result = SolidusCrossings.along(lithology, water, column, points);
        }
        return result(lithology, result, models);
    }

    private static Result result(Lithology lithology, SolidusCrossings.Result r, List<ModelInfo> models) {
        List<CrossingOut> crossings = new ArrayList<>(r.crossings().size());
        for (SolidusCrossings.Crossing c : r.crossings()) {
            crossings.add(new CrossingOut(c.curve().name().toLowerCase(Locale.ROOT),
                    c.direction() == SolidusCrossings.Direction.INTO_MELT ? "into-melt" : "out-of-melt",
                    Units.mToKm(c.depth()), Units.paToGpa(c.pressure()), Units.kelvinToCelsius(c.temperature())));
        }
        List<ProfileOut> profile = new ArrayList<>(r.profile().size());
        for (SolidusCrossings.ProfilePoint p : r.profile()) {
            profile.add(new ProfileOut(Units.mToKm(p.depth()), Units.paToGpa(p.pressure()),
                    Units.kelvinToCelsius(p.temperature()), Units.kelvinToCelsius(p.solidus()),
                    MeltFractionOperation.celsiusOrNull(p.liquidus()), p.meltFraction()));
        }
        return new Result(lithology.id(), crossings, r.meltPresent(), r.maxMeltFraction(), profile, r.warnings(),
                List.copyOf(models));
    }
}
