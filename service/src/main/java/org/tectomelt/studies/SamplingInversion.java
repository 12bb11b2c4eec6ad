package org.tectomelt.studies;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.exception.TooManyEvaluationsException;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.ZigguratSampler;
import org.tectomelt.engine.Deadline;

/**
 * Inversion by sampling: for each Monte Carlo draw of the observation (normal with its sd) and of
 * the nuisance inputs, the value of the solved input that reproduces the drawn observation.
 *
 * <p>Per draw the relation is first scanned at {@code scanPoints} evenly spaced values over
 * [min, max]: no sign change of output − target means no root (the target is above the largest or
 * below the smallest output reached), more than one means several roots (the relation is not
 * monotonic there); exactly one bracket is refined by Brent's method (Brent 1973, Algorithms for
 * Minimization without Derivatives, ch. 4; Commons Math {@code BrentSolver}) to
 * {@value #RELATIVE_ACCURACY} of the interval. Draws without a single root are counted by cause
 * and left out of the summary, never forced to a bound. Two roots closer than one scan step, or a
 * touch without a sign change, are not seen: raise {@code scanPoints} for a wiggly relation.
 */
public final class SamplingInversion {

    /** Fewest scan points. */
    public static final int MIN_SCAN_POINTS = 2;
    /** Root accuracy as a fraction of max − min. */
    public static final double RELATIVE_ACCURACY = 1e-9;
    private static final int MAX_EVALUATIONS = 100;

    /** Why a draw has no solution. */
    public enum Outcome { SOLVED, OUT_OF_RANGE, FAILED, ABOVE, BELOW, SEVERAL }

    private SamplingInversion() {
    }

    /**
     * What to invert.
     *
     * @param field      the solved input
     * @param fieldUnit  its unit (for the summary)
     * @param fieldRange its range ([min, max] must stay inside)
     * @param min        lower end of the search
     * @param max        upper end of the search
     * @param output     the observed output
     * @param observed   its observation
     * @param nuisance   uncertain other inputs (not the solved field)
     * @param samples    Monte Carlo draws, at least 1
     * @param seed       seed of the draws
     * @param scanPoints scan points per draw, at least {@value #MIN_SCAN_POINTS}
     */
    public record Setup(String field, String fieldUnit, FieldRange fieldRange, double min, double max, String output,
                        Observation observed, UncertainInputs nuisance, int samples, long seed, int scanPoints) {
        /** Required parts. */
        public Setup {
            Objects.requireNonNull(field, "field");
            Objects.requireNonNull(fieldUnit, "fieldUnit");
            Objects.requireNonNull(fieldRange, "fieldRange");
            Objects.requireNonNull(output, "output");
            Objects.requireNonNull(observed, "observed");
            Objects.requireNonNull(nuisance, "nuisance");
        }
    }

    /**
     * The solutions.
     *
     * @param field          the solved input
     * @param samples        draws made
     * @param solved         draws with exactly one root
     * @param summary        summary of the roots, or {@code null} when no draw had one
     * @param noRootAbove    draws whose target is above the largest output reached in [min, max]
     * @param noRootBelow    draws whose target is below the smallest output reached
     * @param severalRoots   draws whose target is reached at several values (non-monotonic relation)
     * @param failed         draws that failed in the model
     * @param failureReasons failed draws by reason
     * @param outOfRange     nuisance draws outside their field's range (not used), by field
     * @param warnings       what the caller should know about the numbers
     */
    public record Result(String field, int samples, int solved, Summary summary, int noRootAbove, int noRootBelow,
                         int severalRoots, int failed, Map<String, Integer> failureReasons,
                         Map<String, Integer> outOfRange, List<String> warnings) {
        /** Copies. */
        public Result {
            failureReasons = Collections.unmodifiableMap(new LinkedHashMap<>(failureReasons));
            outOfRange = Collections.unmodifiableMap(new LinkedHashMap<>(outOfRange));
            warnings = List.copyOf(warnings);
        }
    }

