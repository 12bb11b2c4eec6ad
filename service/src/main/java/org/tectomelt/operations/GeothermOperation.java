package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.OptionalDouble;
import java.util.Set;
import java.util.TreeSet;
import java.util.function.DoubleFunction;
import org.tectomelt.Config;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.thermal.ConductiveGeotherm;
import org.tectomelt.engine.thermal.ContinentalGeotherm;
import org.tectomelt.engine.thermal.ContinentalGeotherm.HeatProduction;
import org.tectomelt.engine.thermal.Geotherm;
import org.tectomelt.engine.thermal.HalfSpaceCooling;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.thermal.MantleAdiabat;
import org.tectomelt.engine.thermal.OceanicLithosphere;
import org.tectomelt.engine.thermal.PlateCooling;
import org.tectomelt.engine.thermal.PlateParameters;
import org.tectomelt.engine.units.Units;

/**
 * {@code geotherm}: temperature and pressure with depth for oceanic (half-space or plate) or
 * continental lithosphere, optionally joined to a mantle adiabat, or the adiabat alone. Cheap.
 *
 * <p>The lithosphere's defaults depend on its type, so they are the engine models' constants
 * ({@link HalfSpaceCooling}, {@link PlateParameters}, {@link ContinentalGeotherm}), not spec
 * defaults; the spec states the ranges.
 */
public final class GeothermOperation implements Operation<GeothermOperation.Request, GeothermOperation.Result> {

    /** Above this, a purely conductive geotherm earns a warning (°C). */
    static final double HOT_CONDUCTIVE_C = 1600;

    static final String HALF_SPACE = "oceanic-half-space";
    static final String PLATE = "oceanic-plate";
    static final String CONTINENTAL = "continental";

    private static final Set<String> OCEANIC_FIELDS = Set.of("type", "ageMyr", "mantleTemperatureC",
            "surfaceTemperatureC", "conductivityWPerMK", "diffusivityM2PerS");
    private static final Set<String> PLATE_FIELDS = union(OCEANIC_FIELDS, Set.of("plateThicknessKm", "parameterSet"));
    private static final Set<String> CONTINENTAL_FIELDS = Set.of("type", "surfaceHeatFlowMWPerM2",
            "reducedHeatFlowFraction", "heatProductionScaleKm", "heatProduction", "conductivityWPerMK",
            "surfaceTemperatureC", "crustThicknessKm");

    /** Request (the spec fills {@code maxDepthKm} and {@code stepKm}). */
    public record Request(Lithosphere lithosphere, Double potentialTemperatureC, Double maxDepthKm, Double stepKm) {
    }

    /** The lithosphere: {@code type} plus the fields of that type. */
    public record Lithosphere(String type, Double ageMyr, Double mantleTemperatureC, Double plateThicknessKm,
                              Double surfaceTemperatureC, Double conductivityWPerMK, Double diffusivityM2PerS,
                              String parameterSet, Double surfaceHeatFlowMWPerM2, Double reducedHeatFlowFraction,
                              Double heatProductionScaleKm, String heatProduction, Double crustThicknessKm) {

        /** Every field by its JSON name, in declaration order (nulls included). */
        Map<String, Object> fields() {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("type", type);
            m.put("ageMyr", ageMyr);
            m.put("mantleTemperatureC", mantleTemperatureC);
            m.put("plateThicknessKm", plateThicknessKm);
            m.put("surfaceTemperatureC", surfaceTemperatureC);
            m.put("conductivityWPerMK", conductivityWPerMK);
            m.put("diffusivityM2PerS", diffusivityM2PerS);
            m.put("parameterSet", parameterSet);
            m.put("surfaceHeatFlowMWPerM2", surfaceHeatFlowMWPerM2);
            m.put("reducedHeatFlowFraction", reducedHeatFlowFraction);
            m.put("heatProductionScaleKm", heatProductionScaleKm);
            m.put("heatProduction", heatProduction);
            m.put("crustThicknessKm", crustThicknessKm);
            return m;
        }
    }

    /** One depth of the geotherm. */
    public record Point(double depthKm, double pressureGPa, double temperatureC) {
    }

