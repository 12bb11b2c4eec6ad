package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import org.tectomelt.Config;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.units.Units;

/** {@code pressure}: lithostatic pressure at depths, or the depths of pressures. Cheap. */
public final class PressureOperation implements Operation<PressureOperation.Request, PressureOperation.Result> {

    /** Request: exactly one of {@code depthsKm} or {@code pressuresGPa}. */
    public record Request(List<Double> depthsKm, List<Double> pressuresGPa, Double crustThicknessKm,
                          Double crustDensityKgPerM3, Double mantleDensityKgPerM3, Double gravityMPerS2) {
    }

    /** One depth–pressure pair. */
    public record Point(double depthKm, double pressureGPa) {
    }

    /** Pressures (or depths) in request order. */
    public record Result(List<Point> points, List<ModelInfo> models) {
    }

    private final int maxPoints;

    PressureOperation(Config config) {
        this.maxPoints = config.maxProfilePoints();
    }

    @Override
    public String name() {
        return "pressure";
    }

    @Override
    public String path() {
        return "/v1/pressure";
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
    public List<Cap> caps() {
        return List.of(new Cap("depthsKm", maxPoints, "TECTOMELT_MAX_PROFILE_POINTS"),
                new Cap("pressuresGPa", maxPoints, "TECTOMELT_MAX_PROFILE_POINTS"));
    }

    @Override
    public String rows() {
        return "points";
    }

    @Override
    public List<Input> inputs() {
        return List.of(
                new Input("crustThicknessKm", "km", "crust thickness (0: mantle only)", true),
                new Input("crustDensityKgPerM3", "kg/m³", "crust density", true),
                new Input("mantleDensityKgPerM3", "kg/m³", "mantle density", true),
                new Input("gravityMPerS2", "m/s²", "gravitational acceleration", true));
    }

    @Override
    public List<Output<Result>> outputs() {
        return List.of();
    }

    @Override
    public Result run(Request q, Deadline deadline) {
        boolean byDepth = q.depthsKm() != null;
        if (byDepth == (q.pressuresGPa() != null)) {
            throw new OperationException("depthsKm", "give exactly one of depthsKm or pressuresGPa");
        }
        LithostaticColumn column = new LithostaticColumn(Units.kmToM(q.crustThicknessKm()), q.crustDensityKgPerM3(),
                q.mantleDensityKgPerM3(), q.gravityMPerS2());
        List<Double> values = byDepth ? q.depthsKm() : q.pressuresGPa();
        List<Point> points = new ArrayList<>(values.size());
        for (double x : values) {
            if (byDepth) {
                points.add(new Point(x, Units.paToGpa(column.pressureAt(Units.kmToM(x)))));
            } else {
                points.add(new Point(Units.mToKm(column.depthAt(Units.gpaToPa(x))), x));
            }
        }
        return new Result(points, List.of(LithostaticColumn.INFO));
    }
}
