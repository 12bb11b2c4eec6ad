package org.tectomelt.engine.melting;

import org.tectomelt.engine.ModelInfo;

/**
 * Solidus and liquidus of granite with excess water after the experiments of Huang &amp; Wyllie
 * (1973): solidus 680 °C at 0.2 GPa and 620 °C at 1 GPa; liquidus 715 °C at 0.2 GPa and 725 °C
 * at 1 GPa (REFERENCES.md §3.4).
 *
 * <p>Between the two anchor pressures both curves are interpolated linearly in pressure; outside
 * them they are held at the nearest anchor (a falling solidus must not be extrapolated: at low
 * pressure the measured water-saturated solidus rises again, and above about 1 GPa it flattens).
 * The melt fraction is taken to rise linearly from 0 at the solidus to 1 at the liquidus. That
 * straight-line shape is this project's approximation, not a published fit: treat melt fractions
 * as ±10–20 % absolute; the curves themselves as ±20 °C.
 *
 * <p>Source: Huang, W.L. &amp; Wyllie, P.J. (1973), melting experiments on granite with excess
 * water, Earth and Planetary Science Letters; anchor values as listed in REFERENCES.md §3.4 [pub].
 * Volume, pages and DOI are not given: they could not be re-checked here.
 *
 * <p>Validity: anchors between {@value #ANCHOR_LOW_GPA} and {@value #ANCHOR_HIGH_GPA} GPa; outside
 * them the caller warns.
 */
public record HuangWyllie1973Granite() {

    /** Provenance. */
    public static final ModelInfo INFO = new ModelInfo("granite-water-saturated",
            "Huang, W.L. & Wyllie, P.J. (1973) melting experiments on granite with excess water, Earth and "
                    + "Planetary Science Letters: solidus 680/620 °C, liquidus 715/725 °C at 0.2/1 GPa; "
                    + "linear melt fraction in between (approximate)",
            "");

    /** Low anchor pressure (GPa). */
    public static final double ANCHOR_LOW_GPA = 0.2;
    /** High anchor pressure (GPa). */
    public static final double ANCHOR_HIGH_GPA = 1.0;
    /** Solidus at the low and high anchors (°C). */
    public static final double SOLIDUS_LOW_C = 680.0, SOLIDUS_HIGH_C = 620.0;
    /** Liquidus at the low and high anchors (°C). */
    public static final double LIQUIDUS_LOW_C = 715.0, LIQUIDUS_HIGH_C = 725.0;

    private static final double ZERO_C = 273.15;

    /** Water-saturated solidus (K) at pressure {@code p} (Pa). */
    public double solidus(double p) {
        return interpolate(p, SOLIDUS_LOW_C, SOLIDUS_HIGH_C) + ZERO_C;
    }

    /** Water-saturated liquidus (K) at pressure {@code p} (Pa). */
    public double liquidus(double p) {
        return interpolate(p, LIQUIDUS_LOW_C, LIQUIDUS_HIGH_C) + ZERO_C;
    }

    /** The melt curve at pressure {@code p} (Pa): F = 0 at the solidus rising linearly to 1 at the liquidus. */
    public MeltCurve curveAt(double p) {
        return new MeltCurve(new double[] {solidus(p), liquidus(p)}, new double[] {0.0, 1.0});
    }

    private static double interpolate(double p, double low, double high) {
        double g = p * 1e-9;
        double w = Math.max(0.0, Math.min(1.0, (g - ANCHOR_LOW_GPA) / (ANCHOR_HIGH_GPA - ANCHOR_LOW_GPA)));
        return low + w * (high - low);
    }
}
