package org.tectomelt.runs;

/**
 * Turns a run's definition into the computation of its points. Implemented outside this package,
 * on the operations' engine path (no HTTP per point).
 */
@FunctionalInterface
public interface Evaluator {

    /**
     * Prepares the computation of a run's points; called once per chunk.
     *
     * @throws IllegalArgumentException when the definition cannot be carried out any more (the run
     *                                  then fails with the message as its reason)
     */
    Prepared prepare(RunRecord run);

    /**
     * Runs whose points cost about the same share this key; the executor sizes a new run's
     * chunks by what the points of earlier runs with its key cost. Default: the operation.
     */
    default String costKey(String operation, String definition) {
        return operation;
    }

    /** A run ready to compute any of its points. */
    @FunctionalInterface
    interface Prepared {
        /**
         * Computes one point. A failure of the point itself (the model cannot give a number there)
         * is returned as a {@link PointResult} with a problem, never thrown; anything thrown stops
         * the chunk, which is tried again later.
         */
        PointResult evaluate(int index);
    }
}
