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

    /**
     * The melt fraction at pressure {@code p} (Pa) where the melting law changes branch because a
     * phase is used up (clinopyroxene for Katz et al. 2003), or 1 when the law has one branch.
     * There (∂T/∂F)_P jumps, so a decompression column stops and restarts its integration at it.
     */
    default double exhaustionMeltFraction(double p) {
        return 1.0;
    }

    /**
     * The exponent n of the melting law just above the start of a branch, F − F₀ ∝ (T − T₀)ⁿ
     * along an isobar: n = β1 (solidus branch) and β2 (after exhaustion) for Katz et al. (2003);
     * 1 where ∂F/∂T is finite and non-zero at the start of the branch (the default). A column
     * integrates in u = ((F − F₀)/(1 − F₀))^(1/n), in which both T and F are smooth even where
     * (∂T/∂F)_P is infinite.
     *
     * @param afterExhaustion false for the branch that starts at the solidus, true for the branch
     *                        that starts at {@link #exhaustionMeltFraction}
     */
    default double branchExponent(boolean afterExhaustion) {
        return 1.0;
    }

    /**
     * T(P, F) (K) on one branch of the melting law, the solidus branch continued with its own
     * formula past {@link #exhaustionMeltFraction}. A column integrating the solidus branch uses it,
     * so that an integration step straddling the exhaustion point sees a smooth law and the point
     * is located accurately. The default, for laws with one branch, is {@link #temperatureAt}.
     *
     * @param p               pressure (Pa)
     * @param f               melt fraction (on the exhaustion branch at least {@link #exhaustionMeltFraction})
     * @param bulkWater       bulk water (mass fraction)
     * @param afterExhaustion false for the solidus branch, true for the branch after exhaustion
     */
    default double temperatureOnBranch(double p, double f, double bulkWater, boolean afterExhaustion) {
        return temperatureAt(p, f, bulkWater);
    }

    /**
     * {@link #temperatureOnBranch} with the melt's water not capped at saturation: the same law
     * continued smoothly past the point where {@link #waterSaturationMargin} reaches zero, which a
     * column integrates up to that point (then on with the capped law). Equal to
     * {@link #temperatureOnBranch} wherever the melt is undersaturated; laws without a cap need not
     * override it.
     */
    default double temperatureBelowSaturation(double p, double f, double bulkWater, boolean afterExhaustion) {
        return temperatureOnBranch(p, f, bulkWater, afterExhaustion);
    }

    /**
     * Water dissolved in the melt (mass fraction) when the rock holds melt fraction {@code f} at
     * pressure {@code p} (Pa) with bulk water {@code bulkWater}, melt and residue in equilibrium
     * (batch). The default asks {@link #melt} at {@link #temperatureAt}; hydrous models with a
     * closed form override it.
     */
    default double waterInMelt(double p, double f, double bulkWater) {
        if (bulkWater <= 0 || f <= 0) {
            return 0.0;
        }
        return melt(p, temperatureAt(p, f, bulkWater), bulkWater).waterInMelt();
    }

    /**
     * How far below saturation the melt's water is at melt fraction {@code f} (mass fraction of
     * water; negative once the melt would hold more than it can dissolve and the law caps it). Its
     * zero is where T(P, F) changes form: a column starting there towards a top at zero pressure,
     * where the saturated water and so the solidus change without bound, integrates in a variable
     * that keeps that end regular. Laws without a saturation cap return {@code +∞} (the default).
     */
    default double waterSaturationMargin(double p, double f, double bulkWater) {
        return Double.POSITIVE_INFINITY;
    }

    /**
     * Bulk/melt partition coefficient D of water, for hydrous laws (0.01 for Katz et al. 2003); 0 for
     * dry laws. The water of a solid residue in equilibrium with melt holding X is D·X.
     */
    default double waterPartition() {
        return 0.0;
    }

    /**
     * Melt fraction (the extent of melting of the source) at pressure {@code p} (Pa) and temperature
     * {@code t} (K) when the melt present holds water {@code waterInMelt} (mass fraction), whatever
     * bulk water that implies: the form fractional melting needs, where the melt present is a small
     * retained fraction while the extent of melting grows. Dry laws ignore the water (the default).
     */
    default double meltFractionAtMeltWater(double p, double t, double waterInMelt) {
        return meltFraction(p, t, 0.0);
    }
}
