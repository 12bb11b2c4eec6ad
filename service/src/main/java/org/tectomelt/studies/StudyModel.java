package org.tectomelt.studies;

import java.util.Map;
import java.util.Objects;
import java.util.function.Function;
import org.tectomelt.engine.EngineException;

/**
 * A computation as a study sees it: named numeric inputs in, named numeric outputs out.
 *
 * <p>Inputs and outputs are named by their dotted API paths ({@code potentialTemperatureC},
 * {@code column.onset.depthKm}) and given in API units. The inputs handed in are only the ones the
 * study varies; the model holds every other input fixed. An output that does not exist for these
 * inputs (no melting, so no onset depth) is {@code null} or missing, never NaN. When the
 * computation cannot give a result for a sample, it throws: {@link #failureReason} decides whether
 * that exception is a failed sample (counted, its reason tallied) or a fault to propagate.
 *
 * <p>Implementations must be safe to call from several threads at once.
 */
@FunctionalInterface
public interface StudyModel {

    /**
     * Computes the outputs for one sample.
     *
     * @param inputs the varied inputs by name, API units
     * @return outputs by name, API units; {@code null} values for absent quantities
     */
    Map<String, Double> evaluate(Map<String, Double> inputs);

    /**
     * Why an exception thrown by {@link #evaluate} failed the sample, or {@code null} when it is not
     * a sample's failure but a fault (a bug, a spent budget) that must end the study. By default an
     * {@link EngineException} (the model cannot give a number there) is a failure, anything else a
     * fault.
     */
    default String failureReason(RuntimeException e) {
        return e instanceof EngineException ? e.getMessage() : null;
    }

    /**
     * A model from a function and a failure classifier.
     *
     * @param evaluate the computation
     * @param reason   the reason of a failed sample, or {@code null} to propagate the exception
     */
    static StudyModel of(Function<Map<String, Double>, Map<String, Double>> evaluate,
                         Function<RuntimeException, String> reason) {
        Objects.requireNonNull(evaluate, "evaluate");
        Objects.requireNonNull(reason, "reason");
        return new StudyModel() {
            @Override
            public Map<String, Double> evaluate(Map<String, Double> inputs) {
                return evaluate.apply(inputs);
            }

            @Override
            public String failureReason(RuntimeException e) {
                return reason.apply(e);
            }
        };
    }
}
