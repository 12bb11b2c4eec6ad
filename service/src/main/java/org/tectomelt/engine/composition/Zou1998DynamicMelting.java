package org.tectomelt.engine.composition;

import org.tectomelt.engine.ModelInfo;

/**
 * Dynamic (near-fractional, continuous) melting after Zou (1998): the residue keeps a melt mass
 * fraction φ (the critical mass porosity); until the melt reaches φ nothing leaves (batch melting),
 * after it every further increment of melt is extracted, so that the total melt fraction is
 * F = φ + (1 − φ)X with X the mass fraction of the source extracted as melt. For a source of fixed
 * mineralogy, with D₀ the bulk coefficient of the source, P that of the melting reaction,
 * <pre>
 *   α   = φ + (1 − φ)P,      B_φ = D₀ + φ(1 − P)
 *   extracted melt, instantaneous   C_L/C₀ = (1/B_φ) · (1 − αX/B_φ)^(1/α − 1)
 *   extracted melt, accumulated     C̄_X/C₀ = [1 − (1 − αX/B_φ)^(1/α)] / X
 * </pre>
 * the non-modal dynamic-melting forms in the shape given by Zou (1998; recalled from memory, derived
 * again here from the mass balance dQ = −C_L dX with C_L = Q/(Σmᵢ Kᵢ + melt retained), which gives
 * exactly these). Modal melting is P = D₀ = D: then α = B_φ = φ + (1 − φ)D and
 * C_L/C₀ = (1/α)(1 − X)^(1/α − 1). Limits: φ → 0 gives Shaw's (1970) fractional melting with X = F;
 * X = 0 (the melt fraction reaching φ, nothing yet extracted) gives batch melting with F = φ, so for a
 * given total F the forms tend to batch as φ grows to F and to fractional as φ → 0.
 *
 * <p>Zou, H. (1998) Trace element fractionation during modal and nonmodal dynamic melting and
 * open-system melting: a mathematical treatment. Geochimica et Cosmochimica Acta 62(11), 1937–1945.
 */
public final class Zou1998DynamicMelting {

    /** The dynamic-melting equations. */
    public static final ModelInfo INFO = new ModelInfo("dynamic-melting-zou1998",
            "Zou, H. (1998) Trace element fractionation during modal and nonmodal dynamic melting and open-system "
                    + "melting: a mathematical treatment. Geochimica et Cosmochimica Acta 62(11), 1937-1945",
            "10.1016/S0016-7037(98)00115-X");

    private Zou1998DynamicMelting() {
    }

    /** Total melt fraction F = φ + (1 − φ)X for an extracted fraction X. */
    public static double totalMeltFraction(double phi, double x) {
        return phi + (1.0 - phi) * x;
    }

    /** Extracted fraction X = (F − φ)/(1 − φ) for a total melt fraction F ≥ φ. */
    public static double extractedFraction(double phi, double f) {
        return (f - phi) / (1.0 - phi);
    }

    /** Instantaneous extracted melt C_L/C₀ after extracting X, non-modal. */
    public static double melt(double d0, double p, double phi, double x) {
        double alpha = phi + (1.0 - phi) * p;
        double bPhi = d0 + phi * (1.0 - p);
        return Math.exp((1.0 - alpha) * lnRemaining(alpha, bPhi, x)) / bPhi;
    }

    /** Accumulated extracted melt C̄_X/C₀ after extracting X &gt; 0, non-modal; the first drop at X = 0. */
    public static double accumulatedMelt(double d0, double p, double phi, double x) {
        double alpha = phi + (1.0 - phi) * p;
        double bPhi = d0 + phi * (1.0 - p);
        if (x == 0) {
            return 1.0 / bPhi;
        }
        return -Math.expm1(lnRemaining(alpha, bPhi, x)) / x;
    }

    /** Modal instantaneous extracted melt, (1/α)(1 − X)^(1/α − 1) with α = φ + (1 − φ)D. */
    public static double melt(double d, double phi, double x) {
        return melt(d, d, phi, x);
    }

    /** Modal accumulated extracted melt, [1 − (1 − X)^(1/α)]/X. */
    public static double accumulatedMelt(double d, double phi, double x) {
        return accumulatedMelt(d, d, phi, x);
    }

    /** (1/α)·ln(1 − αX/B_φ), exact as α → 0. */
    private static double lnRemaining(double alpha, double bPhi, double x) {
        return -(x / bPhi) * Shaw1970.log1pOverX(-alpha * x / bPhi);
    }
}
