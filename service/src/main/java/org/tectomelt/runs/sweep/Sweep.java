package org.tectomelt.runs.sweep;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.math.BigDecimal;
import java.math.MathContext;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import java.util.function.Predicate;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.Json;
import org.tectomelt.contract.SpecContract;
import org.tectomelt.operations.Cap;
import org.tectomelt.operations.Input;
import org.tectomelt.operations.Operation;
import org.tectomelt.operations.OperationException;
import org.tectomelt.operations.Output;
import org.tectomelt.operations.Violation;
import org.tectomelt.runs.study.OperationModel;
import org.tectomelt.runs.study.StudyRequest;
import org.tectomelt.runs.study.StudyRun;

/**
 * A parameter sweep: one operation, its base request, the axes (a swept request field and its
 * values) and the outputs to keep. The points are the Cartesian product of the axes in the order
 * given, the last axis varying fastest; point {@code i} is the base request with each swept field
 * set to its value.
 *
 * @param operation the operation's name
 * @param request   the base request, as sent (swept fields are set per point)
 * @param sweep     the axes as sent (kept for display)
 * @param axes      each swept field with its values, in order
 * @param outputs   output names, in order
 * @param label     free text, or null
 * @param study     the study parts ({@code uncertainty}, {@code solve}, {@code observed}, the seed filled
 *                  in) when every sweep point carries a Monte Carlo study or an inversion, else null
 * @param blocks    stored points per sweep point: 1 without a study, else the study's blocks
 *                  ({@link StudyRun#blocks()})
 */
