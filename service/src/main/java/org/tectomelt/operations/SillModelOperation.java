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
import org.tectomelt.engine.melting.MeltTable;
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
    /** Default cell (m) of a uniform grid ({@code gridGrowth} 1), the route's former default. */
    public static final double UNIFORM_DEFAULT_SPACING_M = 10;
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
                        Double thicknessKm, List<CrustalRocks.TableRow> meltTable)
            implements CrustalRocks.CurveFields {
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
                            MeltingInterval meltingInterval, Repeat repeat, Boolean convection,
                            Double lockMeltFraction, Double viscosityPaS, Double thermalExpansivityPerK)
            implements CrustalRocks.CurveFields {
    }

    /** A steady continental geotherm as the initial state (the spec fills its defaults). */
    public record Geotherm(Double surfaceHeatFlowMWPerM2, Double reducedHeatFlowFraction,
                           Double heatProductionScaleKm, String heatProduction, Double surfaceTemperatureC) {
    }

    /**
     * Request (the spec fills {@code columnDepthKm}, {@code gridGrowth}, {@code largestCellM} and
     * {@code convergenceCheck}; {@code gridSpacingM} defaults to {@link SillModel#resolvingSpacing}).
     */
    public record Request(Crust crust, Intrusion intrusion, Mantle mantle, Geotherm geotherm, Double columnDepthKm,
                          Double durationKyr, Double gridSpacingM, Double outputEveryKyr, List<Double> profileTimesKyr,
                          Double profileSpacingM, Double gridGrowth, Double largestCellM, Boolean convergenceCheck) {
    }

    /** One entry of the time series. */
    public record Sample(double timeKyr, double crustMeltThicknessM, double crustPartiallyMoltenThicknessM,
                         double maxCrustMeltFraction, double intrusionMeltFraction, double contactTemperatureC,
                         double maxTemperatureC, double roofHeatFluxMWPerM2, double firstSillTemperatureC) {
    }

    /** Key numbers of the run. */
    public record Summary(Double solidificationTimeKyr, Double timeToFirstCrustMeltKyr, double peakCrustMeltThicknessM,
                          Double peakTimeKyr, double energyErrorFraction, int sillsEmplaced, double emplacedThicknessM,
                          double intrusionTopDepthKm, Double maxMantleTemperatureC, Double lockUpTimeKyr) {
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

    /** The coarser run's key numbers: the other answer of the convergence check's pair. */
    public record CoarseRun(Double solidificationTimeKyr, Double timeToFirstCrustMeltKyr, double peakCrustMeltThicknessM,
                            Double peakTimeKyr, Double lockUpTimeKyr) {
    }

    /**
     * The convergence check: the run repeated one level coarser, the finest cell doubled and the time-step
     * tolerance quadrupled (see {@link SillResult.Convergence}), after {@code refinements} refinements of the
     * default.
     */
    public record Convergence(double coarseGridSpacingM, double coarseToleranceK, Double solidificationTimeChange,
                              Double timeToFirstCrustMeltChange, Double peakCrustMeltThicknessChange,
                              Double peakTimeChange, Double lockUpTimeChange, double largestChange, boolean converged,
                              int refinements, CoarseRun coarse) {
    }

    /** Cost figures of the run. */
    public record Numerics(int cells, double gridSpacingM, int timeSteps, int rejectedSteps, long linearSolves,
                           double smallestCellM, double largestCellM, double toleranceK, Convergence convergence) {
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
                new Input("intrusion.lockMeltFraction", "–", "melt fraction at which a convecting sill locks up",
                        true),
                new Input("durationKyr", "kyr", "simulated time", false),
                new Input("gridSpacingM", "m", "finest grid spacing", false));
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
                        r -> r.summary().maxMantleTemperatureC()),
                new Output<>("summary.lockUpTimeKyr", "kyr", "time at which the first sill stopped convecting",
                        r -> r.summary().lockUpTimeKyr()));
    }

    @Override
    public void check(Request q, Rules rules) {
        CrustalRocks.checkOneCurve(rules, q.crust(), q.intrusion());
    }

    @Override
    public Result run(Request q, Deadline deadline) {
        Rules rules = new Rules();
        double durationKyr = q.durationKyr();
        Crust c = q.crust();
        Intrusion b = q.intrusion();
        double growth = q.gridGrowth() == null ? SillModel.GridPlan.DEFAULT_GROWTH : q.gridGrowth();
        double dz = q.gridSpacingM() != null ? q.gridSpacingM()
                : growth == 1.0 ? UNIFORM_DEFAULT_SPACING_M : SillModel.resolvingSpacing(b.thicknessM());
        double columnKm = q.columnDepthKm();
        double largest = q.largestCellM() == null ? SillModel.GridPlan.DEFAULT_LARGEST_CELL : q.largestCellM();
        SillModel.GridPlan plan = growth == 1.0 ? SillModel.GridPlan.UNIFORM : new SillModel.GridPlan(growth, largest);
        if (!plan.uniform()) {
            rules.check(largest >= dz, "largestCellM", "must not be below the finest cell gridSpacingM ("
                    + Rules.format(dz) + " m), got " + Rules.format(largest));
        }
        SillModel.Convection convection = convection(rules.at("intrusion"), b);
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
        MeltTable crustTable = c.meltTable() == null ? null : CrustalRocks.meltTable(cv, c.meltTable());
        if (c.meltTable() != null && (c.meltCurve() != null || c.meltingInterval() != null)) {
            cv.error("meltTable", "give meltTable, meltCurve or meltingInterval, not more than one");
        }
        MeltCurve crustCurve = crustTable != null ? crustTable.curveAt(curvePressure) : crustIn.curve();
        if (crustTable == null && c.meltCurve() == null && c.meltingInterval() == null && crustIn.lithology() != null) {
            // the catalogue's F(T, P): each cell reads it at its own pressure
            crustTable = crustIn.lithology().meltTable();
        }
        if (crustCurve == null && c.lithology() == null && c.meltCurve() == null && c.meltingInterval() == null
                && c.meltTable() == null) {
            cv.error("meltCurve", "the crust needs a lithology, a meltCurve, a meltingInterval or a meltTable");
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
        if (c.meltTable() != null && crustTable != null) {
            // a caller's table must cover the crust's pressures, surface to Moho (or to the column's base)
            double base = mohoKm == null ? columnM : Math.min(columnM, Units.kmToM(mohoKm));
            double pBase = CrustalRocks.crustPressure(c.lithology(), c.densityKgPerM3(), base);
            double pTop = 0;
            if (!crustTable.covers(pTop, pBase)) {
                double missing = crustTable.minPressure() > pTop + 1 ? pTop : pBase;
                rules.error("crust.meltTable", String.format(Locale.ROOT, "must cover the crust's pressures, %.3g to "
                        + "%.3g GPa (surface to %.4g km); its rows span %.3g to %.3g GPa, so %.3g GPa is not covered",
                        pTop * 1e-9, pBase * 1e-9, Units.mToKm(base), crustTable.minPressure() * 1e-9,
                        crustTable.maxPressure() * 1e-9, missing * 1e-9));
            }
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
        Rock crustRock = crustTable == null
                ? new Rock(crustIn.density(), crustIn.heatCapacity(), crustIn.latentHeat(), kC, crustCurve)
                : new Rock(crustIn.density(), crustIn.heatCapacity(), crustIn.latentHeat(), kC, crustCurve, crustTable);
        SillModel.Setup probe = new SillModel.Setup(
                crustRock,
                new Rock(intrusionIn.density(), intrusionIn.heatCapacity(), intrusionIn.latentHeat(), kB,
                        intrusionIn.curve()),
                initial, intrusions, columnM, dz,
                Units.kyrToS(durationKyr), Units.kyrToS(every),
                profileKyr.stream().map(Units::kyrToS).toList(), profileM,
                new SillModel.Numerics(SillModel.resolvingTolerance(thickness, dz), MAX_TIME_STEPS,
                        config.maxSillCellSteps()),
                mantle, mohoM, plan, convection);
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
        // the column at its end: samples of a profile lie at least the spacing apart (and are cells)
        double finalDepth = columnM + probe.sillsWithinDuration() * thickness;
        // the default graded grid is refined until converged (SillModel.runRefined), within MAX_CELLS
        boolean refine = q.gridSpacingM() == null && !plan.uniform() && !Boolean.FALSE.equals(q.convergenceCheck());
        if (profileSpacing != null) {
            long most = cells;
            SillModel.Setup finest = probe;
            for (int k = 0; refine && k < SillModel.MAX_REFINEMENTS; k++) {
                finest = finest.finer();
                most = Math.max(most, Math.min(MAX_CELLS,
                        (long) finest.initialCells() + (long) finest.sillsWithinDuration() * finest.cellsPerSill()));
            }
            double points = plan.uniform() ? Math.ceil(cells / Math.max(1, Math.rint(profileSpacing / dz)))
                    : Math.min(most, Math.floor(finalDepth / profileSpacing) + 1);
            rules.cap("profileSpacingM", points, config.maxProfilePoints(), "points per profile",
                    "TECTOMELT_MAX_PROFILE_POINTS");
        }
        rules.throwIfBroken();
        SillModel.Setup setup = probe;
        if (profileSpacing == null) {
            int perProfile = Math.min(DEFAULT_PROFILE_POINTS, config.maxProfilePoints());
            int stride = (int) Math.max(1, (cells + perProfile - 1) / perProfile);
            double spacing = plan.uniform() ? stride * dz : Math.max(dz, finalDepth / (perProfile - 1));
            setup = new SillModel.Setup(probe.crust(), probe.intrusion(), probe.initial(), intrusions, columnM, dz,
                    probe.duration(), probe.outputEvery(), probe.profileTimes(), spacing, probe.numerics(),
                    probe.mantle(), probe.mohoDepth(), plan, convection);
        }
        SillResult r;
        try {
            if (Boolean.FALSE.equals(q.convergenceCheck())) {
                r = SillModel.run(setup, deadline);
            } else if (refine) {
                r = SillModel.runRefined(setup, MAX_CELLS, deadline);
            } else {
                r = SillModel.runWithConvergenceCheck(setup, deadline);
            }
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

    /** Convection in the intrusion: {@code convection: true} and its parameters (given only with it), or null. */
    private static SillModel.Convection convection(Rules rules, Intrusion b) {
        boolean on = Boolean.TRUE.equals(b.convection());
        if (!on) {
            rules.check(b.lockMeltFraction() == null, "lockMeltFraction", "give it with convection: true");
            rules.check(b.viscosityPaS() == null, "viscosityPaS", "give it with convection: true");
            rules.check(b.thermalExpansivityPerK() == null, "thermalExpansivityPerK", "give it with convection: true");
            return null;
        }
        double lock = b.lockMeltFraction() == null ? SillModel.Convection.DEFAULT_LOCK_MELT_FRACTION
                : b.lockMeltFraction();
        if (!rules.check(lock > 0 && lock < 1, "lockMeltFraction", "must lie strictly between 0 and 1, got "
                + Rules.format(lock))) {
            return null;
        }
        return new SillModel.Convection(lock,
                b.viscosityPaS() == null ? SillModel.Convection.DEFAULT_VISCOSITY : b.viscosityPaS(),
                b.thermalExpansivityPerK() == null ? SillModel.Convection.DEFAULT_EXPANSIVITY
                        : b.thermalExpansivityPerK(),
                SillModel.Convection.HUPPERT_SPARKS_COEFFICIENT);
    }

    private static Result result(SillModel.Setup setup, SillResult r, List<String> notes, List<ModelInfo> citations) {
        List<Sample> series = new ArrayList<>(r.series().size());
        for (SillResult.Sample s : r.series()) {
            series.add(new Sample(Units.sToKyr(s.time()), s.crustMeltThickness(), s.crustPartiallyMoltenThickness(),
                    s.maxCrustMeltFraction(), s.intrusionMeltFraction(), Units.kelvinToCelsius(s.contactTemperature()),
                    Units.kelvinToCelsius(s.maxTemperature()), Units.wPerM2ToMwPerM2(s.roofHeatFlux()),
                    Units.kelvinToCelsius(s.firstSillTemperature())));
        }
        SillResult.Summary sm = r.summary();
        Double mantleC = sm.maxMantleTemperature() == null ? null : Units.kelvinToCelsius(sm.maxMantleTemperature());
        Summary summary = new Summary(kyrOrNull(sm.solidificationTime()), kyrOrNull(sm.timeToFirstCrustMelt()),
                sm.peakCrustMeltThickness(), kyrOrNull(sm.peakTime()), sm.energyErrorFraction(), sm.sillsEmplaced(),
                sm.emplacedThickness(), Units.mToKm(sm.topDepth()), mantleC, kyrOrNull(sm.lockUpTime()));
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
        SillResult.Convergence cc = r.convergence();
        Convergence check = null;
        if (cc != null) {
            SillResult.Summary cs = cc.coarse();
            check = new Convergence(cc.coarseSpacing(), cc.coarseTolerance(), cc.solidificationTimeChange(),
                    cc.timeToFirstCrustMeltChange(), cc.peakCrustMeltChange(), cc.peakTimeChange(),
                    cc.lockUpTimeChange(), cc.largestChange(), cc.converged(), cc.refinements(),
                    new CoarseRun(kyrOrNull(cs.solidificationTime()), kyrOrNull(cs.timeToFirstCrustMelt()),
                            cs.peakCrustMeltThickness(), kyrOrNull(cs.peakTime()), kyrOrNull(cs.lockUpTime())));
        }
        Numerics numerics = new Numerics(nm.cells(), nm.gridSpacing(), nm.timeSteps(), nm.rejectedSteps(),
                nm.linearSolves(), nm.smallestCell(), nm.largestCell(), nm.toleranceK(), check);
        List<ModelInfo> models = new ArrayList<>(List.of(SillModel.ENTHALPY_METHOD));
        if (setup.initial() instanceof GeothermInitialState) {
            models.add(ContinentalGeotherm.INFO);
        }
        if (setup.intrusions().count() > 1) {
            models.add(SillModel.ANNEN_SPARKS_2002);
        }
        if (setup.convection() != null) {
            models.add(SillModel.HUPPERT_SPARKS_1988);
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
