package org.tectomelt.http;

import org.tectomelt.contract.Json;
import io.javalin.http.Context;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.OptionalDouble;
import java.util.Set;
import java.util.function.DoubleFunction;
import org.tectomelt.Config;
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
 * {@code POST /v1/geotherm}: temperature and pressure with depth for oceanic (half-space or
 * plate) or continental lithosphere, optionally joined to a mantle adiabat, or the adiabat alone.
 */
final class GeothermRoutes {

    /** Default depth range (km). */
    static final double MAX_DEPTH_KM = 300;
    /** Default depth step (km). */
    static final double STEP_KM = 1;
    /** Above this, a purely conductive geotherm earns a warning (°C). */
    static final double HOT_CONDUCTIVE_C = 1600;

    static final String HALF_SPACE = "oceanic-half-space";
    static final String PLATE = "oceanic-plate";
    static final String CONTINENTAL = "continental";
    static final List<String> TYPES = List.of(HALF_SPACE, PLATE, CONTINENTAL);
    static final List<String> PARAMETER_SETS = List.of("GDH1", "PS77");
    static final List<String> HEAT_PRODUCTIONS = List.of("exponential", "two-layer");

    private static final Set<String> OCEANIC_FIELDS = Set.of("type", "ageMyr", "mantleTemperatureC",
            "surfaceTemperatureC", "conductivityWPerMK", "diffusivityM2PerS");
    private static final Set<String> PLATE_FIELDS = union(OCEANIC_FIELDS, Set.of("plateThicknessKm", "parameterSet"));
    private static final Set<String> CONTINENTAL_FIELDS = Set.of("type", "surfaceHeatFlowMWPerM2",
            "reducedHeatFlowFraction", "heatProductionScaleKm", "heatProduction", "conductivityWPerMK",
            "surfaceTemperatureC", "crustThicknessKm");

    private GeothermRoutes() {
    }

    static List<Route> routes(Config config) {
        int maxPoints = config.maxProfilePoints();
        return List.of(Route.post("/v1/geotherm", ctx -> geotherm(ctx, maxPoints)));
    }

    /** Request body. */
    record GeothermRequest(Lithosphere lithosphere, Double potentialTemperatureC, Double maxDepthKm, Double stepKm) {
    }

