package org.tectomelt.engine.composition;

import java.util.List;
import org.tectomelt.engine.EngineException;

/**
 * Trace elements along a melting column: at each output point (from the onset upwards) the melt
 * fraction made so far, the garnet share of the aluminous phase, and for each element (in the order of
 * {@link ColumnComposition#elements()}) the concentration (ppm) in the instantaneous melt, in all the
 * melt made so far (accumulated: extracted and retained) and in the solid residue. Immutable.
 */
public final class CompositionResult {

    private final ColumnComposition model;
    private final double[] depth;
    private final double[] pressure;
    private final double[] meltFraction;
    private final double[] garnetFraction;
    private final int ne;
    /** Partition coefficients element by element, {@code kE[e·N + j]} (as the integration holds them). */
    private final double[] kE;
    /** Point by point, the mass of each mineral in the residue per unit source mass, {@code mix[i·N + j]}. */
    private final double[] mix;
    /**
     * Point by point, the accumulated melt and the residue of every element: {@code values[(2i + k)·ne + e]},
     * k = 0, 1 (one array, written and read in order). The instantaneous melt is not stored: it is the melt in
     * equilibrium with the residue, C_L = C_s·(1 − F)/S with the solid's capacity S = Σ mⱼKⱼ of the point's
     * mix, derived on access (a third fewer concentrations written per column).
     */
    private final double[] values;

    CompositionResult(ColumnComposition model, int ne, double[] kE, double[] depth, double[] pressure,
                      double[] meltFraction, double[] garnetFraction, double[] mix, double[] values) {
        this.model = model;
        this.ne = ne;
        this.kE = kE;
        this.depth = depth;
        this.pressure = pressure;
        this.meltFraction = meltFraction;
        this.garnetFraction = garnetFraction;
        this.mix = mix;
        this.values = values;
    }

    /** The model that produced this. */
    public ColumnComposition model() {
        return model;
    }

    /** The elements, in the order of the per-element indices. */
    public List<Element> elements() {
        return model.elements();
    }

    /** Number of points (0 when the column does not melt). */
    public int size() {
        return depth.length;
    }

    /** Depth of point {@code i} (m). */
    public double depth(int i) {
        return depth[i];
    }

    /** Pressure of point {@code i} (Pa). */
    public double pressure(int i) {
        return pressure[i];
    }

    /** Melt fraction made by point {@code i} (the running maximum of the column's F). */
    public double meltFraction(int i) {
        return meltFraction[i];
    }

    /** Garnet share of the aluminous phase at point {@code i}, 0 (spinel field) to 1 (garnet field). */
    public double garnetFraction(int i) {
        return garnetFraction[i];
    }

    /** Mass fraction of clinopyroxene in the solid residue at point {@code i} (0 once exhausted). */
    public double cpxInResidue(int i) {
        double solid = 1 - meltFraction[i];
        return mix[i * Mineral.COUNT + Mineral.CLINOPYROXENE.ordinal()] / solid;
    }

    /** Instantaneous melt leaving (or in equilibrium with) the residue at point {@code i} (ppm). */
    public double instantaneousMelt(int i, int element) {
        // S = Σ mⱼKⱼ summed as the integration sums it (in mineral order)
        double s = 0;
        for (int j = 0, o = i * Mineral.COUNT, k = element * Mineral.COUNT; j < Mineral.COUNT; j++) {
            s += mix[o + j] * kE[k + j];
        }
        return residue(i, element) * (1 - meltFraction[i]) / s;
    }

    /** All melt made up to point {@code i}, extracted and retained (ppm); the first drop at F = 0. */
    public double accumulatedMelt(int i, int element) {
        return values[2 * i * ne + element];
    }

    /** Solid residue at point {@code i} (ppm). */
    public double residue(int i, int element) {
        return values[(2 * i + 1) * ne + element];
    }

    /** Index of {@code e} among the elements. */
    public int indexOf(Element e) {
        int i = model.elements().indexOf(e);
        if (i < 0) {
            throw new EngineException(e.symbol() + " was not computed");
        }
        return i;
    }

    /**
     * The pooled melt and residue of the chosen regime.
     *
     * @param mantleFlowPassive true for a passive, triangular regime (a ridge, a rift), false for an
     *                          active column (a plume)
     */
    public Pooled pooled(boolean mantleFlowPassive) {
        return mantleFlowPassive ? pooledPassive(Double.POSITIVE_INFINITY) : pooledActive();
    }

