package org.tectomelt.http;

import org.tectomelt.contract.Json;
import io.javalin.http.Context;
import java.util.ArrayList;
import java.util.List;
import org.tectomelt.Config;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.crust.ConductivityLaw;
import org.tectomelt.engine.crust.GeothermInitialState;
import org.tectomelt.engine.crust.HeatBudget;
import org.tectomelt.engine.crust.InitialState;
import org.tectomelt.engine.crust.MeltingIntervals;
import org.tectomelt.engine.crust.Miao2014Conductivity;
import org.tectomelt.engine.crust.Rock;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.crust.SillResult;
import org.tectomelt.engine.melting.CrustalLithology;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.MeltCurve;
import org.tectomelt.engine.melting.ThermalProperties;
import org.tectomelt.engine.thermal.ContinentalGeotherm;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.units.Units;

/**
 * {@code POST /v1/crustal-heating/budget} (the no-loss energy balance) and
 * {@code POST /v1/crustal-heating/sill} (the transient sill model).
 */
final class CrustalHeatingRoutes {

    /** Most cells a sill run may have at its end (column plus emplaced sills). */
    static final int MAX_CELLS = 20_000;
    /** Largest {@code durationKyr} the model accepts at all (the server cap is usually lower). */
    static final double MODEL_MAX_DURATION_KYR = 4.5e6;
    /** Longest interval between emplacements (kyr). */
    static final double MAX_INTERVAL_KYR = 20_000;
    /** Most accepted time steps of one run. */
    static final int MAX_TIME_STEPS = 100_000;
    /** Most profiles per request. */
    static final int MAX_PROFILES = 20;
    /** Most points per profile when the spacing is left to the default. */
    static final int DEFAULT_PROFILE_POINTS = 2_000;
    /** Most points in a user melt curve. */
    static final int MAX_CURVE_POINTS = 50;
    /** Fewest cells across one sill. */
    static final int MIN_CELLS_PER_SILL = 2;
    /** Most sills in one request. */
    static final int MAX_SILLS = 1_000;

    static final String LAW_CONSTANT = "constant";
    static final String LAW_GRANITE = "miao2014-granite";
    static final String LAW_GABBRO = "miao2014-gabbro";
    static final List<String> LAWS = List.of(LAW_CONSTANT, LAW_GRANITE, LAW_GABBRO);
    static final List<String> STACKINGS = List.of("under", "over");
    /** The intrusion's lithology when none is named. */
    static final String DEFAULT_INTRUSION = "basalt";

    static final String LOWER_BOUND_NOTE = "No-loss lower bound: every joule the intrusion gives up is assumed to heat "
            + "this crustal layer, none is lost to the surface, to rock beyond the layer or to melt that leaves. "
            + "Real intrusions lose much of their heat, so the intrusion thickness is a lower bound and the crust "
            + "thickness an upper bound; use /v1/crustal-heating/sill for the transient, lossy case.";

    private CrustalHeatingRoutes() {
    }

    static List<Route> routes(Config config) {
        return List.of(Route.post("/v1/crustal-heating/budget", CrustalHeatingRoutes::budget),
                Route.heavyPost("/v1/crustal-heating/sill", ctx -> sill(ctx, config)));
    }

    // ---------------------------------------------------------------------------------------
    // shared request parts

    /** One point of a user melt curve. */
    record MeltPoint(Double temperatureC, Double meltFraction) {
    }

    /** Solidus and liquidus of a linear (or, when equal, isothermal) melting interval. */
    record MeltingInterval(Double solidusC, Double liquidusC) {
    }

    /** Reads {@code meltCurve} or {@code meltingInterval} of one rock (at most one of them); null when neither. */
    static MeltCurve meltCurve(Validation v, List<MeltPoint> points, MeltingInterval interval) {
        if (points != null && interval != null) {
            v.error("meltingInterval", "give meltCurve or meltingInterval, not both");
            return null;
        }
        if (interval != null) {
            Validation iv = v.at("meltingInterval");
            double ts = iv.required("solidusC", interval.solidusC(), 0, 2000);
            double tl = iv.required("liquidusC", interval.liquidusC(), 0, 2000);
            if (!Double.isNaN(ts) && !Double.isNaN(tl) && tl < ts) {
                iv.error("liquidusC", "must not be below solidusC (" + Validation.format(ts) + ")");
            }
            if (!v.ok()) {
                return null;
            }
            return MeltingIntervals.linear(Units.celsiusToKelvin(ts), Units.celsiusToKelvin(tl));
        }
        if (points == null) {
            return null;
        }
        List<MeltPoint> list = v.list("meltCurve", points, 2, MAX_CURVE_POINTS);
        double[] t = new double[list.size()];
        double[] f = new double[list.size()];
        boolean good = list.size() >= 2 && list.size() <= MAX_CURVE_POINTS;
        for (int i = 0; i < list.size(); i++) {
            MeltPoint p = list.get(i);
            Validation pv = v.at("meltCurve", i);
            if (p == null) {
                v.error("meltCurve[" + i + "]", "must be an object {temperatureC, meltFraction}");
                good = false;
                continue;
            }
            t[i] = pv.required("temperatureC", p.temperatureC(), 0, 2000);
            f[i] = pv.required("meltFraction", p.meltFraction(), 0, 1);
            if (Double.isNaN(t[i]) || Double.isNaN(f[i])) {
                good = false;
                continue;
            }
            if (i > 0 && !Double.isNaN(t[i - 1]) && !(t[i] > t[i - 1])) {
                pv.error("temperatureC", "temperatures must increase strictly along the curve");
                good = false;
            }
            if (i > 0 && !Double.isNaN(f[i - 1]) && f[i] < f[i - 1]) {
                pv.error("meltFraction", "melt fraction must not decrease with temperature");
                good = false;
            }
        }
        if (!good || !v.ok()) {
            return null;
        }
        double[] tk = new double[t.length];
        for (int i = 0; i < t.length; i++) {
            tk[i] = Units.celsiusToKelvin(t[i]);
        }
        return new MeltCurve(tk, f);
    }

