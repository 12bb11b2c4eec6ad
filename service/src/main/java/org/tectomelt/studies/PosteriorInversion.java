package org.tectomelt.studies;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;
import org.tectomelt.engine.Deadline;

/**
 * One-dimensional Bayesian inversion on a grid: the posterior of one input given observed outputs.
 *
 * <pre>
 *   p(θ_j | y) ∝ (1/N) Σ_k Π_o exp(−(y_o − f_o(θ_j, η_k))² / (2 σ_o²)),   Σ p Δθ = 1 (trapezoid)
 * </pre>
 * with a uniform prior on the grid θ_j over [min, max], a Gaussian likelihood in each observation
 * and the uncertain nuisance inputs η marginalised by N Monte Carlo draws (REFERENCES §5, common
 * practice). The same N draws serve every grid point (common random numbers), so the nuisance
 * noise does not roughen the density. Sums are taken in log space (log-sum-exp), so an observation
 * far more precise than the grid does not underflow; the mode is refined by a parabola through the
 * log density at the three grid points around the peak, exact when f is linear near it. Mean,
 * sd and percentiles are those of the density interpolated linearly between grid points, so they
 * resolve nothing narrower than the grid spacing (a warning says so).
 *
 * <p>The result states what would make the numbers misleading: probability mass piled at a bound
 * (the observation may be out of reach in [min, max]), several peaks, an observed value reached at
 * several values of the field (a non-monotonic relation) or never reached (its maximum below the
 * target).
 */
public final class PosteriorInversion {

    /** Fewest grid points. */
    public static final int MIN_GRID_POINTS = 3;
    /** Density at a bound above this fraction of the peak means the posterior is cut by the bound. */
    static final double CUT_FRACTION = 0.01;
    /** A local maximum above this fraction of the peak counts as a separate peak. */
    static final double PEAK_FRACTION = 0.05;

    private PosteriorInversion() {
    }

    /**
     * What to invert.
     *
     * @param field           the solved input
     * @param fieldRange      its range (the grid must stay inside)
     * @param min             lower end of the grid
     * @param max             upper end of the grid
     * @param gridPoints      grid points, at least {@value #MIN_GRID_POINTS}
     * @param observed        observation by output name
     * @param nuisance        uncertain other inputs (not the solved field)
     * @param nuisanceSamples Monte Carlo draws of the nuisance inputs (ignored, taken as 1, when there are none)
     * @param seed            seed of the nuisance draws
     */
    public record Setup(String field, FieldRange fieldRange, double min, double max, int gridPoints,
                        Map<String, Observation> observed, UncertainInputs nuisance, int nuisanceSamples, long seed) {
        /** Copies. */
        public Setup {
            Objects.requireNonNull(field, "field");
            Objects.requireNonNull(fieldRange, "fieldRange");
            observed = Collections.unmodifiableMap(new LinkedHashMap<>(observed));
            Objects.requireNonNull(nuisance, "nuisance");
        }

        /** Draws actually used per grid point. */
        int draws() {
            return nuisance.isEmpty() ? 1 : nuisanceSamples;
        }
    }

    /**
     * Summary of the posterior.
     *
     * @param mean  posterior mean
     * @param sd    posterior standard deviation
     * @param mode  most probable value (refined between grid points)
     * @param p2_5  2.5th percentile
     * @param p16   16th percentile
     * @param p50   median
     * @param p84   84th percentile
     * @param p97_5 97.5th percentile
     */
    public record Estimate(double mean, double sd, double mode, double p2_5, double p16, double p50, double p84,
                           double p97_5) {
    }

