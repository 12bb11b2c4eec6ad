package org.tectomelt.http;

import org.tectomelt.contract.Json;
import com.fasterxml.jackson.annotation.JsonInclude;
import io.javalin.http.Context;
import java.util.ArrayList;
import java.util.List;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.ColumnState;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.ProfilePoint;
import org.tectomelt.engine.column.Upwelling;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.Lithology;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.settings.ContinentalRift;
import org.tectomelt.engine.settings.Hotspot;
import org.tectomelt.engine.units.Units;

/**
 * Decompression melting: {@code POST /v1/decompression-melting} (one isentropic column) and the
 * settings built on it, {@code POST /v1/settings/mid-ocean-ridge}, {@code /v1/settings/hotspot} and
 * {@code /v1/settings/continental-rift}.
 */
final class DecompressionRoutes {

    /** Accepted potential temperatures (°C). */
    static final double MIN_TP_C = 1000, MAX_TP_C = 1700;
    /** Deepest accepted lid or lithosphere (km). */
    static final double MAX_LID_KM = 300;
    /** Accepted profile spacing (km). */
    static final double MIN_STEP_KM = 0.1, MAX_STEP_KM = 10;
    /** Default profile spacing (km). */
    static final double DEFAULT_STEP_KM = 1.0;
    /** Accepted plume radii (km). */
    static final double MIN_RADIUS_KM = 1, MAX_RADIUS_KM = 1000;
    /** Accepted plume upwelling velocities (cm/yr). */
    static final double MIN_VELOCITY_CM_PER_YR = 0.01, MAX_VELOCITY_CM_PER_YR = 100;
    /** Accepted stretching factors. */
    static final double MIN_BETA = 1, MAX_BETA = 50;
    /** Accepted rift lithosphere thickness (km). */
    static final double MIN_RIFT_LITHOSPHERE_KM = 30;
    /** Accepted rift crust thickness (km). */
    static final double MAX_RIFT_CRUST_KM = 80;

    private DecompressionRoutes() {
    }

    static List<Route> routes() {
        return List.of(
                Route.heavyPost("/v1/decompression-melting", DecompressionRoutes::column),
                Route.post("/v1/settings/hotspot", DecompressionRoutes::hotspot),
                Route.post("/v1/settings/continental-rift", DecompressionRoutes::rift));
    }

    // ---- request bodies

    /** Body of {@code /v1/decompression-melting}. */
    record ColumnRequest(String lithology, Double potentialTemperatureC, Double bulkWaterWtPct, Double lidDepthKm,
                         String upwelling, Double stepKm) {
    }

    /** Body of {@code /v1/settings/hotspot}. */
    record HotspotRequest(Double potentialTemperatureC, Double ambientPotentialTemperatureC,
                          Double lithosphereThicknessKm, Double plumeRadiusKm, Double upwellingVelocityCmPerYr,
                          Double bulkWaterWtPct, String lithology) {
    }

    /** Body of {@code /v1/settings/continental-rift}. */
    record RiftRequest(Double potentialTemperatureC, Double stretchingFactor, Double lithosphereThicknessKm,
                       Double crustThicknessKm, Double bulkWaterWtPct, String lithology) {
    }

    // ---- response bodies

    /** Where melting begins. */
    record Onset(double depthKm, double pressureGPa, double temperatureC) {
    }

    /** Where melting stops. */
    record Top(double depthKm, double pressureGPa, double temperatureC, double meltFraction) {
    }

    /** One profile point. */
    record Point(double depthKm, double pressureGPa, double temperatureC, double meltFraction,
                 double productivityPercentPerGPa, double waterInMeltWtPct) {
    }

    /** Body of {@code /v1/decompression-melting}; absent quantities are explicit nulls. */
    record ColumnResponse(String lithology, String upwelling, double lidDepthKm,
                          @JsonInclude(JsonInclude.Include.ALWAYS) Onset onset,
                          @JsonInclude(JsonInclude.Include.ALWAYS) Top top,
                          double maxMeltFraction, double meanMeltFraction, double meltThicknessKm,
                          double crustalThicknessKm,
                          @JsonInclude(JsonInclude.Include.ALWAYS) Double meanMeltingPressureGPa,
                          List<Point> profile, List<String> warnings, List<String> assumptions,
                          List<ModelInfo> models) {
    }

    /** The column inside a setting's response. */
    record Column(String upwelling, double lidDepthKm,
                  @JsonInclude(JsonInclude.Include.ALWAYS) Onset onset,
                  @JsonInclude(JsonInclude.Include.ALWAYS) Top top,
                  double maxMeltFraction, double meanMeltFraction, double meltThicknessKm, double crustalThicknessKm,
                  @JsonInclude(JsonInclude.Include.ALWAYS) Double meanMeltingPressureGPa, List<Point> profile) {
    }

