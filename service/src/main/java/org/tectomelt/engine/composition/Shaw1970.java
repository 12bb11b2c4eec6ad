package org.tectomelt.engine.composition;

import java.math.BigDecimal;
import java.math.MathContext;
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

    /** 1/(n + 1) for n = 0 … 10: the coefficients of ln(1 + x)/x = Σ (−x)ⁿ/(n + 1). */
    private static final double[] LOG1P_OVER_X_SERIES = {1.0, 1.0 / 2, 1.0 / 3, 1.0 / 4, 1.0 / 5, 1.0 / 6, 1.0 / 7,
        1.0 / 8, 1.0 / 9, 1.0 / 10, 1.0 / 11};
    /** {@link #log1pOverX} uses its series for |x| below this (all steps of the benchmark column). */
    static final double LOG1P_SERIES_LIMIT = 0.03;
    /** Table step in y of {@link #exp}: y is reduced to r = y − k/16, |r| ≤ 1/32. */
    private static final double EXP_TABLE_STEP = 1.0 / 16;
    /** {@link #exp} and {@link #expm1} use the table for |y| below this; the library beyond. */
    static final double EXP_TABLE_LIMIT = 4.0;
    private static final int EXP_TABLE_HALF = (int) (EXP_TABLE_LIMIT / EXP_TABLE_STEP);
    /** e^(k/16) for k = −64 … 64 as a sum of two doubles, hi the correctly rounded value, lo the rest. */
    private static final double[] EXP_TABLE_HI = new double[2 * EXP_TABLE_HALF + 1];
    private static final double[] EXP_TABLE_LO = new double[2 * EXP_TABLE_HALF + 1];
    /**
     * 1.5·2⁵²: added to 16y (|16y| &lt; 2⁵¹) it leaves round(16y) (to nearest, ties to even, as Math.rint) in the
     * low bits of the sum, and subtracted again it gives k exactly; cheaper than Math.rint and a conversion to int.
     */
    private static final double ROUND_TO_INTEGER = 0x1.8p52;

    /** 1/(n + 1)! for n = 0 … 7: (e^r − 1)/r = Σ rⁿ/(n + 1)!. */
    private static final double[] EXPM1_OVER_R_SERIES = {1.0, 1.0 / 2, 1.0 / 6, 1.0 / 24, 1.0 / 120, 1.0 / 720,
        1.0 / 5040, 1.0 / 40320};

    static {
        // e^(1/16) to 40 digits by its Taylor series (terms below 1e-45 left out), then its powers
        MathContext mc = new MathContext(40);
        BigDecimal step = BigDecimal.ONE.divide(BigDecimal.valueOf(16), mc);
        BigDecimal term = BigDecimal.ONE;
        BigDecimal e = BigDecimal.ONE;
        for (int n = 1; n < 40; n++) {
            term = term.multiply(step, mc).divide(BigDecimal.valueOf(n), mc);
            e = e.add(term, mc);
        }
        BigDecimal up = BigDecimal.ONE;
        for (int k = 0; k <= EXP_TABLE_HALF; k++) {
            BigDecimal down = BigDecimal.ONE.divide(up, mc);
            setExpTableEntry(EXP_TABLE_HALF + k, up);
            setExpTableEntry(EXP_TABLE_HALF - k, down);
            up = up.multiply(e, mc);
        }
    }

    private static void setExpTableEntry(int at, BigDecimal value) {
        double hi = value.doubleValue(); // correctly rounded
        EXP_TABLE_HI[at] = hi;
        EXP_TABLE_LO[at] = value.subtract(new BigDecimal(hi)).doubleValue();
    }

    /**
     * e^y within one ulp (for |y| below {@value #EXP_TABLE_LIMIT}; Math.exp beyond), cheaper than Math.exp in
     * the column's steps: table-driven after Tang (1989), e^y = e^(k/16)·e^r with k = round(16y) and
     * r = y − k/16 (exact, |r| ≤ 1/32); e^(k/16) is held as a sum of two doubles hi + lo, and e^r − 1 by its
     * Taylor series to r⁸/8! (the first term left out, r⁹/9!, is below 1e-19), so that
     * e^y = hi + (hi·(e^r − 1) + lo) rounds once at the end.
     *
     * <p>Tang, P.T.P. (1989) Table-driven implementation of the exponential function in IEEE floating-point
     * arithmetic. ACM Transactions on Mathematical Software 15(2), 144–157.
     */
    static double exp(double y) {
        if (!(Math.abs(y) < EXP_TABLE_LIMIT)) {
            return Math.exp(y);
        }
        double t = y * 16 + ROUND_TO_INTEGER;
        int at = tableIndex(t);
        return EXP_TABLE_HI[at] + expTail(y, t, at);
    }

    /**
     * e^y − 1 as {@link #exp} computes e^y, without the cancellation of e^y − 1 near y = 0:
     * (hi − 1) + (hi·(e^r − 1) + lo), hi − 1 exact for the table's values (and 0 for k = 0, where the result is
     * the series itself).
     */
    static double expm1(double y) {
        if (!(Math.abs(y) < EXP_TABLE_LIMIT)) {
            return Math.expm1(y);
        }
        double t = y * 16 + ROUND_TO_INTEGER;
        int at = tableIndex(t);
        return (EXP_TABLE_HI[at] - 1.0) + expTail(y, t, at);
    }

    /** The table index of k = round(16y) from t = 16y + 1.5·2⁵²: the low 32 bits of t are k in two's complement. */
    private static int tableIndex(double t) {
        return (int) Double.doubleToRawLongBits(t) + EXP_TABLE_HALF;
    }

    /** hi·(e^r − 1) + lo at table index {@code at}; y·16 and k/16 are exact, so r = y − k/16 is (Sterbenz). */
    private static double expTail(double y, double t, int at) {
        double k = t - ROUND_TO_INTEGER;
        double r = y - k * EXP_TABLE_STEP;
        return Math.fma(EXP_TABLE_HI[at], r * expm1OverR(r), EXP_TABLE_LO[at]);
    }

    /**
     * (e^r − 1)/r = Σ rⁿ/(n + 1)! to n = 7 by Estrin's scheme in fused multiply-adds: pairs of terms first,
     * then r² and r⁴ join them (the elements of one melting step are independent, and the processor overlaps
     * their chains).
     */
    private static double expm1OverR(double r) {
        double[] c = EXPM1_OVER_R_SERIES;
        double r2 = r * r;
        double low = Math.fma(Math.fma(c[3], r, c[2]), r2, Math.fma(c[1], r, c[0]));
        double high = Math.fma(Math.fma(c[7], r, c[6]), r2, Math.fma(c[5], r, c[4]));
        return Math.fma(high, r2 * r2, low);
    }

    /** ln(1 + x)/x, continuous through x = 0 (value 1); x &gt; −1. */
    static double log1pOverX(double x) {
        if (Math.abs(x) < LOG1P_SERIES_LIMIT) {
            // series Σ (−x)ⁿ/(n + 1) to n = 10: the truncation error x¹¹/12 is below 2e-18 (cheaper than a log);
            // Estrin's scheme, as in expm1OverR: a chain of four instead of ten
            double[] c = LOG1P_OVER_X_SERIES;
            double u = -x;
            double u2 = u * u;
            double u4 = u2 * u2;
            double low = Math.fma(Math.fma(Math.fma(c[7], u, c[6]), u2, Math.fma(c[5], u, c[4])), u4,
                    Math.fma(Math.fma(c[3], u, c[2]), u2, Math.fma(c[1], u, c[0])));
            double high = Math.fma(c[10], u2, Math.fma(c[9], u, c[8]));
            return Math.fma(high, u4 * u4, low);
        }
        // ln(u)/(u − 1) with u = 1 + x rounded: the rounding of u cancels between the two (Goldberg 1991,
        // "What every computer scientist should know about floating-point arithmetic", Theorem 4), and
        // Math.log is an intrinsic where Math.log1p is not
        double u = 1.0 + x;
        return Math.log(u) / (u - 1.0);
    }
}