    /** The geotherm; absent fields do not apply to the request. */
    public record Result(List<Point> points, Double surfaceHeatFlowMWPerM2, Double lithosphereBaseDepthKm,
                         Double mohoTemperatureC, Double seafloorDepthM, List<ModelInfo> models,
                         List<String> warnings) {
    }

    private record LithosphereSetup(String type, DoubleFunction<ConductiveGeotherm> build, double mantleK,
                                    LithostaticColumn column, List<String> warnings) {

        ConductiveGeotherm model() {
            return build.apply(mantleK);
        }
    }

    /**
     * A checked and built geotherm request: used by this operation and, nested under
     * {@code path.geotherm}, by {@code solidus-crossings}.
     */
    record Built(Geotherm geotherm, ConductiveGeotherm model, MantleAdiabat adiabat, LithostaticColumn column,
                 double[] depths, double maxDepthKm, List<String> warnings) {

        /** The input warnings plus those about the sampled profile ({@code temperaturesK} at {@link #depths}). */
        List<String> allWarnings(double[] temperaturesK) {
            List<String> all = new ArrayList<>(warnings);
            double hottestC = Double.NEGATIVE_INFINITY;
            double hotFromKm = Double.NaN;
            for (int i = 0; i < depths.length; i++) {
                double tC = Units.kelvinToCelsius(temperaturesK[i]);
                hottestC = Math.max(hottestC, tC);
                if (tC > HOT_CONDUCTIVE_C && Double.isNaN(hotFromKm)) {
                    hotFromKm = Units.mToKm(depths[i]);
                }
            }
            OptionalDouble base = geotherm.lithosphereBaseDepth();
            if (base.isPresent() && model != null && Units.mToKm(base.getAsDouble()) > maxDepthKm) {
                all.add("The base of the thermal lithosphere (" + Rules.format(Math.round(Units.mToKm(
                        base.getAsDouble()))) + " km) lies below maxDepthKm: every returned point is on the conductive part");
            }
            if (adiabat == null && hottestC > HOT_CONDUCTIVE_C) {
                all.add("Without potentialTemperatureC the conductive model is continued to every depth; it exceeds "
                        + Rules.format(HOT_CONDUCTIVE_C) + " °C from " + Rules.format(hotFromKm)
                        + " km down, where real mantle follows an adiabat: give potentialTemperatureC to join one");
            }
            return all;
        }

        /** The models behind the geotherm and its pressure column. */
        List<ModelInfo> models() {
            List<ModelInfo> models = new ArrayList<>(geotherm.models());
            models.add(LithostaticColumn.INFO);
            return models;
        }
    }

    private final int maxPoints;

    GeothermOperation(Config config) {
        this.maxPoints = config.maxProfilePoints();
    }

    @Override
    public String name() {
        return "geotherm";
    }