    /**
     * Pooled melt of an active column: every parcel rises through the whole column, so the pooled melt
     * is the accumulated melt at the top and the residue that of the top.
     */
    public Pooled pooledActive() {
        requireMelt();
        int top = size() - 1;
        double[] melt = new double[ne];
        double[] res = new double[ne];
        System.arraycopy(values, 2 * top * ne, melt, 0, ne);
        System.arraycopy(values, (2 * top + 1) * ne, res, 0, ne);
        return new Pooled(meltFraction[top], melt, res);
    }

    /**
     * Pooled melt of a passive, triangular melting regime beneath a spreading centre (Plank &amp; Langmuir
     * 1992): streamlines turn away at every level between the top and the onset with equal mantle flux,
     * each having melted to the F of its turning level, so that
     * <pre>  C̄_pool = ∫ F·C̄_L dz / ∫ F dz,   C̄_res = ∫ (1 − F)·C_s dz / ∫ (1 − F) dz,   F̄ = ∫ F dz / H</pre>
     * over the melting height H (equivalently each increment of melt weighted by the share of
     * streamlines reaching its level). Trapezoidal in depth over the output points; mass balance
     * F̄·C̄_pool + (1 − F̄)·C̄_res = C₀ holds exactly, whatever the spacing.
     *
     * @param maxDepth streamlines turning deeper than this (m) are left out (for a rift: the melt below
     *                 the unstretched lithosphere was made before stretching); +∞ for all
     */
    public Pooled pooledPassive(double maxDepth) {
        requireMelt();
        double[] fc = new double[ne];
        double[] rc = new double[ne];
        double fInt = 0;
        double height = 0;
        // the trapezoids of the products F·C̄_L and (1 − F)·C_s over the intervals, the deep end of a cut interval
        // interpolated to the cut (so that F·C̄_L + (1 − F)·C_s = C₀ holds there as well): weight t/2 on the deep
        // point, (2 − t)/2 on the upper. Each point's weights from its two intervals are added first, so that
        // every point's values are read once.
        int n = size();
        double[] meltWeight = new double[n];
        double[] solidWeight = new double[n];
        for (int i = 0; i + 1 < n; i++) {
            double zDeep = depth[i];
            double zUp = depth[i + 1];
            if (zUp >= maxDepth) {
                continue;
            }
            double t = 1.0;
            if (zDeep > maxDepth) {
                t = (maxDepth - zUp) / (zDeep - zUp);
            }
            double dz = (zDeep - zUp) * t;
            double fDeep = meltFraction[i + 1] + t * (meltFraction[i] - meltFraction[i + 1]);
            double fUp = meltFraction[i + 1];
            fInt += 0.5 * dz * (fDeep + fUp);
            height += dz;
            meltWeight[i] += 0.5 * dz * t * meltFraction[i];
            meltWeight[i + 1] += 0.5 * dz * (2 - t) * fUp;
            solidWeight[i] += 0.5 * dz * t * (1 - meltFraction[i]);
            solidWeight[i + 1] += 0.5 * dz * (2 - t) * (1 - fUp);
        }
        for (int i = 0; i < n; i++) {
            double a = meltWeight[i];
            double b = solidWeight[i];
            if (a == 0.0 && b == 0.0) {
                continue;
            }
            int at = 2 * i * ne; // accumulated melt of point i; its residue follows
            for (int e = 0; e < ne; e++) {
                fc[e] += a * values[at + e];
                rc[e] += b * values[at + ne + e];
            }
        }
        if (!(fInt > 0)) {
            throw new EngineException("no melt is made above the pooling depth");
        }
        for (int e = 0; e < ne; e++) {
            fc[e] /= fInt;
            rc[e] /= height - fInt;
        }
        return new Pooled(fInt / height, fc, rc);
    }

    private void requireMelt() {
        if (size() < 2 || meltFraction[size() - 1] <= 0) {
            throw new EngineException("the column makes no melt, so there is no pooled melt");
        }
    }

    /**
     * A pooled melt and its residue.
     */
    public static final class Pooled {
        private final double meanMeltFraction;
        private final double[] melt;
        private final double[] residue;

        Pooled(double meanMeltFraction, double[] melt, double[] residue) {
            this.meanMeltFraction = meanMeltFraction;
            this.melt = melt;
            this.residue = residue;
        }

        /** Mean melt fraction of the regime (F̄, the mass of melt per mass of mantle melted). */
        public double meanMeltFraction() {
            return meanMeltFraction;
        }

        /** Pooled melt (ppm) of element index {@code e}. */
        public double melt(int e) {
            return melt[e];
        }

        /** Pooled residue (ppm) of element index {@code e}. */
        public double residue(int e) {
            return residue[e];
        }
    }
}