    /** The lithosphere: {@code type} plus the fields of that type. */
    record Lithosphere(String type, Double ageMyr, Double mantleTemperatureC, Double plateThicknessKm,
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
    record Point(double depthKm, double pressureGPa, double temperatureC) {
    }

    /** Response body; absent fields do not apply to the request. */
    record GeothermResponse(List<Point> points, Double surfaceHeatFlowMWPerM2, Double lithosphereBaseDepthKm,
                            Double mohoTemperatureC, Double seafloorDepthM, List<ModelInfo> models,
                            List<String> warnings) {
    }

    /**
     * A validated lithosphere, ready to build once every field has passed.
     *
     * @param build      builds the conductive model with a mantle temperature (K) (the value is
     *                   ignored by the continental model)
     * @param mantleK    the requested or default mantle temperature (K); NaN for continental
     * @param column     the pressure column
     * @param warnings   warnings that follow from the inputs alone
     */
    private record LithosphereSetup(String type, DoubleFunction<ConductiveGeotherm> build, double mantleK,
                                    LithostaticColumn column, List<String> warnings) {

        ConductiveGeotherm model() {
            return build.apply(mantleK);
        }
    }

    /**
     * A validated and built geotherm request: used by this route and, nested under
     * {@code path.geotherm}, by {@code POST /v1/solidus-crossings}.
     *
     * @param geotherm   the engine geotherm
     * @param model      its conductive part, or null for the adiabat alone
     * @param adiabat    its adiabat, or null for a purely conductive geotherm
     * @param column     the pressure column
     * @param depths     the sample depths (m), from the surface down
     * @param maxDepthKm the deepest requested depth (km)
     * @param warnings   warnings that follow from the inputs alone
     */
    record BuiltGeotherm(Geotherm geotherm, ConductiveGeotherm model, MantleAdiabat adiabat, LithostaticColumn column,
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
                all.add("The base of the thermal lithosphere (" + Validation.format(Math.round(Units.mToKm(
                        base.getAsDouble()))) + " km) lies below maxDepthKm: every returned point is on the conductive part");
            }
            if (adiabat == null && hottestC > HOT_CONDUCTIVE_C) {
                all.add("Without potentialTemperatureC the conductive model is continued to every depth; it exceeds "
                        + Validation.format(HOT_CONDUCTIVE_C) + " °C from " + Validation.format(hotFromKm)
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

    static void geotherm(Context ctx, int maxPoints) {
        GeothermRequest req = Json.read(ctx.bodyAsBytes(), GeothermRequest.class);
        BuiltGeotherm b = build(new Validation(), req, maxPoints);
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
        Responses.json(ctx, new GeothermResponse(points, heatFlow, baseKm, mohoC, seafloorM, b.models(), warnings));
    }

    /**
     * Validates a geotherm request and builds its geotherm; field names are reported under
     * {@code v}'s prefix. Throws the 400 problem when anything is invalid.
     */
    static BuiltGeotherm build(Validation v, GeothermRequest req, int maxPoints) {
        double tpC = v.optional("potentialTemperatureC", req.potentialTemperatureC(), Double.NaN, 1000, 2000);
        double maxKm = v.optional("maxDepthKm", req.maxDepthKm(), MAX_DEPTH_KM, 1,
                Units.mToKm(Geotherm.MAX_DEPTH_M));
        double stepKm = v.optional("stepKm", req.stepKm(), STEP_KM, 0.01, Units.mToKm(Geotherm.MAX_DEPTH_M));
        if (v.ok() && stepKm > maxKm) {
            v.error("stepKm", "must not exceed maxDepthKm (" + Validation.format(maxKm) + " km), got "
                    + Validation.format(stepKm));
        } else if (v.ok()) {
            long n = Geotherm.pointCount(Units.kmToM(maxKm), Units.kmToM(stepKm));
            v.check(n <= maxPoints, "stepKm", "gives " + n + " depths from 0 to " + Validation.format(maxKm)
                    + " km; at most " + maxPoints + " are allowed (server cap TECTOMELT_MAX_PROFILE_POINTS): "
                    + "raise stepKm or lower maxDepthKm");
        }
        if (req.lithosphere() == null && req.potentialTemperatureC() == null) {
            v.error("lithosphere", "is required unless potentialTemperatureC is given (for the adiabat alone); "
                    + "give lithosphere, potentialTemperatureC, or both");
        }
        LithosphereSetup setup = req.lithosphere() == null ? null : lithosphere(v.at("lithosphere"), req.lithosphere());
        v.throwIfInvalid();

        List<String> warnings = new ArrayList<>();
        MantleAdiabat adiabat = Double.isNaN(tpC) ? null : MantleAdiabat.of(Units.celsiusToKelvin(tpC));
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
                    throw neverMeets(v, setup, adiabat, tpC);
                }
                geotherm = Geotherm.combined(model, adiabat);
            }
        }
        return new BuiltGeotherm(geotherm, model, adiabat, column,
                Geotherm.depths(Units.kmToM(maxKm), Units.kmToM(stepKm)), maxKm, warnings);
    }

    /** Validates the lithosphere object; returns null when its type is missing or unknown. */
    private static LithosphereSetup lithosphere(Validation v, Lithosphere l) {
        String type = v.requiredChoice("type", l.type(), TYPES);
        if (type == null || !TYPES.contains(type)) {
            return null;
        }
        Set<String> allowed = switch (type) {
            case HALF_SPACE -> OCEANIC_FIELDS;
            case PLATE -> PLATE_FIELDS;
            default -> CONTINENTAL_FIELDS;
        };
        l.fields().forEach((name, value) -> {
            if (value != null && !allowed.contains(name)) {
                v.error(name, "does not apply to type '" + type + "'; its fields are "
                        + allowed.stream().sorted().toList());
            }
        });
        return switch (type) {
            case HALF_SPACE -> halfSpace(v, l);
            case PLATE -> plate(v, l);
            default -> continental(v, l);
        };
    }

