package org.tectomelt.operations;

import java.util.function.Function;

/**
 * A numeric scalar of a result a sweep or a study may read.
 *
 * @param name        dotted path in the result JSON ({@code crustalThicknessKm},
 *                    {@code column.onset.depthKm})
 * @param unit        its unit ({@code 1} for a fraction)
 * @param description one line for a listing
 * @param read        the value from a result; null where the quantity is absent (no melting),
 *                    never NaN
 * @param <R>         the result record
 */
public record Output<R>(String name, String unit, String description, Function<R, Double> read) {
}
