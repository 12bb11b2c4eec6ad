package org.tectomelt.engine.composition;

import java.util.List;
import java.util.Locale;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;

/**
 * The mineralogy of melting peridotite: source modes in the spinel and garnet fields, the melting
 * reaction of each field, the reaction once clinopyroxene is used up, and the pressure interval of
 * the spinel → garnet transition. Arrays are indexed by {@link Mineral#ordinal()}: ol, opx, cpx, grt, sp.
 *
 * <p><b>Transition.</b> The garnet share w of the aluminous phase rises linearly from 0 at
 * {@link #GARNET_IN_PRESSURE_PA} to 1 at {@link #SPINEL_OUT_PRESSURE_PA}. Robinson &amp; Wood (1998)
 * place garnet-in on the solidus of fertile peridotite near 2.8 GPa (from memory); Klemme &amp;
 * O'Neill (2000) show spinel and garnet coexisting over an interval that widens with Cr (from memory).
 * The 0.3 GPa width is this project's choice within that picture. The residue at pressure P is the
 * blend (1 − w)·(spinel-field residue) + w·(garnet-field residue), each field's source mode melted to
 * the current F by that field's reaction: the solid-state change between the fields keeps the
 * residue's element budget and changes only its bulk D and P. Which field earlier increments melted
 * in is followed for the elements, not for the modes.
 *
 * <p><b>Default values</b> (all recalled, not read from the papers; check them before quantitative
 * use, or pass your own):
 * <ul>
 * <li>spinel-field source mode ol 0.57, opx 0.28, cpx 0.13, sp 0.02: the depleted MORB mantle of
 *     Workman &amp; Hart (2005; from memory);</li>
 * <li>garnet-field source mode ol 0.60, opx 0.20, cpx 0.10, grt 0.10: a typical garnet lherzolite
 *     (common practice, rounded; no single source);</li>
 * <li>spinel-field reaction ol 0.10, opx 0.20, cpx 0.68, sp 0.02 (melting proportions of Johnson,
 *     Dick &amp; Shimizu 1990; from memory);</li>
 * <li>garnet-field reaction 0.08 ol − 0.19 opx + 0.81 cpx + 0.30 grt = 1 melt (opx crystallises; the
 *     3 GPa reaction of Walter 1998; from memory);</li>
 * <li>after cpx is used up, ol 0.25, opx 0.75, the aluminous phase inert: an assumption of this
 *     project (harzburgite melting dominated by opx; no published proportions recalled).</li>
 * </ul>
 * Where a mineral other than cpx runs out, its share is spread over the minerals still entering the
 * melt in proportion to their shares (see {@link ColumnComposition}).
 *
 * <p>Accuracy: the modes and reactions are rounded to about ±0.02–0.05 in each proportion; the
 * largest effect is on garnet-hosted elements (HREE, Y), whose melt concentrations move by tens of
 * per cent with the garnet mode and reaction coefficient.
 */
public final class MantleMineralogy {

    /** Garnet appears on the solidus of fertile peridotite (Pa): Robinson &amp; Wood 1998, from memory. */
    public static final double GARNET_IN_PRESSURE_PA = 2.8e9;
    /** Spinel is gone and garnet is the only aluminous phase (Pa): this project's 0.3 GPa interval. */
    public static final double SPINEL_OUT_PRESSURE_PA = 3.1e9;

