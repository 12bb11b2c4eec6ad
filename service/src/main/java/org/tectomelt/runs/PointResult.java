package org.tectomelt.runs;

/**
 * One computed point as stored: its inputs and either its outputs or its problem (opaque text
 * produced by the {@link Evaluator}).
 *
 * @param index      position in the run, from 0
 * @param inputs     the point's own input values (for a sweep: the swept fields)
 * @param outputs    the outputs when it succeeded, else null
 * @param problem    the problem when it failed, else null
 * @param computedBy name of the instance that computed it
 */
public record PointResult(int index, String inputs, String outputs, String problem, String computedBy) {

    /** True when the point has outputs. */
    public boolean ok() {
        return outputs != null;
    }
}
