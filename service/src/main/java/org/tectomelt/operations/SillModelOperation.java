package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.tectomelt.Config;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.crust.ConductivityLaw;
import org.tectomelt.engine.crust.GeothermInitialState;
import org.tectomelt.engine.crust.InitialState;
import org.tectomelt.engine.crust.Miao2014Conductivity;
import org.tectomelt.engine.crust.Rock;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.crust.SillResult;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.MeltCurve;
import org.tectomelt.engine.thermal.ContinentalGeotherm;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.units.Units;
import org.tectomelt.operations.CrustalRocks.MeltPoint;
import org.tectomelt.operations.CrustalRocks.MeltingInterval;
import org.tectomelt.operations.CrustalRocks.RockInput;

/**
 * {@code sill-model}: the transient enthalpy model of one sill or a stack of repeated sills heating
 * the crust. Heavy: its work is bounded by {@code TECTOMELT_MAX_SILL_CELL_STEPS} and the duration by
 * {@code TECTOMELT_MAX_SILL_DURATION_MYR}.
 */
public final class SillModelOperation implements Operation<SillModelOperation.Request, SillModelOperation.Result> {

    /** Most cells a run may have at its end (column plus emplaced sills). */
    public static final int MAX_CELLS = 20_000;
    /** Most accepted time steps of one run. */
    public static final int MAX_TIME_STEPS = 100_000;
    /** Most points per profile when the spacing is left to the default. */
    public static final int DEFAULT_PROFILE_POINTS = 2_000;
    /** Fewest cells across one sill. */
    public static final int MIN_CELLS_PER_SILL = 2;
    /**
     * Most sills a repeat emplaces when {@code count} is left to the duration; the spec's maximum of
     * {@code intrusion.repeat.count} (a test keeps them equal).
     */
    public static final int MAX_SILLS = 1_000;

    /** The crust (the spec fills {@code conductivityLaw}). */
    public record Crust(String lithology, Double initialTemperatureC, Double conductivityWPerMK,
                        String conductivityLaw, Double densityKgPerM3, Double heatCapacityJPerKgK,
                        Double latentHeatJPerKg, List<MeltPoint> meltCurve, MeltingInterval meltingInterval,
                        Double thicknessKm) {
    }

    /** The non-melting mantle below the Moho (the spec fills density and heat capacity). */
    public record Mantle(Double densityKgPerM3, Double heatCapacityJPerKgK, Double conductivityWPerMK) {
    }

    /** Repeated emplacement (the spec fills {@code stacking}). */
    public record Repeat(Integer count, Double intervalKyr, Double rateMmPerYr, String stacking) {
    }

    /** The intrusion (the spec fills {@code lithology} and {@code conductivityLaw}). */
    public record Intrusion(String lithology, Double temperatureC, Double thicknessM, Double topDepthKm,
                            Double conductivityWPerMK, String conductivityLaw, Double densityKgPerM3,
                            Double heatCapacityJPerKgK, Double latentHeatJPerKg, List<MeltPoint> meltCurve,
                            MeltingInterval meltingInterval, Repeat repeat) {
    }

    /** A steady continental geotherm as the initial state (the spec fills its defaults). */
    public record Geotherm(Double surfaceHeatFlowMWPerM2, Double reducedHeatFlowFraction,
                           Double heatProductionScaleKm, String heatProduction, Double surfaceTemperatureC) {
    }

    /** Request (the spec fills {@code columnDepthKm} and {@code gridSpacingM}). */
    public record Request(Crust crust, Intrusion intrusion, Mantle mantle, Geotherm geotherm, Double columnDepthKm,
                          Double durationKyr, Double gridSpacingM, Double outputEveryKyr, List<Double> profileTimesKyr,
                          Double profileSpacingM) {
    }

    /** One entry of the time series. */
    public record Sample(double timeKyr, double crustMeltThicknessM, double crustPartiallyMoltenThicknessM,
                         double maxCrustMeltFraction, double intrusionMeltFraction, double contactTemperatureC,
                         double maxTemperatureC) {
    }

    /** Key numbers of the run. */
    public record Summary(Double solidificationTimeKyr, Double timeToFirstCrustMeltKyr, double peakCrustMeltThicknessM,
                          Double peakTimeKyr, double energyErrorFraction, int sillsEmplaced, double emplacedThicknessM,
                          double intrusionTopDepthKm, Double maxMantleTemperatureC) {
    }

