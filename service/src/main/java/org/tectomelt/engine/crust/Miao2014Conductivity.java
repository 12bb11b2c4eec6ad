package org.tectomelt.engine.crust;

import org.tectomelt.engine.ModelInfo;

/**
 * Temperature-dependent thermal conductivity of crustal rocks after Miao, Li &amp; Chen (2014):
 * <pre>
 *   K(T) = 1 / (a + b·T),   T in K, K in W/m/K
 *   granite  a = 0.24094, b = 4.6019e-4
 *   gabbro   a = 0.33727, b = 3.5002e-4
 * </pre>
 * (coefficients as listed in REFERENCES.md §3.5).
 *
 * <p>Source: Miao, S.Q., Li, H.P. &amp; Chen, G. (2014) Temperature dependence of thermal
 * diffusivity, specific heat capacity, and thermal conductivity for several types of rocks.
 * Journal of Thermal Analysis and Calorimetry 115, 1057–1063, doi:10.1007/s10973-013-3427-2
 * (DOI from memory).
 *
 * <p>Validity: measured from room temperature to {@value #MAX_MEASURED_K} K; above that (magmatic
 * temperatures) the law is extrapolated, and the sill model says so in its warnings. Expected
 * accuracy: a few percent within the measured range for the rock types measured; rocks of other
 * composition can differ by tens of percent.
 *
 * @param rock short name of the rock type
 * @param a    constant term (m·K/W)
 * @param b    temperature coefficient (m/W)
 */
public record Miao2014Conductivity(String rock, double a, double b) implements ConductivityLaw {

    /** Provenance. */
    public static final ModelInfo INFO = new ModelInfo("conductivity-miao2014",
            "Miao, S.Q., Li, H.P. & Chen, G. (2014) Temperature dependence of thermal diffusivity, specific heat "
                    + "capacity, and thermal conductivity for several types of rocks. Journal of Thermal Analysis "
                    + "and Calorimetry 115, 1057-1063",
            "10.1007/s10973-013-3427-2");

    /** Top of the measured temperature range (K). */
    public static final double MAX_MEASURED_K = 1173.0;

    /** Granite. */
    public static final Miao2014Conductivity GRANITE = new Miao2014Conductivity("granite", 0.24094, 4.6019e-4);
    /** Gabbro. */
    public static final Miao2014Conductivity GABBRO = new Miao2014Conductivity("gabbro", 0.33727, 3.5002e-4);

    @Override
    public double at(double temperatureK) {
        return 1.0 / (a + b * temperatureK);
    }

    @Override
    public boolean isConstant() {
        return false;
    }
}
