package org.tectomelt.operations;

import java.util.List;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.column.Upwelling;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.units.Units;

/** {@code decompression-melting}: one isentropic decompression melting column. Heavy. */
public final class DecompressionOperation
        implements Operation<DecompressionOperation.Request, DecompressionOperation.Result> {

    /** Request (the spec fills every default). */
    public record Request(String lithology, Double potentialTemperatureC, Double bulkWaterWtPct, Double lidDepthKm,
                          String upwelling, Double stepKm, String meltingMode, Double retainedMeltFraction, Double cpxMassFraction,
                          Double solidusShiftK, Double pyroxeniteFraction, String pyroxenite,
                          Double pyroxeniteSolidusShiftK) implements Sources.Fields {
    }

    /** The column; absent quantities are explicit nulls. */
    public record Result(String lithology, String upwelling, double lidDepthKm, @ExplicitNull Columns.Onset onset,
                         @ExplicitNull Columns.Top top, double maxMeltFraction, double meanMeltFraction,
                         double meltThicknessKm, double crustalThicknessKm,
                         @ExplicitNull Double meanMeltingPressureGPa, String meltingMode,
                         @ExplicitNull Double pyroxeniteMeltShare, List<Columns.LithologyShare> lithologies,
                         List<Columns.Point> profile, List<String> warnings, List<String> assumptions,
                         List<ModelInfo> models) {
    }

    @Override
    public String name() {
        return "decompression-melting";
    }

    @Override
    public String path() {
        return "/v1/decompression-melting";
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
    public String rows() {
        return "profile";
    }

    @Override
    public List<Input> inputs() {
        return Sources.with(
                new Input("potentialTemperatureC", "°C", "mantle potential temperature", true),
                new Input("bulkWaterWtPct", "wt%", "bulk water of the source", true),
                new Input("lidDepthKm", "km", "depth where upwelling stops", true),
                new Input("stepKm", "km", "profile spacing", false));
    }

    @Override
    public List<Output<Result>> outputs() {
        List<Output<Result>> out = new java.util.ArrayList<>(Columns.outputs("",
                r -> new Columns.Column(r.upwelling(), r.lidDepthKm(), r.onset(), r.top(), r.maxMeltFraction(),
                        r.meanMeltFraction(), r.meltThicknessKm(), r.crustalThicknessKm(), r.meanMeltingPressureGPa(),
                        r.meltingMode(), r.pyroxeniteMeltShare(), r.lithologies(), r.profile())));
        out.add(new Output<>("crustalThicknessKm", "km", "igneous crust thickness", Result::crustalThicknessKm));
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
        ColumnResult r = source.column(Units.celsiusToKelvin(q.potentialTemperatureC()), water)
                .withLidDepth(Units.kmToM(q.lidDepthKm()))
                .withUpwelling("active".equals(q.upwelling()) ? Upwelling.ACTIVE : Upwelling.PASSIVE)
                .withOutputStep(Units.kmToM(q.stepKm()))
                .solve();
        Columns.Column c = Columns.column(r);
        return new Result(lithology.id(), c.upwelling(), c.lidDepthKm(), c.onset(), c.top(), c.maxMeltFraction(),
                c.meanMeltFraction(), c.meltThicknessKm(), c.crustalThicknessKm(), c.meanMeltingPressureGPa(),
                c.meltingMode(), c.pyroxeniteMeltShare(), c.lithologies(), c.profile(), r.warnings(), r.assumptions(),
                r.models());
    }
}
