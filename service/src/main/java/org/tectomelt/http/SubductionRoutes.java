package org.tectomelt.http;

import org.tectomelt.contract.Json;
import com.fasterxml.jackson.annotation.JsonInclude;
import io.javalin.http.Context;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.Lithology;
import org.tectomelt.engine.settings.ArcMagmaBudget;
import org.tectomelt.engine.settings.SubductionWedge;
import org.tectomelt.engine.settings.WedgeMelting;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.units.Units;

/** {@code POST /v1/settings/subduction}: flux melting of a mantle wedge and the arc magma budget. */
final class SubductionRoutes {

    /** Deepest accepted wedge depth (km). */
    static final double MAX_DEPTH_KM = 300;
    /** Highest accepted pressure (GPa). */
    static final double MAX_PRESSURE_GPA = 10;
    /** Accepted wedge temperatures (°C). */
    static final double MIN_TEMPERATURE_C = 0, MAX_TEMPERATURE_C = 2200;
    /** Largest accepted slab water flux (kg per m of arc per yr). */
    static final double MAX_FLUX_KG_PER_M_PER_YR = 1e6;
    /** Smallest accepted maximum of the water curve (wt%). */
    static final double MIN_CURVE_MAX_WT_PCT = 0.01;
    /** Default lithology. */
    static final String DEFAULT_LITHOLOGY = "peridotite-katz2003";

    private SubductionRoutes() {
    }

    static List<Route> routes() {
        return List.of(Route.post("/v1/settings/subduction", SubductionRoutes::subduction));
    }

    /** Request body. */
    record SubductionRequest(Double depthKm, Double pressureGPa, Double wedgeTemperatureC, Double bulkWaterWtPct,
                             Double slabWaterFluxKgPerMPerYr, Double maxWaterWtPct, String lithology) {
    }

    /** One point of the melt fraction against added water curve. */
    record WaterCurvePoint(double bulkWaterWtPct, double meltFraction, boolean waterSaturated) {
    }

    /** Response body; the nullable fields are written as explicit nulls. */
    record SubductionResponse(
            String lithology, double depthKm, double pressureGPa, double wedgeTemperatureC, double bulkWaterWtPct,
            double meltFraction, double waterInMeltWtPct, boolean waterSaturated, double freeFluidWtPct,
            double drySolidusC, double wetSolidusC, double solidusDepressionK, double saturatedSolidusC,
            @JsonInclude(JsonInclude.Include.ALWAYS) Double waterForOnsetWtPct,
            @JsonInclude(JsonInclude.Include.ALWAYS) Double waterForSaturationWtPct,
            @JsonInclude(JsonInclude.Include.ALWAYS) Double meltPerWaterPercentPerWtPct,
            Double slabWaterFluxKgPerMPerYr, Double magmaProductionKm3PerYrPerKm, Double meltDensityKgPerM3,
            double maxWaterWtPct, List<WaterCurvePoint> waterCurve, List<String> warnings, List<String> assumptions,
            List<ModelInfo> models) {
    }

    static void subduction(Context ctx) {
        SubductionRequest req = Json.read(ctx.bodyAsBytes(), SubductionRequest.class);
        Validation v = new Validation();
        Lithology lithology = hydrousLithology(v, req.lithology(), Lithologies.all());
        boolean byDepth = req.depthKm() != null;
        double depthKm = Double.NaN;
        double pressureGPa = Double.NaN;
        if (byDepth == (req.pressureGPa() != null)) {
            v.error("depthKm", "give exactly one of depthKm (0 to " + Validation.format(MAX_DEPTH_KM)
                    + " km) or pressureGPa (0 to " + Validation.format(MAX_PRESSURE_GPA) + " GPa)");
        } else if (byDepth) {
            depthKm = v.required("depthKm", req.depthKm(), 0, MAX_DEPTH_KM);
        } else {
            pressureGPa = v.required("pressureGPa", req.pressureGPa(), 0, MAX_PRESSURE_GPA);
        }
        double temperatureC = v.required("wedgeTemperatureC", req.wedgeTemperatureC(),
                MIN_TEMPERATURE_C, MAX_TEMPERATURE_C);
        // an unusable lithology is already reported; check the water against the default's range meanwhile
        Lithology ranges = lithology != null ? lithology : Lithologies.defaultMantle();
        double maxAccepted = Units.fractionToWtPct(ranges.maxBulkWater());
        double waterWtPct = v.required("bulkWaterWtPct", req.bulkWaterWtPct(), 0, maxAccepted);
        Double flux = req.slabWaterFluxKgPerMPerYr();
        if (flux != null) {
            v.optional("slabWaterFluxKgPerMPerYr", flux, 0, 0, MAX_FLUX_KG_PER_M_PER_YR);
        }
        double defaultMax = Math.min(maxAccepted, Math.max(1.0, 2 * (Double.isNaN(waterWtPct) ? 0 : waterWtPct)));
        double maxWaterWtPct = v.optional("maxWaterWtPct", req.maxWaterWtPct(), defaultMax,
                MIN_CURVE_MAX_WT_PCT, maxAccepted);
        v.throwIfInvalid();

        LithostaticColumn column = LithostaticColumn.mantleOnly();
        double p = byDepth ? column.pressureAt(Units.kmToM(depthKm)) : Units.gpaToPa(pressureGPa);
        if (byDepth) {
            pressureGPa = Units.paToGpa(p);
        } else {
            depthKm = Units.mToKm(column.depthAt(p));
        }
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

        Responses.json(ctx, new SubductionResponse(
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
                maxWaterWtPct, curve, m.warnings(), assumptions, models));
    }

    /**
     * The requested lithology if it is hydrous-capable; otherwise records an error on
     * {@code lithology} listing the hydrous ones and returns {@code null}.
     */
    static Lithology hydrousLithology(Validation v, String id, List<Lithology> catalogue) {
        List<String> hydrous = catalogue.stream().filter(Lithology::hydrous).map(Lithology::id).toList();
        String wanted = id == null ? DEFAULT_LITHOLOGY : id;
        Optional<Lithology> found = catalogue.stream().filter(l -> l.id().equals(wanted)).findFirst();
        if (found.isPresent() && found.get().hydrous()) {
            return found.get();
        }
        if (found.isPresent()) {
            v.error("lithology", "'" + wanted + "' ignores water; flux melting needs a hydrous-capable lithology, "
                    + "one of " + hydrous);
        } else {
            v.error("lithology", "must be one of the hydrous-capable lithologies " + hydrous + ", got '"
                    + (wanted.length() <= 40 ? wanted : wanted.substring(0, 40) + "…") + "'");
        }
        return null;
    }

    private static Double wtPct(OptionalDouble fraction) {
        return fraction.isPresent() ? Units.fractionToWtPct(fraction.getAsDouble()) : null;
    }
}
