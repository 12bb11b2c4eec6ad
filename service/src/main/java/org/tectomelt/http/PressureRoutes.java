package org.tectomelt.http;

import io.javalin.http.Context;
import java.util.ArrayList;
import java.util.List;
import org.tectomelt.Config;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.units.Units;

/** {@code POST /v1/pressure}: lithostatic pressure at depths, or depths of pressures. */
final class PressureRoutes {

    private PressureRoutes() {
    }

    /** A cheap route: at most {@code TECTOMELT_MAX_PROFILE_POINTS} closed-form evaluations. */
    static List<Route> routes(Config config) {
        return List.of(Route.post("/v1/pressure", ctx -> pressure(ctx, config.maxProfilePoints())));
    }

    /** Request body. */
    record PressureRequest(List<Double> depthsKm, List<Double> pressuresGPa, Double crustThicknessKm,
                           Double crustDensityKgPerM3, Double mantleDensityKgPerM3, Double gravityMPerS2) {
    }

    /** One depth–pressure pair. */
    record Point(double depthKm, double pressureGPa) {
    }

    /** Response body. */
    record PressureResponse(List<Point> points, List<ModelInfo> models) {
    }

    static void pressure(Context ctx, int maxPoints) {
        PressureRequest req = Json.read(ctx.bodyAsBytes(), PressureRequest.class);
        Validation v = new Validation();
        double crustKm = v.optional("crustThicknessKm", req.crustThicknessKm(), 0, 0, 100);
        double rhoC = v.optional("crustDensityKgPerM3", req.crustDensityKgPerM3(),
                LithostaticColumn.CRUST_DENSITY, 2000, 3500);
        double rhoM = v.optional("mantleDensityKgPerM3", req.mantleDensityKgPerM3(),
                LithostaticColumn.MANTLE_DENSITY, 2800, 4500);
        double g = v.optional("gravityMPerS2", req.gravityMPerS2(), LithostaticColumn.G, 1, 30);
        boolean byDepth = req.depthsKm() != null;
        if (byDepth == (req.pressuresGPa() != null)) {
            v.error("depthsKm", "give exactly one of depthsKm or pressuresGPa");
            v.throwIfInvalid();
        }
        String name = byDepth ? "depthsKm" : "pressuresGPa";
        List<Double> values = v.list(name, byDepth ? req.depthsKm() : req.pressuresGPa(), 1, maxPoints,
                "TECTOMELT_MAX_PROFILE_POINTS");
        double max = byDepth ? Units.mToKm(LithostaticColumn.MAX_DEPTH_M) : 25;
        for (int i = 0; i < values.size(); i++) {
            Double x = values.get(i);
            String field = name + "[" + i + "]";
            if (x == null) {
                v.error(field, "must be a number between 0 and " + Validation.format(max));
            } else {
                v.required(field, x, 0, max);
            }
        }
        v.throwIfInvalid();

        LithostaticColumn column = new LithostaticColumn(Units.kmToM(crustKm), rhoC, rhoM, g);
        List<Point> points = new ArrayList<>(values.size());
        for (double x : values) {
            if (byDepth) {
                points.add(new Point(x, Units.paToGpa(column.pressureAt(Units.kmToM(x)))));
            } else {
                points.add(new Point(Units.mToKm(column.depthAt(Units.gpaToPa(x))), x));
            }
        }
        Responses.json(ctx, new PressureResponse(points, List.of(LithostaticColumn.INFO)));
    }
}