    /** Body of {@code /v1/settings/hotspot}. */
    record HotspotResponse(String lithology, double excessTemperatureK,
                           @JsonInclude(JsonInclude.Include.ALWAYS) Double onsetDepthKm,
                           double meltFractionAtLid, double meltFluxM3PerS, double meltFluxKm3PerYr, Column column,
                           List<String> warnings, List<String> assumptions, List<ModelInfo> models) {
    }

    /** Body of {@code /v1/settings/continental-rift}. */
    record RiftResponse(String lithology, double lidDepthKm, double stretchedCrustThicknessKm,
                        @JsonInclude(JsonInclude.Include.ALWAYS) Double onsetStretchingFactor,
                        double meltThicknessKm, double igneousCrustThicknessKm, Column column,
                        List<String> warnings, List<String> assumptions, List<ModelInfo> models) {
    }

    // ---- handlers

    static void column(Context ctx) {
        ColumnRequest req = Json.read(ctx.bodyAsBytes(), ColumnRequest.class);
        Validation v = new Validation();
        MantleLithology lithology = mantleLithology(v, req.lithology());
        double tp = v.required("potentialTemperatureC", req.potentialTemperatureC(), MIN_TP_C, MAX_TP_C);
        double water = water(v, req.bulkWaterWtPct(), lithology);
        double lid = v.optional("lidDepthKm", req.lidDepthKm(), 0, 0, MAX_LID_KM);
        String upwelling = v.optionalChoice("upwelling", req.upwelling(), "passive", List.of("passive", "active"));
        double step = v.optional("stepKm", req.stepKm(), DEFAULT_STEP_KM, MIN_STEP_KM, MAX_STEP_KM);
        v.throwIfInvalid();

        ColumnResult r = DecompressionColumn.of(lithology, Units.celsiusToKelvin(tp), Units.wtPctToFraction(water))
                .withLidDepth(Units.kmToM(lid))
                .withUpwelling("active".equals(upwelling) ? Upwelling.ACTIVE : Upwelling.PASSIVE)
                .withOutputStep(Units.kmToM(step))
                .solve();
        Column c = column(r);
        Responses.json(ctx, new ColumnResponse(lithology.id(), c.upwelling(), c.lidDepthKm(), c.onset(), c.top(),
                c.maxMeltFraction(), c.meanMeltFraction(), c.meltThicknessKm(), c.crustalThicknessKm(),
                c.meanMeltingPressureGPa(), c.profile(), r.warnings(), r.assumptions(), r.models()));
    }

    static void hotspot(Context ctx) {
        HotspotRequest req = Json.read(ctx.bodyAsBytes(), HotspotRequest.class);
        Validation v = new Validation();
        MantleLithology lithology = mantleLithology(v, req.lithology());
        double tp = v.required("potentialTemperatureC", req.potentialTemperatureC(), MIN_TP_C, MAX_TP_C);
        double ambient = v.required("ambientPotentialTemperatureC", req.ambientPotentialTemperatureC(),
                MIN_TP_C, MAX_TP_C);
        double lithosphere = v.required("lithosphereThicknessKm", req.lithosphereThicknessKm(), 0, MAX_LID_KM);
        double radius = v.required("plumeRadiusKm", req.plumeRadiusKm(), MIN_RADIUS_KM, MAX_RADIUS_KM);
        double velocity = v.required("upwellingVelocityCmPerYr", req.upwellingVelocityCmPerYr(),
                MIN_VELOCITY_CM_PER_YR, MAX_VELOCITY_CM_PER_YR);
        double water = water(v, req.bulkWaterWtPct(), lithology);
        v.throwIfInvalid();

        Hotspot.Result r = new Hotspot(lithology, Units.celsiusToKelvin(tp), Units.celsiusToKelvin(ambient),
                Units.kmToM(lithosphere), Units.kmToM(radius), Units.cmPerYrToMPerS(velocity),
                Units.wtPctToFraction(water)).solve();
        Responses.json(ctx, new HotspotResponse(lithology.id(), r.excessTemperature(),
                r.onsetDepth().isPresent() ? Units.mToKm(r.onsetDepth().getAsDouble()) : null,
                r.meltFractionAtLid(), r.meltFlux(), Units.m3PerSToKm3PerYr(r.meltFlux()), column(r.column()),
                r.warnings(), r.assumptions(), r.models()));
    }

