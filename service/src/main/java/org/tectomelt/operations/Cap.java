package org.tectomelt.operations;

/**
 * A server cap from {@link org.tectomelt.Config} on a request field: on a list, its length (the
 * contract enforces it instead of the spec's {@code maxItems}, which documents the default); on a
 * number, its value (instead of the spec's {@code maximum}). The message names the variable, so a
 * caller who hits it knows it is the server's setting and not the model's limit.
 *
 * @param field    the field's path in the request ({@code points}, {@code path.points},
 *                 {@code durationKyr}); no array indices
 * @param limit    the configured maximum, in the field's unit
 * @param variable the environment variable that sets it ({@code TECTOMELT_MAX_BATCH_POINTS})
 */
public record Cap(String field, double limit, String variable) {
}
