package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.settings.Hotspot;
import org.tectomelt.engine.units.Units;

/** {@code hotspot}: a plume's melting column beneath a lithospheric lid and its melt flux. Cheap. */
public final class HotspotOperation implements Operation<HotspotOperation.Request, HotspotOperation.Result> {

    /** Request (the spec fills {@code bulkWaterWtPct} and {@code lithology}). */
    public record Request(Double potentialTemperatureC, Double ambientPotentialTemperatureC,
                          Double lithosphereThicknessKm, Double plumeRadiusKm, Double upwellingVelocityCmPerYr,
                          Double bulkWaterWtPct, String lithology, String meltingMode, Double retainedMeltFraction, Double cpxMassFraction,
                          Double solidusShiftK, Double pyroxeniteFraction, String pyroxenite,
                          Double pyroxeniteSolidusShiftK) implements Sources.Fields {
    }

    /** Excess temperature, melt flux and the column. */
    public record Result(String lithology, double excessTemperatureK, @ExplicitNull Double onsetDepthKm,
                         double meltFractionAtLid, double meltFluxM3PerS, double meltFluxKm3PerYr,
                         Columns.Column column, List<String> warnings, List<String> assumptions,
                         List<ModelInfo> models) {
    }

    @Override
    public String name() {
        return "hotspot";
    }

    @Override
    public String path() {
        return "/v1/settings/hotspot";
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
        return Sources.with(
                new Input("potentialTemperatureC", "°C", "plume potential temperature", true),
                new Input("ambientPotentialTemperatureC", "°C", "ambient mantle potential temperature", true),
                new Input("lithosphereThicknessKm", "km", "lithosphere (lid) thickness", true),
                new Input("plumeRadiusKm", "km", "radius of the melting region", true),
                new Input("upwellingVelocityCmPerYr", "cm/yr", "upwelling velocity", true),
                new Input("bulkWaterWtPct", "wt%", "bulk water of the plume source", true));
    }

    @Override
    public List<Output<Result>> outputs() {
        List<Output<Result>> out = new ArrayList<>(List.of(
                new Output<>("excessTemperatureK", "K", "plume excess temperature", Result::excessTemperatureK),
                new Output<>("onsetDepthKm", "km", "depth where melting begins", Result::onsetDepthKm),
                new Output<>("meltFractionAtLid", "1", "melt fraction at the base of the lid",
                        Result::meltFractionAtLid),
                new Output<>("meltFluxKm3PerYr", "km³/yr", "melt flux", Result::meltFluxKm3PerYr)));
        out.addAll(Columns.outputs("column", Result::column));
        return List.copyOf(out);
    }

    @Override
    public void check(Request q, Rules rules) {
        MantleLithology lithology = Choices.mantleLithology(rules, q.lithology());
        if (q.bulkWaterWtPct() != null) {
            Choices.mantleWater(rules, lithology, q.bulkWaterWtPct());
        }
        Sources.source(rules, lithology, q.bulkWaterWtPct() == null ? 0 : q.bulkWaterWtPct(), q);
    }

    @Override
    public Result run(Request q, Deadline deadline) {
        Rules rules = new Rules();
        MantleLithology lithology = Choices.mantleLithology(rules, q.lithology());
        double water = Choices.mantleWater(rules, lithology, q.bulkWaterWtPct());
        MantleSource source = Sources.source(rules, lithology, q.bulkWaterWtPct(), q);
        rules.throwIfBroken();
        Hotspot.Result r = new Hotspot(source, Units.celsiusToKelvin(q.potentialTemperatureC()),
                Units.celsiusToKelvin(q.ambientPotentialTemperatureC()), Units.kmToM(q.lithosphereThicknessKm()),
                Units.kmToM(q.plumeRadiusKm()), Units.cmPerYrToMPerS(q.upwellingVelocityCmPerYr()), water).solve();
        return new Result(lithology.id(), r.excessTemperature(),
                r.onsetDepth().isPresent() ? Units.mToKm(r.onsetDepth().getAsDouble()) : null,
                r.meltFractionAtLid(), r.meltFlux(), Units.m3PerSToKm3PerYr(r.meltFlux()), Columns.column(r.column()),
                r.warnings(), r.assumptions(), r.models());
    }
}
