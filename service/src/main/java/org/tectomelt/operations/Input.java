package org.tectomelt.operations;

/**
 * A numeric request field a sweep or a sample may address.
 *
 * @param name        dotted path in the request JSON ({@code potentialTemperatureC},
 *                    {@code crust.thicknessKm}); its range and default come from the spec
 *                    ({@code SpecContract.range}), never from here
 * @param unit        the unit, as in the field name ({@code °C}, {@code GPa}, {@code km})
 * @param description one line for a listing
 * @param sampleable  whether a Monte Carlo study may draw it from a distribution (false for
 *                    numerics such as a step size)
 */
public record Input(String name, String unit, String description, boolean sampleable) {
}
