package org.tectomelt.runs.sweep;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.time.Duration;
import java.util.Map;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.Json;
import org.tectomelt.engine.BudgetExceededException;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.EngineException;
import org.tectomelt.operations.Operation;
import org.tectomelt.operations.OperationException;
import org.tectomelt.operations.Violation;
import org.tectomelt.runs.Evaluator;
import org.tectomelt.runs.PointResult;
import org.tectomelt.runs.RunRecord;
import org.tectomelt.runs.study.StudyRequest;
import org.tectomelt.runs.study.StudyRun;

/**
 * Computes the points of a sweep on the operations' engine path: the point's request through
 * {@link Invoker#prepare} (the spec's rules and defaults, as over HTTP) and
 * {@code run(request, deadline)}, then the chosen outputs. A point the model cannot compute
 * ({@link EngineException}), one breaking a rule across fields ({@link OperationException}) or one
 * over its budget records a problem in the form the HTTP route would have answered; the run goes on.
 */
public final class SweepEvaluator implements Evaluator {

    private final Invoker invoker;
    private final Duration pointBudget;

    /**
     * @param invoker     the operations and the spec
     * @param pointBudget wall-clock budget of one point ({@code TECTOMELT_HEAVY_BUDGET_MS})
     */
    public SweepEvaluator(Invoker invoker, Duration pointBudget) {
        this.invoker = invoker;
        this.pointBudget = pointBudget;
    }

    /**
     * The operation, its fixed request (a lithology or a water content changes what a point
     * costs), the swept fields and whether each stored point is a study block.
     */
    @Override
    public String costKey(String operation, String definition) {
        try {
            Sweep sweep = Sweep.fromDefinition(definition, null);
            return operation + " " + sweep.request() + " " + sweep.axes().keySet() + (sweep.study() != null ? " study" : "");
        } catch (RuntimeException e) {
            return operation + " ?";
        }
    }

    @Override
    public Prepared prepare(RunRecord run) {
        if (!Sweep.KIND.equals(run.kind())) {
            throw new IllegalArgumentException("runs of kind '" + run.kind() + "' are not computed by this version");
        }
        Sweep sweep = Sweep.fromDefinition(run.definition(), run.label());
        Operation<?, ?> op = invoker.operations().named(sweep.operation()).orElseThrow(() ->
                new IllegalArgumentException("this version has no operation '" + sweep.operation() + "'"));
        if (sweep.study() != null) {
            StudyRun study = new StudyRun(invoker, op, StudyRequest.parse(sweep.study(), op, invoker), sweep.outputs());
            return index -> evaluateStudy(sweep, study, index);
        }
        // the spec's defaults, filled once into the base request: every point was checked against
        // the spec when the run was accepted, so a point is then only bound, not checked again
        ObjectNode filled = sweep.pointRequest(0);
        boolean checked = Sweep.fieldsIndependent(invoker.spec(), op.path())
                && invoker.spec().check(op.path(), filled, op.caps()).isEmpty();
        return index -> evaluate(sweep, op, checked ? filled : null, index);
    }


    /** One block of the study of a sweep point: point {@code index} is block {@code index % blocks} of it. */
    private PointResult evaluateStudy(Sweep sweep, StudyRun study, int index) {
        int point = index / sweep.blocks();
        String inputs = Json.numbers(sweep.inputs(point));
        try {
            StudyRun.Block block = study.evaluateBlock(sweep.pointRequest(point), index % sweep.blocks(),
                    Deadline.after(pointBudget));
            return new PointResult(index, inputs, block.json(), null, null, block.models());
        } catch (BudgetExceededException e) {
            return problem(index, inputs, 503, "over-budget", "Computation budget exceeded",
                    e.getMessage() + " (TECTOMELT_HEAVY_BUDGET_MS per stored point: " + StudyRun.BLOCK_SAMPLES
                            + " samples or one grid point of a study)", null);
        }
    }

    private PointResult evaluate(Sweep sweep, Operation<?, ?> op, ObjectNode filled, int index) {
        String inputs = Json.numbers(sweep.inputs(index));
        try {
            Record result = (filled == null ? invoker.prepare(op, sweep.pointRequest(index))
                    : bound(op, sweep.pointRequest(filled, index))).run(Deadline.after(pointBudget));
            Map<String, Double> out = invoker.outputs(op.name(), result, sweep.outputs());
            return new PointResult(index, inputs, Json.numbers(out), null, null, Invoker.models(result));
        } catch (EngineException e) {
            return problem(index, inputs, 400, "outside-model-range", "Outside what the model can compute", e.getMessage(),
                    null);
        } catch (OperationException e) {
            return problem(index, inputs, 400, "validation", "Invalid request field", e.getMessage(), e);
        } catch (BudgetExceededException e) {
            return problem(index, inputs, 503, "over-budget", "Computation budget exceeded",
                    e.getMessage() + " (TECTOMELT_HEAVY_BUDGET_MS per point)", null);
        }
    }

    private static <Q extends Record, R extends Record> Invoker.Prepared<Q, R> bound(Operation<Q, R> op,
                                                                                    ObjectNode tree) {
        return new Invoker.Prepared<>(op, Json.bind(tree, op.requestType()));
    }

    private static PointResult problem(int index, String inputs, int status, String type, String title, String detail,
                                       OperationException errors) {
        ObjectNode p = Json.mapper().createObjectNode();
        p.put("type", "/problems/" + type);
        p.put("title", title);
        p.put("status", status);
        p.put("detail", detail);
        if (errors != null) {
            ArrayNode a = p.putArray("errors");
            for (Violation v : errors.violations()) {
                a.addObject().put("field", v.field()).put("message", v.message());
            }
        }
        return new PointResult(index, inputs, null, p.toString(), null);
    }
}