    /** Ids accepted for {@code lithology}: the crustal rocks and intrusions of the catalogue. */
    static List<String> crustalIds() {
        return Lithologies.all().stream().filter(CrustalLithology.class::isInstance).map(l -> l.id()).toList();
    }

    /**
     * One rock's density, heat capacity, latent heat and melt curve: the named lithology's defaults
     * (issue-4 catalogue) under the request's explicit values, which are required when no lithology is
     * named. The curve is the request's {@code meltCurve} or {@code meltingInterval}, else the
     * lithology's curve at {@code pressure} (Pa).
     */
    record RockInput(CrustalLithology lithology, double density, double heatCapacity, double latentHeat,
                     MeltCurve curve, List<String> warnings, boolean usedLithology) {

        static RockInput read(Validation v, String role, String lithologyId, Double density, Double heatCapacity,
                              Double latentHeat, List<MeltPoint> points, MeltingInterval interval, double pressure,
                              boolean conductivityGiven) {
            CrustalLithology lith = null;
            if (lithologyId != null) {
                lith = Lithologies.crustalById(lithologyId).orElse(null);
                if (lith == null) {
                    v.error("lithology", "must be one of " + crustalIds() + ", got '" + lithologyId + "'");
                }
            }
            ThermalProperties defaults = lith == null ? null : lith.thermalProperties();
            double rho = property(v, "densityKgPerM3", density, defaults == null ? null : defaults.density(), 1500, 4000);
            double cp = property(v, "heatCapacityJPerKgK", heatCapacity,
                    defaults == null ? null : defaults.heatCapacity(), 500, 2500);
            double latent = property(v, "latentHeatJPerKg", latentHeat,
                    defaults == null ? null : defaults.latentHeat(), 0, 1_000_000);
            MeltCurve curve = meltCurve(v, points, interval);
            List<String> warnings = new ArrayList<>();
            boolean used = lith != null && (density == null || heatCapacity == null || latentHeat == null
                    || !conductivityGiven || (points == null && interval == null));
            if (curve == null && points == null && interval == null && lith != null && v.ok()) {
                curve = lith.curveAt(pressure);
                for (String w : lith.melt(pressure, curve.solidus(), 0).warnings()) {
                    warnings.add(role + " (" + lith.id() + "): " + w);
                }
            }
            return new RockInput(lith, rho, cp, latent, curve, warnings, used);
        }

        /** The lithology's citations, when it supplied anything. */
        List<ModelInfo> citations() {
            return usedLithology ? lithology.citations() : List.of();
        }
    }

    /** A number that defaults to the lithology's value, or is required when there is none. */
    private static double property(Validation v, String name, Double value, Double fallback, double min, double max) {
        return fallback == null ? v.required(name, value, min, max) : v.optional(name, value, fallback, min, max);
    }

    // ---------------------------------------------------------------------------------------
    // budget

    /** The crust in a budget request. */
    record BudgetCrust(String lithology, Double initialTemperatureC, Double densityKgPerM3, Double heatCapacityJPerKgK,
                       Double latentHeatJPerKg, List<MeltPoint> meltCurve, MeltingInterval meltingInterval,
                       Double targetMeltFraction, Double thicknessM) {
    }

    /** The intrusion in a budget request. */
    record BudgetIntrusion(String lithology, Double temperatureC, Double densityKgPerM3, Double heatCapacityJPerKgK,
                           Double latentHeatJPerKg, List<MeltPoint> meltCurve, MeltingInterval meltingInterval,
                           Double crystallizedFraction, Double thicknessM) {
    }

    /** Budget request body. */
    record BudgetRequest(BudgetCrust crust, BudgetIntrusion intrusion, Double finalTemperatureC, Double depthKm) {
    }

    /** Budget response body. */
    record BudgetResponse(double finalTemperatureC, double crustMeltFraction, double intrusionCrystallizedFraction,
                          double heatReleasedJPerM3, double heatRequiredJPerM3, double basaltToCrustThicknessRatio,
                          Double heatReleasedJPerM2, Double crustThicknessBroughtToTargetM, Double heatRequiredJPerM2,
                          Double intrusionThicknessNeededM, String note, List<String> warnings,
                          List<ModelInfo> models) {
    }