    private static LithosphereSetup halfSpace(Validation v, Lithosphere l) {
        double ageS = Units.myrToS(v.required("ageMyr", l.ageMyr(), 0.01, 200));
        double tm = kelvin(v.optional("mantleTemperatureC", l.mantleTemperatureC(), 1300, 800, 2000));
        double t0 = kelvin(v.optional("surfaceTemperatureC", l.surfaceTemperatureC(), 0, -50, 100));
        double k = v.optional("conductivityWPerMK", l.conductivityWPerMK(), HalfSpaceCooling.CONDUCTIVITY, 0.5, 10);
        double kappa = v.optional("diffusivityM2PerS", l.diffusivityM2PerS(), HalfSpaceCooling.DIFFUSIVITY, 1e-7, 1e-5);
        List<String> warnings = new ArrayList<>();
        if (ageS > HalfSpaceCooling.RELIABLE_AGE_S) {
            warnings.add("Half-space cooling predicts sea floor deeper and heat flow lower than observed beyond about "
                    + "80 Myr; oceanic-plate describes old sea floor better");
        }
        return new LithosphereSetup(HALF_SPACE, mantle -> new HalfSpaceCooling(ageS, t0, mantle, k, kappa), tm,
                LithostaticColumn.mantleOnly(), warnings);
    }

