package org.tectomelt.studies;

import java.util.Objects;

/**
 * One thing wrong with a study's request, for the caller: the field (a dotted path such as
 * {@code uncertainty.inputs.potentialTemperatureC}) and what is wrong, with the allowed range.
 *
 * @param field   dotted path of the offending field
 * @param message what is wrong and what would be accepted
 */
public record InputProblem(String field, String message) {
    /** Both parts are required. */
    public InputProblem {
        Objects.requireNonNull(field, "field");
        Objects.requireNonNull(message, "message");
    }
}
