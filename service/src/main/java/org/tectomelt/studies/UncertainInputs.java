package org.tectomelt.studies;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.apache.commons.rng.UniformRandomProvider;

/**
 * The uncertain inputs of a study, each with its distribution and its field's range, checked
 * against each other once ({@link #of}).
 *
 * <p>A sample's values are drawn in the order of the field names (sorted), from the generator of
 * that sample ({@link SampleRandom}), so they depend only on (seed, sample index) and not on the
 * order in which a request listed the fields.
 */
public final class UncertainInputs {

    private static final UncertainInputs NONE = new UncertainInputs(new TreeMap<>(), new TreeMap<>());

    private final String[] fields;
    private final Distribution[] distributions;
    private final FieldRange[] ranges;

    private UncertainInputs(TreeMap<String, Distribution> byField, TreeMap<String, FieldRange> rangeByField) {
        this.fields = byField.keySet().toArray(new String[0]);
        this.distributions = byField.values().toArray(new Distribution[0]);
        this.ranges = new FieldRange[fields.length];
        for (int i = 0; i < fields.length; i++) {
            ranges[i] = rangeByField.get(fields[i]);
        }
    }

    /** No uncertain input. */
    public static UncertainInputs none() {
        return NONE;
    }

    /**
     * Checks the distributions against the fields' ranges.
     *
     * @param distributions distribution by field name
     * @param ranges        range by field name of every field that may take a distribution
     * @param pathPrefix    prefix naming the fields in problems, e.g. {@code uncertainty.inputs.}
     * @throws StudyException naming every field that is not sampleable or whose distribution leaves its range
     */
    public static UncertainInputs of(Map<String, Distribution> distributions, Map<String, FieldRange> ranges,
                                     String pathPrefix) {
        List<InputProblem> problems = new ArrayList<>();
        TreeMap<String, Distribution> byField = new TreeMap<>();
        TreeMap<String, FieldRange> rangeByField = new TreeMap<>();
        distributions.forEach((field, d) -> {
            String path = pathPrefix + field;
            FieldRange range = ranges.get(field);
            if (d == null) {
                problems.add(new InputProblem(path, "needs a distribution"));
            } else if (range == null) {
                problems.add(new InputProblem(path, "is not an input that can take a distribution; these can: "
                        + String.join(", ", new TreeMap<>(ranges).keySet())));
            } else {
                problems.addAll(d.problems(path, range));
                byField.put(field, d);
                rangeByField.put(field, range);
            }
        });
        StudyException.throwIfAny(problems);
        return new UncertainInputs(byField, rangeByField);
    }

    /** True when there is no uncertain input. */
    public boolean isEmpty() {
        return fields.length == 0;
    }

    /** The fields, sorted. */
    public List<String> fields() {
        return List.of(fields);
    }

    /** The distribution of each field, in field order. */
    public Map<String, Distribution> distributions() {
        Map<String, Distribution> m = new LinkedHashMap<>();
        for (int i = 0; i < fields.length; i++) {
            m.put(fields[i], distributions[i]);
        }
        return Collections.unmodifiableMap(m);
    }

    /** A copy without {@code field} (the solved field of an inversion, which is not drawn). */
    public UncertainInputs without(String field) {
        TreeMap<String, Distribution> d = new TreeMap<>();
        TreeMap<String, FieldRange> r = new TreeMap<>();
        for (int i = 0; i < fields.length; i++) {
            if (!fields[i].equals(field)) {
                d.put(fields[i], distributions[i]);
                r.put(fields[i], ranges[i]);
            }
        }
        return new UncertainInputs(d, r);
    }

    /**
     * One sample's draws.
     *
     * @param values     value by field
     * @param outOfRange the first field whose draw left its range, or {@code null}
     */
    public record Draw(Map<String, Double> values, String outOfRange) {
    }

    /** The draws of sample {@code index} of a study seeded with {@code seed}. */
    public Draw draw(long seed, long index) {
        UniformRandomProvider rng = SampleRandom.forSample(seed, index, SampleRandom.INPUTS);
        Map<String, Double> values = new LinkedHashMap<>();
        String outside = null;
        for (int i = 0; i < fields.length; i++) {
            double x = distributions[i].sample(rng);
            values.put(fields[i], x);
            if (outside == null && !ranges[i].contains(x)) {
                outside = fields[i];
            }
        }
        return new Draw(values, outside);
    }
}