    @Override
    public String path() {
        return "/v1/geotherm";
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
    public String rows() {
        return "points";
    }

    @Override
    public List<Input> inputs() {
        return List.of(
                new Input("potentialTemperatureC", "°C", "mantle potential temperature", true),
                new Input("lithosphere.ageMyr", "Myr", "sea-floor age (oceanic)", true),
                new Input("lithosphere.mantleTemperatureC", "°C", "mantle temperature beneath the lithosphere (oceanic)",
                        true),
                new Input("lithosphere.plateThicknessKm", "km", "plate thickness (oceanic-plate)", true),
                new Input("lithosphere.conductivityWPerMK", "W/m/K", "thermal conductivity", true),
                new Input("lithosphere.surfaceHeatFlowMWPerM2", "mW/m²", "surface heat flow (continental)", true),
                new Input("lithosphere.reducedHeatFlowFraction", "1", "reduced heat flow fraction (continental)", true),
                new Input("lithosphere.heatProductionScaleKm", "km", "heat production scale (continental)", true),
                new Input("lithosphere.crustThicknessKm", "km", "crust thickness (continental)", true),
                new Input("maxDepthKm", "km", "deepest depth returned", false),
                new Input("stepKm", "km", "depth step", false));
    }

    @Override
    public List<Output<Result>> outputs() {
        return List.of(
                new Output<>("surfaceHeatFlowMWPerM2", "mW/m²", "surface heat flow of the conductive model",
                        Result::surfaceHeatFlowMWPerM2),
                new Output<>("lithosphereBaseDepthKm", "km", "depth where the lithosphere meets the adiabat",
                        Result::lithosphereBaseDepthKm),
                new Output<>("mohoTemperatureC", "°C", "temperature at the Moho (continental)",
                        Result::mohoTemperatureC),
                new Output<>("seafloorDepthM", "m", "sea-floor depth (oceanic)", Result::seafloorDepthM));
    }

    @Override
    public Result run(Request q, Deadline deadline) {
        Built b = build(new Rules(), q, maxPoints);
        double[] depths = b.depths();
        double[] temperatures = new double[depths.length];
        List<Point> points = new ArrayList<>(depths.length);
        for (int i = 0; i < depths.length; i++) {
            double z = depths[i];
            temperatures[i] = b.geotherm().temperatureAt(z);
            points.add(new Point(Units.mToKm(z), Units.paToGpa(b.column().pressureAt(z)),
                    Units.kelvinToCelsius(temperatures[i])));
        }
        List<String> warnings = b.allWarnings(temperatures);
        OptionalDouble base = b.geotherm().lithosphereBaseDepth();
        Double baseKm = base.isPresent() ? Units.mToKm(base.getAsDouble()) : null;
        ConductiveGeotherm model = b.model();
        Double heatFlow = model == null ? null : Units.wPerM2ToMwPerM2(model.surfaceHeatFlow());
        Double mohoC = model instanceof ContinentalGeotherm c
                ? Units.kelvinToCelsius(b.geotherm().temperatureAt(c.crustThickness())) : null;
        Double seafloorM = model instanceof OceanicLithosphere o ? o.seafloorDepth() : null;
        return new Result(points, heatFlow, baseKm, mohoC, seafloorM, b.models(), warnings);
    }

    /**
     * Checks the rules the spec cannot state and builds the geotherm; fields are reported under
     * {@code rules}' prefix. Throws {@link OperationException} when a rule is broken.
     */
    static Built build(Rules rules, Request q, int maxPoints) {
        double maxKm = q.maxDepthKm();
        double stepKm = q.stepKm();
        if (stepKm > maxKm) {
            rules.error("stepKm", "must not exceed maxDepthKm (" + Rules.format(maxKm) + " km), got "
                    + Rules.format(stepKm));
        } else {
            long n = Geotherm.pointCount(Units.kmToM(maxKm), Units.kmToM(stepKm));
            rules.check(n <= maxPoints, "stepKm", "gives " + n + " depths from 0 to " + Rules.format(maxKm)
                    + " km; at most " + maxPoints + " are allowed (server cap TECTOMELT_MAX_PROFILE_POINTS): "
                    + "raise stepKm or lower maxDepthKm");
        }
        if (q.lithosphere() == null && q.potentialTemperatureC() == null) {
            rules.error("lithosphere", "is required unless potentialTemperatureC is given (for the adiabat alone); "
                    + "give lithosphere, potentialTemperatureC, or both");
        }
        LithosphereSetup setup = q.lithosphere() == null ? null : lithosphere(rules.at("lithosphere"), q.lithosphere());
        rules.throwIfBroken();

        List<String> warnings = new ArrayList<>();
        Double tpC = q.potentialTemperatureC();
        MantleAdiabat adiabat = tpC == null ? null : MantleAdiabat.of(Units.celsiusToKelvin(tpC));
        Geotherm geotherm;
        ConductiveGeotherm model = null;
        LithostaticColumn column = LithostaticColumn.mantleOnly();
        if (setup == null) {
            geotherm = Geotherm.adiabatic(adiabat);
        } else {
            model = setup.model();
            column = setup.column();
            warnings.addAll(setup.warnings());
            if (adiabat == null) {
                geotherm = Geotherm.conductive(model);
            } else {
                if (Geotherm.lithosphereBase(model, adiabat).isEmpty()) {
                    throw neverMeets(rules, setup, adiabat, tpC);
                }
                geotherm = Geotherm.combined(model, adiabat);
            }
        }
        return new Built(geotherm, model, adiabat, column,
                Geotherm.depths(Units.kmToM(maxKm), Units.kmToM(stepKm)), maxKm, warnings);
    }

    /** Checks the lithosphere object's type-specific rules and prepares its model. */
    private static LithosphereSetup lithosphere(Rules rules, Lithosphere l) {
        String type = l.type();
        Set<String> allowed = switch (type) {
            case HALF_SPACE -> OCEANIC_FIELDS;
            case PLATE -> PLATE_FIELDS;
            default -> CONTINENTAL_FIELDS;
        };
        l.fields().forEach((name, value) -> {
            if (value != null && !allowed.contains(name)) {
                rules.error(name, "does not apply to type '" + type + "'; its fields are " + new TreeSet<>(allowed));
            }
        });
        boolean oceanic = !CONTINENTAL.equals(type);
        if (oceanic) {
            rules.check(l.ageMyr() != null, "ageMyr", "is required for type '" + type + "'");
        } else {
            rules.check(l.surfaceHeatFlowMWPerM2() != null, "surfaceHeatFlowMWPerM2",
                    "is required for type 'continental'");
        }
        if (!rules.ok()) {
            return null;
        }
        return switch (type) {
            case HALF_SPACE -> halfSpace(l);
            case PLATE -> plate(l);
            default -> continental(rules, l);
        };
    }

    private static LithosphereSetup halfSpace(Lithosphere l) {
        double ageS = Units.myrToS(l.ageMyr());
        double tm = or(l.mantleTemperatureC(), HalfSpaceCooling.MANTLE_TEMPERATURE);
        double t0 = or(l.surfaceTemperatureC(), HalfSpaceCooling.SURFACE_TEMPERATURE);
        double k = l.conductivityWPerMK() != null ? l.conductivityWPerMK() : HalfSpaceCooling.CONDUCTIVITY;
        double kappa = l.diffusivityM2PerS() != null ? l.diffusivityM2PerS() : HalfSpaceCooling.DIFFUSIVITY;
        List<String> warnings = new ArrayList<>();
        if (ageS > HalfSpaceCooling.RELIABLE_AGE_S) {
            warnings.add("Half-space cooling predicts sea floor deeper and heat flow lower than observed beyond about "
                    + "80 Myr; oceanic-plate describes old sea floor better");
        }
        return new LithosphereSetup(HALF_SPACE, mantle -> new HalfSpaceCooling(ageS, t0, mantle, k, kappa), tm,
                LithostaticColumn.mantleOnly(), warnings);
    }

    private static LithosphereSetup plate(Lithosphere l) {
        PlateParameters set = "PS77".equals(l.parameterSet()) ? PlateParameters.PS77 : PlateParameters.GDH1;
        double ageS = Units.myrToS(l.ageMyr());
        double tm = or(l.mantleTemperatureC(), set.mantleTemperature());
        double a = l.plateThicknessKm() != null ? Units.kmToM(l.plateThicknessKm()) : set.plateThickness();
        double t0 = or(l.surfaceTemperatureC(), set.surfaceTemperature());
        double k = l.conductivityWPerMK() != null ? l.conductivityWPerMK() : set.conductivity();
        double kappa = l.diffusivityM2PerS() != null ? l.diffusivityM2PerS() : set.diffusivity();
        List<String> changed = new ArrayList<>();
        for (var e : Map.of("mantleTemperatureC", l.mantleTemperatureC() != null,
                "plateThicknessKm", l.plateThicknessKm() != null,
                "surfaceTemperatureC", l.surfaceTemperatureC() != null,
                "conductivityWPerMK", l.conductivityWPerMK() != null,
                "diffusivityM2PerS", l.diffusivityM2PerS() != null).entrySet()) {
            if (e.getValue()) {
                changed.add(e.getKey());
            }
        }
        List<String> warnings = new ArrayList<>();
        if (!changed.isEmpty()) {
            warnings.add("Plate parameters differ from the published " + set.name() + " set ("
                    + String.join(", ", changed.stream().sorted().toList())
                    + "): its published heat-flow and depth fits no longer apply");
        }
        return new LithosphereSetup(PLATE, mantle -> new PlateCooling(set.withMantleTemperature(mantle)
                .withPlateThickness(a).withSurfaceTemperature(t0).withConductivity(k).withDiffusivity(kappa), ageS),
                tm, LithostaticColumn.mantleOnly(), warnings);
    }

    private static LithosphereSetup continental(Rules rules, Lithosphere l) {
        double q0 = Units.mwPerM2ToWPerM2(l.surfaceHeatFlowMWPerM2());
        double f = l.reducedHeatFlowFraction() != null ? l.reducedHeatFlowFraction()
                : ContinentalGeotherm.REDUCED_FRACTION;
        double hr = l.heatProductionScaleKm() != null ? Units.kmToM(l.heatProductionScaleKm())
                : ContinentalGeotherm.HEAT_PRODUCTION_SCALE;
        double k = l.conductivityWPerMK() != null ? l.conductivityWPerMK() : ContinentalGeotherm.CONDUCTIVITY;
        double t0 = or(l.surfaceTemperatureC(), ContinentalGeotherm.SURFACE_TEMPERATURE);
        double crust = l.crustThicknessKm() != null ? Units.kmToM(l.crustThicknessKm())
                : ContinentalGeotherm.CRUST_THICKNESS;
        HeatProduction distribution = "two-layer".equals(l.heatProduction()) ? HeatProduction.TWO_LAYER
                : HeatProduction.EXPONENTIAL;
        if (distribution == HeatProduction.TWO_LAYER && hr > crust) {
            rules.error("heatProductionScaleKm", "is the thickness of the heat-producing layer for two-layer heat "
                    + "production and must not exceed crustThicknessKm (" + Rules.format(Units.mToKm(crust))
                    + "), got " + Rules.format(Units.mToKm(hr)));
        }
        return new LithosphereSetup(CONTINENTAL,
                ignored -> ContinentalGeotherm.of(q0, f, hr, k, t0, crust, distribution), Double.NaN,
                new LithostaticColumn(crust, LithostaticColumn.CRUST_DENSITY, LithostaticColumn.MANTLE_DENSITY,
                        LithostaticColumn.G), List.of());
    }

    /** The 400 for a conductive lithosphere that never reaches the adiabat, naming what to change. */
    private static OperationException neverMeets(Rules rules, LithosphereSetup setup, MantleAdiabat adiabat,
                                                 double tpC) {
        String depth = Rules.format(Units.mToKm(Geotherm.MAX_DEPTH_M));
        String tp = Rules.format(tpC);
        if (CONTINENTAL.equals(setup.type())) {
            return new OperationException(List.of(
                    new Violation(rules.path("potentialTemperatureC"), "the continental geotherm stays colder than the "
                            + tp + " °C adiabat down to " + depth + " km, so they never meet; lower "
                            + "potentialTemperatureC or raise lithosphere.surfaceHeatFlowMWPerM2 or "
                            + "lithosphere.reducedHeatFlowFraction"),
                    new Violation(rules.path("lithosphere.reducedHeatFlowFraction"), "too little heat reaches the base "
                            + "of the crust for the geotherm to meet the " + tp + " °C adiabat above " + depth + " km")));
        }
        OptionalDouble lowest = Geotherm.lowestMeetingValue(setup.build(), adiabat, setup.mantleK(),
                Units.celsiusToKelvin(2000), 0.5);
        String needed = lowest.isPresent()
                ? "at least " + Rules.format(Math.ceil(Units.kelvinToCelsius(lowest.getAsDouble()))) + " °C"
                : "more than 2000 °C";
        String mantle = Rules.format(Math.round(Units.kelvinToCelsius(setup.mantleK()) * 10) / 10.0);
        return new OperationException(List.of(
                new Violation(rules.path("potentialTemperatureC"), "the " + setup.type() + " geotherm (mantle "
                        + "temperature " + mantle + " °C) stays colder than the " + tp + " °C adiabat down to " + depth
                        + " km, so they never meet; lower potentialTemperatureC or raise lithosphere.mantleTemperatureC"),
                new Violation(rules.path("lithosphere.mantleTemperatureC"), "must be " + needed + " for this lithosphere "
                        + "to meet the " + tp + " °C adiabat above " + depth + " km, got " + mantle)));
    }

    /** A temperature given in °C, or the engine's default (K), in K. */
    private static double or(Double celsius, double defaultKelvin) {
        return celsius != null ? Units.celsiusToKelvin(celsius) : defaultKelvin;
    }

    private static Set<String> union(Set<String> a, Set<String> b) {
        Set<String> all = new java.util.HashSet<>(a);
        all.addAll(b);
        return Set.copyOf(all);
    }
}
