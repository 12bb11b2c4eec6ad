package org.tectomelt.engine.composition;

import org.tectomelt.engine.ModelInfo;

/**
 * The closed forms of Shaw (1970) for trace elements in batch (equilibrium) and fractional
 * (Rayleigh) melting, modal and non-modal, for a source of fixed mineralogy. Every method returns a
 * concentration ratio C/C₀.
 *
 * <pre>
 *   batch, non-modal          C_L/C₀ = 1 / (D₀ + F(1 − P))          (modal: P = D₀ = D)
 *   batch residue             C_s/C₀ = D_res · C_L/C₀,  D_res = (D₀ − P F)/(1 − F)
 *   fractional, instantaneous C_L/C₀ = (1/D₀)(1 − P F/D₀)^(1/P − 1)  (modal: (1/D)(1 − F)^(1/D − 1))
 *   fractional, residue       C_s/C₀ = (1/(1 − F))(1 − P F/D₀)^(1/P)  (modal: (1 − F)^(1/D − 1))
 *   fractional, accumulated   C̄_L/C₀ = (1/F)[1 − (1 − P F/D₀)^(1/P)] (modal: [1 − (1 − F)^(1/D)]/F)
 * </pre>
 * D₀ = Σ xᵢKᵢ is the bulk partition coefficient of the source (xᵢ its mineral mass fractions, Kᵢ the
 * mineral/melt coefficients), P = Σ pᵢKᵢ that of the melting reaction (pᵢ the proportions in which
 * the minerals enter the melt). The forms hold while every mineral remains (pᵢF ≤ xᵢ); a column whose
 * mineralogy changes is integrated increment by increment by {@link ColumnComposition}. Exact: the
 * only error is rounding (the forms are evaluated with {@code log1p}/{@code expm1} so that F → 0 and
 * P → 0 lose no digits).
 *
 * <p>Shaw, D.M. (1970) Trace element fractionation during anatexis. Geochimica et Cosmochimica
 * Acta 34(2), 237–243.
 */
public final class Shaw1970 {

    /** The batch and fractional melting equations. */
    public static final ModelInfo INFO = new ModelInfo("trace-element-melting-shaw1970",
            "Shaw, D.M. (1970) Trace element fractionation during anatexis. Geochimica et Cosmochimica Acta "
                    + "34(2), 237-243", "10.1016/0016-7037(70)90009-8");

    private Shaw1970() {
    }

    /** Modal batch melt C_L/C₀ = 1/(D + F(1 − D)). */
    public static double batchMelt(double d, double f) {
        return 1.0 / (d + f * (1.0 - d));
    }

    /** Non-modal batch melt C_L/C₀ = 1/(D₀ + F(1 − P)). */
    public static double batchMelt(double d0, double p, double f) {
        return 1.0 / (d0 + f * (1.0 - p));
    }

    /** Non-modal batch residue C_s/C₀ = [(D₀ − P F)/(1 − F)] / (D₀ + F(1 − P)); F &lt; 1. */
    public static double batchResidue(double d0, double p, double f) {
        return (d0 - p * f) / (1.0 - f) * batchMelt(d0, p, f);
    }

    /** Modal fractional instantaneous melt C_L/C₀ = (1/D)(1 − F)^(1/D − 1). */
    public static double fractionalMelt(double d, double f) {
        return fractionalMelt(d, d, f);
    }

    /** Non-modal fractional instantaneous melt C_L/C₀ = (1/D₀)(1 − P F/D₀)^(1/P − 1). */
    public static double fractionalMelt(double d0, double p, double f) {
        // (1 − PF/D₀)^(1/P − 1) = exp((1 − P) · ln(1 − PF/D₀)/P)
        return Math.exp((1.0 - p) * lnRemaining(d0, p, f)) / d0;
    }

    /** Modal fractional residue C_s/C₀ = (1 − F)^(1/D − 1). */
    public static double fractionalResidue(double d, double f) {
        return fractionalResidue(d, d, f);
    }

    /** Non-modal fractional residue C_s/C₀ = (1 − P F/D₀)^(1/P) / (1 − F); F &lt; 1. */
    public static double fractionalResidue(double d0, double p, double f) {
        return Math.exp(lnRemaining(d0, p, f)) / (1.0 - f);
    }