    /** Spinel-field source mode (depleted MORB mantle of Workman &amp; Hart 2005, from memory). */
    public static final ModelInfo WORKMAN_HART_2005_MODE = new ModelInfo("dmm-mode-workman-hart2005",
            "Workman, R.K. & Hart, S.R. (2005) Major and trace element composition of the depleted MORB mantle "
                    + "(DMM). Earth and Planetary Science Letters 231(1-2), 53-72 (spinel-field mode, from memory)",
            "10.1016/j.epsl.2004.12.005");
    /** Spinel-field melting proportions. */
    public static final ModelInfo JOHNSON_1990_REACTION = new ModelInfo("spinel-field-reaction-johnson1990",
            "Johnson, K.T.M., Dick, H.J.B. & Shimizu, N. (1990) Melting in the oceanic upper mantle: an ion "
                    + "microprobe study of diopsides in abyssal peridotites. Journal of Geophysical Research 95(B3), "
                    + "2661-2678 (melting proportions, from memory)", "10.1029/JB095iB03p02661");
    /** Garnet-field melting reaction. */
    public static final ModelInfo WALTER_1998_REACTION = new ModelInfo("garnet-field-reaction-walter1998",
            "Walter, M.J. (1998) Melting of garnet peridotite and the origin of komatiite and depleted "
                    + "lithosphere. Journal of Petrology 39(1), 29-60 (3 GPa melting reaction, from memory)",
            "10.1093/petroj/39.1.29");
    /** Garnet-in on the solidus. */
    public static final ModelInfo ROBINSON_WOOD_1998 = new ModelInfo("spinel-garnet-robinson-wood1998",
            "Robinson, J.A.C. & Wood, B.J. (1998) The depth of the spinel to garnet transition at the peridotite "
                    + "solidus. Earth and Planetary Science Letters 164(1-2), 277-284", "10.1016/S0012-821X(98)00213-1");
    /** Width of the spinel–garnet interval. */
    public static final ModelInfo KLEMME_ONEILL_2000 = new ModelInfo("spinel-garnet-klemme-oneill2000",
            "Klemme, S. & O'Neill, H.St.C. (2000) The near-solidus transition from garnet lherzolite to spinel "
                    + "lherzolite. Contributions to Mineralogy and Petrology 138(3), 237-248",
            "10.1007/s004100050560");

    /** The defaults listed above. */
    public static final MantleMineralogy DEFAULT = new MantleMineralogy(
            new double[] {0.57, 0.28, 0.13, 0.0, 0.02},
            new double[] {0.60, 0.20, 0.10, 0.10, 0.0},
            new double[] {0.10, 0.20, 0.68, 0.0, 0.02},
            new double[] {0.08, -0.19, 0.81, 0.30, 0.0},
            new double[] {0.25, 0.75, 0.0, 0.0, 0.0},
            GARNET_IN_PRESSURE_PA, SPINEL_OUT_PRESSURE_PA, List.of(WORKMAN_HART_2005_MODE, JOHNSON_1990_REACTION,
            WALTER_1998_REACTION, ROBINSON_WOOD_1998, KLEMME_ONEILL_2000));

    private static final double SUM_TOLERANCE = 1e-6;

    private final double[] spinelMode;
    private final double[] garnetMode;
    private final double[] spinelReaction;
    private final double[] garnetReaction;
    private final double[] afterCpxReaction;
    private final double garnetInPressure;
    private final double spinelOutPressure;
    private final List<ModelInfo> models;

