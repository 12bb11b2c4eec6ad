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
import org.tectomelt.engine.Deadline;

/**
 * Forward Monte Carlo: draws the uncertain inputs, computes every sample, summarises each output.
 *
 * <p>Sample i is drawn from its own generator ({@link SampleRandom}) and its outputs are stored at
 * index i; the summaries are computed afterwards in index order, so the result is bit-identical for
 * any {@link Workers}. Nothing is dropped silently: a draw outside its field's range is counted
 * under {@code outOfRange} and not computed (it is never clipped), a sample that fails in the
 * model is counted with its reason, and an output absent for a sample (no melting) is counted
 * under {@code absent}. Summaries cover the samples that gave the output.
 */
public final class MonteCarlo {

    private MonteCarlo() {
    }

    /**
     * A forward study's result.
     *
     * @param seed           the seed used
     * @param samples        samples drawn
     * @param evaluated      samples computed (drawn inside every range)
     * @param failed         computed samples that failed in the model
     * @param failureReasons failed samples by reason
     * @param outOfRange     samples not computed because a draw left its field's range, by field
     * @param absent         samples without a value, by output
     * @param summaries      summary by output (outputs no sample gave are missing)
     * @param warnings       what the caller should know about the numbers
     */
    public record Result(long seed, int samples, int evaluated, int failed, Map<String, Integer> failureReasons,
                         Map<String, Integer> outOfRange, Map<String, Integer> absent, Map<String, Summary> summaries,
                         List<String> warnings) {
        /** Defensive copies. */
        public Result {
            outOfRange = Collections.unmodifiableMap(new LinkedHashMap<>(outOfRange));
            absent = Collections.unmodifiableMap(new LinkedHashMap<>(absent));
            summaries = Collections.unmodifiableMap(new LinkedHashMap<>(summaries));
            failureReasons = Collections.unmodifiableMap(new LinkedHashMap<>(failureReasons));
            warnings = List.copyOf(warnings);
        }
    }

    /**
     * Runs a forward study.
     *
     * @param model    the computation
     * @param inputs   the uncertain inputs (may be empty: every sample is then the same computation)
     * @param outputs  unit by output name, in the order to report
     * @param samples  number of samples, at least 1
     * @param seed     seed of the draws
     * @param workers  where to compute
     * @param deadline budget, polled before each sample
     */
    public static Result run(StudyModel model, UncertainInputs inputs, Map<String, String> outputs, int samples,
                             long seed, Workers workers, Deadline deadline) {
        Objects.requireNonNull(model, "model");
        if (samples < 1) {
            throw new StudyException("samples", "must be at least 1, got " + samples);
        }
        if (outputs.isEmpty()) {
            throw new StudyException("outputs", "name at least one output");
        }
        List<String> names = new ArrayList<>(outputs.keySet());
        double[][] values = new double[names.size()][samples];
        String[] outside = new String[samples];
        String[] failure = new String[samples];
        workers.forEach(samples, i -> {
            UncertainInputs.Draw draw = inputs.draw(seed, i);
            if (draw.outOfRange() != null) {
                outside[i] = draw.outOfRange();
                for (double[] v : values) {
                    v[i] = Double.NaN;
                }
                return;
            }
            Evaluation e = Evaluation.of(model, draw.values(), names);
            failure[i] = e.failure();
            for (int k = 0; k < names.size(); k++) {
                values[k][i] = e.values()[k];
            }
        }, deadline);
        return summarise(seed, samples, outputs, names, values, outside, failure);
    }

    private static Result summarise(long seed, int samples, Map<String, String> outputs, List<String> names,
                                    double[][] values, String[] outside, String[] failure) {
        Map<String, Integer> outOfRange = new TreeMap<>();
        int evaluated = 0;
        for (String f : outside) {
            if (f == null) {
                evaluated++;
            } else {
                outOfRange.merge(f, 1, Integer::sum);
            }
        }
        FailureTally tally = FailureTally.of(failure);
        Map<String, Integer> absent = new LinkedHashMap<>();
        Map<String, Summary> summaries = new LinkedHashMap<>();
        for (int k = 0; k < names.size(); k++) {
            double[] ok = new double[samples];
            int n = 0;
            int missing = 0;
            for (int i = 0; i < samples; i++) {
                if (outside[i] != null || failure[i] != null) {
                    continue;
                }
                double v = values[k][i];
                if (Double.isNaN(v)) {
                    missing++;
                } else {
                    ok[n++] = v;
                }
            }
            absent.put(names.get(k), missing);
            if (n > 0) {
                summaries.put(names.get(k), Summary.of(outputs.get(names.get(k)), Arrays.copyOf(ok, n)));
            }
        }
        List<String> warnings = new ArrayList<>();
        int outsideCount = samples - evaluated;
        if (outsideCount > 0) {
            warnings.add(String.format(Locale.ROOT, "%d of %d draws left their field's range (%s) and were not "
                    + "computed: the summaries describe the distribution restricted to the range", outsideCount,
                    samples, outOfRange));
        }
        if (tally.count() > 0) {
            warnings.add(String.format(Locale.ROOT, "%d of %d computed samples failed in the model and are not in "
                    + "the summaries; see failureReasons", tally.count(), evaluated));
        }
        absent.forEach((name, count) -> {
            if (count > 0) {
                warnings.add(String.format(Locale.ROOT, "%s is absent in %d samples (the quantity does not exist "
                        + "there, e.g. no melting); its summary covers the other samples", name, count));
            }
        });
        return new Result(seed, samples, evaluated, tally.count(), tally.reasons(), outOfRange, absent, summaries,
                warnings);
    }
}