    static void rift(Context ctx) {
        RiftRequest req = Json.read(ctx.bodyAsBytes(), RiftRequest.class);
        Validation v = new Validation();
        MantleLithology lithology = mantleLithology(v, req.lithology());
        double tp = v.required("potentialTemperatureC", req.potentialTemperatureC(), MIN_TP_C, MAX_TP_C);
        double beta = v.required("stretchingFactor", req.stretchingFactor(), MIN_BETA, MAX_BETA);
        double lithosphere = v.required("lithosphereThicknessKm", req.lithosphereThicknessKm(),
                MIN_RIFT_LITHOSPHERE_KM, MAX_LID_KM);
        double crust = v.required("crustThicknessKm", req.crustThicknessKm(), 0, MAX_RIFT_CRUST_KM);
        if (crust >= lithosphere) {
            v.error("crustThicknessKm", "must be less than lithosphereThicknessKm (" + Validation.format(lithosphere)
                    + " km), got " + Validation.format(crust));
        }
        double water = water(v, req.bulkWaterWtPct(), lithology);
        v.throwIfInvalid();

        ContinentalRift.Result r = new ContinentalRift(lithology, Units.celsiusToKelvin(tp), beta,
                Units.kmToM(lithosphere), Units.kmToM(crust), Units.wtPctToFraction(water)).solve();
        Responses.json(ctx, new RiftResponse(lithology.id(), Units.mToKm(r.lidDepth()),
                Units.mToKm(r.stretchedCrust()),
                r.onsetStretchingFactor().isPresent() ? r.onsetStretchingFactor().getAsDouble() : null,
                Units.mToKm(r.meltThickness()), Units.mToKm(r.igneousCrustThickness()), column(r.column()),
                r.warnings(), r.assumptions(), r.models()));
    }

    // ---- helpers

    /** The requested mantle lithology (default: the catalogue's default mantle); errors name {@code lithology}. */
    static MantleLithology mantleLithology(Validation v, String id) {
        List<String> mantle = new ArrayList<>();
        for (Lithology l : Lithologies.all()) {
            if (l instanceof MantleLithology) {
                mantle.add(l.id());
            }
        }
        String wanted = id == null ? Lithologies.defaultMantle().id() : v.optionalChoice("lithology", id, null, mantle);
        if (wanted == null || !mantle.contains(wanted)) {
            return Lithologies.defaultMantle();
        }
        return (MantleLithology) Lithologies.byId(wanted).orElseThrow();
    }

    /** Optional bulk water (wt%), 0 by default, within what the lithology accepts. */
    private static double water(Validation v, Double value, MantleLithology lithology) {
        double max = Units.fractionToWtPct(lithology.maxBulkWater());
        if (max == 0 && value != null && value != 0) {
            v.error("bulkWaterWtPct", "must be 0 for " + lithology.id() + ", a dry-only melting model");
            return 0;
        }
        return v.optional("bulkWaterWtPct", value, 0, 0, max);
    }

    /** The column in API units. */
    static Column column(ColumnResult r) {
        Onset onset = r.onset().map(DecompressionRoutes::onset).orElse(null);
        Top top = r.top().map(DecompressionRoutes::top).orElse(null);
        List<Point> profile = new ArrayList<>(r.profile().size());
        for (ProfilePoint p : r.profile()) {
            profile.add(new Point(Units.mToKm(p.depth()), Units.paToGpa(p.pressure()),
                    Units.kelvinToCelsius(p.temperature()), p.meltFraction(),
                    Units.perPaToPercentPerGpa(p.productivity()), Units.fractionToWtPct(p.waterInMelt())));
        }
        Double meanP = r.meanMeltingPressure().isPresent()
                ? Units.paToGpa(r.meanMeltingPressure().getAsDouble()) : null;
        return new Column(r.upwelling() == Upwelling.ACTIVE ? "active" : "passive", Units.mToKm(r.lidDepth()), onset,
                top, r.maxMeltFraction(), r.meanMeltFraction(), Units.mToKm(r.meltThickness()),
                Units.mToKm(r.crustalThickness()), meanP, profile);
    }

    private static Onset onset(ColumnState s) {
        return new Onset(Units.mToKm(s.depth()), Units.paToGpa(s.pressure()), Units.kelvinToCelsius(s.temperature()));
    }

    private static Top top(ColumnState s) {
        return new Top(Units.mToKm(s.depth()), Units.paToGpa(s.pressure()), Units.kelvinToCelsius(s.temperature()),
                s.meltFraction());
    }
}
