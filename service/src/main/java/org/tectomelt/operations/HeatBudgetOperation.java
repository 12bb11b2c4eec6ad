package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.crust.HeatBudget;
import org.tectomelt.engine.melting.CrustalLithology;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.MeltCurve;
import org.tectomelt.engine.units.Units;
import org.tectomelt.operations.CrustalRocks.MeltPoint;
import org.tectomelt.operations.CrustalRocks.MeltingInterval;
import org.tectomelt.operations.CrustalRocks.RockInput;

/**
 * {@code crustal-heating-budget}: the no-loss energy balance between an intrusion and the crust it
 * heats (a lower bound on the intrusion needed). Cheap.
 */
public final class HeatBudgetOperation implements Operation<HeatBudgetOperation.Request, HeatBudgetOperation.Result> {

    static final String LOWER_BOUND_NOTE = "No-loss lower bound: every joule the intrusion gives up is assumed to heat "
            + "this crustal layer, none is lost to the surface, to rock beyond the layer or to melt that leaves. "
            + "Real intrusions lose much of their heat, so the intrusion thickness is a lower bound and the crust "
            + "thickness an upper bound; use /v1/crustal-heating/sill for the transient, lossy case.";

    /** The crust. */
    public record Crust(String lithology, Double initialTemperatureC, Double densityKgPerM3,
                        Double heatCapacityJPerKgK, Double latentHeatJPerKg, List<MeltPoint> meltCurve,
                        MeltingInterval meltingInterval, Double targetMeltFraction, Double thicknessM)
            implements CrustalRocks.CurveFields {
    }

    /** The intrusion (the spec fills {@code lithology}). */
    public record Intrusion(String lithology, Double temperatureC, Double densityKgPerM3, Double heatCapacityJPerKgK,
                            Double latentHeatJPerKg, List<MeltPoint> meltCurve, MeltingInterval meltingInterval,
                            Double crystallizedFraction, Double thicknessM)
            implements CrustalRocks.CurveFields {
    }

    /** Request. */
    public record Request(Crust crust, Intrusion intrusion, Double finalTemperatureC, Double depthKm) {
    }

    /** The balance. */
    public record Result(double finalTemperatureC, double crustMeltFraction, double intrusionCrystallizedFraction,
                         double heatReleasedJPerM3, double heatRequiredJPerM3, double basaltToCrustThicknessRatio,
                         Double heatReleasedJPerM2, Double crustThicknessBroughtToTargetM, Double heatRequiredJPerM2,
                         Double intrusionThicknessNeededM, String note, List<String> warnings,
                         List<ModelInfo> models) {
    }

    @Override
    public String name() {
        return "crustal-heating-budget";
    }

