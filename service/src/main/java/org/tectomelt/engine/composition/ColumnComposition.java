package org.tectomelt.engine.composition;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.function.DoubleUnaryOperator;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.MeltingColumn;
import org.tectomelt.engine.column.MeltingMode;
import org.tectomelt.engine.column.SourceColumn;
import org.tectomelt.engine.column.ProfilePoint;
import org.tectomelt.engine.melting.MantleLithology;

/**
 * Trace elements in the melts and residues of a melting column, integrated increment by increment
 * along its F(P) with the bulk D and P of the current mineralogy (the practice for a column whose
 * mineralogy changes; common practice).
 *
 * <p><b>Bookkeeping.</b> Per unit mass of source: the residue's mineral masses mᵢ (Σmᵢ = 1 − F), the
 * mass Q of the element in the residue system (solid and the melt it retains), the mass E already
 * extracted, E + Q = C₀. The solid's capacity is S = Σ mᵢKᵢ, so that a melt in equilibrium with the
 * residue holds C_L = Q/(S + M_r), M_r the retained melt mass. Until the melt fraction reaches the
 * retained fraction φ nothing leaves (C_L = C₀/(S + F), batch); after it the residue keeps
 * M_r = r(1 − F), r = φ/(1 − φ), and extracts dX = dF/(1 − φ), so dQ = −C_L dX. Within an increment
 * the reaction pᵢ is fixed, hence S and B = S + r(1 − F) are linear in F (slope −(P + r), P = Σ pᵢKᵢ)
 * and the increment integrates exactly:
 * <pre>  Q_b = Q_a · (B_b/B_a)^(1/((1 − φ)(P + r)))  =  Q_a · exp( −ΔF/((1 − φ)B_a) · ln(1 + x)/x ),  x = −(P + r)ΔF/B_a</pre>
 * φ = 0 is fractional melting (Shaw 1970), 0 &lt; φ &lt; 1 near-fractional (dynamic) melting (Zou 1998),
 * and batch melting is the case where the threshold is never reached. With a fixed mineralogy this
 * reproduces the closed forms of {@link Shaw1970} and {@link Zou1998DynamicMelting} to rounding; mass
 * balance F·C̄_L + (1 − F)·C_s = C₀ holds at every point to rounding, C̄_L being all the melt made so
 * far (extracted and retained) and C_s the solid residue.
 *
 * <p><b>Mineralogy along the column</b> ({@link MantleMineralogy}): two residues are followed, the
 * spinel-field and the garnet-field source each melted by its own reaction, and blended with the
 * garnet share w(P) of the increment's mid-pressure (the output points use their own pressure).
 * Increments end exactly where a mineral is used up. Clinopyroxene is exhausted where the column's
 * melting law says (its {@link MantleLithology#exhaustionMeltFraction}, Katz et al. 2003: cpx enters the
 * melt at m_cpx/(F_cpx-out − F) per unit melt, the other minerals keep the ratios of the field's
 * reaction), or, for a law without one, where the reaction has consumed it; then the reaction after cpx
 * exhaustion applies. Another mineral that runs out stops entering the melt, and its share is spread
 * over the minerals still melting in proportion to their shares.
 *
 * <p><b>Melt fraction.</b> The melt made is the running maximum of the column's F (where a hydrous
 * column refreezes near the surface the extracted melt does not return).
 *
 * @param elements             the elements to follow, in output order
 * @param source               source concentrations (ppm), covering every element
 * @param coefficients         mineral/melt partition coefficients, covering every element
 * @param mineralogy           modes, reactions and the spinel–garnet transition
 * @param mode                 batch, fractional or near-fractional melting
 * @param retainedMeltFraction φ, the melt mass fraction kept in the residue in near-fractional melting
 *                             (0 ≤ φ ≤ {@value #MAX_RETAINED_MELT_FRACTION}); ignored otherwise
 */
