package org.tectomelt.engine.crust;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Random;
import org.junit.jupiter.api.Test;

class TridiagonalTest {

    @Test
    void solvesADiagonallyDominantSystemToRoundOff() {
        int n = 200;
        Random rnd = new Random(7);
        double[] lo = new double[n];
        double[] di = new double[n];
        double[] up = new double[n];
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            lo[i] = i == 0 ? 0 : -rnd.nextDouble();
            up[i] = i == n - 1 ? 0 : -rnd.nextDouble();
            di[i] = 1 + Math.abs(lo[i]) + Math.abs(up[i]) + rnd.nextDouble();
            x[i] = rnd.nextGaussian() * 100;
        }
        double[] d = new double[n];
        for (int i = 0; i < n; i++) {
            d[i] = di[i] * x[i] + (i > 0 ? lo[i] * x[i - 1] : 0) + (i < n - 1 ? up[i] * x[i + 1] : 0);
        }
        Tridiagonal.solve(lo, di, up, d, new double[n], n);
        for (int i = 0; i < n; i++) {
            assertEquals(x[i], d[i], 1e-9 * Math.max(1, Math.abs(x[i])));
        }
    }
}