    /** One point of a profile. */
    public record ProfilePoint(double depthKm, double temperatureC, double meltFraction, String rock) {
    }

    /** A profile at one time. */
    public record Profile(double timeKyr, List<ProfilePoint> points) {
    }

    /** The boundary conditions the run used. */
    public record Boundaries(double surfaceTemperatureC, double basalHeatFlowMWPerM2) {
    }

    /** Cost figures of the run. */
    public record Numerics(int cells, double gridSpacingM, int timeSteps, int rejectedSteps, long linearSolves) {
    }

    /** The run. */
    public record Result(List<Sample> series, Summary summary, List<Profile> profiles, Boundaries boundaryConditions,
                         Numerics numerics, List<String> warnings, List<ModelInfo> models) {
    }

    private final Config config;

    SillModelOperation(Config config) {
        this.config = config;
    }

    @Override
    public String name() {
        return "sill-model";
    }

    @Override
    public String path() {
        return "/v1/crustal-heating/sill";
    }

    @Override
    public Class<Request> requestType() {
        return Request.class;
    }

    @Override
    public Cost costClass() {
        return Cost.HEAVY;
    }

    @Override
    public List<Cap> caps() {
        return List.of(new Cap("durationKyr", config.maxSillDurationMyr() * 1000, "TECTOMELT_MAX_SILL_DURATION_MYR"));
    }

    @Override
    public String rows() {
        return "series";
    }

    @Override
    public List<Input> inputs() {
        return List.of(
                new Input("crust.initialTemperatureC", "°C", "uniform initial temperature of the column", true),
                new Input("crust.thicknessKm", "km", "depth of the Moho", true),
                new Input("intrusion.temperatureC", "°C", "intrusion temperature", true),
                new Input("intrusion.thicknessM", "m", "thickness of one sill", true),
                new Input("intrusion.topDepthKm", "km", "depth of the first sill's top", true),
                new Input("intrusion.repeat.intervalKyr", "kyr", "time between emplacements", true),
                new Input("intrusion.repeat.rateMmPerYr", "mm/yr", "emplacement rate", true),
                new Input("geotherm.surfaceHeatFlowMWPerM2", "mW/m²", "surface heat flow of the initial geotherm",
                        true),
                new Input("durationKyr", "kyr", "simulated time", false),
                new Input("gridSpacingM", "m", "grid spacing", false));
    }

    @Override
    public List<Output<Result>> outputs() {
        return List.of(
                new Output<>("summary.solidificationTimeKyr", "kyr", "time for the intrusion to solidify",
                        r -> r.summary().solidificationTimeKyr()),
                new Output<>("summary.timeToFirstCrustMeltKyr", "kyr", "time to the first crustal melt",
                        r -> r.summary().timeToFirstCrustMeltKyr()),
                new Output<>("summary.peakCrustMeltThicknessM", "m", "largest thickness of crustal melt",
                        r -> r.summary().peakCrustMeltThicknessM()),
                new Output<>("summary.peakTimeKyr", "kyr", "time of the largest crustal melt thickness",
                        r -> r.summary().peakTimeKyr()),
                new Output<>("summary.maxMantleTemperatureC", "°C", "hottest mantle below the Moho",
                        r -> r.summary().maxMantleTemperatureC()));
    }

    @Override
    public void check(Request q, Rules rules) {
        if (q.crust() != null) {
            CrustalRocks.checkOneCurve(rules.at("crust"), q.crust().meltCurve(), q.crust().meltingInterval());
        }
        if (q.intrusion() != null) {
            CrustalRocks.checkOneCurve(rules.at("intrusion"), q.intrusion().meltCurve(),
                    q.intrusion().meltingInterval());
        }
    }

