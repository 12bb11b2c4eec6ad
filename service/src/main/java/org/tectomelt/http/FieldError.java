package org.tectomelt.http;

/**
 * One invalid request field: its JSON path ({@code lithosphere.ageMyr}, {@code points[3].temperatureC})
 * and what is wrong with it, including the allowed range where there is one.
 */
public record FieldError(String field, String message) {
}