public record ColumnComposition(List<Element> elements, ElementAbundances source, PartitionCoefficients coefficients,
                                MantleMineralogy mineralogy, MeltingMode mode, double retainedMeltFraction) {

    /** Increment-by-increment integration of trace-element melting along a column. */
    public static final ModelInfo INFO = new ModelInfo("incremental-trace-element-melting",
            "Increment-by-increment integration of the melting equations of Shaw (1970) and Zou (1998) along a "
                    + "column with the current bulk D and P (common practice)", "");
    /** Largest retained melt fraction φ accepted for near-fractional melting. */
    public static final double MAX_RETAINED_MELT_FRACTION = 0.3;
    /** A mineral mass below this (per unit source mass) counts as used up. */
    static final double EXHAUSTED = 1e-13;

    private static final int OL = Mineral.OLIVINE.ordinal();
    private static final int CPX = Mineral.CLINOPYROXENE.ordinal();
    private static final int N = Mineral.COUNT;

    static {
        if (N != 5) {
            throw new ExceptionInInitializerError("the bulk sums are written out for five minerals, not " + N);
        }
    }

    /** Validates coverage and the retained fraction. */
    public ColumnComposition {
        elements = List.copyOf(elements);
        if (elements.isEmpty()) {
            throw new EngineException("at least one element is needed");
        }
        if (new LinkedHashSet<>(elements).size() != elements.size()) {
            throw new EngineException("an element is listed twice");
        }
        for (Element e : elements) {
            if (!source.covers(e)) {
                throw new EngineException("source " + source.id() + " has no concentration of " + e.symbol());
            }
            if (!coefficients.covers(e)) {
                throw new EngineException("partition coefficients " + coefficients.id() + " have no row for "
                        + e.symbol());
            }
        }
        if (mode == MeltingMode.NEAR_FRACTIONAL
                && !(retainedMeltFraction >= 0 && retainedMeltFraction <= MAX_RETAINED_MELT_FRACTION)) {
            throw new EngineException(String.format(Locale.ROOT,
                    "the retained melt fraction must be between 0 and %.2f", MAX_RETAINED_MELT_FRACTION));
        }
    }

    /** The default tables and mineralogy for these elements and mode. */
    public static ColumnComposition of(List<Element> elements, MeltingMode mode, double retainedMeltFraction) {
        return new ColumnComposition(elements, CompositionTables.defaultSource(),
                CompositionTables.defaultPartitionCoefficients(), MantleMineralogy.DEFAULT, mode, retainedMeltFraction);
    }

    /** The retained melt fraction in effect: 0 for fractional, 1 (never reached) for batch melting. */
    double threshold() {
        return switch (mode) {
            case BATCH -> 1.0;
            case FRACTIONAL -> 0.0;
            case NEAR_FRACTIONAL -> retainedMeltFraction;
        };
    }

    /**
     * Composition along a column's output profile, cpx exhausted where its melting law says.
     *
     * @param column a solved column; its profile runs from the onset up to the top
     */
    public CompositionResult along(ColumnResult column) {
        List<ProfilePoint> pts = column.profile();
        int n = pts.size();
        double[] z = new double[n];
        double[] p = new double[n];
        double[] f = new double[n];
        for (int i = 0; i < n; i++) {
            ProfilePoint pt = pts.get(i);
            z[i] = pt.depth();
            p[i] = pt.pressure();
            f[i] = pt.meltFraction();
        }
        MantleLithology lith = peridotite(column.column());
        boolean declares = n > 0 && (lith.exhaustionMeltFraction(p[0]) < 1.0 || lith.exhaustionMeltFraction(p[n - 1]) < 1.0);
        // z and p are this call's own arrays: the result keeps them (the public path below copies its arguments)
        return new Run(n).integrate(z, p, f, declares ? lith::exhaustionMeltFraction : null);
    }

    /** The one peridotite a column melts; trace elements are not modelled for a mixed source. */
    private static MantleLithology peridotite(MeltingColumn column) {
        if (column instanceof DecompressionColumn d) {
            return d.lithology();
        }
        if (column instanceof SourceColumn s && s.lithologies().size() == 1) {
            return s.lithologies().get(0);
        }
        throw new EngineException("trace elements are modelled for a source of one peridotite, not a mixed source");
    }

    /**
     * Composition along a path of points from the deepest upwards.
     *
     * @param depth         depth of each point (m)
     * @param pressure      pressure of each point (Pa), not increasing upwards
     * @param meltFraction  the column's melt fraction F at each point (0–1)
     * @param cpxExhaustion melt fraction of cpx exhaustion as a function of pressure (Pa), or null to let
     *                      the melting reaction use cpx up
     */
    public CompositionResult along(double[] depth, double[] pressure, double[] meltFraction,
                                   DoubleUnaryOperator cpxExhaustion) {
        int n = depth.length;
        if (pressure.length != n || meltFraction.length != n) {
            throw new IllegalArgumentException("depth, pressure and melt fraction need the same length");
        }
        return new Run(n).integrate(depth.clone(), pressure.clone(), meltFraction, cpxExhaustion);
    }

    /** Every published model the composition rests on. */
    public List<ModelInfo> models() {
        Set<ModelInfo> m = new LinkedHashSet<>();
        m.add(INFO);
        m.add(mode == MeltingMode.NEAR_FRACTIONAL ? Zou1998DynamicMelting.INFO : Shaw1970.INFO);
        m.addAll(coefficients.models());
        m.addAll(source.models());
        m.addAll(mineralogy.models());
        return List.copyOf(m);
    }

    /** The assumptions, in words. */
    public List<String> assumptions() {
        List<String> a = new ArrayList<>();
        a.add(switch (mode) {
            case BATCH -> "batch melting: all melt stays in equilibrium with its residue up to the top";
            case FRACTIONAL -> "fractional melting: every increment of melt leaves its residue at once";
            case NEAR_FRACTIONAL -> String.format(Locale.ROOT, "near-fractional (dynamic) melting: the residue keeps "
                    + "a melt mass fraction of %.3g and every increment beyond it leaves (Zou 1998)",
                    retainedMeltFraction);
        });
        a.add(String.format(Locale.ROOT, "mineralogy: spinel field below %.2f GPa, garnet field above %.2f GPa, "
                + "linear between; the residue blends the two fields' residues; bulk D and P recomputed at every "
                + "increment", mineralogy.garnetInPressure() * 1e-9, mineralogy.spinelOutPressure() * 1e-9));
        a.add("the melt made is the running maximum of the column's melt fraction; pooled melts are mixed "
                + "without further reaction with the mantle they cross");
        return a;
    }

    /**
     * One integration; mutable scratch state. The partition coefficients are held element by element
     * ({@code kE[e·N + j]}), so that a bulk sum Σ xⱼKⱼ is five products in a row per element.
     */
    private final class Run {
        private final int n;
        private final int ne;
        private final double[] kE;
        private final double[] c0;
        /** Mineral masses of the spinel-field [0] and garnet-field [1] residues. */
        private final double[][] m = new double[2][];
        private final boolean[] cpxOut = new boolean[2];
        private final double[][] reaction = new double[2][N];
        private final double[] mix = new double[N];
        private final double[] pMix = new double[N];
        private final double[] q;
        private final double[] extracted;
        /** Bulk sums of the current step, per element: Σ xⱼKⱼ (the solid's capacity S) and Σ pⱼKⱼ (P). */
        private final double[] bulkS;
        private final double[] bulkP;
        /** The garnet share bulkS was built for, and whether the residues are unchanged since (then it is reused). */
        private double bulkSW = Double.NaN;
        private boolean bulkSFresh;
        /** Residues still melted: both, or only the spinel-field one once garnet is gone for good. */
        private int residues = 2;
        private final double phi = threshold();
        private final double r = phi < 1 ? phi / (1 - phi) : 0.0;
        private double f;

        Run(int n) {
            this.n = n;
            this.ne = elements.size();
            this.kE = new double[N * ne];
            this.c0 = new double[ne];
            for (int e = 0; e < ne; e++) {
                double[] row = coefficients.row(elements.get(e));
                for (int j = 0; j < N; j++) {
                    kE[e * N + j] = row[j];
                }
                c0[e] = source.ppm(elements.get(e));
            }
            bulkS = new double[ne];
            bulkP = new double[ne];
            m[0] = mineralogy.spinelModeRef().clone();
            m[1] = mineralogy.garnetModeRef().clone();
            q = c0.clone();
            extracted = new double[ne];
        }

        /** Integrates along the points; z and p are kept by the result, not copied. */
        CompositionResult integrate(double[] z, double[] p, double[] fCol, DoubleUnaryOperator cpxExhaustion) {
            double[] values = new double[2 * n * ne];
            double[] mixes = new double[n * N];
            double[] fOut = new double[n];
            double[] w = new double[n];
            // past the last point (or step) with any garnet share, the garnet-field residue has weight 0 in every
            // blend: it is no longer melted (the blends, and so the results, are the same)
            int lastGarnet = -1;
            for (int i = 0; i < n; i++) {
                if (mineralogy.garnetFraction(p[i]) > 0 || (i > 0 && mineralogy.garnetFraction(0.5 * (p[i - 1] + p[i])) > 0)) {
                    lastGarnet = i;
                }
            }
            for (int i = 0; i < n; i++) {
                if (i > 0) {
                    double target = Math.max(f, clampFraction(fCol[i]));
                    if (target > f) {
                        double pm = 0.5 * (p[i - 1] + p[i]);
                        double exh = cpxExhaustion == null ? Double.NaN : cpxExhaustion.applyAsDouble(pm);
                        residues = i > lastGarnet ? 1 : 2;
                        melt(target, mineralogy.garnetFraction(pm), exh);
                    }
                }
                fOut[i] = f;
                w[i] = mineralogy.garnetFraction(p[i]);
                output(w[i], values, 2 * i * ne);
                System.arraycopy(mix, 0, mixes, i * N, N);
            }
            return new CompositionResult(ColumnComposition.this, ne, kE, z, p, fOut, w, mixes, values);
        }

        private double clampFraction(double x) {
            if (!(x >= 0) || !(x < 1)) {
                throw new EngineException("melt fractions along the column must lie in [0, 1), got " + x);
            }
            return x;
        }

        /** Melts from the current F to {@code target} at garnet share {@code w}. */
        private void melt(double target, double w, double exhaustion) {
            int guard = 0;
            while (f < target) {
                if (++guard > 100) {
                    throw new IllegalStateException("composition increment did not converge");
                }
                double h = target - f;
                for (int t = 0; t < residues; t++) {
                    double[] rt = reaction[t];
                    double[] mt = m[t];
                    reactionOf(t, exhaustion, rt);
                    for (int j = 0; j < N; j++) {
                        // the mineral runs out within h: the division only where it may shorten the step
                        // (a multiplication first; the margin covers its rounding, so h is the same as always dividing)
                        if (rt[j] > 0 && mt[j] <= h * rt[j] * (1 + 1e-9)) {
                            h = Math.min(h, mt[j] / rt[j]);
                        }
                    }
                }
                boolean crossesThreshold = f < phi && f + h > phi;
                if (crossesThreshold) {
                    h = phi - f;
                }
                if (f >= phi) {
                    extract(h, w);
                }
                bulkSFresh = false;
                for (int t = 0; t < residues; t++) {
                    for (int j = 0; j < N; j++) {
                        double mj = m[t][j] - reaction[t][j] * h;
                        m[t][j] = mj < EXHAUSTED ? 0.0 : mj;
                    }
                    if (m[t][CPX] == 0.0) {
                        cpxOut[t] = true;
                    }
                }
                f = (target - (f + h) < 1e-15) ? target : f + h;
            }
        }

        /**
         * Σ weightⱼ·Kⱼ for every element into {@code out}, the five minerals written out in their order (a sum
         * of five products per element in one pass; a zero weight adds an exact zero, so each sum is the same as
         * that of the minerals present alone).
         */
        private void bulk(double[] weight, double[] out) {
            double w0 = weight[0];
            double w1 = weight[1];
            double w2 = weight[2];
            double w3 = weight[3];
            double w4 = weight[4];
            double[] k = kE;
            for (int e = 0, o = 0; e < ne; e++, o += N) {
                double s = w0 * k[o];
                s += w1 * k[o + 1];
                s += w2 * k[o + 2];
                s += w3 * k[o + 3];
                s += w4 * k[o + 4];
                out[e] = s;
            }
        }

        /** Advances Q and E of every element over an increment h after the threshold. */
        private void extract(double h, double w) {
            solidCapacities(w);
            double w0 = 1 - w;
            for (int j = 0; j < N; j++) {
                pMix[j] = w0 * reaction[0][j] + w * reaction[1][j];
            }
            bulk(pMix, bulkP);
            double retained = r * (1 - f);
            double scale = 1.0 / (1 - phi);
            for (int e = 0; e < ne; e++) {
                double pb = bulkP[e];
                double hb = h / (bulkS[e] + retained);
                double qa = q[e];
                double y = -hb * scale * Shaw1970.log1pOverX(-(pb + r) * hb); // ln(Q_b/Q_a)
                double qb;
                double leaving;
                if (y > -0.5) {
                    // a small share leaves: by e^y − 1 directly, as Q_a − Q_b would lose its digits (all but about
                    // five of them at the first steps of a compatible element)
                    leaving = -qa * Shaw1970.expm1(y);
                    qb = qa - leaving;
                } else {
                    // most of it leaves: Q_b by e^y, so that a nearly stripped residue keeps its digits
                    qb = qa * Shaw1970.exp(y);
                    leaving = qa - qb;
                }
                q[e] = qb;
                extracted[e] += leaving;
            }
        }

        /**
         * The solid's capacity S = Σ xⱼKⱼ of every element into {@code bulkS} for the residues blended at garnet
         * share w. Kept when nothing has melted since it was built for the same w (an output point and the next
         * step inside one mineral field): the same numbers either way.
         */
        private void solidCapacities(double w) {
            if (bulkSFresh && w == bulkSW) {
                return;
            }
            double w0 = 1 - w;
            for (int j = 0; j < N; j++) {
                mix[j] = w0 * m[0][j] + w * m[1][j];
            }
            bulk(mix, bulkS);
            bulkSW = w;
            bulkSFresh = true;
        }

        /** The reaction of residue {@code t} now: proportions entering the melt, summing to 1. */
        private void reactionOf(int t, double exhaustion, double[] out) {
            double[] mt = m[t];
            if (cpxOut[t]) {
                System.arraycopy(mineralogy.afterCpxReactionRef(), 0, out, 0, N);
            } else {
                double[] base = mineralogy.reactionRef(t == 1);
                System.arraycopy(base, 0, out, 0, N);
                if (!Double.isNaN(exhaustion)) {
                    double left = exhaustion - f;
                    double pc = left > 1e-12 ? mt[CPX] / left : 1.0;
                    pc = Math.min(pc, 1.0);
                    double others = 1 - base[CPX];
                    double perOther = others > 0 ? (1 - pc) / others : 0.0;
                    for (int j = 0; j < N; j++) {
                        out[j] = j == CPX ? pc : base[j] * perOther;
                    }
                }
            }
            // minerals used up stop melting; their share goes to those still melting, pro rata
            double lost = 0;
            double melting = 0;
            for (int j = 0; j < N; j++) {
                if (out[j] > 0 && mt[j] == 0.0) {
                    lost += out[j];
                    out[j] = 0.0;
                } else if (out[j] > 0) {
                    melting += out[j];
                }
            }
            if (lost > 0) {
                if (melting > 0) {
                    double spread = lost / melting;
                    for (int j = 0; j < N; j++) {
                        if (out[j] > 0) {
                            out[j] += out[j] * spread;
                        }
                    }
                } else if (mt[OL] > 0) {
                    out[OL] += lost;
                } else {
                    throw new EngineException("the residue has no mineral left to melt");
                }
            }
        }

        /**
         * Concentrations at the current state for garnet share {@code w}, from {@code at}: the accumulated melt and
         * the residue of every element. The residue's mineral mix is left in {@code mix}: with it the result
         * derives the instantaneous melt from the residue (C_L = C_s·(1 − F)/S), so that it need not be stored.
         */
        private void output(double w, double[] values, int at) {
            solidCapacities(w);
            boolean open = f > phi;
            double retained = open ? r * (1 - f) : f;
            double perSolid = 1 / (1 - f);
            double perMelt = f > 0 ? 1 / f : 0.0;
            for (int e = 0; e < ne; e++) {
                double s = bulkS[e];
                double cl = q[e] / (s + retained);
                values[at + e] = f > 0 ? (extracted[e] + cl * retained) * perMelt : cl;
                values[at + ne + e] = cl * s * perSolid;
            }
        }
    }
}
