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
     * The samples [from, from + n) of a study, as computed: per sample its outputs (null where
     * absent, failed or not computed), its failure reason and the field whose draw left its range.
     * A study may be computed in blocks anywhere (several threads, several instances) and
     * summarised from them ({@link #summarise}) with the same result as {@link #run}.
     *
     * @param from       index of the first sample
     * @param values     per output, per sample of the block: the value, or null
     * @param failures   per sample: why it failed in the model, or null
     * @param outOfRange per sample: the field whose draw left its range (not computed), or null
     */
    public record Block(int from, Map<String, List<Double>> values, List<String> failures, List<String> outOfRange) {
        /** Copies (lists may hold nulls). */
        public Block {
            Map<String, List<Double>> v = new LinkedHashMap<>();
            values.forEach((k, l) -> v.put(k, Collections.unmodifiableList(new ArrayList<>(l))));
            values = Collections.unmodifiableMap(v);
            failures = Collections.unmodifiableList(new ArrayList<>(failures));
            outOfRange = Collections.unmodifiableList(new ArrayList<>(outOfRange));
        }

        /** Samples in the block. */
        public int size() {
            return failures.size();
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
        if (samples < 1) {
            throw new StudyException("uncertainty.samples", "must be at least 1, got " + samples);
        }
        Block all = evaluate(model, inputs, List.copyOf(outputs.keySet()), seed, 0, samples, workers, deadline);
        return summarise(seed, outputs, List.of(all));
    }

    /**
     * Computes the samples [from, to) of a study.
     *
     * @param model    the computation
     * @param inputs   the uncertain inputs
     * @param outputs  output names to keep
     * @param seed     seed of the draws
     * @param from     first sample index
     * @param to       one past the last sample index
     * @param workers  where to compute
     * @param deadline budget, polled before each sample
     */
    public static Block evaluate(StudyModel model, UncertainInputs inputs, List<String> outputs, long seed, int from,
                                 int to, Workers workers, Deadline deadline) {
        Objects.requireNonNull(model, "model");
        if (outputs.isEmpty()) {
            throw new StudyException("outputs", "name at least one output");
        }
        int n = to - from;
        Double[][] values = new Double[outputs.size()][n];
        String[] outside = new String[n];
        String[] failure = new String[n];
        workers.forEach(n, i -> {
            UncertainInputs.Draw draw = inputs.draw(seed, from + i);
            if (draw.outOfRange() != null) {
                outside[i] = draw.outOfRange();
                return;
            }
            Evaluation e = Evaluation.of(model, draw.values(), outputs);
            failure[i] = e.failure();
            for (int k = 0; k < outputs.size(); k++) {
                double v = e.values()[k];
                values[k][i] = Double.isNaN(v) ? null : v;
            }
        }, deadline);
        Map<String, List<Double>> byOutput = new LinkedHashMap<>();
        for (int k = 0; k < outputs.size(); k++) {
            byOutput.put(outputs.get(k), Arrays.asList(values[k]));
        }
        return new Block(from, byOutput, Arrays.asList(failure), Arrays.asList(outside));
    }

    /**
     * Summarises a study from its blocks, which must cover the samples 0, 1, ..., n − 1 without gap
     * (in any order).
     *
     * @param seed    the study's seed (reported)
     * @param outputs unit by output name, in the order to report
     * @param blocks  the computed blocks
     */
    public static Result summarise(long seed, Map<String, String> outputs, List<Block> blocks) {
        List<Block> sorted = new ArrayList<>(blocks);
        sorted.sort(java.util.Comparator.comparingInt(Block::from));
        int samples = 0;
        for (Block b : sorted) {
            if (b.from() != samples) {
                throw new IllegalArgumentException("blocks must cover the samples without gap: expected one from "
                        + samples + ", got one from " + b.from());
            }
            samples += b.size();
        }
        List<String> names = new ArrayList<>(outputs.keySet());
        double[][] values = new double[names.size()][samples];
        String[] outside = new String[samples];
        String[] failure = new String[samples];
        for (Block b : sorted) {
            for (int i = 0; i < b.size(); i++) {
                int at = b.from() + i;
                outside[at] = b.outOfRange().get(i);
                failure[at] = b.failures().get(i);
                for (int k = 0; k < names.size(); k++) {
                    List<Double> col = b.values().get(names.get(k));
                    Double v = col == null ? null : col.get(i);
                    values[k][at] = v == null ? Double.NaN : v;
                }
            }
        }
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