    /**
     * The posterior.
     *
     * @param field          the solved input
     * @param grid           grid values of the field
     * @param density        posterior density at each grid point (per unit of the field); empty when no
     *                       grid point could explain the observation
     * @param estimate       mean, sd, mode and percentiles, or {@code null} with an empty density
     * @param massAtMin      posterior probability in the first grid cell
     * @param massAtMax      posterior probability in the last grid cell
     * @param relation       per observed output, its mean over the nuisance draws at each grid point
     *                       ({@code null} where no draw gave it)
     * @param roots          per observed output, where that mean curve crosses the observed value
     * @param evaluations    model evaluations made
     * @param failed         evaluations that failed in the model
     * @param failureReasons failed evaluations by reason
     * @param outOfRange     nuisance draws outside their field's range (not used), by field
     * @param warnings       what the caller should know about the numbers
     */
    public record Result(String field, List<Double> grid, List<Double> density, Estimate estimate, double massAtMin,
                         double massAtMax, Map<String, List<Double>> relation, Map<String, List<Double>> roots,
                         int evaluations, int failed, Map<String, Integer> failureReasons,
                         Map<String, Integer> outOfRange, List<String> warnings) {
        /** Copies. */
        public Result {
            grid = List.copyOf(grid);
            density = List.copyOf(density);
            relation = Collections.unmodifiableMap(new LinkedHashMap<>(relation));
            roots = Collections.unmodifiableMap(new LinkedHashMap<>(roots));
            failureReasons = Collections.unmodifiableMap(new LinkedHashMap<>(failureReasons));
            outOfRange = Collections.unmodifiableMap(new LinkedHashMap<>(outOfRange));
            warnings = List.copyOf(warnings);
        }
    }

    /** Problems with a setup, each naming its field ({@code solve.min}, {@code observed.crustalThicknessKm.sd}). */
    public static List<InputProblem> problems(Setup s) {
        List<InputProblem> out = new ArrayList<>(gridProblems(s.field(), s.fieldRange(), s.min(), s.max()));
        if (s.gridPoints() < MIN_GRID_POINTS) {
            out.add(new InputProblem("solve.gridPoints", "must be at least " + MIN_GRID_POINTS + ", got "
                    + s.gridPoints()));
        }
        if (s.observed().isEmpty()) {
            out.add(new InputProblem("observed", "name at least one observed output with its value and sd"));
        }
        s.observed().forEach((name, o) -> out.addAll(o.problems("observed." + name)));
        if (s.nuisance().fields().contains(s.field())) {
            out.add(new InputProblem("uncertainty.inputs." + s.field(), "is the solved field: its prior is uniform "
                    + "on [solve.min, solve.max]; give it no distribution"));
        }
        if (!s.nuisance().isEmpty() && s.nuisanceSamples() < 1) {
            out.add(new InputProblem("uncertainty.samples", "must be at least 1, got " + s.nuisanceSamples()));
        }
        return out;
    }

    /** Problems with the interval [min, max] searched for {@code field}. */
    static List<InputProblem> gridProblems(String field, FieldRange range, double min, double max) {
        List<InputProblem> out = new ArrayList<>();
        if (!Double.isFinite(min) || !range.contains(min)) {
            out.add(new InputProblem("solve.min", String.format(Locale.ROOT, "%s must lie in %s's range %s",
                    FieldRange.num(min), field, range.describe())));
        }
        if (!Double.isFinite(max) || !range.contains(max)) {
            out.add(new InputProblem("solve.max", String.format(Locale.ROOT, "%s must lie in %s's range %s",
                    FieldRange.num(max), field, range.describe())));
        }
        if (out.isEmpty() && !(max > min)) {
            out.add(new InputProblem("solve.max", String.format(Locale.ROOT, "%s must be above solve.min %s",
                    FieldRange.num(max), FieldRange.num(min))));
        }
        return out;
    }

    /**
     * One grid point of a posterior, as computed: the log of the nuisance-averaged likelihood, the
     * mean of each observed output over the draws, and the failures. A posterior may be computed
     * grid point by grid point anywhere and assembled from them ({@link #assemble}) with the same
     * result as {@link #run}.
     *
     * @param index         grid index
     * @param value         the solved field's value there
     * @param logLikelihood log of (1/m) Σ_k Π_o exp(−z²/2) over the m draws computed, or null when
     *                      none could explain the observation (likelihood 0)
     * @param used          draws computed there (inside their ranges, not failed)
     * @param relation      per observed output, its mean over the draws that gave it (null when none)
     * @param failures      reasons of the failed draws there, in draw order
     */
    public record GridPoint(int index, double value, Double logLikelihood, int used, Map<String, Double> relation,
                            List<String> failures) {
        /** Copies (relation values may be null). */
        public GridPoint {
            relation = Collections.unmodifiableMap(new LinkedHashMap<>(relation));
            failures = List.copyOf(failures);
        }
    }