    private static LithosphereSetup plate(Validation v, Lithosphere l) {
        String name = v.optionalChoice("parameterSet", l.parameterSet(), "GDH1", PARAMETER_SETS);
        PlateParameters set = "PS77".equals(name) ? PlateParameters.PS77 : PlateParameters.GDH1;
        double ageS = Units.myrToS(v.required("ageMyr", l.ageMyr(), 0.01, 200));
        double tm = kelvin(v.optional("mantleTemperatureC", l.mantleTemperatureC(),
                Units.kelvinToCelsius(set.mantleTemperature()), 800, 2000));
        double a = Units.kmToM(v.optional("plateThicknessKm", l.plateThicknessKm(),
                Units.mToKm(set.plateThickness()), 30, 300));
        double t0 = kelvin(v.optional("surfaceTemperatureC", l.surfaceTemperatureC(),
                Units.kelvinToCelsius(set.surfaceTemperature()), -50, 100));
        double k = v.optional("conductivityWPerMK", l.conductivityWPerMK(), set.conductivity(), 0.5, 10);
        double kappa = v.optional("diffusivityM2PerS", l.diffusivityM2PerS(), set.diffusivity(), 1e-7, 1e-5);
        List<String> changed = new ArrayList<>();
        for (var e : Map.of("mantleTemperatureC", given(l.mantleTemperatureC()),
                "plateThicknessKm", given(l.plateThicknessKm()),
                "surfaceTemperatureC", given(l.surfaceTemperatureC()),
                "conductivityWPerMK", given(l.conductivityWPerMK()),
                "diffusivityM2PerS", given(l.diffusivityM2PerS())).entrySet()) {
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

    private static LithosphereSetup continental(Validation v, Lithosphere l) {
        double q0 = Units.mwPerM2ToWPerM2(v.required("surfaceHeatFlowMWPerM2", l.surfaceHeatFlowMWPerM2(),
                Units.wPerM2ToMwPerM2(ContinentalGeotherm.MIN_SURFACE_HEAT_FLOW),
                Units.wPerM2ToMwPerM2(ContinentalGeotherm.MAX_SURFACE_HEAT_FLOW)));
        double f = v.optional("reducedHeatFlowFraction", l.reducedHeatFlowFraction(),
                ContinentalGeotherm.REDUCED_FRACTION, 0, 1);
        double hrKm = v.optional("heatProductionScaleKm", l.heatProductionScaleKm(),
                Units.mToKm(ContinentalGeotherm.HEAT_PRODUCTION_SCALE), 1, 50);
        String mode = v.optionalChoice("heatProduction", l.heatProduction(), "exponential", HEAT_PRODUCTIONS);
        double k = v.optional("conductivityWPerMK", l.conductivityWPerMK(), ContinentalGeotherm.CONDUCTIVITY, 0.5, 10);
        double t0 = kelvin(v.optional("surfaceTemperatureC", l.surfaceTemperatureC(), 0, -50, 100));
        double crustKm = v.optional("crustThicknessKm", l.crustThicknessKm(),
                Units.mToKm(ContinentalGeotherm.CRUST_THICKNESS), 5, 80);
        HeatProduction distribution = "two-layer".equals(mode) ? HeatProduction.TWO_LAYER : HeatProduction.EXPONENTIAL;
        if (distribution == HeatProduction.TWO_LAYER && hrKm > crustKm) {
            v.error("heatProductionScaleKm", "is the thickness of the heat-producing layer for two-layer heat "
                    + "production and must not exceed crustThicknessKm (" + Validation.format(crustKm) + "), got "
                    + Validation.format(hrKm));
        }
        double hr = Units.kmToM(hrKm);
        double crust = Units.kmToM(crustKm);
        return new LithosphereSetup(CONTINENTAL,
                ignored -> ContinentalGeotherm.of(q0, f, hr, k, t0, crust, distribution), Double.NaN,
                new LithostaticColumn(crust, LithostaticColumn.CRUST_DENSITY, LithostaticColumn.MANTLE_DENSITY,
                        LithostaticColumn.G), List.of());
    }

    /** The 400 for a conductive lithosphere that never reaches the adiabat, naming what to change. */
    private static ApiProblem neverMeets(Validation v, LithosphereSetup setup, MantleAdiabat adiabat, double tpC) {
        String depth = Validation.format(Units.mToKm(Geotherm.MAX_DEPTH_M));
        String tp = Validation.format(tpC);
        if (CONTINENTAL.equals(setup.type())) {
            return ApiProblem.invalid(List.of(
                    new FieldError(v.path("potentialTemperatureC"), "the continental geotherm stays colder than the " + tp
                            + " °C adiabat down to " + depth + " km, so they never meet; lower potentialTemperatureC "
                            + "or raise lithosphere.surfaceHeatFlowMWPerM2 or lithosphere.reducedHeatFlowFraction"),
                    new FieldError(v.path("lithosphere.reducedHeatFlowFraction"), "too little heat reaches the base of the "
                            + "crust for the geotherm to meet the " + tp + " °C adiabat above " + depth + " km")));
        }
        OptionalDouble lowest = Geotherm.lowestMeetingValue(setup.build(), adiabat, setup.mantleK(),
                Units.celsiusToKelvin(2000), 0.5);
        String needed = lowest.isPresent()
                ? "at least " + Validation.format(Math.ceil(Units.kelvinToCelsius(lowest.getAsDouble()))) + " °C"
                : "more than 2000 °C";
        String mantle = Validation.format(Math.round(Units.kelvinToCelsius(setup.mantleK()) * 10) / 10.0);
        return ApiProblem.invalid(List.of(
                new FieldError(v.path("potentialTemperatureC"), "the " + setup.type() + " geotherm (mantle temperature "
                        + mantle + " °C) stays colder than the " + tp + " °C adiabat down to " + depth
                        + " km, so they never meet; lower potentialTemperatureC or raise lithosphere.mantleTemperatureC"),
                new FieldError(v.path("lithosphere.mantleTemperatureC"), "must be " + needed + " for this lithosphere to meet "
                        + "the " + tp + " °C adiabat above " + depth + " km, got " + mantle)));
    }

    private static double kelvin(double celsius) {
        return Units.celsiusToKelvin(celsius);
    }

    private static boolean given(Object o) {
        return o != null;
    }

    private static Set<String> union(Set<String> a, Set<String> b) {
        Set<String> all = new java.util.HashSet<>(a);
        all.addAll(b);
        return Set.copyOf(all);
    }
}
