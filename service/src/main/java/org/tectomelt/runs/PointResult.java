package org.tectomelt.runs;

import java.util.List;
import org.tectomelt.engine.ModelInfo;

/**
 * One computed point as stored: its inputs and either its outputs or its problem (opaque text
 * produced by the {@link Evaluator}), and the published models its result listed.
 *
 * @param index      position in the run, from 0
 * @param inputs     the point's own input values (for a sweep: the swept fields)
 * @param outputs    the outputs when it succeeded, else null
 * @param problem    the problem when it failed, else null
 * @param computedBy name of the instance that computed it
 * @param models     the models the point's result listed, in its order (none for a failed point);
 *                   stored once per run ({@code run_models}), not per point, so points read back
 *                   from the database have none
 */
public record PointResult(int index, String inputs, String outputs, String problem, String computedBy,
                          List<ModelInfo> models) {

    /** Copies the model list. */
    public PointResult {
        models = models == null ? List.of() : List.copyOf(models);
    }

    /** A point without models. */
    public PointResult(int index, String inputs, String outputs, String problem, String computedBy) {
        this(index, inputs, outputs, problem, computedBy, List.of());
    }

    /** True when the point has outputs. */
    public boolean ok() {
        return outputs != null;
    }
}
