package org.tectomelt.runs;

/**
 * A run to store and compute; every point has already been validated by the caller.
 *
 * @param kind        what the definition describes ("sweep")
 * @param operation   the operation every point evaluates
 * @param owner       name of the token that asks for it
 * @param label       free text, or null
 * @param definition  opaque text the {@link Evaluator} understands
 * @param provenance  opaque text, or null
 * @param totalPoints number of points (at least 1)
 */
public record NewRun(String kind, String operation, String owner, String label, String definition,
                     String provenance, int totalPoints) {

    /** Checks the count. */
    public NewRun {
        if (totalPoints < 1) {
            throw new IllegalArgumentException("a run has at least one point");
        }
    }
}
