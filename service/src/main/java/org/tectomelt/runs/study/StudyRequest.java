package org.tectomelt.runs.study;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.concurrent.ThreadLocalRandom;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.SpecContract;
import org.tectomelt.operations.Input;
import org.tectomelt.operations.Operation;
import org.tectomelt.operations.OperationException;
import org.tectomelt.operations.Output;
import org.tectomelt.operations.Violation;
import org.tectomelt.runs.sweep.Sweep;
import org.tectomelt.studies.Distribution;
import org.tectomelt.studies.FieldRange;
import org.tectomelt.studies.InputProblem;
import org.tectomelt.studies.Observation;
import org.tectomelt.studies.StudyException;
import org.tectomelt.studies.UncertainInputs;

/**
 * The study parts of a run, read and checked: {@code uncertainty} (forward Monte Carlo, or the
 * nuisance inputs of an inversion), {@code solve} and {@code observed} (an inversion).
 *
 * <pre>
 *   "uncertainty": {"samples": 10000, "seed": 42,
 *                   "inputs": {"potentialTemperatureC": {"normal": {"mean": 1350, "sd": 25}},
 *                              "bulkWaterWtPct": {"uniform": {"min": 0, "max": 0.02}}}}
 *   "solve":    {"field": "potentialTemperatureC", "min": 1200, "max": 1600, "method": "posterior"}
 *   "observed": {"crustalThicknessKm": {"value": 7.1, "sd": 0.8}}
 * </pre>
 * Which inputs may take a distribution and be solved for is what the operation lists as
 * sampleable; their ranges are the spec's (one source of truth). Every problem is reported at
 * once, naming the field ({@code uncertainty.inputs.potentialTemperatureC},
 * {@code solve.min}, {@code observed.crustalThicknessKm.sd}).
 *
 * @param uncertainty the forward study or the nuisance inputs (samples and seed of an inversion
 *                    without uncertain inputs), or null without a study
 * @param solve       the inversion, or null
 * @param observed    observations by output name (empty without {@code solve})
 * @param definition  the parts as given, with the seed filled in when drawn: what a run stores
 */