    @Override
    public String path() {
        return "/v1/crustal-heating/budget";
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
    public List<Input> inputs() {
        return List.of(
                new Input("crust.initialTemperatureC", "°C", "crust temperature before the intrusion", true),
                new Input("crust.targetMeltFraction", "1", "melt fraction the crust is brought to", true),
                new Input("crust.thicknessM", "m", "thickness of the crust layer", true),
                new Input("intrusion.temperatureC", "°C", "intrusion temperature", true),
                new Input("intrusion.thicknessM", "m", "intrusion thickness", true),
                new Input("finalTemperatureC", "°C", "common final temperature", true),
                new Input("depthKm", "km", "depth at which the melt curves are read", true));
    }

    @Override
    public List<Output<Result>> outputs() {
        return List.of(
                new Output<>("finalTemperatureC", "°C", "common final temperature", Result::finalTemperatureC),
                new Output<>("crustMeltFraction", "1", "melt fraction of the crust", Result::crustMeltFraction),
                new Output<>("basaltToCrustThicknessRatio", "1", "intrusion thickness per thickness of crust",
                        Result::basaltToCrustThicknessRatio),
                new Output<>("crustThicknessBroughtToTargetM", "m", "crust brought to the target by the intrusion",
                        Result::crustThicknessBroughtToTargetM),
                new Output<>("intrusionThicknessNeededM", "m", "intrusion needed for the crust layer",
                        Result::intrusionThicknessNeededM));
    }

    @Override
    public void check(Request q, Rules rules) {
        CrustalRocks.checkOneCurve(rules, q.crust(), q.intrusion());
    }

    @Override
    public Result run(Request q, Deadline deadline) {
        Rules rules = new Rules();
        Double depthKm = q.depthKm();
        Crust c = q.crust();
        Rules cv = rules.at("crust");
        double tc0 = c.initialTemperatureC();
        RockInput crustIn = CrustalRocks.read(cv, "crust", c.lithology(), c.densityKgPerM3(), c.heatCapacityJPerKgK(),
                c.latentHeatJPerKg(), c.meltCurve(), c.meltingInterval(),
                pressure(c.lithology(), depthKm, c.densityKgPerM3()), true);
        MeltCurve crustCurve = crustIn.curve();
        Double targetF = c.targetMeltFraction();
        Double hc = c.thicknessM();

        Intrusion b = q.intrusion();
        Rules bv = rules.at("intrusion");
        double tb0 = b.temperatureC();
        RockInput intrusionIn = CrustalRocks.read(bv, "intrusion", b.lithology(), b.densityKgPerM3(),
                b.heatCapacityJPerKgK(), b.latentHeatJPerKg(), b.meltCurve(), b.meltingInterval(),
                pressure(b.lithology(), depthKm, b.densityKgPerM3()), true);
        Double xb = b.crystallizedFraction();
        Double hb = b.thicknessM();
        Double tf = q.finalTemperatureC();
        rules.throwIfBroken();
        if (tf == null && targetF == null) {
            rules.error("finalTemperatureC", "give finalTemperatureC, crust.targetMeltFraction, or both");
        }
        if (tf == null && targetF != null && crustCurve == null) {
            rules.error("crust.meltCurve", "a target melt fraction without finalTemperatureC needs the crust's "
                    + "lithology, meltCurve or meltingInterval to find the final temperature");
        }
        if (tf != null && targetF == null && crustCurve == null) {
            rules.error("crust.targetMeltFraction", "give it, or the crust's lithology, meltCurve or meltingInterval, "
                    + "to know how much the crust melts at finalTemperatureC");
        }
        if (tf != null && (tf < tc0 || tf > tb0)) {
            rules.error("finalTemperatureC", "must lie between crust.initialTemperatureC (" + Rules.format(tc0)
                    + ") and intrusion.temperatureC (" + Rules.format(tb0) + "), got " + Rules.format(tf));
        }
        if (targetF != null && crustCurve != null && tf == null && targetF > crustCurve.maxFraction()) {
            rules.error("crust.targetMeltFraction", "the crust's melt curve reaches at most "
                    + Rules.format(crustCurve.maxFraction()) + ", got " + Rules.format(targetF));
        }
        rules.throwIfBroken();

        HeatBudget budget = new HeatBudget(
                new HeatBudget.Layer(intrusionIn.density(), intrusionIn.heatCapacity(), intrusionIn.latentHeat(),
                        Units.celsiusToKelvin(tb0), intrusionIn.curve()),
                new HeatBudget.Layer(crustIn.density(), crustIn.heatCapacity(), crustIn.latentHeat(),
                        Units.celsiusToKelvin(tc0), crustCurve));
        HeatBudget.Result r;
        if (tf != null) {
            r = budget.atFinalTemperature(Units.celsiusToKelvin(tf), targetF, xb);
        } else {
            double tFound = targetF <= 0 ? crustCurve.solidus() : crustCurve.temperatureAt(targetF);
            if (tFound < Units.celsiusToKelvin(tc0) || tFound > Units.celsiusToKelvin(tb0)) {
                throw new OperationException("crust.targetMeltFraction", "is reached at " + Rules.format(
                        Math.rint(Units.kelvinToCelsius(tFound) * 100) / 100) + " °C on the crust's melt curve, "
                        + "outside crust.initialTemperatureC to intrusion.temperatureC");
            }
            r = budget.atCrustMeltFraction(targetF, xb);
        }
        List<String> warnings = new ArrayList<>(crustIn.warnings());
        warnings.addAll(intrusionIn.warnings());
        warnings.addAll(r.warnings());
        List<ModelInfo> models = new ArrayList<>(List.of(HeatBudget.INFO));
        CrustalRocks.addAll(models, crustIn.citations());
        CrustalRocks.addAll(models, intrusionIn.citations());
        return new Result(Units.kelvinToCelsius(r.finalTemperature()), r.crustMeltFraction(),
                r.crystallizedFraction(), r.heatReleased(), r.heatRequired(), r.thicknessRatio(),
                hb == null ? null : r.heatReleased() * hb, hb == null ? null : r.crustThicknessFor(hb),
                hc == null ? null : r.heatRequired() * hc, hc == null ? null : r.intrusionThicknessFor(hc),
                LOWER_BOUND_NOTE, warnings, models);
    }

    /**
     * Pressure (Pa) at which a budget reads a lithology's curve: at {@code depthKm} in a crust of the
     * given (or the lithology's, or the engine's default) density, or without it at the middle of the
     * lithology's calibrated pressure range.
     */
    private static double pressure(String lithologyId, Double depthKm, Double density) {
        if (depthKm != null) {
            return CrustalRocks.crustPressure(lithologyId, density, Units.kmToM(depthKm));
        }
        CrustalLithology lith = lithologyId == null ? null : Lithologies.crustalById(lithologyId).orElse(null);
        return lith == null ? 0 : 0.5 * (lith.minPressure() + lith.maxPressure());
    }
}
