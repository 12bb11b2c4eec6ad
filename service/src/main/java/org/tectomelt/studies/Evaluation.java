package org.tectomelt.studies;

import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * One call of a model, read into an array of the requested outputs: a value, NaN for an absent
 * output, or a failure reason for the whole call.
 *
 * @param values  output values in the requested order, NaN where absent (all NaN after a failure)
 * @param failure why the call failed, or {@code null}
 */
record Evaluation(double[] values, String failure) {

    static Evaluation of(StudyModel model, Map<String, Double> inputs, List<String> outputs) {
        double[] v = new double[outputs.size()];
        Arrays.fill(v, Double.NaN);
        Map<String, Double> out;
        try {
            out = Objects.requireNonNull(model.evaluate(inputs), "a model returned no outputs");
        } catch (RuntimeException e) {
            String reason = model.failureReason(e);
            if (reason == null) {
                throw e;
            }
            return new Evaluation(v, reason);
        }
        for (int k = 0; k < outputs.size(); k++) {
            Double x = out.get(outputs.get(k));
            if (x != null) {
                if (!Double.isFinite(x)) {
                    Arrays.fill(v, Double.NaN);
                    return new Evaluation(v, "the model gave a non-finite " + outputs.get(k));
                }
                v[k] = x;
            }
        }
        return new Evaluation(v, null);
    }

    boolean failed() {
        return failure != null;
    }
}
