package org.tectomelt.studies;

import java.util.ArrayList;
import java.util.List;

/**
 * An observed value of an output with its standard deviation (Gaussian measurement error).
 *
 * @param value observed value, API unit of the output
 * @param sd    its standard deviation, positive
 */
public record Observation(double value, double sd) {

    /** Problems with this observation of {@code field}. */
    public List<InputProblem> problems(String field) {
        List<InputProblem> out = new ArrayList<>();
        if (!Double.isFinite(value)) {
            out.add(new InputProblem(field + ".value", "must be a finite number"));
        }
        if (!(sd > 0) || !Double.isFinite(sd)) {
            out.add(new InputProblem(field + ".sd", "must be a positive finite number, got " + FieldRange.num(sd)));
        }
        return out;
    }
}