    /**
     * Computes the posterior.
     *
     * @throws StudyException when the setup has problems ({@link #problems})
     */
    public static Result run(StudyModel model, Setup s, Workers workers, Deadline deadline) {
        StudyException.throwIfAny(problems(s));
        GridPoint[] points = new GridPoint[s.gridPoints()];
        workers.forEach(points.length, j -> points[j] = evaluate(model, s, j, deadline), deadline);
        return assemble(s, List.of(points));
    }

    /**
     * Computes grid point {@code j} of a posterior: the model at that value for every nuisance draw.
     *
     * @param deadline polled before each draw
     */
    public static GridPoint evaluate(StudyModel model, Setup s, int j, Deadline deadline) {
        int n = s.draws();
        List<String> outputs = new ArrayList<>(s.observed().keySet());
        double theta = grid(s.min(), s.max(), s.gridPoints())[j];
        double[] ll = new double[n];
        int m = 0;
        double[] sums = new double[outputs.size()];
        int[] counts = new int[outputs.size()];
        List<String> failures = new ArrayList<>();
        for (int k = 0; k < n; k++) {
            deadline.check();
            UncertainInputs.Draw draw = s.nuisance().draw(s.seed(), k);
            if (draw.outOfRange() != null) {
                continue;
            }
            Map<String, Double> in = new LinkedHashMap<>(draw.values());
            in.put(s.field(), theta);
            Evaluation e = Evaluation.of(model, in, outputs);
            if (e.failed()) {
                failures.add(e.failure());
                continue;
            }
            double l = 0;
            for (int o = 0; o < outputs.size(); o++) {
                double v = e.values()[o];
                if (Double.isNaN(v)) {
                    l = Double.NEGATIVE_INFINITY; // the observed quantity does not exist for this draw
                } else {
                    Observation ob = s.observed().get(outputs.get(o));
                    double z = (ob.value() - v) / ob.sd();
                    l -= 0.5 * z * z;
                    sums[o] += v;
                    counts[o]++;
                }
            }
            ll[m++] = l;
        }
        double logL = m == 0 ? Double.NEGATIVE_INFINITY : logSumExp(ll, m) - Math.log(m);
        Map<String, Double> relation = new LinkedHashMap<>();
        for (int o = 0; o < outputs.size(); o++) {
            relation.put(outputs.get(o), counts[o] == 0 ? null : sums[o] / counts[o]);
        }
        return new GridPoint(j, theta, logL == Double.NEGATIVE_INFINITY ? null : logL, m, relation, failures);
    }

