package org.tectomelt.runs;

import java.time.Instant;

/**
 * One stored run.
 *
 * @param id           random identifier (UUID)
 * @param kind         what the definition describes ("sweep"; later studies add their own kinds)
 * @param operation    the operation every point evaluates
 * @param owner        name of the token that started it
 * @param label        the owner's free-text label, or null
 * @param status       where it is
 * @param definition   opaque text for the {@link Evaluator} (JSON: the request, the sweep, the outputs)
 * @param provenance   opaque text (JSON: version, commit, models), or null
 * @param totalPoints  points in the run
 * @param chunkSize    points per chunk
 * @param donePoints   points computed with outputs
 * @param failedPoints points that recorded a problem
 * @param createdAt    accepted
 * @param startedAt    first chunk started, or null
 * @param finishedAt   succeeded, failed or cancelled, or null
 * @param statusReason why it failed, was cancelled or was interrupted, or null
 */
public record RunRecord(String id, String kind, String operation, String owner, String label, RunStatus status,
                        String definition, String provenance, int totalPoints, int chunkSize, int donePoints,
                        int failedPoints, Instant createdAt, Instant startedAt, Instant finishedAt,
                        String statusReason) {

    /** Number of chunks. */
    public int chunks() {
        return (totalPoints + chunkSize - 1) / chunkSize;
    }

    /** Which points each chunk holds. */
    ChunkLayout layout() {
        return new ChunkLayout(totalPoints, chunkSize);
    }
}