    /** Problems with a setup, each naming its field. */
    public static List<InputProblem> problems(Setup s) {
        List<InputProblem> out = new ArrayList<>(PosteriorInversion.gridProblems(s.field(), s.fieldRange(), s.min(),
                s.max()));
        out.addAll(s.observed().problems("observed." + s.output()));
        if (s.samples() < 1) {
            out.add(new InputProblem("uncertainty.samples", "must be at least 1, got " + s.samples()));
        }
        if (s.scanPoints() < MIN_SCAN_POINTS) {
            out.add(new InputProblem("solve.scanPoints", "must be at least " + MIN_SCAN_POINTS + ", got "
                    + s.scanPoints()));
        }
        if (s.nuisance().fields().contains(s.field())) {
            out.add(new InputProblem("uncertainty.inputs." + s.field(), "is the solved field: it is found by root "
                    + "finding in [solve.min, solve.max]; give it no distribution"));
        }
        return out;
    }

    /**
     * Solves every draw.
     *
     * @throws StudyException when the setup has problems ({@link #problems})
     */
    public static Result run(StudyModel model, Setup s, Workers workers, Deadline deadline) {
        StudyException.throwIfAny(problems(s));
        return assemble(s, List.of(evaluate(model, s, 0, s.samples(), workers, deadline)));
    }

    /**
     * The draws [from, from + n) of a sampling inversion, as computed. An inversion may be computed
     * in blocks anywhere and assembled from them ({@link #assemble}) with the same result as
     * {@link #run}.
     *
     * @param from       index of the first draw
     * @param roots      per draw: its root, or null
     * @param outcomes   per draw: solved, or why not
     * @param failures   per draw: the model's failure reason, or null
     * @param outOfRange per draw: the nuisance field whose draw left its range, or null
     * @param examples   per draw: the numbers behind a missing root, or null
     */
    public record Block(int from, List<Double> roots, List<Outcome> outcomes, List<String> failures,
                        List<String> outOfRange, List<String> examples) {
        /** Copies (lists may hold nulls). */
        public Block {
            roots = Collections.unmodifiableList(new ArrayList<>(roots));
            outcomes = List.copyOf(outcomes);
            failures = Collections.unmodifiableList(new ArrayList<>(failures));
            outOfRange = Collections.unmodifiableList(new ArrayList<>(outOfRange));
            examples = Collections.unmodifiableList(new ArrayList<>(examples));
        }
    }

    /**
     * Solves the draws [from, to).
     *
     * @param deadline polled before each draw
     */
    public static Block evaluate(StudyModel model, Setup s, int from, int to, Workers workers, Deadline deadline) {
        int n = to - from;
        double[] scan = PosteriorInversion.grid(s.min(), s.max(), s.scanPoints());
        // without nuisance inputs the relation is the same for every draw: scan it once
        Scan shared = s.nuisance().isEmpty() ? Scan.of(model, s, Map.of(), scan) : null;
        double[] roots = new double[n];
        Outcome[] outcome = new Outcome[n];
        String[] failure = new String[n];
        String[] outside = new String[n];
        String[] example = new String[n];
        Arrays.fill(roots, Double.NaN);
        workers.forEach(n, k -> {
            UncertainInputs.Draw draw = s.nuisance().draw(s.seed(), from + k);
            if (draw.outOfRange() != null) {
                outcome[k] = Outcome.OUT_OF_RANGE;
                outside[k] = draw.outOfRange();
                return;
            }
            UniformRandomProvider rng = SampleRandom.forSample(s.seed(), from + k, SampleRandom.OBSERVATION);
            double target = s.observed().value() + s.observed().sd() * ZigguratSampler.NormalizedGaussian.of(rng)
                    .sample();
            Scan sc = shared != null ? shared : Scan.of(model, s, draw.values(), scan);
            if (sc.failure() != null) {
                outcome[k] = Outcome.FAILED;
                failure[k] = sc.failure();
                return;
            }
            Crossings c = Crossings.of(scan, sc.values(), target);
            if (c.roots().size() == 1) {
                try {
                    roots[k] = refine(model, s, draw.values(), scan, sc.values(), target);
                    outcome[k] = Outcome.SOLVED;
                } catch (Failure f) {
                    outcome[k] = Outcome.FAILED;
                    failure[k] = f.getMessage();
                }
            } else if (c.roots().size() > 1) {
                outcome[k] = Outcome.SEVERAL;
                example[k] = String.format(Locale.ROOT, "target %.4g reached near %s = %s", target, s.field(),
                        PosteriorInversion.formatList(c.roots()));
            } else if (Double.isNaN(c.highest())) {
                outcome[k] = Outcome.FAILED;
                failure[k] = s.output() + " is absent over the whole interval";
            } else if (c.highest() < target) {
                outcome[k] = Outcome.ABOVE;
                example[k] = String.format(Locale.ROOT, "target %.4g, largest %s %.4g at %s = %s", target, s.output(),
                        c.highest(), s.field(), FieldRange.num(c.xHighest()));
            } else {
                outcome[k] = Outcome.BELOW;
                example[k] = String.format(Locale.ROOT, "target %.4g, smallest %s %.4g at %s = %s", target, s.output(),
                        c.lowest(), s.field(), FieldRange.num(c.xLowest()));
            }
        }, deadline);
        List<Double> r = new ArrayList<>(n);
        for (double x : roots) {
            r.add(Double.isNaN(x) ? null : x);
        }
        return new Block(from, r, Arrays.asList(outcome), Arrays.asList(failure), Arrays.asList(outside),
                Arrays.asList(example));
    }