    /**
     * The posterior from all its grid points (in any order).
     *
     * @throws IllegalArgumentException when a grid point is missing
     */
    public static Result assemble(Setup s, List<GridPoint> points) {
        int g = s.gridPoints();
        int n = s.draws();
        List<String> outputs = new ArrayList<>(s.observed().keySet());
        double[] grid = grid(s.min(), s.max(), g);
        GridPoint[] byIndex = new GridPoint[g];
        for (GridPoint p : points) {
            byIndex[p.index()] = p;
        }
        Map<String, Integer> outOfRange = new TreeMap<>();
        for (int k = 0; k < n; k++) {
            String outside = s.nuisance().draw(s.seed(), k).outOfRange();
            if (outside != null) {
                outOfRange.merge(outside, 1, Integer::sum);
            }
        }
        double[] logL = new double[g];
        int[] used = new int[g];
        double[][] curve = new double[outputs.size()][g];
        FailureTally tally = new FailureTally();
        for (int j = 0; j < g; j++) {
            GridPoint p = byIndex[j];
            if (p == null) {
                throw new IllegalArgumentException("grid point " + j + " of the posterior is missing");
            }
            logL[j] = p.logLikelihood() == null ? Double.NEGATIVE_INFINITY : p.logLikelihood();
            used[j] = p.used();
            for (int o = 0; o < outputs.size(); o++) {
                Double v = p.relation().get(outputs.get(o));
                curve[o][j] = v == null ? Double.NaN : v;
            }
            p.failures().forEach(tally::add);
        }

        List<String> warnings = new ArrayList<>();
        Map<String, List<Double>> relation = new LinkedHashMap<>();
        Map<String, List<Double>> roots = new LinkedHashMap<>();
        for (int o = 0; o < outputs.size(); o++) {
            String name = outputs.get(o);
            List<Double> rel = new ArrayList<>(g);
            for (double v : curve[o]) {
                rel.add(Double.isNaN(v) ? null : v);
            }
            relation.put(name, rel);
            Crossings c = Crossings.of(grid, curve[o], s.observed().get(name).value());
            roots.put(name, c.roots());
            c.warning(s.field(), name, s.observed().get(name).value(), grid).ifPresent(warnings::add);
        }
        if (tally.count() > 0) {
            warnings.add(String.format(Locale.ROOT, "%d of %d evaluations failed in the model and are left out of "
                    + "the likelihood; see failureReasons", tally.count(), g * n));
        }
        if (!outOfRange.isEmpty()) {
            warnings.add(String.format(Locale.ROOT, "%d nuisance draws left their field's range and were not used: %s",
                    outOfRange.values().stream().mapToInt(Integer::intValue).sum(), outOfRange));
        }
        for (int j = 0; j < g; j++) {
            if (used[j] == 0) {
                warnings.add(String.format(Locale.ROOT, "no draw could be computed at %s = %s: the density there is 0",
                        s.field(), FieldRange.num(grid[j])));
                break;
            }
        }

        double peak = Double.NEGATIVE_INFINITY;
        int jPeak = -1;
        for (int j = 0; j < g; j++) {
            if (logL[j] > peak) {
                peak = logL[j];
                jPeak = j;
            }
        }
        List<Double> gridList = toList(grid);
        if (jPeak < 0) {
            warnings.add("no grid point can explain the observation (the observed outputs are absent or every "
                    + "evaluation failed): there is no posterior");
            return new Result(s.field(), gridList, List.of(), null, 0, 0, relation, roots, g * n, tally.count(),
                    tally.reasons(), outOfRange, warnings);
        }
        double h = grid[1] - grid[0];
        double[] p = new double[g];
        for (int j = 0; j < g; j++) {
            p[j] = Math.exp(logL[j] - peak);
        }
        double z = trapezoid(p, h);
        for (int j = 0; j < g; j++) {
            p[j] /= z;
        }
        double mean = 0;
        double[] tp = new double[g];
        for (int j = 0; j < g; j++) {
            tp[j] = grid[j] * p[j];
        }
        mean = trapezoid(tp, h);
        for (int j = 0; j < g; j++) {
            double d = grid[j] - mean;
            tp[j] = d * d * p[j];
        }
        double sd = Math.sqrt(Math.max(0, trapezoid(tp, h)));
        double mode = refinedMode(grid, logL, jPeak);
        double[] cdf = cumulative(p, h);
        Estimate est = new Estimate(mean, sd, mode, quantile(grid, p, cdf, 0.025), quantile(grid, p, cdf, 0.16),
                quantile(grid, p, cdf, 0.5), quantile(grid, p, cdf, 0.84), quantile(grid, p, cdf, 0.975));
        double massAtMin = 0.5 * h * (p[0] + p[1]);
        double massAtMax = 0.5 * h * (p[g - 2] + p[g - 1]);
        double pMax = p[jPeak];
        if (jPeak == 0 || jPeak == g - 1) {
            warnings.add(String.format(Locale.ROOT, "the most probable %s is at the bound %s of [%s, %s]: the "
                    + "observation may be out of reach inside this interval", s.field(), FieldRange.num(grid[jPeak]),
                    FieldRange.num(s.min()), FieldRange.num(s.max())));
        }
        if (p[0] > CUT_FRACTION * pMax) {
            warnings.add(String.format(Locale.ROOT, "the posterior has not decayed at solve.min = %s (%.3g of its "
                    + "probability in the first grid cell): values below it may be as likely; widen the interval if "
                    + "the field allows", FieldRange.num(s.min()), massAtMin));
        }
        if (p[g - 1] > CUT_FRACTION * pMax) {
            warnings.add(String.format(Locale.ROOT, "the posterior has not decayed at solve.max = %s (%.3g of its "
                    + "probability in the last grid cell): values above it may be as likely; widen the interval if "
                    + "the field allows", FieldRange.num(s.max()), massAtMax));
        }
        if (sd < 2 * h) {
            warnings.add(String.format(Locale.ROOT, "the posterior (sd %.3g) is narrower than two grid spacings "
                    + "(%.3g): its mean, sd and percentiles are resolved only to the grid (the mode is refined); "
                    + "narrow [solve.min, solve.max] around %s or add grid points", sd, h, FieldRange.num(mode)));
        }
        List<Double> peaks = peaks(grid, p, pMax);
        if (peaks.size() > 1) {
            warnings.add(String.format(Locale.ROOT, "the posterior has %d separate peaks (near %s): mean and sd "
                    + "summarise a multimodal density", peaks.size(), formatList(peaks)));
        }
        return new Result(s.field(), gridList, toList(p), est, massAtMin, massAtMax, relation, roots, g * n,
                tally.count(), tally.reasons(), outOfRange, warnings);
    }

