package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.settings.ContinentalRift;
import org.tectomelt.engine.units.Units;

/** {@code continental-rift}: uniform stretching of continental lithosphere and the melt it yields. Cheap. */
public final class ContinentalRiftOperation
        implements Operation<ContinentalRiftOperation.Request, ContinentalRiftOperation.Result> {

    /** Request (the spec fills {@code bulkWaterWtPct} and {@code lithology}). */
    public record Request(Double potentialTemperatureC, Double stretchingFactor, Double lithosphereThicknessKm,
                          Double crustThicknessKm, Double bulkWaterWtPct, String lithology, String meltingMode, Double retainedMeltFraction, Double cpxMassFraction,
                          Double solidusShiftK, Double pyroxeniteFraction, String pyroxenite,
                          Double pyroxeniteSolidusShiftK) implements Sources.Fields {
    }

    /** The stretched lid, the melt and the column. */
    public record Result(String lithology, double lidDepthKm, double stretchedCrustThicknessKm,
                         @ExplicitNull Double onsetStretchingFactor, double meltThicknessKm,
                         double igneousCrustThicknessKm, Columns.Column column, List<String> warnings,
                         List<String> assumptions, List<ModelInfo> models) {
    }

    @Override
    public String name() {
        return "continental-rift";
    }

    @Override
    public String path() {
        return "/v1/settings/continental-rift";
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
                new Input("potentialTemperatureC", "°C", "mantle potential temperature", true),
                new Input("stretchingFactor", "1", "stretching factor β", true),
                new Input("lithosphereThicknessKm", "km", "lithosphere thickness before stretching", true),
                new Input("crustThicknessKm", "km", "crust thickness before stretching", true),
                new Input("bulkWaterWtPct", "wt%", "bulk water of the mantle source", true));
    }

    @Override
    public List<Output<Result>> outputs() {
        List<Output<Result>> out = new ArrayList<>(List.of(
                new Output<>("lidDepthKm", "km", "lithosphere thickness after stretching", Result::lidDepthKm),
                new Output<>("onsetStretchingFactor", "1", "stretching factor at which melting begins",
                        Result::onsetStretchingFactor),
                new Output<>("meltThicknessKm", "km", "melt thickness", Result::meltThicknessKm),
                new Output<>("igneousCrustThicknessKm", "km", "igneous crust thickness",
                        Result::igneousCrustThicknessKm)));
        out.addAll(Columns.outputs("column", Result::column));
        return List.copyOf(out);
    }

    @Override
    public void check(Request q, Rules rules) {
        MantleLithology lithology = Choices.mantleLithology(rules, q.lithology());
        if (q.crustThicknessKm() != null && q.lithosphereThicknessKm() != null
                && q.crustThicknessKm() >= q.lithosphereThicknessKm()) {
            rules.error("crustThicknessKm", "must be less than lithosphereThicknessKm ("
                    + Rules.format(q.lithosphereThicknessKm()) + " km), got " + Rules.format(q.crustThicknessKm()));
        }
        if (q.bulkWaterWtPct() != null) {
            Choices.mantleWater(rules, lithology, q.bulkWaterWtPct());
        }
        Sources.source(rules, lithology, q.bulkWaterWtPct() == null ? 0 : q.bulkWaterWtPct(), q);
    }

    @Override
    public Result run(Request q, Deadline deadline) {
        Rules rules = new Rules();
        check(q, rules);
        rules.throwIfBroken();
        MantleLithology lithology = Choices.mantleLithology(rules, q.lithology());
        MantleSource source = Sources.source(rules, lithology, q.bulkWaterWtPct(), q);
        ContinentalRift.Result r = new ContinentalRift(source, Units.celsiusToKelvin(q.potentialTemperatureC()),
                q.stretchingFactor(), Units.kmToM(q.lithosphereThicknessKm()), Units.kmToM(q.crustThicknessKm()),
                Units.wtPctToFraction(q.bulkWaterWtPct())).solve();
        return new Result(lithology.id(), Units.mToKm(r.lidDepth()), Units.mToKm(r.stretchedCrust()),
                r.onsetStretchingFactor().isPresent() ? r.onsetStretchingFactor().getAsDouble() : null,
                Units.mToKm(r.meltThickness()), Units.mToKm(r.igneousCrustThickness()), Columns.column(r.column()),
                r.warnings(), r.assumptions(), r.models());
    }
}