    @Override
    public Result run(Request q, Deadline deadline) {
        Rules rules = new Rules();
        double durationKyr = q.durationKyr();
        double dz = q.gridSpacingM();
        double columnKm = q.columnDepthKm();
        Crust c = q.crust();
        Intrusion b = q.intrusion();
        Rules cv = rules.at("crust");
        Rules bv = rules.at("intrusion");
        // the lithologies' curves are read at the pressure of the first sill's top
        double topForCurves = Units.kmToM(b.topDepthKm());
        double curvePressure = CrustalRocks.crustPressure(c.lithology(), c.densityKgPerM3(), topForCurves);
        RockInput crustIn = CrustalRocks.read(cv, "crust", c.lithology(), c.densityKgPerM3(), c.heatCapacityJPerKgK(),
                c.latentHeatJPerKg(), c.meltCurve(), c.meltingInterval(), curvePressure,
                c.conductivityWPerMK() != null || !CrustalRocks.LAW_CONSTANT.equals(c.conductivityLaw()));
        RockInput intrusionIn = CrustalRocks.read(bv, "intrusion", b.lithology(), b.densityKgPerM3(),
                b.heatCapacityJPerKgK(), b.latentHeatJPerKg(), b.meltCurve(), b.meltingInterval(), curvePressure,
                b.conductivityWPerMK() != null || !CrustalRocks.LAW_CONSTANT.equals(b.conductivityLaw()));
        ConductivityLaw kC = CrustalRocks.law(cv, c.conductivityLaw(), c.conductivityWPerMK(), crustIn.lithology());
        Geotherm geo = q.geotherm();
        if (geo == null) {
            cv.check(c.initialTemperatureC() != null, "initialTemperatureC", "is required unless geotherm is given");
        } else if (c.initialTemperatureC() != null) {
            cv.error("initialTemperatureC", "give crust.initialTemperatureC (a uniform column) or geotherm, not both");
        }
        MeltCurve crustCurve = crustIn.curve();
        if (crustCurve == null && c.lithology() == null && c.meltCurve() == null && c.meltingInterval() == null) {
            cv.error("meltCurve", "the crust needs a lithology, a meltCurve or a meltingInterval");
        }
        Double mohoKm = c.thicknessKm();
        Rock mantle = null;
        if (mohoKm != null && kC != null) {
            Mantle m = q.mantle();
            double rhoM = m == null ? LithostaticColumn.MANTLE_DENSITY : m.densityKgPerM3();
            double cpM = m == null ? org.tectomelt.engine.thermal.MantleAdiabat.HEAT_CAPACITY : m.heatCapacityJPerKgK();
            ConductivityLaw kM = m == null || m.conductivityWPerMK() == null ? kC
                    : ConductivityLaw.constant(m.conductivityWPerMK());
            mantle = new Rock(rhoM, cpM, 0, kM, null);
        } else if (q.mantle() != null) {
            rules.error("mantle", "a mantle needs crust.thicknessKm, the depth of the Moho");
        }
        double tb0 = b.temperatureC();
        double thickness = b.thicknessM();
        double topKm = b.topDepthKm();
        ConductivityLaw kB = CrustalRocks.law(bv, b.conductivityLaw(), b.conductivityWPerMK(), intrusionIn.lithology());

        int count = 1;
        double intervalKyr = 0;
        SillModel.Stacking stacking = SillModel.Stacking.UNDER;
        if (b.repeat() != null) {
            Rules rv = bv.at("repeat");
            Repeat rep = b.repeat();
            stacking = "over".equals(rep.stacking()) ? SillModel.Stacking.OVER : SillModel.Stacking.UNDER;
            if ((rep.intervalKyr() == null) == (rep.rateMmPerYr() == null)) {
                rv.error("intervalKyr", "give exactly one of intervalKyr or rateMmPerYr");
            } else if (rep.intervalKyr() != null) {
                intervalKyr = rep.intervalKyr();
            } else {
                // a sill every thickness / rate
                intervalKyr = Units.sToKyr(thickness / Units.mmPerYrToMPerS(rep.rateMmPerYr()));
            }
            if (rep.count() != null) {
                count = rep.count();
            } else if (intervalKyr > 0) {
                count = (int) Math.min(MAX_SILLS, Math.ceil(durationKyr / intervalKyr - 1e-9));
            }
        }

        double every = q.outputEveryKyr() != null ? q.outputEveryKyr() : durationKyr / 100;
        if (rules.check(every >= durationKyr * 1e-9 && every <= durationKyr, "outputEveryKyr", "must be between "
                + Rules.format(durationKyr * 1e-9) + " and durationKyr (" + Rules.format(durationKyr) + "), got "
                + Rules.format(every))) {
            rules.cap("outputEveryKyr", Math.ceil(durationKyr / every - 1e-9) + 1, config.maxProfilePoints(),
                    "series entries", "TECTOMELT_MAX_PROFILE_POINTS");
        }
        List<Double> profileKyr = q.profileTimesKyr() == null ? List.of() : q.profileTimesKyr();
        for (int i = 0; i < profileKyr.size(); i++) {
            rules.within("profileTimesKyr[" + i + "]", profileKyr.get(i), 0, durationKyr);
        }
        Double profileSpacing = q.profileSpacingM();
        rules.throwIfBroken();

        // geometry and work limits, each naming the field to change
        double columnM = Units.kmToM(columnKm);
        double topM = Units.kmToM(topKm);
        if (mohoKm != null && mohoKm > columnKm) {
            rules.error("crust.thicknessKm", "must not exceed columnDepthKm (" + Rules.format(columnKm) + "), got "
                    + Rules.format(mohoKm));
        }
        if (topM + thickness > columnM) {
            rules.error("columnDepthKm", "must reach below the first sill (intrusion.topDepthKm + thicknessM = "
                    + Rules.format(Units.mToKm(topM + thickness)) + " km), got " + Rules.format(columnKm));
        }
        if (thickness / dz < MIN_CELLS_PER_SILL - 1e-9) {
            rules.error("gridSpacingM", "must be at most half the sill thickness (" + Rules.format(thickness / 2)
                    + " m) so that a sill spans at least " + MIN_CELLS_PER_SILL + " cells, got " + Rules.format(dz));
        }
        if (columnM / dz < 2) {
            rules.error("gridSpacingM", "the column must span at least two cells");
        }
        rules.throwIfBroken();

        SillModel.Intrusions intrusions = new SillModel.Intrusions(thickness, topM, Units.celsiusToKelvin(tb0), count,
                Units.kyrToS(intervalKyr), stacking);
        double profileM = profileSpacing != null ? profileSpacing : dz;
        InitialState initial;
        if (geo == null) {
            initial = new InitialState.Uniform(Units.celsiusToKelvin(c.initialTemperatureC()));
        } else {
            // the geotherm's conductivity is the crust's, so that the column starts steady
            double surfaceK = Units.celsiusToKelvin(geo.surfaceTemperatureC());
            ContinentalGeotherm.HeatProduction distribution = "two-layer".equals(geo.heatProduction())
                    ? ContinentalGeotherm.HeatProduction.TWO_LAYER : ContinentalGeotherm.HeatProduction.EXPONENTIAL;
            initial = new GeothermInitialState(ContinentalGeotherm.of(Units.mwPerM2ToWPerM2(geo.surfaceHeatFlowMWPerM2()),
                    geo.reducedHeatFlowFraction(), Units.kmToM(geo.heatProductionScaleKm()), kC.at(surfaceK),
                    surfaceK, mohoKm == null ? columnM : Units.kmToM(mohoKm), distribution));
        }
        double mohoM = mantle == null ? Double.POSITIVE_INFINITY : Units.kmToM(mohoKm);
        SillModel.Setup probe = new SillModel.Setup(
                new Rock(crustIn.density(), crustIn.heatCapacity(), crustIn.latentHeat(), kC, crustCurve),
                new Rock(intrusionIn.density(), intrusionIn.heatCapacity(), intrusionIn.latentHeat(), kB,
                        intrusionIn.curve()),
                initial, intrusions, columnM, dz,
                Units.kyrToS(durationKyr), Units.kyrToS(every),
                profileKyr.stream().map(Units::kyrToS).toList(), profileM,
                new SillModel.Numerics(SillModel.Numerics.DEFAULT.toleranceK(), MAX_TIME_STEPS,
                        config.maxSillCellSteps()),
                mantle, mohoM);
        long cells = (long) probe.initialCells() + (long) probe.sillsWithinDuration() * probe.cellsPerSill();
        if (cells > MAX_CELLS) {
            throw new OperationException("gridSpacingM", "the column would grow to " + cells + " cells (column plus "
                    + "emplaced sills); at most " + MAX_CELLS + ": coarsen gridSpacingM, shorten columnDepthKm or "
                    + "emplace less intrusion");
        }
        // a lower bound of the work, known before running (shorten durationKyr, coarsen gridSpacingM,
        // shorten columnDepthKm or emplace fewer sills)
        rules.cap("durationKyr", Math.ceil(probe.minimumCellSteps()), config.maxSillCellSteps(),
                "the least grid cells × time steps this run needs,", "TECTOMELT_MAX_SILL_CELL_STEPS");
        if (profileSpacing != null) {
            double stride = Math.max(1, Math.rint(profileSpacing / dz));
            rules.cap("profileSpacingM", Math.ceil(cells / stride), config.maxProfilePoints(), "points per profile",
                    "TECTOMELT_MAX_PROFILE_POINTS");
        }
        rules.throwIfBroken();
        SillModel.Setup setup = probe;
        if (profileSpacing == null) {
            int perProfile = Math.min(DEFAULT_PROFILE_POINTS, config.maxProfilePoints());
            int stride = (int) Math.max(1, (cells + perProfile - 1) / perProfile);
            setup = new SillModel.Setup(probe.crust(), probe.intrusion(), probe.initial(), intrusions, columnM, dz,
                    probe.duration(), probe.outputEvery(), probe.profileTimes(), stride * dz, probe.numerics(),
                    probe.mantle(), probe.mohoDepth());
        }
        SillResult r;
        try {
            r = SillModel.run(setup, deadline);
        } catch (SillModel.WorkLimitExceeded e) {
            throw new OperationException("durationKyr", e.getMessage() + " (server caps TECTOMELT_MAX_SILL_CELL_STEPS "
                    + "and " + MAX_TIME_STEPS + " time steps); shorten durationKyr, coarsen gridSpacingM or emplace "
                    + "fewer sills");
        }
        List<String> notes = new ArrayList<>(crustIn.warnings());
        notes.addAll(intrusionIn.warnings());
        List<ModelInfo> citations = new ArrayList<>(crustIn.citations());
        CrustalRocks.addAll(citations, intrusionIn.citations());
        return result(setup, r, notes, citations);
    }

