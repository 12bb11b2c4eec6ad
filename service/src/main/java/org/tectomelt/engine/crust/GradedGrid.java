package org.tectomelt.engine.crust;

import java.util.function.DoubleUnaryOperator;
import org.tectomelt.engine.EngineException;

/**
 * Cell sizes of a smoothly stretched 1-D grid: fine at chosen faces (the sill contacts), growing
 * geometrically away from them, capped at a largest size.
 *
 * <p>The wanted size at depth z is s(z) = min(s_max, min_a (h + (r − 1) |z − z_a|)) over the
 * refined faces z_a, with h the finest size and r the growth ratio: a cell at distance d from a
 * refined face is about (r − 1) d + h, so neighbouring cells differ by a factor of about r. The
 * faces are placed at equal steps of the stretched coordinate ξ(z) = ∫ dz / s(z) (a smooth
 * coordinate stretching, as in the grid-generation texts, e.g. Thompson, Warsi &amp; Mastin 1985,
 * Numerical Grid Generation, ch. 8 — common practice), with a whole number of cells per segment,
 * so every segment end is a face exactly and no cell is larger than its wanted size.
 */
final class GradedGrid {

    /** Sub-steps per cell of the quadrature of ξ: enough that the cell sizes follow s(z) to a fraction of a per cent. */
    private static final int SUBSTEPS = 32;

    private GradedGrid() {
    }

    /**
     * The wanted cell size: the finest size at the refined faces, growing by {@code growth} per cell away
     * from them, at most {@code largest}.
     */
    static DoubleUnaryOperator wanted(double finest, double growth, double largest, double... refined) {
        return z -> {
            double s = largest;
            for (double a : refined) {
                s = Math.min(s, finest + (growth - 1) * Math.abs(z - a));
            }
            return s;
        };
    }

    /**
     * Cell sizes (m) filling [a, b] with at most the wanted size {@code s} anywhere, faces spread at
     * equal steps of ξ = ∫ dz / s.
     */
    static double[] segment(double a, double b, DoubleUnaryOperator s) {
        if (!(b > a)) {
            throw new EngineException("a grid segment needs a positive length");
        }
        double xi = stretch(a, b, s, Double.NaN, null);
        int n = Math.max(1, (int) Math.ceil(xi - 1e-9));
        double[] faces = new double[n + 1];
        faces[0] = a;
        faces[n] = b;
        if (n > 1) {
            stretch(a, b, s, xi / n, faces);
        }
        double[] sizes = new double[n];
        for (int i = 0; i < n; i++) {
            sizes[i] = faces[i + 1] - faces[i];
            if (!(sizes[i] > 0)) {
                throw new EngineException("the graded grid could not place its cells");
            }
        }
        return sizes;
    }

    /**
     * Integrates ξ over [a, b] by the midpoint rule on sub-steps of a fraction of the local wanted size;
     * when {@code faces} is given, records the depth at each multiple of {@code step} of ξ (linear within a
     * sub-step) into faces[1..n−1]. Returns ξ(b).
     */
    private static double stretch(double a, double b, DoubleUnaryOperator s, double step, double[] faces) {
        double z = a;
        double xi = 0;
        int next = 1;
        while (z < b) {
            double dz = Math.min(b - z, s.applyAsDouble(z) / SUBSTEPS);
            double dxi = dz / s.applyAsDouble(z + dz / 2);
            if (faces != null) {
                while (next < faces.length - 1 && next * step <= xi + dxi) {
                    faces[next] = z + dz * (next * step - xi) / dxi;
                    next++;
                }
            }
            xi += dxi;
            z = dz == b - z ? b : z + dz;
        }
        if (faces != null) {
            while (next < faces.length - 1) {
                faces[next] = b - (faces.length - 1 - next) * 1e-9 * (b - a);
                next++;
            }
        }
        return xi;
    }

    /** Concatenation of cell-size arrays. */
    static double[] join(double[]... parts) {
        int n = 0;
        for (double[] p : parts) {
            n += p.length;
        }
        double[] all = new double[n];
        int k = 0;
        for (double[] p : parts) {
            System.arraycopy(p, 0, all, k, p.length);
            k += p.length;
        }
        return all;
    }
}