    static void budget(Context ctx) {
        BudgetRequest req = Json.read(ctx.bodyAsBytes(), BudgetRequest.class);
        Validation v = new Validation();
        v.present("crust", req.crust());
        v.present("intrusion", req.intrusion());
        v.throwIfInvalid();

        double depthKm = req.depthKm() == null ? Double.NaN : v.optional("depthKm", req.depthKm(), 0, 0, 100);
        BudgetCrust c = req.crust();
        Validation cv = v.at("crust");
        double tc0 = cv.required("initialTemperatureC", c.initialTemperatureC(), 0, 1500);
        RockInput crustIn = RockInput.read(cv, "crust", c.lithology(), c.densityKgPerM3(), c.heatCapacityJPerKgK(),
                c.latentHeatJPerKg(), c.meltCurve(), c.meltingInterval(), budgetPressure(c.lithology(), depthKm,
                        c.densityKgPerM3()), true);
        double rhoC = crustIn.density();
        double cpC = crustIn.heatCapacity();
        double lC = crustIn.latentHeat();
        MeltCurve crustCurve = crustIn.curve();
        Double targetF = c.targetMeltFraction() == null ? null
                : cv.optional("targetMeltFraction", c.targetMeltFraction(), 0, 0, 1);
        Double hc = c.thicknessM() == null ? null : cv.optional("thicknessM", c.thicknessM(), 0, 1, 100_000);

        BudgetIntrusion b = req.intrusion();
        Validation bv = v.at("intrusion");
        double tb0 = bv.required("temperatureC", b.temperatureC(), 500, 1600);
        String intrusionLith = b.lithology() != null ? b.lithology() : DEFAULT_INTRUSION;
        RockInput intrusionIn = RockInput.read(bv, "intrusion", intrusionLith, b.densityKgPerM3(),
                b.heatCapacityJPerKgK(), b.latentHeatJPerKg(), b.meltCurve(), b.meltingInterval(),
                budgetPressure(intrusionLith, depthKm, b.densityKgPerM3()), true);
        double rhoB = intrusionIn.density();
        double cpB = intrusionIn.heatCapacity();
        double lB = intrusionIn.latentHeat();
        MeltCurve intrusionCurve = intrusionIn.curve();
        Double xb = b.crystallizedFraction() == null ? null
                : bv.optional("crystallizedFraction", b.crystallizedFraction(), 0, 0, 1);
        Double hb = b.thicknessM() == null ? null : bv.optional("thicknessM", b.thicknessM(), 0, 0.01, 100_000);

        Double tf = req.finalTemperatureC() == null ? null
                : v.optional("finalTemperatureC", req.finalTemperatureC(), 0, 0, 1600);
        v.throwIfInvalid();
        if (tf == null && targetF == null) {
            v.error("finalTemperatureC", "give finalTemperatureC, crust.targetMeltFraction, or both");
        }
        if (tf == null && targetF != null && crustCurve == null) {
            v.error("crust.meltCurve", "a target melt fraction without finalTemperatureC needs the crust's lithology, "
                    + "meltCurve or meltingInterval to find the final temperature");
        }
        if (tf != null && targetF == null && crustCurve == null) {
            v.error("crust.targetMeltFraction", "give it, or the crust's lithology, meltCurve or meltingInterval, to "
                    + "know how much the crust melts at finalTemperatureC");
        }
        if (tf != null && (tf < tc0 || tf > tb0)) {
            v.error("finalTemperatureC", "must lie between crust.initialTemperatureC (" + Validation.format(tc0)
                    + ") and intrusion.temperatureC (" + Validation.format(tb0) + "), got " + Validation.format(tf));
        }
        if (targetF != null && crustCurve != null && tf == null && targetF > crustCurve.maxFraction()) {
            v.error("crust.targetMeltFraction", "the crust's melt curve reaches at most "
                    + Validation.format(crustCurve.maxFraction()) + ", got " + Validation.format(targetF));
        }
        v.throwIfInvalid();

        HeatBudget budget = new HeatBudget(
                new HeatBudget.Layer(rhoB, cpB, lB, Units.celsiusToKelvin(tb0), intrusionCurve),
                new HeatBudget.Layer(rhoC, cpC, lC, Units.celsiusToKelvin(tc0), crustCurve));
        HeatBudget.Result r;
        if (tf != null) {
            r = budget.atFinalTemperature(Units.celsiusToKelvin(tf), targetF, xb);
        } else {
            double tFound = targetF <= 0 ? crustCurve.solidus() : crustCurve.temperatureAt(targetF);
            if (tFound < Units.celsiusToKelvin(tc0) || tFound > Units.celsiusToKelvin(tb0)) {
                v.error("crust.targetMeltFraction", "is reached at " + Validation.format(
                        Math.rint(Units.kelvinToCelsius(tFound) * 100) / 100) + " °C on the crust's melt curve, outside "
                        + "crust.initialTemperatureC to intrusion.temperatureC");
                v.throwIfInvalid();
            }
            r = budget.atCrustMeltFraction(targetF, xb);
        }
        List<String> warnings = new ArrayList<>(crustIn.warnings());
        warnings.addAll(intrusionIn.warnings());
        warnings.addAll(r.warnings());
        List<ModelInfo> models = new ArrayList<>(List.of(HeatBudget.INFO));
        addAll(models, crustIn.citations());
        addAll(models, intrusionIn.citations());
        Responses.json(ctx, new BudgetResponse(Units.kelvinToCelsius(r.finalTemperature()), r.crustMeltFraction(),
                r.crystallizedFraction(), r.heatReleased(), r.heatRequired(), r.thicknessRatio(),
                hb == null ? null : r.heatReleased() * hb, hb == null ? null : r.crustThicknessFor(hb),
                hc == null ? null : r.heatRequired() * hc, hc == null ? null : r.intrusionThicknessFor(hc),
                LOWER_BOUND_NOTE, warnings, models));
    }