    private static Result result(SillModel.Setup setup, SillResult r, List<String> notes, List<ModelInfo> citations) {
        List<Sample> series = new ArrayList<>(r.series().size());
        for (SillResult.Sample s : r.series()) {
            series.add(new Sample(Units.sToKyr(s.time()), s.crustMeltThickness(), s.crustPartiallyMoltenThickness(),
                    s.maxCrustMeltFraction(), s.intrusionMeltFraction(), Units.kelvinToCelsius(s.contactTemperature()),
                    Units.kelvinToCelsius(s.maxTemperature())));
        }
        SillResult.Summary sm = r.summary();
        Double mantleC = sm.maxMantleTemperature() == null ? null : Units.kelvinToCelsius(sm.maxMantleTemperature());
        Summary summary = new Summary(kyrOrNull(sm.solidificationTime()), kyrOrNull(sm.timeToFirstCrustMelt()),
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
                warnings.add(String.format(Locale.ROOT, "the mantle below the Moho reached %.0f °C, above "
                        + "the dry peridotite solidus at the Moho (%.0f °C, Katz et al. 2003), but it does not melt in "
                        + "this model", Units.kelvinToCelsius(sm.maxMantleTemperature()), Units.kelvinToCelsius(solidus)));
            }
        }
        List<Profile> profiles = new ArrayList<>(r.profiles().size());
        for (SillResult.Profile p : r.profiles()) {
            List<ProfilePoint> points = new ArrayList<>(p.depth().length);
            for (int i = 0; i < p.depth().length; i++) {
                points.add(new ProfilePoint(Units.mToKm(p.depth()[i]), Units.kelvinToCelsius(p.temperature()[i]),
                        p.meltFraction()[i], p.material()[i].name().toLowerCase(Locale.ROOT)));
            }
            profiles.add(new Profile(Units.sToKyr(p.time()), points));
        }
        Boundaries bc = new Boundaries(Units.kelvinToCelsius(setup.initial().surfaceTemperature()),
                Units.wPerM2ToMwPerM2(setup.initial().basalHeatFlow(setup.columnDepth())));
        SillResult.Numerics nm = r.numerics();
        Numerics numerics = new Numerics(nm.cells(), setup.gridSpacing(), nm.timeSteps(), nm.rejectedSteps(),
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
        CrustalRocks.addAll(models, citations);
        if (mantleAboveSolidus) {
            models.add(Lithologies.defaultMantle().info());
        }
        return new Result(series, summary, profiles, bc, numerics, warnings, models);
    }

    private static Double kyrOrNull(Double seconds) {
        return seconds == null ? null : Units.sToKyr(seconds);
    }
}
