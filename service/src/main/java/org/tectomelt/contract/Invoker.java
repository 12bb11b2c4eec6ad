package org.tectomelt.contract;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.lang.reflect.RecordComponent;
import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.operations.Cost;
import org.tectomelt.operations.Operation;
import org.tectomelt.operations.OperationException;
import org.tectomelt.operations.Operations;
import org.tectomelt.operations.Output;
import org.tectomelt.operations.Rules;
import org.tectomelt.operations.Violation;

/**
 * The one path every generic caller takes to run an operation: JSON tree → check against the
 * spec (defaults filled) → bind to the request record → {@code run(request, deadline)} → result.
 * The HTTP skin, the runs executor and the studies all call it; none needs HTTP per point.
 *
 * <pre>{@code
 * Invoker invoker = Invoker.standard();                // packaged spec, default caps
 * ObjectNode body = (ObjectNode) Json.mapper().readTree("{\"potentialTemperatureC\": 1350,"
 *         + " \"fullSpreadingRateMmPerYr\": 40}");
 * Record r = invoker.run("mid-ocean-ridge", body, Deadline.none());
 * Map<String, Double> out = invoker.outputs("mid-ocean-ridge", r, List.of("crustalThicknessKm"));
 * }</pre>
 *
 * Failures: {@link OperationException} (the spec's rules or the operation's, every violation at
 * once; 400 over HTTP), {@link MalformedBodyException}, and the engine's {@code EngineException}
 * and {@code BudgetExceededException}. Thread-safe.
 */
public final class Invoker {

    private static volatile Invoker standard;

    private final SpecContract spec;
    private final Operations operations;

    /** An invoker over a spec and a catalogue. */
    public Invoker(SpecContract spec, Operations operations) {
        this.spec = spec;
        this.operations = operations;
    }

    /** The packaged spec with the embedded default caps. */
    public static Invoker standard() {
        Invoker i = standard;
        if (i == null) {
            i = new Invoker(SpecContract.standard(), Operations.of(org.tectomelt.Config.defaults()));
            standard = i;
        }
        return i;
    }

    /** The packaged spec with the caps of {@code config}. */
    public static Invoker of(org.tectomelt.Config config) {
        return new Invoker(SpecContract.standard(), Operations.of(config));
    }

    /** The spec this invoker enforces. */
    public SpecContract spec() {
        return spec;
    }

    /** The catalogue it runs. */
    public Operations operations() {
        return operations;
    }

    /** A checked, bound request ready to run. */
    public record Prepared<Q extends Record, R extends Record>(Operation<Q, R> operation, Q request) {

        /** The request's cost class. */
        public Cost cost() {
            return operation.cost(request);
        }

        /** Runs it. */
        public R run(Deadline deadline) {
            return operation.run(request, deadline);
        }
    }

    /**
     * Checks {@code body} against the spec (in place: nulls removed, defaults filled) and binds it.
     *
     * @throws OperationException  when the body breaks the spec's rules (every violation listed)
     * @throws MalformedBodyException when the body is not a JSON object
     */
    public <Q extends Record, R extends Record> Prepared<Q, R> prepare(Operation<Q, R> op, JsonNode body) {
        if (!(body instanceof ObjectNode obj)) {
            throw new MalformedBodyException("The request body must be a JSON object");
        }
        List<Violation> violations = spec.check(op.path(), obj, op.caps());
        if (!violations.isEmpty()) {
            throw new OperationException(withOperationRules(op, obj, violations));
        }
        return new Prepared<>(op, Json.bind(obj, op.requestType()));
    }

    /** The spec's violations plus those of the operation's own rules, where the body still binds. */
    private static <Q extends Record, R extends Record> List<Violation> withOperationRules(
            Operation<Q, R> op, ObjectNode body, List<Violation> violations) {
        Rules rules = new Rules();
        try {
            op.check(Json.bind(body, op.requestType()), rules);
        } catch (RuntimeException e) {
            return violations;   // the body does not bind, or a rule needs a value the spec refused
        }
        if (rules.ok()) {
            return violations;
        }
        List<Violation> all = new java.util.ArrayList<>(violations);
        for (Violation v : rules.violations()) {
            if (!all.contains(v)) {
                all.add(v);
            }
        }
        return all;
    }

    /**
     * Parses a request body and prepares it. A body the tree parser refuses (too deep, say) is read
     * once more straight into the request record, whose first wrong member is then named.
     */
    public <Q extends Record, R extends Record> Prepared<Q, R> prepare(Operation<Q, R> op, byte[] body) {
        JsonNode tree;
        try {
            tree = Json.readTree(body);
        } catch (MalformedBodyException e) {
            Json.read(body, op.requestType());   // throws the field-naming failure when there is one
            throw e;
        }
        return prepare(op, tree);
    }

    /** {@link #prepare} then run. */
    public <Q extends Record, R extends Record> R run(Operation<Q, R> op, JsonNode body, Deadline deadline) {
        return prepare(op, body).run(deadline);
    }

    /** Runs the operation called {@code name}. */
    public Record run(String name, JsonNode body, Deadline deadline) {
        return run(operation(name), body, deadline);
    }

    /** The operation called {@code name}. */
    public Operation<?, ?> operation(String name) {
        return operations.named(name).orElseThrow(() -> new IllegalArgumentException("no operation " + name
                + "; known: " + operations.list().stream().map(Operation::name).toList()));
    }

    /**
     * The named scalar outputs of a result (null where the quantity is absent); an unknown name is
     * an {@link IllegalArgumentException} listing the known ones.
     */
    public Map<String, Double> outputs(String name, Record result, Collection<String> names) {
        return outputsOf(operation(name), result, names);
    }

    /** Reads a result record's {@code models} component; null for a record without one. */
    private static final ClassValue<RecordComponent> MODELS = new ClassValue<>() {
        @Override
        protected RecordComponent computeValue(Class<?> type) {
            if (type.isRecord()) {
                for (RecordComponent c : type.getRecordComponents()) {
                    if (c.getName().equals("models") && List.class.isAssignableFrom(c.getType())) {
                        return c;
                    }
                }
            }
            return null;
        }
    };

    /**
     * The published models an operation's result lists under {@code models} (what the answer's
     * {@code provenance.models} shows over HTTP); empty when the result has no such component.
     */
    public static List<ModelInfo> models(Record result) {
        RecordComponent c = MODELS.get(result.getClass());
        if (c == null) {
            return List.of();
        }
        Object value;
        try {
            value = c.getAccessor().invoke(result);
        } catch (ReflectiveOperationException e) {
            throw new IllegalStateException("cannot read the models of " + result.getClass().getName(), e);
        }
        List<ModelInfo> out = new java.util.ArrayList<>();
        if (value instanceof List<?> list) {
            for (Object m : list) {
                if (m instanceof ModelInfo info) {
                    out.add(info);
                }
            }
        }
        return out;
    }

    @SuppressWarnings("unchecked")
    private static <R extends Record> Map<String, Double> outputsOf(Operation<?, R> op, Record result,
                                                                   Collection<String> names) {
        Map<String, Output<R>> byName = new LinkedHashMap<>();
        for (Output<R> o : op.outputs()) {
            byName.put(o.name(), o);
        }
        Map<String, Double> out = new LinkedHashMap<>();
        for (String n : names) {
            Output<R> o = byName.get(n);
            if (o == null) {
                throw new IllegalArgumentException(op.name() + " has no output " + n + "; known: " + byName.keySet());
            }
            out.put(n, o.read().apply((R) result));
        }
        return out;
    }
}