    /** Adds each citation not yet listed. */
    private static void addAll(List<ModelInfo> models, List<ModelInfo> more) {
        for (ModelInfo m : more) {
            if (!models.contains(m)) {
                models.add(m);
            }
        }
    }

    /**
     * Pressure (Pa) at which a budget reads a lithology's curve: at {@code depthKm} in a crust of the
     * given (or the lithology's, or 2800 kg/m³) density, or without it at the middle of the lithology's
     * calibrated pressure range.
     */
    private static double budgetPressure(String lithologyId, double depthKm, Double density) {
        CrustalLithology lith = lithologyId == null ? null : Lithologies.crustalById(lithologyId).orElse(null);
        if (!Double.isNaN(depthKm)) {
            double rho = density != null ? density
                    : lith != null ? lith.thermalProperties().density() : LithostaticColumn.CRUST_DENSITY;
            return rho * LithostaticColumn.G * Units.kmToM(depthKm);
        }
        return lith == null ? 0 : 0.5 * (lith.minPressure() + lith.maxPressure());
    }

    // ---------------------------------------------------------------------------------------
    // sill

    /** The crust in a sill request. */
    record SillCrust(String lithology, Double initialTemperatureC, Double conductivityWPerMK, String conductivityLaw,
                     Double densityKgPerM3, Double heatCapacityJPerKgK, Double latentHeatJPerKg,
                     List<MeltPoint> meltCurve, MeltingInterval meltingInterval, Double thicknessKm) {
    }

    /** The non-melting mantle below the Moho. */
    record SillMantle(Double densityKgPerM3, Double heatCapacityJPerKgK, Double conductivityWPerMK) {
    }

    /** Repeated emplacement. */
    record Repeat(Integer count, Double intervalKyr, Double rateMmPerYr, String stacking) {
    }

    /** The intrusion in a sill request. */
    record SillIntrusion(String lithology, Double temperatureC, Double thicknessM, Double topDepthKm,
                         Double conductivityWPerMK,
                         String conductivityLaw, Double densityKgPerM3, Double heatCapacityJPerKgK,
                         Double latentHeatJPerKg, List<MeltPoint> meltCurve, MeltingInterval meltingInterval,
                         Repeat repeat) {
    }

    /** A steady continental geotherm as the initial state (the fields of {@code /v1/geotherm}'s continental model). */
    record SillGeotherm(Double surfaceHeatFlowMWPerM2, Double reducedHeatFlowFraction, Double heatProductionScaleKm,
                        String heatProduction, Double surfaceTemperatureC) {
    }

    /** Sill request body. */
    record SillRequest(SillCrust crust, SillIntrusion intrusion, SillMantle mantle, SillGeotherm geotherm,
                       Double columnDepthKm,
                       Double durationKyr, Double gridSpacingM, Double outputEveryKyr, List<Double> profileTimesKyr,
                       Double profileSpacingM) {
    }

    /** One entry of the time series. */
    record SillSample(double timeKyr, double crustMeltThicknessM, double crustPartiallyMoltenThicknessM,
                      double maxCrustMeltFraction, double intrusionMeltFraction, double contactTemperatureC,
                      double maxTemperatureC) {
    }

    /** Key numbers of the run. */
    record SillSummary(Double solidificationTimeKyr, Double timeToFirstCrustMeltKyr, double peakCrustMeltThicknessM,
                       Double peakTimeKyr, double energyErrorFraction, int sillsEmplaced, double emplacedThicknessM,
                       double intrusionTopDepthKm, Double maxMantleTemperatureC) {
    }

    /** One point of a profile. */
    record ProfilePoint(double depthKm, double temperatureC, double meltFraction, String rock) {
    }

    /** A profile at one time. */
    record SillProfile(double timeKyr, List<ProfilePoint> points) {
    }

    /** The boundary conditions the run used. */
    record Boundaries(double surfaceTemperatureC, double basalHeatFlowMWPerM2) {
    }

    /** Cost figures of the run. */
    record SillNumerics(int cells, double gridSpacingM, int timeSteps, int rejectedSteps, long linearSolves) {
    }