public record Sweep(String operation, ObjectNode request, ObjectNode sweep, Map<String, List<Double>> axes,
                    List<String> outputs, String label, ObjectNode study, int blocks) {

    /** Kind of run this describes. */
    public static final String KIND = "sweep";
    /** The path whose request schema in the spec ({@code RunRequest}) is the body of a run. */
    public static final String SPEC_PATH = "/v1/runs";
    /** The server cap on the points of a run, which also caps each axis. */
    private static final String CAP_VARIABLE = "TECTOMELT_MAX_RUN_POINTS";

    private static final MathContext TWELVE = new MathContext(12);

    /** Number of points. */
    public int size() {
        long n = 1;
        for (List<Double> v : axes.values()) {
            n *= v.size();
        }
        return (int) n;
    }

    /** Points the run stores: every sweep point times its study's blocks. */
    public int points() {
        return size() * blocks;
    }

    /** The swept values of point {@code index}, field → value, in axis order. */
    public Map<String, Double> inputs(int index) {
        Map<String, Double> out = new LinkedHashMap<>();
        List<String> fields = new ArrayList<>(axes.keySet());
        int rest = index;
        Double[] values = new Double[fields.size()];
        for (int a = fields.size() - 1; a >= 0; a--) {
            List<Double> v = axes.get(fields.get(a));
            values[a] = v.get(rest % v.size());
            rest /= v.size();
        }
        for (int a = 0; a < fields.size(); a++) {
            out.put(fields.get(a), values[a]);
        }
        return out;
    }

    /** The request of point {@code index}: a fresh copy of the base with the swept fields set. */
    public ObjectNode pointRequest(int index) {
        return pointRequest(request, index);
    }

    /** Point {@code index} on another base (the base with the spec's defaults filled in). */
    public ObjectNode pointRequest(ObjectNode base, int index) {
        ObjectNode r = base.deepCopy();
        inputs(index).forEach((field, value) -> OperationModel.set(r, field, value));
        return r;
    }

    /** The stored definition: request, sweep as sent, expanded axes and outputs (JSON). */
    public String definition() {
        ObjectNode d = Json.mapper().createObjectNode();
        d.put("operation", operation);
        d.set("request", request);
        d.set("sweep", sweep);
        ObjectNode ax = d.putObject("axes");
        axes.forEach((f, v) -> {
            ArrayNode a = ax.putArray(f);
            v.forEach(a::add);
        });
        ArrayNode o = d.putArray("outputs");
        outputs.forEach(o::add);
        if (study != null) {
            d.set("study", study);
            d.put("blocks", blocks);
        }
        return d.toString();
    }

    /** Reads a stored {@link #definition()}. */
    public static Sweep fromDefinition(String definition, String label) {
        JsonNode d;
        try {
            d = Json.mapper().readTree(definition);
        } catch (java.io.IOException e) {
            throw new IllegalArgumentException("the stored sweep is not readable JSON: " + e.getMessage());
        }
        Map<String, List<Double>> axes = new LinkedHashMap<>();
        for (Iterator<Map.Entry<String, JsonNode>> it = d.path("axes").fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> e = it.next();
            List<Double> v = new ArrayList<>();
            e.getValue().forEach(x -> v.add(x.doubleValue()));
            axes.put(e.getKey(), List.copyOf(v));
        }
        List<String> outputs = new ArrayList<>();
        d.path("outputs").forEach(x -> outputs.add(x.asText()));
        return new Sweep(d.path("operation").asText(), (ObjectNode) d.get("request"), (ObjectNode) d.get("sweep"),
                axes, List.copyOf(outputs), label, d.get("study") instanceof ObjectNode st ? st : null,
                d.path("blocks").asInt(1));
    }

    /**
     * Reads and checks the body of {@code POST /v1/runs}. The spec's {@code RunRequest} schema is
     * checked first, through the same contract the operations' routes use: the fields and their
     * types, the axes' shapes and {@code steps}, the label's length, the study's {@code samples},
     * {@code gridPoints}, {@code scanPoints} and {@code method}, with the spec's defaults filled in
     * (the longest axis is the server cap {@code maxPoints} instead of the spec's documented
     * default). Then what the spec cannot say: the operation and its sweepable fields and outputs,
     * {@code values} or {@code from}/{@code to}/{@code steps}, {@code from} below {@code to}, the
     * size against {@code maxPoints}, and every point against the operation's own request schema.
     * Every problem is reported at once, naming the field ({@code sweep.potentialTemperatureC},
     * {@code outputs[1]}) and, for a sweep leaving a field's range, the offending values; a part
     * whose shape the spec refused is not read further, and a field named by the spec is not named
     * again.
     *
     * @throws OperationException listing every violation
     */
    public static Sweep parse(JsonNode body, Invoker invoker, int maxPoints) {
        if (!(body instanceof ObjectNode b)) {
            throw new OperationException("(body)", "must be a JSON object with operation, request, sweep and outputs");
        }
        List<Violation> spec = invoker.spec().check(SPEC_PATH, b, axisCaps(b, maxPoints));
        if (spec.stream().anyMatch(x -> SpecContract.BEYOND_DOUBLE.equals(x.message()))) {
            throw new OperationException(spec); // the schema was not applied: nothing else can be read safely
        }
        // a part the spec refused (the field or anything under it) is not read further
        Predicate<String> refused = f -> spec.stream().anyMatch(x -> x.field().equals(f)
                || x.field().startsWith(f + ".") || x.field().startsWith(f + "["));
        List<Violation> v = new ArrayList<>(spec);
        Operation<?, ?> op = null;
        List<String> known = invoker.operations().list().stream().map(Operation::name).toList();
        if (!refused.test("operation")) {
            String name = b.get("operation").asText();
            op = invoker.operations().named(name).orElse(null);
            if (op == null) {
                v.add(new Violation("operation", "names no operation: '" + name + "'; known: " + known));
            } else if (op.outputs().isEmpty()) {
                v.add(new Violation("operation", op.name() + " has no scalar output a run could keep; operations with "
                        + "outputs: " + invoker.operations().list().stream().filter(o -> !o.outputs().isEmpty())
                        .map(Operation::name).toList()));
                op = null;
            }
        } else if (b.get("operation") == null) {
            v.removeIf(x -> x.field().equals("operation"));
            v.add(new Violation("operation", "is required: the name of an operation, one of " + known));
        }
        ObjectNode request = b.get("request") instanceof ObjectNode o ? o : Json.mapper().createObjectNode();
        String label = b.hasNonNull("label") && !refused.test("label") ? b.get("label").asText() : null;
        boolean withStudy = StudyRequest.FIELDS.stream().anyMatch(b::hasNonNull);
        StudyRequest study = null;
        if (withStudy) {
            try {
                study = StudyRequest.parse(b, op, invoker); // without a known operation: the shapes only
            } catch (OperationException e) {
                boolean opKnown = op != null;
                e.violations().stream().filter(x -> opKnown || !x.field().equals("operation")).forEach(v::add);
            }
        }
        JsonNode sweepNode = b.get("sweep");
        Map<String, List<Double>> axes = new LinkedHashMap<>();
        if (withStudy && sweepNode == null) {
            sweepNode = Json.mapper().createObjectNode(); // one study at the request itself
        } else if (sweepNode == null) {
            v.add(new Violation("sweep", "is required: an object of at least one swept field, each "
                    + "{\"values\": [...]} or {\"from\": a, \"to\": b, \"steps\": n}"));
            sweepNode = Json.mapper().createObjectNode();
        } else if (!(sweepNode instanceof ObjectNode) || spec.stream().anyMatch(x -> x.field().equals("sweep"))) {
            sweepNode = Json.mapper().createObjectNode();
        } else if (op != null) {
            Set<String> sweepable = new LinkedHashSet<>();
            op.inputs().stream().map(Input::name).forEach(sweepable::add);
            for (Iterator<Map.Entry<String, JsonNode>> it = sweepNode.fields(); it.hasNext(); ) {
                Map.Entry<String, JsonNode> e = it.next();
                String field = "sweep." + e.getKey();
                if (!sweepable.contains(e.getKey())) {
                    boolean exists = invoker.spec().range(op.path(), e.getKey()).isPresent();
                    v.add(new Violation(field, (exists ? "is a field of " + op.name() + " that a sweep cannot address"
                            : "is not a field of " + op.name()) + "; sweepable fields: " + sweepable));
                    continue;
                }
                if (refused.test(field)) {
                    continue; // the spec refused this axis's shape
                }
                List<Double> values = axis(field, (ObjectNode) e.getValue(), v);
                if (values != null) {
                    axes.put(e.getKey(), values);
                }
            }
        }
        if (withStudy) {
            String solved = b.path("solve").path("field").asText("");
            for (String f : axes.keySet()) {
                if (f.equals(solved) || b.path("uncertainty").path("inputs").has(f)) {
                    v.add(new Violation("sweep." + f, "is " + (f.equals(solved) ? "the solved field" : "an uncertain "
                            + "input") + " of the study: it cannot be swept too"));
                }
            }
        }
        List<String> outputs = new ArrayList<>();
        if (!refused.test("outputs")) {
            outputs(op, b.get("outputs"), outputs, v);
        }
        if (!v.isEmpty()) {
            Map<String, Violation> first = new LinkedHashMap<>(); // the spec's word on a field comes first
            v.forEach(x -> first.putIfAbsent(x.field(), x));
            throw new OperationException(List.copyOf(first.values()));
        }
        int blocks = study == null ? 1 : new StudyRun(invoker, op, study, outputs).blocks();
        long total = blocks;
        for (List<Double> values : axes.values()) {
            total *= values.size();
            if (total > maxPoints) {
                break;
            }
        }
        if (total > maxPoints) {
            StringBuilder sizes = new StringBuilder();
            axes.forEach((f, vals) -> sizes.append(sizes.length() == 0 ? "" : " × ").append(vals.size()));
            if (blocks > 1) {
                sizes.append(sizes.length() == 0 ? "" : " × ").append(blocks).append(" study blocks");
            }
            throw new OperationException(axes.isEmpty() ? "uncertainty.samples" : "sweep", "has " + sizes
                    + " points, more than the " + maxPoints + " a run may have (server cap TECTOMELT_MAX_RUN_POINTS; a "
                    + "study stores one point per " + StudyRun.BLOCK_SAMPLES + " samples or per grid point)");
        }
        Sweep s = new Sweep(op.name(), request, (ObjectNode) sweepNode, axes, List.copyOf(outputs), label,
                study == null ? null : study.definition(), blocks);
        s.checkEveryPoint(invoker, op, study == null ? Map.of() : study.representative());
        return s;
    }

    /**
     * Holds every point to the spec; a violation of a swept field lists its offending values.
     *
     * <p>When the operation's request schema has no rule tying fields together ({@code oneOf},
     * {@code anyOf}, {@code allOf} of several, {@code not}, {@code if}, {@code dependencies}…), a
     * point conforms exactly when each of its values does with the rest of the request as it is,
     * so each axis value is checked once, with the other axes at their first value (the sum of the
     * axis lengths instead of their product); otherwise every point is checked.
     */
    private void checkEveryPoint(Invoker invoker, Operation<?, ?> op, Map<String, Double> studied) {
        Map<String, String> firstMessage = new LinkedHashMap<>();
        Map<String, TreeSet<Double>> offending = new LinkedHashMap<>();
        List<Integer> probes = new ArrayList<>();
        if (fieldsIndependent(invoker.spec(), op.path())) {
            List<String> fields = new ArrayList<>(axes.keySet());
            int stride = 1;
            for (int a = fields.size() - 1; a >= 0; a--) {
                int len = axes.get(fields.get(a)).size();
                for (int k = 0; k < len; k++) {
                    probes.add(k * stride);
                }
                stride *= len;
            }
        } else {
            for (int i = 0; i < size(); i++) {
                probes.add(i);
            }
        }
        if (probes.isEmpty()) {
            probes.add(0); // no axes (a study at the request itself): the request is the one point
        }
        for (int i : probes) {
            ObjectNode point = pointRequest(i);
            studied.forEach((f, x) -> OperationModel.set(point, f, x)); // a study sets these per sample
            List<Violation> vs = invoker.spec().check(op.path(), point, op.caps());
            if (vs.isEmpty()) {
                continue;
            }
            Map<String, Double> in = inputs(i);
            for (Violation x : vs) {
                boolean swept = in.containsKey(x.field());
                String field = (swept ? "sweep." : "request.") + x.field();
                firstMessage.putIfAbsent(field, x.message());
                if (swept) {
                    offending.computeIfAbsent(field, k -> new TreeSet<>()).add(in.get(x.field()));
                }
            }
            if (firstMessage.size() > 20) {
                break;
            }
        }
        if (firstMessage.isEmpty()) {
            return;
        }
        List<Violation> out = new ArrayList<>();
        firstMessage.forEach((field, message) -> {
            TreeSet<Double> bad = offending.get(field);
            if (bad == null) {
                out.add(new Violation(field, message));
            } else {
                List<String> shown = bad.stream().limit(10).map(Sweep::format).toList();
                String more = bad.size() > 10 ? " and " + (bad.size() - 10) + " more" : "";
                String rule = message.replaceAll(",? got [^,;]*$", "");
                out.add(new Violation(field, rule + "; offending values: " + String.join(", ", shown) + more));
            }
        });
        throw new OperationException(out);
    }

    private static final Set<String> CROSS_FIELD = Set.of("oneOf", "anyOf", "not", "if", "then", "else",
            "dependencies", "dependentRequired", "dependentSchemas", "patternProperties");

    /** True when no rule of the request schema of {@code POST path} ties one field to another. */
    static boolean fieldsIndependent(SpecContract spec, String path) {
        JsonNode doc = spec.document();
        JsonNode root = doc.at("/paths/" + path.replace("~", "~0").replace("/", "~1")
                + "/post/requestBody/content/application~1json/schema");
        return !root.isMissingNode() && independent(doc, root, new java.util.HashSet<>());
    }

    private static boolean independent(JsonNode doc, JsonNode s, Set<String> seen) {
        if (s == null || !s.isContainerNode()) {
            return true;
        }
        if (s.has("$ref")) {
            String ref = s.get("$ref").asText();
            if (!ref.startsWith("#")) {
                return false;
            }
            if (!seen.add(ref)) {
                return true;
            }
            return independent(doc, doc.at(ref.substring(1)), seen);
        }
        if (s.isObject()) {
            for (String k : CROSS_FIELD) {
                if (s.has(k)) {
                    return false;
                }
            }
            if (s.has("allOf") && s.get("allOf").size() > 1) {
                return false;
            }
        }
        for (JsonNode child : s) {
            if (!independent(doc, child, seen)) {
                return false;
            }
        }
        return true;
    }

    /** Each axis's {@code values} and {@code steps} are held to the run's cap instead of the spec's default. */
    private static List<Cap> axisCaps(ObjectNode body, int maxPoints) {
        List<Cap> caps = new ArrayList<>();
        if (body.get("sweep") instanceof ObjectNode sweep) {
            sweep.fieldNames().forEachRemaining(f -> {
                caps.add(new Cap("sweep." + f + ".values", maxPoints, CAP_VARIABLE));
                caps.add(new Cap("sweep." + f + ".steps", maxPoints, CAP_VARIABLE));
            });
        }
        return caps;
    }

    /** The values of an axis the spec's {@code SweepAxis} accepted: its list, or {@code steps} from {@code from} to {@code to}. */
    private static List<Double> axis(String field, ObjectNode o, List<Violation> v) {
        if (o.has("values")) {
            if (o.has("from") || o.has("to") || o.has("steps")) {
                v.add(new Violation(field, "give either values or from, to and steps, not both"));
                return null;
            }
            List<Double> out = new ArrayList<>();
            o.get("values").forEach(x -> out.add(x.doubleValue()));
            return List.copyOf(out);
        }
        if (!(o.has("from") && o.has("to") && o.has("steps"))) {
            v.add(new Violation(field, "needs from, to and steps (or a list of values)"));
            return null;
        }
        double a0 = o.get("from").doubleValue();
        double a1 = o.get("to").doubleValue();
        if (!(a0 < a1)) {
            v.add(new Violation(field, "from must be below to (got from " + format(a0) + ", to " + format(a1)
                    + "); for a descending or uneven axis list the values"));
            return null;
        }
        int n = o.get("steps").asInt();
        List<Double> out = new ArrayList<>(n);
        for (int k = 0; k < n; k++) {
            double x = k == n - 1 ? a1 : a0 + (a1 - a0) * k / (n - 1);
            out.add(new BigDecimal(x).round(TWELVE).doubleValue());
        }
        return List.copyOf(out);
    }

    /** Checks the output names the spec accepted as a list of strings ({@code op} null: the operation is unknown). */
    private static void outputs(Operation<?, ?> op, JsonNode node, List<String> out, List<Violation> v) {
        List<String> names = op == null ? List.of() : op.outputs().stream().map(Output::name).toList();
        if (node == null) {
            out.addAll(names);
            return;
        }
        if (op == null) {
            return;
        }
        for (int i = 0; i < node.size(); i++) {
            String x = node.get(i).asText();
            if (!names.contains(x)) {
                v.add(new Violation("outputs[" + i + "]", "names no output of " + op.name() + ": \"" + x
                        + "\"; outputs: " + names));
            } else if (out.contains(x)) {
                v.add(new Violation("outputs[" + i + "]", "repeats \"" + x + "\""));
            } else {
                out.add(x);
            }
        }
    }

    /** A value as a person writes it: 1250 rather than 1250.0. */
    static String format(double x) {
        return x == Math.rint(x) && Math.abs(x) < 1e15 ? Long.toString((long) x) : Double.toString(x);
    }
}
