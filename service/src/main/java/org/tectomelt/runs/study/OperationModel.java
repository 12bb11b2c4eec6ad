package org.tectomelt.runs.study;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.Collections;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import org.tectomelt.contract.Invoker;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.operations.Operation;
import org.tectomelt.operations.OperationException;
import org.tectomelt.studies.StudyModel;

/**
 * An operation as a study's model: the base request with the varied fields set (dotted paths),
 * checked against the spec and run through {@link Invoker#prepare}, exactly as the operation's own
 * route would; then the named outputs.
 *
 * <p>A sample the model cannot compute ({@link EngineException}) or whose combination of values
 * breaks a rule across fields ({@link OperationException}) is a failed sample, its message the
 * reason; anything else (a spent budget, a fault) ends the study.
 */
public final class OperationModel implements StudyModel {

    private final Invoker invoker;
    private final Operation<?, ?> operation;
    private final ObjectNode base;
    private final List<String> outputs;
    private final Set<ModelInfo> models = Collections.synchronizedSet(new LinkedHashSet<>());

    /**
     * @param invoker   the spec and the operations
     * @param operation the operation
     * @param base      the request every sample starts from (not modified)
     * @param outputs   output names to read
     */
    public OperationModel(Invoker invoker, Operation<?, ?> operation, ObjectNode base, List<String> outputs) {
        this.invoker = Objects.requireNonNull(invoker, "invoker");
        this.operation = Objects.requireNonNull(operation, "operation");
        this.base = base.deepCopy();
        this.outputs = List.copyOf(outputs);
    }

    @Override
    public Map<String, Double> evaluate(Map<String, Double> inputs) {
        ObjectNode request = base.deepCopy();
        inputs.forEach((field, value) -> set(request, field, value));
        Record result = invoker.prepare(operation, request).run(Deadline.none());
        models.addAll(Invoker.models(result));
        return invoker.outputs(operation.name(), result, outputs);
    }

    /** The published models the results computed so far listed (their union, first seen first). */
    public List<ModelInfo> models() {
        synchronized (models) {
            return List.copyOf(models);
        }
    }

    @Override
    public String failureReason(RuntimeException e) {
        if (e instanceof EngineException) {
            return e.getMessage();
        }
        if (e instanceof OperationException oe) {
            return String.join("; ", oe.violations().stream().map(v -> v.field() + " " + v.message()).toList());
        }
        return null;
    }

    /** Sets {@code field} (a dotted path) in {@code request}, creating objects on the way. */
    public static void set(ObjectNode request, String field, double value) {
        String[] parts = field.split("\\.");
        ObjectNode at = request;
        for (int i = 0; i < parts.length - 1; i++) {
            JsonNode child = at.get(parts[i]);
            at = child instanceof ObjectNode o ? o : at.putObject(parts[i]);
        }
        at.put(parts[parts.length - 1], value);
    }
}