    /** Default mantle density (kg/m³): common practice (REFERENCES §1.1). */
    static final double MANTLE_DENSITY = 3300;
    /** Default mantle heat capacity (J/kg/K): Katz et al. (2003) Table 2. */
    static final double MANTLE_HEAT_CAPACITY = 1000;

    /** Sill response body. */
    record SillResponse(List<SillSample> series, SillSummary summary, List<SillProfile> profiles,
                        Boundaries boundaryConditions, SillNumerics numerics, List<String> warnings,
                        List<ModelInfo> models) {
    }

    /** Conductivity law of a rock from its request fields. */
    private static ConductivityLaw law(Validation v, String lawName, Double conductivity, CrustalLithology lith) {
        String law = v.optionalChoice("conductivityLaw", lawName, LAW_CONSTANT, LAWS);
        if (!LAWS.contains(law)) {
            return null;
        }
        if (!LAW_CONSTANT.equals(law) && conductivity != null) {
            v.error("conductivityWPerMK", "give it only with conductivityLaw 'constant'; the law '" + law
                    + "' sets the conductivity");
            return null;
        }
        if (LAW_GRANITE.equals(law)) {
            return Miao2014Conductivity.GRANITE;
        }
        if (LAW_GABBRO.equals(law)) {
            return Miao2014Conductivity.GABBRO;
        }
        double k = property(v, "conductivityWPerMK", conductivity,
                lith == null ? null : lith.thermalProperties().conductivity(), 0.5, 10);
        return Double.isNaN(k) ? null : ConductivityLaw.constant(k);
    }