public record StudyRequest(Uncertainty uncertainty, Solve solve, Map<String, Observation> observed,
                           ObjectNode definition) {

    /** The run body's fields that carry a study. */
    public static final List<String> FIELDS = List.of("uncertainty", "solve", "observed");

    /**
     * Most model evaluations of a posterior (grid points × nuisance samples) per sweep point: a rule
     * across two fields, which the spec states in words.
     */
    public static final long MAX_POSTERIOR_EVALUATIONS = 2_000_000;

    private static final Map<String, List<String>> FAMILIES = Map.of(
            "normal", List.of("mean", "sd"),
            "truncatedNormal", List.of("mean", "sd", "min", "max"),
            "lognormal", List.of("mu", "sigma"),
            "uniform", List.of("min", "max"),
            "triangular", List.of("min", "mode", "max"));

    /**
     * The uncertain inputs.
     *
     * @param samples Monte Carlo samples
     * @param seed    the seed (drawn at random and reported when the request gave none)
     * @param inputs  the checked distributions
     */
    public record Uncertainty(int samples, long seed, UncertainInputs inputs) {
    }

    /**
     * The inversion.
     *
     * @param field      the solved input
     * @param unit       its unit
     * @param range      its range in the spec
     * @param min        lower end searched
     * @param max        upper end searched
     * @param method     {@code posterior} or {@code sampling}
     * @param gridPoints grid points of a posterior
     * @param scanPoints scan points per draw of a sampling inversion
     */
    public record Solve(String field, String unit, FieldRange range, double min, double max, String method,
                        int gridPoints, int scanPoints) {
    }

    /** True when the run carries a study. */
    public boolean present() {
        return uncertainty != null || solve != null;
    }

    /** Monte Carlo samples: of the forward study, the nuisance draws of a posterior, the draws of sampling. */
    public int samples() {
        return uncertainty.samples();
    }

    /** The seed (stored with the run and reported). */
    public long seed() {
        return uncertainty.seed();
    }

    /** The uncertain inputs (none when only an inversion is asked). */
    public UncertainInputs inputs() {
        return uncertainty.inputs();
    }

    /**
     * Representative values of the varied fields (each distribution's mean, the middle of the solved
     * interval), for checking the base request once before a run starts.
     */
    public Map<String, Double> representative() {
        Map<String, Double> m = new LinkedHashMap<>();
        inputs().distributions().forEach((f, d) -> m.put(f, d.mean()));
        if (solve != null) {
            m.put(solve.field(), 0.5 * (solve.min() + solve.max()));
        }
        return m;
    }

    /**
     * Reads the study parts of a run body; an absent part is null. The parts are those the spec's
     * {@code RunRequest} schema accepted (their fields, types, ranges and the method's name are
     * its rules); the spec's defaults ({@code samples}, {@code method}, {@code gridPoints},
     * {@code scanPoints}) are filled into a copy, also for a run stored by an earlier build. What
     * the spec cannot say is checked here: which inputs take a distribution or may be solved, the
     * distributions, the solved interval inside the field's range, the observations, and the
     * posterior's evaluations. With {@code op} null (the run names no known operation) only the
     * shapes are checked, so that every wrong field is still named, and the violations are thrown.
     */
    public static StudyRequest parse(ObjectNode body, Operation<?, ?> op, Invoker invoker) {
        List<Violation> v = new ArrayList<>();
        Map<String, Input> sampleable = new LinkedHashMap<>();
        Map<String, FieldRange> ranges = new TreeMap<>();
        if (op != null) {
            op.inputs().stream().filter(Input::sampleable).forEach(i -> sampleable.put(i.name(), i));
            sampleable.keySet().forEach(f -> ranges.put(f, range(invoker.spec(), op, f)));
        }
        boolean known = op != null;
        ObjectNode parts = body.objectNode();
        for (String f : FIELDS) {
            if (body.hasNonNull(f)) {
                parts.set(f, body.get(f).deepCopy());
            }
        }
        if (parts.has("solve") && !parts.has("uncertainty")) {
            parts.putObject("uncertainty"); // an inversion without uncertain inputs: its draws still need samples and a seed
        }
        invoker.spec().fillDefaults(Sweep.SPEC_PATH, parts);

        // a part of the wrong JSON type, or a member missing or of the wrong type, the spec has named
        Uncertainty uncertainty = null;
        if (parts.get("uncertainty") instanceof ObjectNode u) {
            uncertainty = uncertainty(u, known ? sampleable : null, ranges, v, parts.has("solve"));
        }
        Solve solve = null;
        if (parts.get("solve") instanceof ObjectNode so) {
            solve = solve(so, known ? sampleable : null, ranges, v);
        }
        Map<String, Observation> observed = new LinkedHashMap<>();
        if (parts.has("observed")) {
            observed(parts.get("observed"), op, observed, v);
            if (!parts.has("solve")) {
                v.add(new Violation("observed", "goes with solve: name the field to solve for"));
            }
        } else if (parts.has("solve")) {
            v.add(new Violation("observed", "is required with solve: {\"<output>\": {\"value\": ..., \"sd\": ...}}"));
        }
        if (solve != null && "sampling".equals(solve.method()) && observed.size() > 1) {
            v.add(new Violation("observed", "the sampling method solves for one observed output; give one, or use "
                    + "method posterior for several"));
        }
        if (solve != null && uncertainty != null) {
            if (uncertainty.inputs().fields().contains(solve.field())) {
                v.add(new Violation("uncertainty.inputs." + solve.field(), "is the solved field: its prior is uniform on "
                        + "[solve.min, solve.max]; give it no distribution"));
            }
            if ("posterior".equals(solve.method())
                    && (long) solve.gridPoints() * uncertainty.samples() > MAX_POSTERIOR_EVALUATIONS) {
                v.add(new Violation("uncertainty.samples", String.format("%d grid points × %d nuisance samples is more "
                        + "than the %d evaluations a posterior may take", solve.gridPoints(), uncertainty.samples(),
                        MAX_POSTERIOR_EVALUATIONS)));
            }
        }
        if (!v.isEmpty()) {
            throw new OperationException(v);
        }
        if (!known) {
            throw new OperationException("operation", "is required to read a study: the name of an operation");
        }
        if (uncertainty != null) {
            ((ObjectNode) parts.get("uncertainty")).put("seed", uncertainty.seed());
        }
        return new StudyRequest(uncertainty, solve, observed, parts);
    }

    /** The spec's range of a request field. */
    static FieldRange range(SpecContract spec, Operation<?, ?> op, String field) {
        return spec.range(op.path(), field).map(r -> new FieldRange(r.minimum(), false, r.maximum(), false))
                .orElse(FieldRange.unbounded());
    }

    private static Uncertainty uncertainty(ObjectNode obj, Map<String, Input> sampleable, Map<String, FieldRange> ranges,
                                           List<Violation> v, boolean withSolve) {
        int samples = obj.path("samples").asInt();
        long seed;
        JsonNode seedNode = obj.get("seed");
        if (seedNode == null || seedNode.isNull()) {
            seed = ThreadLocalRandom.current().nextLong(0, 1L << 53); // exact in JSON numbers; reported
        } else if (!seedNode.canConvertToLong()) {
            v.add(new Violation("uncertainty.seed", "must be a 64-bit integer, got " + seedNode));
            seed = 0;
        } else {
            seed = seedNode.asLong();
        }
        Map<String, Distribution> dists = new LinkedHashMap<>();
        JsonNode inputs = obj.get("inputs");
        if (inputs == null && withSolve) {
            inputs = obj.objectNode();
        }
        if (!(inputs instanceof ObjectNode in) || (inputs.isEmpty() && !withSolve)) {
            v.add(new Violation("uncertainty.inputs", "must name at least one input with its distribution, e.g. "
                    + "{\"potentialTemperatureC\": {\"normal\": {\"mean\": 1350, \"sd\": 25}}}"
                    + (sampleable == null ? "" : "; inputs that can take one: " + sampleable.keySet())));
            return null;
        }
        for (Iterator<Map.Entry<String, JsonNode>> it = in.fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> e = it.next();
            String path = "uncertainty.inputs." + e.getKey();
            if (sampleable == null) {
                distribution(e.getValue(), path, v); // the operation is unknown: shapes only
                continue;
            }
            if (!sampleable.containsKey(e.getKey())) {
                v.add(new Violation(path, "is not an input that can take a distribution; these can: "
                        + sampleable.keySet()));
                continue;
            }
            Distribution d = distribution(e.getValue(), path, v);
            if (d != null) {
                dists.put(e.getKey(), d);
            }
        }
        if (sampleable == null) {
            return null;
        }
        try {
            return new Uncertainty(samples, seed, UncertainInputs.of(dists, ranges, "uncertainty.inputs."));
        } catch (StudyException ex) {
            add(ex.problems(), v);
            return null;
        }
    }

    private static Distribution distribution(JsonNode node, String path, List<Violation> v) {
        if (!(node instanceof ObjectNode o) || o.size() != 1) {
            v.add(new Violation(path, "must be one distribution: {\"normal\": {mean, sd}}, {\"truncatedNormal\": "
                    + "{mean, sd, min, max}}, {\"lognormal\": {mu, sigma}}, {\"uniform\": {min, max}} or "
                    + "{\"triangular\": {min, mode, max}}"));
            return null;
        }
        String family = o.fieldNames().next();
        List<String> params = FAMILIES.get(family);
        if (params == null) {
            v.add(new Violation(path + "." + family, "is not a distribution; families: " + new TreeMap<>(FAMILIES)
                    .keySet()));
            return null;
        }
        JsonNode p = o.get(family);
        if (!(p instanceof ObjectNode po)) {
            v.add(new Violation(path + "." + family, "must be an object " + params));
            return null;
        }
        unknown(po, path + "." + family, Set.copyOf(params), v);
        double[] x = new double[params.size()];
        boolean ok = true;
        for (int i = 0; i < params.size(); i++) {
            JsonNode n = po.get(params.get(i));
            if (n == null || !n.isNumber() || !Double.isFinite(n.doubleValue())) {
                v.add(new Violation(path + "." + family + "." + params.get(i), "is required: a finite number"));
                ok = false;
            } else {
                x[i] = n.doubleValue();
            }
        }
        if (!ok) {
            return null;
        }
        return switch (family) {
            case "normal" -> new Distribution.Normal(x[0], x[1]);
            case "truncatedNormal" -> new Distribution.TruncatedNormal(x[0], x[1], x[2], x[3]);
            case "lognormal" -> new Distribution.LogNormal(x[0], x[1]);
            case "uniform" -> new Distribution.Uniform(x[0], x[1]);
            default -> new Distribution.Triangular(x[0], x[1], x[2]);
        };
    }

    private static Solve solve(ObjectNode o, Map<String, Input> sampleable, Map<String, FieldRange> ranges,
                               List<Violation> v) {
        String field = o.path("field").isTextual() ? o.get("field").asText() : null;
        if (field != null && sampleable != null && !sampleable.containsKey(field)) {
            v.add(new Violation("solve.field", "must name an input to solve for, one of " + sampleable.keySet()));
            field = null;
        }
        double min = o.path("min").doubleValue();
        double max = o.path("max").doubleValue();
        String method = o.path("method").asText();
        int grid = o.path("gridPoints").asInt();
        int scan = o.path("scanPoints").asInt();
        if (field == null || !o.path("min").isNumber() || !o.path("max").isNumber() || sampleable == null) {
            return null;
        }
        FieldRange range = ranges.get(field);
        List<InputProblem> problems = new ArrayList<>();
        if (!range.contains(min)) {
            problems.add(new InputProblem("solve.min", min + " must lie in " + field + "'s range " + range.describe()));
        }
        if (!range.contains(max)) {
            problems.add(new InputProblem("solve.max", max + " must lie in " + field + "'s range " + range.describe()));
        }
        if (problems.isEmpty() && !(max > min)) {
            problems.add(new InputProblem("solve.max", "must be above solve.min"));
        }
        add(problems, v);
        return problems.isEmpty() ? new Solve(field, sampleable.get(field).unit(), range, min, max, method, grid, scan)
                : null;
    }

    private static void observed(JsonNode o, Operation<?, ?> op, Map<String, Observation> out, List<Violation> v) {
        List<String> names = op == null ? null : op.outputs().stream().map(Output::name).toList();
        if (!(o instanceof ObjectNode obj) || o.isEmpty()) {
            v.add(new Violation("observed", "must name at least one output with its {value, sd}"
                    + (names == null ? "" : "; outputs: " + names)));
            return;
        }
        for (Iterator<Map.Entry<String, JsonNode>> it = obj.fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> e = it.next();
            String path = "observed." + e.getKey();
            if (names != null && !names.contains(e.getKey())) {
                v.add(new Violation(path, "is not an output of " + op.name() + "; outputs: " + names));
                continue;
            }
            if (!(e.getValue() instanceof ObjectNode ob)) {
                v.add(new Violation(path, "must be {\"value\": ..., \"sd\": ...}"));
                continue;
            }
            unknown(ob, path, Set.of("value", "sd"), v);
            Double value = number(ob.get("value"), path + ".value", v);
            Double sd = number(ob.get("sd"), path + ".sd", v);
            if (value != null && sd != null) {
                Observation obs = new Observation(value, sd);
                List<InputProblem> p = obs.problems(path);
                add(p, v);
                if (p.isEmpty()) {
                    out.put(e.getKey(), obs);
                }
            }
        }
    }

    private static void unknown(ObjectNode o, String path, Set<String> allowed, List<Violation> v) {
        for (Iterator<String> it = o.fieldNames(); it.hasNext(); ) {
            String k = it.next();
            if (!allowed.contains(k)) {
                v.add(new Violation(path + "." + k, "is not a field here; fields: "
                        + String.join(", ", new java.util.TreeSet<>(allowed))));
            }
        }
    }

    private static Double number(JsonNode n, String path, List<Violation> v) {
        if (n == null || n.isNull()) {
            v.add(new Violation(path, "is required: a finite number"));
            return null;
        }
        if (!n.isNumber() || !Double.isFinite(n.doubleValue())) {
            v.add(new Violation(path, "must be a finite number"));
            return null;
        }
        return n.doubleValue();
    }

    private static void add(List<InputProblem> problems, List<Violation> v) {
        problems.forEach(p -> v.add(new Violation(p.field(), p.message())));
    }
}
