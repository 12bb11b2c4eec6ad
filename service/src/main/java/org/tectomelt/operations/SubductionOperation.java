package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.Lithology;
import org.tectomelt.engine.settings.ArcMagmaBudget;
import org.tectomelt.engine.settings.SubductionWedge;
import org.tectomelt.engine.settings.WedgeMelting;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.units.Units;

/** {@code subduction}: flux melting of a mantle wedge and the arc magma budget. Cheap. */
public final class SubductionOperation implements Operation<SubductionOperation.Request, SubductionOperation.Result> {

    /** Request: exactly one of {@code depthKm} or {@code pressureGPa} (the spec fills {@code lithology}). */
    public record Request(Double depthKm, Double pressureGPa, Double wedgeTemperatureC, Double bulkWaterWtPct,
                          Double slabWaterFluxKgPerMPerYr, Double maxWaterWtPct, String lithology) {
    }

    /** One point of the melt fraction against added water curve. */
    public record WaterCurvePoint(double bulkWaterWtPct, double meltFraction, boolean waterSaturated) {
    }

    /** The wedge's melt state, its sensitivity to water, and the budget when a flux is given. */
    public record Result(
            String lithology, double depthKm, double pressureGPa, double wedgeTemperatureC, double bulkWaterWtPct,
            double meltFraction, double waterInMeltWtPct, boolean waterSaturated, double freeFluidWtPct,
            double drySolidusC, double wetSolidusC, double solidusDepressionK, double saturatedSolidusC,
            @ExplicitNull Double waterForOnsetWtPct, @ExplicitNull Double waterForSaturationWtPct,
            @ExplicitNull Double meltPerWaterPercentPerWtPct,
            Double slabWaterFluxKgPerMPerYr, Double magmaProductionKm3PerYrPerKm, Double meltDensityKgPerM3,
            double maxWaterWtPct, List<WaterCurvePoint> waterCurve, List<String> warnings, List<String> assumptions,
            List<ModelInfo> models) {
    }

    @Override
    public String name() {
        return "subduction";
    }

    @Override
    public String path() {
        return "/v1/settings/subduction";
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
        return "waterCurve";
    }

    @Override
    public List<Input> inputs() {
        return List.of(
                new Input("depthKm", "km", "depth of the wedge point", true),
                new Input("pressureGPa", "GPa", "pressure of the wedge point", true),
                new Input("wedgeTemperatureC", "°C", "wedge temperature", true),
                new Input("bulkWaterWtPct", "wt%", "water added to the wedge", true),
                new Input("slabWaterFluxKgPerMPerYr", "kg/m/yr", "slab water flux per m of arc", true));
    }

    @Override
    public List<Output<Result>> outputs() {
        return List.of(
                new Output<>("meltFraction", "1", "melt fraction", Result::meltFraction),
                new Output<>("wetSolidusC", "°C", "solidus with this water", Result::wetSolidusC),
                new Output<>("solidusDepressionK", "K", "solidus lowering by the water", Result::solidusDepressionK),
                new Output<>("waterForOnsetWtPct", "wt%", "water needed to start melting", Result::waterForOnsetWtPct),
                new Output<>("magmaProductionKm3PerYrPerKm", "km³/yr per km", "arc magma production",
                        Result::magmaProductionKm3PerYrPerKm));
    }

    @Override
    public void check(Request q, Rules rules) {
        Lithology lithology = hydrousLithology(rules, q.lithology());
        if ((q.depthKm() != null) == (q.pressureGPa() != null)) {
            rules.error("depthKm", "give exactly one of depthKm or pressureGPa");
        }
        // an unusable lithology is already reported; check the water against the default's range meanwhile
        Lithology ranges = lithology != null ? lithology : Lithologies.defaultMantle();
        double maxAccepted = Units.fractionToWtPct(ranges.maxBulkWater());
        if (q.bulkWaterWtPct() != null) {
            rules.within("bulkWaterWtPct", q.bulkWaterWtPct(), 0, maxAccepted);
        }
        if (q.maxWaterWtPct() != null) {
            rules.check(q.maxWaterWtPct() <= maxAccepted, "maxWaterWtPct", "must be at most " + Rules.format(maxAccepted)
                    + " (the lithology's largest bulk water), got " + Rules.format(q.maxWaterWtPct()));
        }
    }