    static void sill(Context ctx, Config config) {
        SillRequest req = Json.read(ctx.bodyAsBytes(), SillRequest.class);
        Validation v = new Validation();
        v.present("crust", req.crust());
        v.present("intrusion", req.intrusion());
        double durationKyr = v.required("durationKyr", req.durationKyr(), 0.001, MODEL_MAX_DURATION_KYR);
        if (!Double.isNaN(durationKyr)) {
            v.cap("durationKyr", durationKyr / 1000, config.maxSillDurationMyr(), "duration (Myr)",
                    "TECTOMELT_MAX_SILL_DURATION_MYR");
        }
        double dz = v.optional("gridSpacingM", req.gridSpacingM(), 10, 0.01, 1000);
        double columnKm = v.optional("columnDepthKm", req.columnDepthKm(), 60, 0.01, 150);
        v.throwIfInvalid();

        SillCrust c = req.crust();
        SillIntrusion b = req.intrusion();
        Validation cv = v.at("crust");
        Validation bv = v.at("intrusion");
        // the lithologies' curves are read at the pressure of the first sill's top
        double topForCurves = b.topDepthKm() == null ? 0 : Units.kmToM(Math.max(0, Math.min(100, b.topDepthKm())));
        String crustLith = c.lithology();
        String intrusionLith = b.lithology() != null ? b.lithology() : DEFAULT_INTRUSION;
        RockInput crustIn = RockInput.read(cv, "crust", crustLith, c.densityKgPerM3(), c.heatCapacityJPerKgK(),
                c.latentHeatJPerKg(), c.meltCurve(), c.meltingInterval(),
                crustPressure(crustLith, c.densityKgPerM3(), topForCurves),
                c.conductivityWPerMK() != null || c.conductivityLaw() != null);
        RockInput intrusionIn = RockInput.read(bv, "intrusion", intrusionLith, b.densityKgPerM3(),
                b.heatCapacityJPerKgK(), b.latentHeatJPerKg(), b.meltCurve(), b.meltingInterval(),
                crustPressure(crustLith, c.densityKgPerM3(), topForCurves),
                b.conductivityWPerMK() != null || b.conductivityLaw() != null);
        ConductivityLaw kC = law(cv, c.conductivityLaw(), c.conductivityWPerMK(), crustIn.lithology());
        double tc0 = Double.NaN;
        if (req.geotherm() == null) {
            tc0 = cv.required("initialTemperatureC", c.initialTemperatureC(), 0, 1200);
        } else if (c.initialTemperatureC() != null) {
            cv.error("initialTemperatureC", "give crust.initialTemperatureC (a uniform column) or geotherm, not both");
        }
        SillGeotherm geo = req.geotherm();
        double q0 = 0;
        double f = 0;
        double hrKm = 0;
        double surfaceC = 0;
        ContinentalGeotherm.HeatProduction distribution = ContinentalGeotherm.HeatProduction.EXPONENTIAL;
        if (geo != null) {
            Validation gv = v.at("geotherm");
            q0 = Units.mwPerM2ToWPerM2(gv.required("surfaceHeatFlowMWPerM2", geo.surfaceHeatFlowMWPerM2(),
                    Units.wPerM2ToMwPerM2(ContinentalGeotherm.MIN_SURFACE_HEAT_FLOW),
                    Units.wPerM2ToMwPerM2(ContinentalGeotherm.MAX_SURFACE_HEAT_FLOW)));
            f = gv.optional("reducedHeatFlowFraction", geo.reducedHeatFlowFraction(),
                    ContinentalGeotherm.REDUCED_FRACTION, 0, 1);
            hrKm = gv.optional("heatProductionScaleKm", geo.heatProductionScaleKm(),
                    Units.mToKm(ContinentalGeotherm.HEAT_PRODUCTION_SCALE), 1, 50);
            String mode = gv.optionalChoice("heatProduction", geo.heatProduction(), "exponential", GeothermRoutes.HEAT_PRODUCTIONS);
            distribution = "two-layer".equals(mode) ? ContinentalGeotherm.HeatProduction.TWO_LAYER
                    : ContinentalGeotherm.HeatProduction.EXPONENTIAL;
            surfaceC = gv.optional("surfaceTemperatureC", geo.surfaceTemperatureC(), 0, -50, 100);
        }
        double rhoC = crustIn.density();
        double cpC = crustIn.heatCapacity();
        double lC = crustIn.latentHeat();
        MeltCurve crustCurve = crustIn.curve();
        if (crustCurve == null && c.lithology() == null && c.meltCurve() == null && c.meltingInterval() == null) {
            cv.error("meltCurve", "the crust needs a lithology, a meltCurve or a meltingInterval");
        }
        double mohoKm = c.thicknessKm() == null ? Double.NaN : cv.required("thicknessKm", c.thicknessKm(), 1, 100);
        Rock mantle = null;
        if (c.thicknessKm() != null && kC != null) {
            SillMantle m = req.mantle() == null ? new SillMantle(null, null, null) : req.mantle();
            Validation mv = v.at("mantle");
            double rhoM = mv.optional("densityKgPerM3", m.densityKgPerM3(), MANTLE_DENSITY, 2800, 4000);
            double cpM = mv.optional("heatCapacityJPerKgK", m.heatCapacityJPerKgK(), MANTLE_HEAT_CAPACITY, 500, 2500);
            ConductivityLaw kM = m.conductivityWPerMK() == null ? kC
                    : ConductivityLaw.constant(mv.optional("conductivityWPerMK", m.conductivityWPerMK(), 3, 0.5, 10));
            if (mv.ok()) {
                mantle = new Rock(rhoM, cpM, 0, kM, null);
            }
        } else if (req.mantle() != null) {
            v.error("mantle", "a mantle needs crust.thicknessKm, the depth of the Moho");
        }

        double tb0 = bv.required("temperatureC", b.temperatureC(), 500, 1600);
        double thickness = bv.required("thicknessM", b.thicknessM(), 0.01, 5000);
        double topKm = bv.required("topDepthKm", b.topDepthKm(), 0, 100);
        ConductivityLaw kB = law(bv, b.conductivityLaw(), b.conductivityWPerMK(), intrusionIn.lithology());
        double rhoB = intrusionIn.density();
        double cpB = intrusionIn.heatCapacity();
        double lB = intrusionIn.latentHeat();
        MeltCurve intrusionCurve = intrusionIn.curve();

        int count = 1;
        double intervalKyr = 0;
        SillModel.Stacking stacking = SillModel.Stacking.UNDER;
        if (b.repeat() != null) {
            Validation rv = bv.at("repeat");
            Repeat rep = b.repeat();
            String st = rv.optionalChoice("stacking", rep.stacking(), "under", STACKINGS);
            stacking = "over".equals(st) ? SillModel.Stacking.OVER : SillModel.Stacking.UNDER;
            if ((rep.intervalKyr() == null) == (rep.rateMmPerYr() == null)) {
                rv.error("intervalKyr", "give exactly one of intervalKyr or rateMmPerYr");
            } else if (rep.intervalKyr() != null) {
                intervalKyr = rv.required("intervalKyr", rep.intervalKyr(), 0.001, MAX_INTERVAL_KYR);
            } else {
                double rate = rv.required("rateMmPerYr", rep.rateMmPerYr(), 0.001, 1000);
                if (!Double.isNaN(rate) && !Double.isNaN(thickness)) {
                    // a sill every thickness / rate
                    intervalKyr = Units.sToKyr(thickness / Units.mmPerYrToMPerS(rate));
                }
            }
            if (rep.count() != null) {
                count = rv.optionalInt("count", rep.count(), 1, 1, MAX_SILLS);
            } else if (intervalKyr > 0 && !Double.isNaN(durationKyr)) {
                count = (int) Math.min(MAX_SILLS, Math.ceil(durationKyr / intervalKyr - 1e-9));
            }
        }

        Double outputEvery = req.outputEveryKyr();
        double every = Double.isNaN(durationKyr) ? Double.NaN
                : v.optional("outputEveryKyr", outputEvery, durationKyr / 100, durationKyr * 1e-9, durationKyr);
        if (!Double.isNaN(every)) {
            v.cap("outputEveryKyr", Math.ceil(durationKyr / every - 1e-9) + 1, config.maxProfilePoints(),
                    "series entries", "TECTOMELT_MAX_PROFILE_POINTS");
        }
        List<Double> profileKyr = v.list("profileTimesKyr", req.profileTimesKyr(), 0, MAX_PROFILES);
        for (int i = 0; i < profileKyr.size(); i++) {
            Double x = profileKyr.get(i);
            String field = "profileTimesKyr[" + i + "]";
            if (x == null) {
                v.error(field, "must be a number between 0 and durationKyr");
            } else if (!Double.isNaN(durationKyr)) {
                v.required(field, x, 0, durationKyr);
            }
        }
        Double profileSpacing = req.profileSpacingM() == null ? null
                : v.optional("profileSpacingM", req.profileSpacingM(), dz, 0.01, 100_000);
        v.throwIfInvalid();

        // geometry and work limits, each naming the field to change
        double columnM = Units.kmToM(columnKm);
        double topM = Units.kmToM(topKm);
        if (!Double.isNaN(mohoKm) && mohoKm > columnKm) {
            v.error("crust.thicknessKm", "must not exceed columnDepthKm (" + Validation.format(columnKm) + "), got "
                    + Validation.format(mohoKm));
        }
        if (topM + thickness > columnM) {
            v.error("columnDepthKm", "must reach below the first sill (intrusion.topDepthKm + thicknessM = "
                    + Validation.format(Units.mToKm(topM + thickness)) + " km), got " + Validation.format(columnKm));
        }
        if (thickness / dz < MIN_CELLS_PER_SILL - 1e-9) {
            v.error("gridSpacingM", "must be at most half the sill thickness (" + Validation.format(thickness / 2)
                    + " m) so that a sill spans at least " + MIN_CELLS_PER_SILL + " cells, got " + Validation.format(dz));
        }
        if (columnM / dz < 2) {
            v.error("gridSpacingM", "the column must span at least two cells");
        }
        v.throwIfInvalid();

        SillModel.Intrusions intrusions = new SillModel.Intrusions(thickness, topM, Units.celsiusToKelvin(tb0), count,
                Units.kyrToS(intervalKyr), stacking);
        double profileM = profileSpacing != null ? profileSpacing : dz;
        InitialState initial;
        if (geo == null) {
            initial = new InitialState.Uniform(Units.celsiusToKelvin(tc0));
        } else {
            // the geotherm's conductivity is the crust's, so that the column starts steady
            double surfaceK = Units.celsiusToKelvin(surfaceC);
            initial = new GeothermInitialState(ContinentalGeotherm.of(q0, f, Units.kmToM(hrKm), kC.at(surfaceK),
                    surfaceK, Double.isNaN(mohoKm) ? columnM : Units.kmToM(mohoKm), distribution));
        }
        double mohoM = mantle == null ? Double.POSITIVE_INFINITY : Units.kmToM(mohoKm);
        SillModel.Setup probe = new SillModel.Setup(
                new Rock(rhoC, cpC, lC, kC, crustCurve), new Rock(rhoB, cpB, lB, kB, intrusionCurve),
                initial, intrusions, columnM, dz,
                Units.kyrToS(durationKyr), Units.kyrToS(every),
                profileKyr.stream().map(Units::kyrToS).toList(), profileM,
                new SillModel.Numerics(SillModel.Numerics.DEFAULT.toleranceK(), MAX_TIME_STEPS,
                        config.maxSillCellSteps()),
                mantle, mohoM);
        long cells = (long) probe.initialCells() + (long) probe.sillsWithinDuration() * probe.cellsPerSill();
        if (cells > MAX_CELLS) {
            v.error("gridSpacingM", "the column would grow to " + cells + " cells (column plus emplaced sills); at most "
                    + MAX_CELLS + ": coarsen gridSpacingM, shorten columnDepthKm or emplace less intrusion");
            v.throwIfInvalid();
        }
        // a lower bound of the work, known before running (shorten durationKyr, coarsen gridSpacingM,
        // shorten columnDepthKm or emplace fewer sills)
        v.cap("durationKyr", Math.ceil(probe.minimumCellSteps()), config.maxSillCellSteps(),
                "the least grid cells × time steps this run needs,", "TECTOMELT_MAX_SILL_CELL_STEPS");
        if (profileSpacing != null) {
            double stride = Math.max(1, Math.rint(profileSpacing / dz));
            v.cap("profileSpacingM", Math.ceil(cells / stride), config.maxProfilePoints(), "points per profile",
                    "TECTOMELT_MAX_PROFILE_POINTS");
        }
        v.throwIfInvalid();
        SillModel.Setup setup = probe;
        if (profileSpacing == null) {
            int perProfile = Math.min(DEFAULT_PROFILE_POINTS, config.maxProfilePoints());
            int stride = (int) Math.max(1, (cells + perProfile - 1) / perProfile);
            setup = new SillModel.Setup(probe.crust(), probe.intrusion(), probe.initial(), intrusions, columnM, dz,
                    probe.duration(), probe.outputEvery(), probe.profileTimes(), stride * dz, probe.numerics(),
                    probe.mantle(), probe.mohoDepth());
        }

        SillModel.Setup run = setup;
        SillResult r;
        try {
            r = Metrics.engine(ctx, () -> SillModel.run(run, Heavy.deadline(ctx)));
        } catch (SillModel.WorkLimitExceeded e) {
            throw ApiProblem.invalid("durationKyr", e.getMessage() + " (server caps TECTOMELT_MAX_SILL_CELL_STEPS and "
                    + MAX_TIME_STEPS + " time steps); shorten durationKyr, coarsen gridSpacingM or emplace fewer sills");
        }
        List<String> notes = new ArrayList<>(crustIn.warnings());
        notes.addAll(intrusionIn.warnings());
        List<ModelInfo> citations = new ArrayList<>(crustIn.citations());
        addAll(citations, intrusionIn.citations());
        Responses.json(ctx, response(setup, r, notes, citations));
    }

