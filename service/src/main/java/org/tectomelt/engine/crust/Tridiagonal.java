package org.tectomelt.engine.crust;

/**
 * The Thomas algorithm for a tridiagonal system, O(n). Stable without pivoting for the
 * diagonally dominant matrices of implicit conduction (Press et al., Numerical Recipes, §2.4).
 */
final class Tridiagonal {

    private Tridiagonal() {
    }

    /**
     * Solves a x = d in place of {@code d} for rows 0..n−1.
     *
     * @param lower sub-diagonal, lower[i] multiplies x[i − 1] (lower[0] unused)
     * @param diag  diagonal
     * @param upper super-diagonal, upper[i] multiplies x[i + 1] (upper[n − 1] unused)
     * @param d     right-hand side on entry, solution on exit
     * @param work  scratch of length ≥ n
     * @param n     number of rows
     */
    static void solve(double[] lower, double[] diag, double[] upper, double[] d, double[] work, int n) {
        double beta = diag[0];
        d[0] /= beta;
        for (int i = 1; i < n; i++) {
            work[i] = upper[i - 1] / beta;
            beta = diag[i] - lower[i] * work[i];
            d[i] = (d[i] - lower[i] * d[i - 1]) / beta;
        }
        for (int i = n - 2; i >= 0; i--) {
            d[i] -= work[i + 1] * d[i + 1];
        }
    }
}
