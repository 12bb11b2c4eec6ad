package org.tectomelt.operations;

/**
 * A server cap on the length of a request list, from {@link org.tectomelt.Config}: the contract
 * enforces it instead of the spec's {@code maxItems} (which documents the default), and names the
 * variable in its message, so a caller who hits it knows it is the server's setting.
 *
 * @param field    the list's path in the request ({@code points}, {@code path.points})
 * @param limit    the configured maximum length
 * @param variable the environment variable that sets it ({@code TECTOMELT_MAX_BATCH_POINTS})
 */
public record Cap(String field, int limit, String variable) {
}