    /** Lithostatic pressure (Pa) at depth {@code z} (m) in a crust of the given or the lithology's density. */
    private static double crustPressure(String lithologyId, Double density, double z) {
        CrustalLithology lith = lithologyId == null ? null : Lithologies.crustalById(lithologyId).orElse(null);
        double rho = density != null ? density
                : lith != null ? lith.thermalProperties().density() : LithostaticColumn.CRUST_DENSITY;
        return rho * LithostaticColumn.G * z;
    }

    private static SillResponse response(SillModel.Setup setup, SillResult r, List<String> notes,
                                         List<ModelInfo> citations) {
        List<SillSample> series = new ArrayList<>(r.series().size());
        for (SillResult.Sample s : r.series()) {
            series.add(new SillSample(Units.sToKyr(s.time()), s.crustMeltThickness(), s.crustPartiallyMoltenThickness(),
                    s.maxCrustMeltFraction(), s.intrusionMeltFraction(), Units.kelvinToCelsius(s.contactTemperature()),
                    Units.kelvinToCelsius(s.maxTemperature())));
        }
        SillResult.Summary sm = r.summary();
        Double mantleC = sm.maxMantleTemperature() == null ? null : Units.kelvinToCelsius(sm.maxMantleTemperature());
        SillSummary summary = new SillSummary(kyrOrNull(sm.solidificationTime()), kyrOrNull(sm.timeToFirstCrustMelt()),
                sm.peakCrustMeltThickness(), kyrOrNull(sm.peakTime()), sm.energyErrorFraction(), sm.sillsEmplaced(),
                sm.emplacedThickness(), Units.mToKm(sm.topDepth()), mantleC);
        List<String> warnings = new ArrayList<>(notes);
        warnings.addAll(r.warnings());
        boolean mantleAboveSolidus = false;
        if (setup.mantle() != null && sm.maxMantleTemperature() != null) {
            // the dry peridotite solidus is lowest at the Moho, the top of the mantle
            double moho = setup.mohoDepth();
            double p = new LithostaticColumn(moho, setup.crust().density(), setup.mantle().density(), LithostaticColumn.G)
                    .pressureAt(moho);
            double solidus = Lithologies.defaultMantle().drySolidus(p);
            if (sm.maxMantleTemperature() > solidus) {
                mantleAboveSolidus = true;
                warnings.add(String.format(java.util.Locale.ROOT, "the mantle below the Moho reached %.0f °C, above "
                        + "the dry peridotite solidus at the Moho (%.0f °C, Katz et al. 2003), but it does not melt in "
                        + "this model", Units.kelvinToCelsius(sm.maxMantleTemperature()), Units.kelvinToCelsius(solidus)));
            }
        }
        List<SillProfile> profiles = new ArrayList<>(r.profiles().size());
        for (SillResult.Profile p : r.profiles()) {
            List<ProfilePoint> points = new ArrayList<>(p.depth().length);
            for (int i = 0; i < p.depth().length; i++) {
                points.add(new ProfilePoint(Units.mToKm(p.depth()[i]), Units.kelvinToCelsius(p.temperature()[i]),
                        p.meltFraction()[i], p.material()[i].name().toLowerCase(java.util.Locale.ROOT)));
            }
            profiles.add(new SillProfile(Units.sToKyr(p.time()), points));
        }
        Boundaries bc = new Boundaries(Units.kelvinToCelsius(setup.initial().surfaceTemperature()),
                Units.wPerM2ToMwPerM2(setup.initial().basalHeatFlow(setup.columnDepth())));
        SillResult.Numerics nm = r.numerics();
        SillNumerics numerics = new SillNumerics(nm.cells(), setup.gridSpacing(), nm.timeSteps(), nm.rejectedSteps(),
                nm.linearSolves());
        List<ModelInfo> models = new ArrayList<>(List.of(SillModel.ENTHALPY_METHOD));
        if (setup.initial() instanceof GeothermInitialState) {
            models.add(ContinentalGeotherm.INFO);
        }
        if (setup.intrusions().count() > 1) {
            models.add(SillModel.ANNEN_SPARKS_2002);
        }
        if (!setup.crust().conductivity().isConstant() || !setup.intrusion().conductivity().isConstant()) {
            models.add(Miao2014Conductivity.INFO);
        }
        addAll(models, citations);
        if (mantleAboveSolidus) {
            models.add(Lithologies.defaultMantle().info());
        }
        return new SillResponse(series, summary, profiles, bc, numerics, warnings, models);
    }

    private static Double kyrOrNull(Double seconds) {
        return seconds == null ? null : Units.sToKyr(seconds);
    }
}