    static double[] grid(double min, double max, int points) {
        double[] g = new double[points];
        for (int j = 0; j < points; j++) {
            g[j] = j == points - 1 ? max : min + (max - min) * j / (points - 1);
        }
        return g;
    }

    private static double logSumExp(double[] x, int m) {
        double top = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < m; i++) {
            top = Math.max(top, x[i]);
        }
        if (top == Double.NEGATIVE_INFINITY) {
            return top;
        }
        double sum = 0;
        for (int i = 0; i < m; i++) {
            sum += Math.exp(x[i] - top);
        }
        return top + Math.log(sum);
    }

    private static double trapezoid(double[] y, double h) {
        double s = 0;
        for (int j = 1; j < y.length; j++) {
            s += 0.5 * (y[j - 1] + y[j]);
        }
        return s * h;
    }

    private static double[] cumulative(double[] p, double h) {
        double[] c = new double[p.length];
        for (int j = 1; j < p.length; j++) {
            c[j] = c[j - 1] + 0.5 * h * (p[j - 1] + p[j]);
        }
        return c;
    }

    /** Quantile q of the density interpolated linearly between grid points (exact for that density). */
    private static double quantile(double[] grid, double[] p, double[] cdf, double q) {
        double total = cdf[cdf.length - 1];
        double target = q * total;
        for (int j = 1; j < grid.length; j++) {
            if (cdf[j] >= target) {
                double h = grid[j] - grid[j - 1];
                double r = target - cdf[j - 1];
                double p0 = p[j - 1];
                double slope = (p[j] - p0) / h;
                double t;
                if (Math.abs(slope) * h < 1e-12 * Math.max(p0, p[j])) {
                    t = p0 > 0 ? r / p0 : 0;
                } else {
                    // p0 t + slope t²/2 = r
                    double disc = Math.max(0, p0 * p0 + 2 * slope * r);
                    t = (Math.sqrt(disc) - p0) / slope;
                }
                return grid[j - 1] + Math.min(Math.max(t, 0), h);
            }
        }
        return grid[grid.length - 1];
    }

    /** The peak refined by a parabola through log density at the three grid points around it. */
    private static double refinedMode(double[] grid, double[] logL, int j) {
        if (j == 0 || j == grid.length - 1) {
            return grid[j];
        }
        double a = logL[j - 1];
        double b = logL[j];
        double c = logL[j + 1];
        double curvature = a - 2 * b + c;
        if (!Double.isFinite(a) || !Double.isFinite(c) || !(curvature < 0)) {
            return grid[j];
        }
        double offset = 0.5 * (a - c) / curvature;
        return grid[j] + Math.max(-0.5, Math.min(0.5, offset)) * (grid[j + 1] - grid[j]);
    }

    private static List<Double> peaks(double[] grid, double[] p, double pMax) {
        List<Double> out = new ArrayList<>();
        for (int j = 0; j < p.length; j++) {
            double left = j > 0 ? p[j - 1] : Double.NEGATIVE_INFINITY;
            double right = j < p.length - 1 ? p[j + 1] : Double.NEGATIVE_INFINITY;
            if (p[j] > PEAK_FRACTION * pMax && p[j] > left && p[j] >= right) {
                out.add(grid[j]);
            }
        }
        return out;
    }

    static List<Double> toList(double[] a) {
        List<Double> l = new ArrayList<>(a.length);
        for (double x : a) {
            l.add(x);
        }
        return l;
    }

    static String formatList(List<Double> xs) {
        List<String> s = new ArrayList<>();
        for (double x : xs) {
            s.add(String.format(Locale.ROOT, "%.4g", x));
        }
        return String.join(", ", s);
    }
}