    /**
     * The result from all its blocks, which must cover the draws 0 … samples − 1 without gap.
     *
     * @throws IllegalArgumentException when they do not
     */
    public static Result assemble(Setup s, List<Block> blocks) {
        List<Block> sorted = new ArrayList<>(blocks);
        sorted.sort(java.util.Comparator.comparingInt(Block::from));
        int n = s.samples();
        double[] roots = new double[n];
        Outcome[] outcome = new Outcome[n];
        String[] failure = new String[n];
        String[] outside = new String[n];
        String[] example = new String[n];
        int next = 0;
        for (Block b : sorted) {
            if (b.from() != next || next + b.outcomes().size() > n) {
                throw new IllegalArgumentException("blocks must cover draws 0 to " + (n - 1) + " without gap");
            }
            for (int i = 0; i < b.outcomes().size(); i++) {
                int k = next + i;
                Double root = b.roots().get(i);
                roots[k] = root == null ? Double.NaN : root;
                outcome[k] = b.outcomes().get(i);
                failure[k] = b.failures().get(i);
                outside[k] = b.outOfRange().get(i);
                example[k] = b.examples().get(i);
            }
            next += b.outcomes().size();
        }
        if (next != n) {
            throw new IllegalArgumentException("blocks cover " + next + " of " + n + " draws");
        }
        return summarise(s, roots, outcome, failure, outside, example);
    }

