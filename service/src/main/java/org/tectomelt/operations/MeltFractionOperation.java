package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import java.util.stream.IntStream;
import org.tectomelt.Config;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.Lithology;
import org.tectomelt.engine.melting.MeltState;
import org.tectomelt.engine.units.Units;

/**
 * {@code melt-fraction}: the melt state at one pressure and temperature, or at a batch of points
 * (given as {@code points} or as {@code columns}).
 * Cheap; a batch of more than {@code TECTOMELT_HEAVY_BATCH_POINTS} (default
 * {@value #HEAVY_BATCH_POINTS}) points is served as heavy: limiter and budget.
 */
public final class MeltFractionOperation
        implements Operation<MeltFractionOperation.Request, MeltFractionOperation.Result> {

    /**
     * Default of {@code TECTOMELT_HEAVY_BATCH_POINTS}: batches longer than this go through the
     * heavy-request limiter (a 10,000-point hydrous batch took 0.4–0.9 s, so 1000 points ~50–90 ms).
     */
    public static final int HEAVY_BATCH_POINTS = Config.DEFAULT_HEAVY_BATCH_POINTS;

    /** A pressure–temperature point of a batch. */
    public record PressureTemperature(Double pressureGPa, Double temperatureC) {
    }

    /** A batch as two equally long lists: point i is ({@code pressureGPa[i]}, {@code temperatureC[i]}). */
    public record Columns(List<Double> pressureGPa, List<Double> temperatureC) {
    }

    /** Request: {@code pressureGPa} and {@code temperatureC}, or {@code points}, or {@code columns}. */
    public record Request(String lithology, Double pressureGPa, Double temperatureC, Double bulkWaterWtPct,
                          List<PressureTemperature> points, Columns columns, List<Choices.MeltCurvePoint> meltCurve) {

        /** Points in the batch (either form), 0 for a single point. */
        int batchSize() {
            return points != null ? points.size() : columns != null && columns.pressureGPa() != null
                    ? columns.pressureGPa().size() : 0;
        }
    }

    /** The melt state at one point. */
    public record MeltResult(double meltFraction, double solidusC, Double drySolidusC, Double liquidusC,
                             double waterInMeltWtPct, boolean waterSaturated, boolean cpxExhausted,
                             List<String> warnings) {
    }

    /**
     * The answer: for one point its fields at the top level ({@code results} absent); for a batch
     * {@code results} in request order (the single-point fields absent).
     */
    public record Result(String lithology, Double meltFraction, Double solidusC, Double drySolidusC,
                         Double liquidusC, Double waterInMeltWtPct, Boolean waterSaturated, Boolean cpxExhausted,
                         List<String> warnings, List<MeltResult> results, List<ModelInfo> models) {
    }

    /** Points per block of a batch (the deadline is checked before each). */
    private static final int BLOCK = 1024;
    /** From this many points a batch's blocks are computed on every core. */
    static final int PARALLEL_POINTS = 2 * BLOCK;

    private final int maxPoints;
    private final int heavyPoints;

    MeltFractionOperation(Config config) {
        this.maxPoints = config.maxBatchPoints();
        this.heavyPoints = config.heavyBatchPoints();
    }

    @Override
    public String name() {
        return "melt-fraction";
    }

    @Override
    public String path() {
        return "/v1/melt-fraction";
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
    public Cost cost(Request q) {
        return q.batchSize() > heavyPoints ? Cost.HEAVY : Cost.CHEAP;
    }

    @Override
    public List<Cap> caps() {
        return List.of(new Cap("points", maxPoints, "TECTOMELT_MAX_BATCH_POINTS"),
                new Cap("columns.pressureGPa", maxPoints, "TECTOMELT_MAX_BATCH_POINTS"),
                new Cap("columns.temperatureC", maxPoints, "TECTOMELT_MAX_BATCH_POINTS"));
    }

    @Override
    public String rows() {
        return "results";
    }

    /** A batch's rows; a single-point answer has none. */
    @Override
    public String rows(Result r) {
        return r.results() != null ? "results" : null;
    }

    @Override
    public List<Input> inputs() {
        return List.of(
                new Input("pressureGPa", "GPa", "pressure of the point", true),
                new Input("temperatureC", "°C", "temperature of the point", true),
                new Input("bulkWaterWtPct", "wt%", "bulk water of the rock (hydrous models)", true));
    }

    @Override
    public List<Output<Result>> outputs() {
        return List.of(
                new Output<>("meltFraction", "1", "melt mass fraction", Result::meltFraction),
                new Output<>("solidusC", "°C", "solidus at the point's pressure", Result::solidusC),
                new Output<>("liquidusC", "°C", "liquidus at the point's pressure", Result::liquidusC),
                new Output<>("waterInMeltWtPct", "wt%", "water dissolved in the melt", Result::waterInMeltWtPct));
    }

    @Override
    public Result run(Request q, Deadline deadline) {
        Rules rules = new Rules();
        Lithology lithology = Choices.lithology(rules, q.lithology(), q.meltCurve());
        double water = Choices.water(rules, lithology, q.bulkWaterWtPct());
        boolean columns = q.columns() != null;
        boolean batch = q.points() != null || columns;
        boolean single = q.pressureGPa() != null || q.temperatureC() != null;
        if (q.points() != null && columns) {
            rules.error("columns", "give the batch as points or as columns, not both");
        } else if (batch && single) {
            rules.error(columns ? "columns" : "points", "give either pressureGPa and temperatureC, or "
                    + (columns ? "columns" : "points") + ", not both");
        }
        if (columns && q.columns().pressureGPa().size() != q.columns().temperatureC().size()) {
            rules.error("columns.temperatureC", "must be as long as columns.pressureGPa ("
                    + q.columns().pressureGPa().size() + " values), got " + q.columns().temperatureC().size());
        }
        rules.throwIfBroken();
        double maxGpa = Units.paToGpa(lithology.hardMaxPressure());
        if (!batch) {
            rules.check(q.pressureGPa() != null, "pressureGPa", "is required (allowed range 0 and "
                    + Rules.format(maxGpa) + "), or give points");
            rules.check(q.temperatureC() != null, "temperatureC", "is required, or give points");
            rules.throwIfBroken();
            rules.within("pressureGPa", q.pressureGPa(), 0, maxGpa);
            rules.throwIfBroken();
            MeltResult r = result(lithology.melt(Units.gpaToPa(q.pressureGPa()),
                    Units.celsiusToKelvin(q.temperatureC()), water));
            return new Result(lithology.id(), r.meltFraction(), r.solidusC(), r.drySolidusC(), r.liquidusC(),
                    r.waterInMeltWtPct(), r.waterSaturated(), r.cpxExhausted(), r.warnings(), null,
                    lithology.citations());
        }
        List<PressureTemperature> points;
        if (columns) {
            List<Double> p = q.columns().pressureGPa();
            List<Double> t = q.columns().temperatureC();
            points = new ArrayList<>(p.size());
            Rules column = rules.at("columns");
            for (int i = 0; i < p.size(); i++) {
                column.within("pressureGPa[" + i + "]", p.get(i), 0, maxGpa);
                points.add(new PressureTemperature(p.get(i), t.get(i)));
            }
        } else {
            points = q.points();
            for (int i = 0; i < points.size(); i++) {
                rules.at("points", i).within("pressureGPa", points.get(i).pressureGPa(), 0, maxGpa);
            }
        }
        rules.throwIfBroken();
        // a large batch is computed in blocks on every core (the lithology is immutable); each block
        // checks the deadline first, and results keep the request's order
        MeltResult[] results = new MeltResult[points.size()];
        int blocks = (points.size() + BLOCK - 1) / BLOCK;
        IntStream range = IntStream.range(0, blocks);
        (points.size() >= PARALLEL_POINTS ? range.parallel() : range).forEach(b -> {
            deadline.check();
            for (int i = b * BLOCK; i < Math.min(points.size(), (b + 1) * BLOCK); i++) {
                PressureTemperature pt = points.get(i);
                results[i] = result(lithology.melt(Units.gpaToPa(pt.pressureGPa()),
                        Units.celsiusToKelvin(pt.temperatureC()), water));
            }
        });
        return new Result(lithology.id(), null, null, null, null, null, null, null, null, List.of(results),
                lithology.citations());
    }

    private static MeltResult result(MeltState s) {
        return new MeltResult(s.meltFraction(), Units.kelvinToCelsius(s.solidus()), celsiusOrNull(s.drySolidus()),
                celsiusOrNull(s.liquidus()), Units.fractionToWtPct(s.waterInMelt()), s.waterSaturated(),
                s.cpxExhausted(), s.warnings());
    }

    static Double celsiusOrNull(double kelvin) {
        return Double.isFinite(kelvin) ? Units.kelvinToCelsius(kelvin) : null;
    }
}
