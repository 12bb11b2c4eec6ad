package org.tectomelt.engine.melting;

/**
 * A mantle lithology that can drive a decompression melting column: it knows its
 * thermodynamic constants and can invert its melt-fraction law.
 */
public interface MantleLithology extends Lithology {

    /** The thermodynamic constants published with (or paired with) the model. */
    MantleThermodynamics thermodynamics();

    /**
     * The temperature (K) at which the rock holds melt fraction {@code f} at pressure {@code p},
     * for bulk water {@code bulkWater}: the inverse of {@link #melt} in temperature.
     *
     * @param p         pressure (Pa)
     * @param f         melt fraction, 0–1
     * @param bulkWater bulk water (mass fraction)
     */
    double temperatureAt(double p, double f, double bulkWater);
}
