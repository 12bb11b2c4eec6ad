package org.tectomelt.operations;

import java.util.List;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.settings.MidOceanRidge;
import org.tectomelt.engine.settings.SlowSpreadingConductiveLid;
import org.tectomelt.engine.units.Units;

/** {@code mid-ocean-ridge}: passive upwelling beneath a spreading ridge, and the crust it makes. Cheap. */
public final class MidOceanRidgeOperation
        implements Operation<MidOceanRidgeOperation.Request, MidOceanRidgeOperation.Result> {

    /** Request (the spec fills {@code bulkWaterWtPct} and {@code lithology}). */
    public record Request(Double potentialTemperatureC, Double bulkWaterWtPct, Double fullSpreadingRateMmPerYr,
                          String lithology, String meltingMode, Double retainedMeltFraction, Double cpxMassFraction,
                          Double solidusShiftK, Double pyroxeniteFraction, String pyroxenite,
                          Double pyroxeniteSolidusShiftK) implements Sources.Fields {
    }

    /**
     * Crust thickness, melt production and the column; {@code crustModel} names what set the top of
     * melting ({@code infinite-stretching} or {@code slow-spreading-conductive-lid}).
     */
    public record Result(String lithology, double crustalThicknessKm, double meltProductionKm3PerYrPerKm,
                         String crustModel, double conductiveLidKm, Columns.Column column, List<String> warnings,
                         List<String> assumptions, List<ModelInfo> models) {
    }

    @Override
    public String name() {
        return "mid-ocean-ridge";
    }

    @Override
    public String path() {
        return "/v1/settings/mid-ocean-ridge";
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
        return "column.profile";
    }

    @Override
    public List<Input> inputs() {
        List<Input> in = new java.util.ArrayList<>(List.of(
                new Input("potentialTemperatureC", "°C", "mantle potential temperature", true),
                new Input("bulkWaterWtPct", "wt%", "bulk water of the source", true),
                new Input("fullSpreadingRateMmPerYr", "mm/yr", "full spreading rate", true)));
        in.addAll(Sources.inputs());
        return List.copyOf(in);
    }

    @Override
    public List<Output<Result>> outputs() {
        List<Output<Result>> out = new java.util.ArrayList<>(List.of(
                new Output<>("crustalThicknessKm", "km", "igneous crust thickness", Result::crustalThicknessKm),
                new Output<>("meltProductionKm3PerYrPerKm", "km³/yr per km", "new crust per km of ridge per year",
                        Result::meltProductionKm3PerYrPerKm),
                new Output<>("conductiveLidKm", "km", "conductive lid of a slow-spreading ridge (0 at and above 20 "
                        + "mm/yr)", Result::conductiveLidKm)));
        out.addAll(Columns.outputs("column", Result::column));
        return List.copyOf(out);
    }

    @Override
    public Result run(Request q, Deadline deadline) {
        Rules rules = new Rules();
        MantleLithology lithology = Choices.mantleLithology(rules, q.lithology());
        double water = Choices.mantleWater(rules, lithology, q.bulkWaterWtPct());
        MantleSource source = Sources.source(rules, lithology, q.bulkWaterWtPct(), q);
        rules.throwIfBroken();
        MidOceanRidge.Result r = new MidOceanRidge(source, Units.celsiusToKelvin(q.potentialTemperatureC()), water,
                Units.mmPerYrToMPerS(q.fullSpreadingRateMmPerYr()), SlowSpreadingConductiveLid.standard()).solve();
        return new Result(lithology.id(), Units.mToKm(r.crustalThickness()),
                Units.m2PerSToKm3PerYrPerKm(r.meltProduction()), r.crustModel(), Units.mToKm(r.conductiveLid()),
                Columns.column(r.column()), r.warnings(), r.assumptions(), r.models());
    }
}