    @Override
    public Result run(Request q, Deadline deadline) {
        Rules rules = new Rules();
        check(q, rules);
        rules.throwIfBroken();
        Lithology lithology = hydrousLithology(rules, q.lithology());
        double maxAccepted = Units.fractionToWtPct(lithology.maxBulkWater());
        double waterWtPct = q.bulkWaterWtPct();
        double temperatureC = q.wedgeTemperatureC();
        Double flux = q.slabWaterFluxKgPerMPerYr();
        // the curve reaches twice the water given (at least 1 wt%), within what the model accepts
        double maxWaterWtPct = q.maxWaterWtPct() != null ? q.maxWaterWtPct()
                : Math.min(maxAccepted, Math.max(1.0, 2 * waterWtPct));
        boolean byDepth = q.depthKm() != null;
        LithostaticColumn column = LithostaticColumn.mantleOnly();
        double p = byDepth ? column.pressureAt(Units.kmToM(q.depthKm())) : Units.gpaToPa(q.pressureGPa());
        double pressureGPa = byDepth ? Units.paToGpa(p) : q.pressureGPa();
        double depthKm = byDepth ? q.depthKm() : Units.mToKm(column.depthAt(p));
        // the curve's grid is made in wt%, so the response echoes round numbers (0.35, not 0.35000000000000003)
        double[] gridWtPct = SubductionWedge.evenWaterGrid(maxWaterWtPct, SubductionWedge.CURVE_POINTS);
        double[] grid = new double[gridWtPct.length];
        for (int i = 0; i < grid.length; i++) {
            grid[i] = Units.wtPctToFraction(gridWtPct[i]);
        }
        SubductionWedge wedge = new SubductionWedge(lithology);
        WedgeMelting m = wedge.evaluate(p, Units.celsiusToKelvin(temperatureC), Units.wtPctToFraction(waterWtPct),
                grid, flux == null ? OptionalDouble.empty() : OptionalDouble.of(Units.perYrToPerS(flux)));

        List<WaterCurvePoint> curve = new ArrayList<>(m.waterCurve().size());
        for (int i = 0; i < gridWtPct.length; i++) {
            WedgeMelting.CurvePoint c = m.waterCurve().get(i);
            curve.add(new WaterCurvePoint(gridWtPct[i], c.meltFraction(), c.waterSaturated()));
        }
        Optional<ArcMagmaBudget> budget = m.budget();
        List<String> assumptions = new ArrayList<>();
        assumptions.add(byDepth
                ? String.format(Locale.ROOT, "depth to pressure: mantle-only lithostatic column (%.0f kg/m3, g = %.2f "
                        + "m/s2, no crust); to use another column give pressureGPa (see /v1/pressure)",
                        column.mantleDensity(), column.gravity())
                : String.format(Locale.ROOT, "depthKm is the depth of this pressure in a mantle-only lithostatic "
                        + "column (%.0f kg/m3, no crust), for orientation only", column.mantleDensity()));
        assumptions.add(SubductionWedge.MODEL_ASSUMPTION);
        assumptions.add(SubductionWedge.SLOPE_METHOD);
        if (flux != null) {
            assumptions.add(ArcMagmaBudget.ASSUMPTION + String.format(Locale.ROOT,
                    "; melt density %.0f kg/m3", wedge.meltDensity()));
        }
        List<ModelInfo> models = new ArrayList<>(lithology.citations());
        models.add(LithostaticColumn.INFO);
        return new Result(
                lithology.id(), depthKm, pressureGPa, temperatureC, waterWtPct,
                m.state().meltFraction(), Units.fractionToWtPct(m.state().waterInMelt()), m.state().waterSaturated(),
                Units.fractionToWtPct(m.freeFluid()),
                Units.kelvinToCelsius(m.state().drySolidus()), Units.kelvinToCelsius(m.state().solidus()),
                m.solidusDepression(), Units.kelvinToCelsius(m.saturatedSolidus()),
                wtPct(m.waterForOnset()), wtPct(m.waterForSaturation()),
                // dF/dX_bulk with both as mass fractions is the same number as percent melt per wt% water
                m.meltPerWater().isPresent() ? m.meltPerWater().getAsDouble() : null,
                flux,
                budget.map(b -> Units.m2PerSToKm3PerYrPerKm(b.meltVolumeRate())).orElse(null),
                budget.map(ArcMagmaBudget::meltDensity).orElse(null),
                maxWaterWtPct, curve, m.warnings(), assumptions, models);
    }

    /**
     * The requested lithology if it is hydrous-capable; otherwise records a violation on
     * {@code lithology} listing the hydrous ones and returns {@code null}.
     */
    static Lithology hydrousLithology(Rules rules, String id) {
        List<String> hydrous = Lithologies.all().stream().filter(Lithology::hydrous).map(Lithology::id).toList();
        Optional<Lithology> found = id == null ? Optional.empty() : Lithologies.byId(id);
        if (found.isPresent() && found.get().hydrous()) {
            return found.get();
        }
        if (found.isPresent()) {
            rules.error("lithology", "'" + id + "' ignores water; flux melting needs a hydrous-capable lithology, "
                    + "one of " + hydrous);
        } else {
            rules.error("lithology", "must be one of the hydrous-capable lithologies " + hydrous + ", got '"
                    + Choices.abbreviate(id) + "'");
        }
        return null;
    }

    private static Double wtPct(OptionalDouble fraction) {
        return fraction.isPresent() ? Units.fractionToWtPct(fraction.getAsDouble()) : null;
    }
}
