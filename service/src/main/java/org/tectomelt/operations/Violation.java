package org.tectomelt.operations;

/**
 * One invalid request field: its path in the API's dotted/indexed form
 * ({@code lithosphere.ageMyr}, {@code points[3].temperatureC}) and what is wrong, with the allowed
 * range where there is one.
 */
public record Violation(String field, String message) {
}