    /**
     * A mineralogy; each array has one entry per {@link Mineral}, in declaration order.
     *
     * @param spinelMode        source mode in the spinel field (mass fractions, ≥ 0, sum 1)
     * @param garnetMode        source mode in the garnet field (mass fractions, ≥ 0, sum 1)
     * @param spinelReaction    proportions entering the melt in the spinel field (sum 1; a negative entry
     *                          is a mineral that crystallises)
     * @param garnetReaction    the same in the garnet field
     * @param afterCpxReaction  the same once cpx is used up (its cpx entry must be 0)
     * @param garnetInPressure  pressure where garnet appears (Pa)
     * @param spinelOutPressure pressure above which spinel is gone (Pa), &gt; garnetInPressure
     * @param models            the published sources of these values (empty for values of one's own)
     */
    public MantleMineralogy(double[] spinelMode, double[] garnetMode, double[] spinelReaction,
                            double[] garnetReaction, double[] afterCpxReaction, double garnetInPressure,
                            double spinelOutPressure, List<ModelInfo> models) {
        this.models = List.copyOf(models);
        this.spinelMode = checked("spinel-field mode", spinelMode, true);
        this.garnetMode = checked("garnet-field mode", garnetMode, true);
        this.spinelReaction = checked("spinel-field reaction", spinelReaction, false);
        this.garnetReaction = checked("garnet-field reaction", garnetReaction, false);
        this.afterCpxReaction = checked("reaction after cpx exhaustion", afterCpxReaction, false);
        if (afterCpxReaction[Mineral.CLINOPYROXENE.ordinal()] != 0) {
            throw new EngineException("the reaction after cpx exhaustion cannot consume cpx");
        }
        if (!(garnetInPressure > 0) || !(spinelOutPressure > garnetInPressure) || !Double.isFinite(spinelOutPressure)) {
            throw new EngineException("the spinel-out pressure must exceed the garnet-in pressure, both positive");
        }
        this.garnetInPressure = garnetInPressure;
        this.spinelOutPressure = spinelOutPressure;
    }

    private static double[] checked(String what, double[] v, boolean mode) {
        if (v == null || v.length != Mineral.COUNT) {
            throw new EngineException(what + " needs one value per mineral (" + Mineral.COUNT + ")");
        }
        double sum = 0;
        for (double x : v) {
            if (!Double.isFinite(x) || (mode && x < 0)) {
                throw new EngineException(what + ": every proportion must be finite" + (mode ? " and ≥ 0" : ""));
            }
            sum += x;
        }
        if (Math.abs(sum - 1.0) > SUM_TOLERANCE) {
            throw new EngineException(String.format(Locale.ROOT, "%s: proportions must sum to 1, got %.6f", what, sum));
        }
        return v.clone();
    }

    /** Garnet share w of the aluminous phase at pressure {@code p} (Pa): 0 in the spinel field, 1 in the garnet field. */
    public double garnetFraction(double p) {
        if (p <= garnetInPressure) {
            return 0.0;
        }
        if (p >= spinelOutPressure) {
            return 1.0;
        }
        return (p - garnetInPressure) / (spinelOutPressure - garnetInPressure);
    }

    /** Source mode in the spinel field (a copy). */
    public double[] spinelMode() {
        return spinelMode.clone();
    }

    /** Source mode in the garnet field (a copy). */
    public double[] garnetMode() {
        return garnetMode.clone();
    }

    /** Spinel-field reaction (a copy). */
    public double[] spinelReaction() {
        return spinelReaction.clone();
    }

    /** Garnet-field reaction (a copy). */
    public double[] garnetReaction() {
        return garnetReaction.clone();
    }

    /** Reaction after cpx exhaustion (a copy). */
    public double[] afterCpxReaction() {
        return afterCpxReaction.clone();
    }

    /** Garnet-in pressure (Pa). */
    public double garnetInPressure() {
        return garnetInPressure;
    }

    /** Spinel-out pressure (Pa). */
    public double spinelOutPressure() {
        return spinelOutPressure;
    }

    /** Source mode at pressure {@code p} (Pa): the blend of the two fields' modes. */
    public double[] sourceModeAt(double p) {
        double w = garnetFraction(p);
        double[] m = new double[Mineral.COUNT];
        for (int i = 0; i < m.length; i++) {
            m[i] = (1 - w) * spinelMode[i] + w * garnetMode[i];
        }
        return m;
    }

    /** The published sources of these values (empty for values of one's own). */
    public List<ModelInfo> models() {
        return models;
    }

    double[] spinelModeRef() {
        return spinelMode;
    }

    double[] garnetModeRef() {
        return garnetMode;
    }

    double[] reactionRef(boolean garnetField) {
        return garnetField ? garnetReaction : spinelReaction;
    }

    double[] afterCpxReactionRef() {
        return afterCpxReaction;
    }
}