    /** Modal accumulated fractional melt C̄_L/C₀ = [1 − (1 − F)^(1/D)]/F; the instantaneous melt at F = 0. */
    public static double accumulatedFractionalMelt(double d, double f) {
        return accumulatedFractionalMelt(d, d, f);
    }

    /** Non-modal accumulated fractional melt C̄_L/C₀ = [1 − (1 − P F/D₀)^(1/P)]/F; 1/D₀ at F = 0. */
    public static double accumulatedFractionalMelt(double d0, double p, double f) {
        if (f == 0) {
            return 1.0 / d0;
        }
        return -Math.expm1(lnRemaining(d0, p, f)) / f;
    }

    /**
     * ln of the fraction of the element left in the residue after fractional melting to F,
     * (1/P)·ln(1 − P F/D₀), written as −(F/D₀)·[ln(1 + x)/x] with x = −P F/D₀ so that P → 0 is exact.
     */
    static double lnRemaining(double d0, double p, double f) {
        double x = -p * f / d0;
        return -(f / d0) * log1pOverX(x);
    }

    /** 1/n! for n = 0 … 10: the Taylor coefficients of e^y used below. */
    private static final double[] EXP_SERIES = {1.0, 1.0, 1.0 / 2, 1.0 / 6, 1.0 / 24, 1.0 / 120, 1.0 / 720, 1.0 / 5040,
        1.0 / 40320, 1.0 / 362880, 1.0 / 3628800};
    /** 1/(n + 1) for n = 0 … 7: the coefficients of ln(1 + x)/x = Σ (−x)ⁿ/(n + 1). */
    private static final double[] LOG1P_OVER_X_SERIES = {1.0, 1.0 / 2, 1.0 / 3, 1.0 / 4, 1.0 / 5, 1.0 / 6, 1.0 / 7,
        1.0 / 8};

    /**
     * e^y. Near 0 (|y| &lt; 1/8, most steps of a column for all but the most incompatible elements) by its
     * Taylor series to y¹⁰/10!: the first term left out, y¹¹/11!, is below 3e-18 of the value, under the
     * rounding of a double, and the polynomial is cheaper than {@link Math#exp}; elsewhere Math.exp.
     */
    static double exp(double y) {
        return Math.abs(y) < 0.125 ? expSeries(y) : Math.exp(y);
    }

    /**
     * Σ yⁿ/n! to n = 10 by Estrin's scheme in fused multiply-adds: pairs of terms first, then y², y⁴ and
     * y⁸ join them, so the longest chain of dependent operations is five long instead of Horner's ten
     * (the elements of one melting step are independent, and the processor overlaps their chains).
     */
    private static double expSeries(double y) {
        double[] c = EXP_SERIES;
        double y2 = y * y;
        double y4 = y2 * y2;
        double low = Math.fma(Math.fma(c[3], y, c[2]), y2, Math.fma(c[1], y, c[0]));
        double mid = Math.fma(Math.fma(c[7], y, c[6]), y2, Math.fma(c[5], y, c[4]));
        double high = Math.fma(c[10], y2, Math.fma(c[9], y, c[8]));
        return Math.fma(high, y4 * y4, Math.fma(mid, y4, low));
    }

    /** ln(1 + x)/x, continuous through x = 0 (value 1); x &gt; −1. */
    static double log1pOverX(double x) {
        if (Math.abs(x) < 0.01) {
            // series Σ (−x)ⁿ/(n + 1) to n = 7: the truncation error x⁸/9 is below 2e-17 (cheaper than a log)
            double[] c = LOG1P_OVER_X_SERIES;
            double u = -x;
            double u2 = u * u;
            // Estrin's scheme, as in expSeries: a chain of three instead of seven
            return Math.fma(Math.fma(Math.fma(c[7], u, c[6]), u2, Math.fma(c[5], u, c[4])), u2 * u2,
                    Math.fma(Math.fma(c[3], u, c[2]), u2, Math.fma(c[1], u, c[0])));
        }
        // ln(u)/(u − 1) with u = 1 + x rounded: the rounding of u cancels between the two (Goldberg 1991,
        // "What every computer scientist should know about floating-point arithmetic", Theorem 4), and
        // Math.log is an intrinsic where Math.log1p is not
        double u = 1.0 + x;
        return Math.log(u) / (u - 1.0);
    }
}