    private static Result summarise(Setup s, double[] roots, Outcome[] outcome, String[] failure, String[] outside,
                                    String[] example) {
        int n = roots.length;
        int[] counts = new int[Outcome.values().length];
        String[] firstExample = new String[Outcome.values().length];
        Map<String, Integer> outOfRange = new TreeMap<>();
        double[] ok = new double[n];
        int solved = 0;
        for (int k = 0; k < n; k++) {
            counts[outcome[k].ordinal()]++;
            if (outcome[k] == Outcome.SOLVED) {
                ok[solved++] = roots[k];
            }
            if (outside[k] != null) {
                outOfRange.merge(outside[k], 1, Integer::sum);
            }
            if (example[k] != null && firstExample[outcome[k].ordinal()] == null) {
                firstExample[outcome[k].ordinal()] = "draw " + k + ": " + example[k];
            }
        }
        FailureTally tally = FailureTally.of(failure);
        String interval = "[" + FieldRange.num(s.min()) + ", " + FieldRange.num(s.max()) + "]";
        List<String> warnings = new ArrayList<>();
        int several = counts[Outcome.SEVERAL.ordinal()];
        int above = counts[Outcome.ABOVE.ordinal()];
        int below = counts[Outcome.BELOW.ordinal()];
        if (several > 0) {
            warnings.add(String.format(Locale.ROOT, "%d of %d draws reach the drawn %s at several values of %s: the "
                    + "relation is not monotonic over %s, and these draws are not in the summary (%s)", several, n,
                    s.output(), s.field(), interval, firstExample[Outcome.SEVERAL.ordinal()]));
        }
        if (above > 0) {
            warnings.add(String.format(Locale.ROOT, "%d of %d draws have no root: the drawn %s is above the largest "
                    + "value reached over %s = %s (%s); widen the interval if the field allows", above, n, s.output(),
                    s.field(), interval, firstExample[Outcome.ABOVE.ordinal()]));
        }
        if (below > 0) {
            warnings.add(String.format(Locale.ROOT, "%d of %d draws have no root: the drawn %s is below the smallest "
                    + "value reached over %s = %s (%s); widen the interval if the field allows", below, n, s.output(),
                    s.field(), interval, firstExample[Outcome.BELOW.ordinal()]));
        }
        if (tally.count() > 0) {
            warnings.add(String.format(Locale.ROOT, "%d of %d draws failed in the model; see failureReasons",
                    tally.count(), n));
        }
        if (!outOfRange.isEmpty()) {
            warnings.add(String.format(Locale.ROOT, "%d nuisance draws left their field's range and were not used: %s",
                    counts[Outcome.OUT_OF_RANGE.ordinal()], outOfRange));
        }
        if (solved < n) {
            warnings.add(String.format(Locale.ROOT, "the summary covers the %d of %d draws with a single root: it "
                    + "is conditional on the observation being reachable once in %s", solved, n, interval));
        }
        Summary summary = solved == 0 ? null : Summary.of(s.fieldUnit(), Arrays.copyOf(ok, solved));
        return new Result(s.field(), n, solved, summary, above, below, several, tally.count(), tally.reasons(),
                outOfRange, warnings);
    }

    /** The relation at the scan points for one draw of the nuisance inputs. */
    private record Scan(double[] values, String failure) {
        static Scan of(StudyModel model, Setup s, Map<String, Double> nuisance, double[] scan) {
            double[] v = new double[scan.length];
            for (int i = 0; i < scan.length; i++) {
                Evaluation e = evaluate(model, s, nuisance, scan[i]);
                if (e.failed()) {
                    return new Scan(null, e.failure());
                }
                v[i] = e.values()[0];
            }
            return new Scan(v, null);
        }
    }

    private static Evaluation evaluate(StudyModel model, Setup s, Map<String, Double> nuisance, double x) {
        Map<String, Double> in = new LinkedHashMap<>(nuisance);
        in.put(s.field(), x);
        return Evaluation.of(model, in, List.of(s.output()));
    }

    /** Brent's method inside the one bracket of the scan. */
    private static double refine(StudyModel model, Setup s, Map<String, Double> nuisance, double[] scan,
                                 double[] values, double target) {
        for (int i = 0; i < scan.length; i++) {
            if (values[i] == target) {
                return scan[i];
            }
        }
        int lo = -1;
        int prev = -1;
        for (int i = 0; i < scan.length && lo < 0; i++) {
            if (Double.isNaN(values[i])) {
                continue;
            }
            if (prev >= 0 && (values[prev] < target) != (values[i] < target)) {
                lo = prev;
                prev = i;
                break;
            }
            prev = i;
        }
        int hi = prev;
        double abs = RELATIVE_ACCURACY * (s.max() - s.min());
        BrentSolver brent = new BrentSolver(1e-14, abs);
        try {
            return brent.solve(MAX_EVALUATIONS, x -> {
                Evaluation e = evaluate(model, s, nuisance, x);
                if (e.failed()) {
                    throw new Failure(e.failure());
                }
                if (Double.isNaN(e.values()[0])) {
                    throw new Failure(s.output() + " is absent inside the bracket of the root");
                }
                return e.values()[0] - target;
            }, scan[lo], scan[hi]);
        } catch (TooManyEvaluationsException e) {
            throw new Failure("root finding did not converge in " + MAX_EVALUATIONS + " evaluations");
        }
    }

    /** A draw's failure inside root finding. */
    private static final class Failure extends RuntimeException {
        private static final long serialVersionUID = 1L;

        Failure(String reason) {
            super(reason, null, false, false);
        }
    }
}
