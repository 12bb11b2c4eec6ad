package org.tectomelt.engine.crust;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.function.DoubleUnaryOperator;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;

class GradedGridTest {

    @Test
    void theCellsFillTheSegmentExactlyAndFollowTheWantedSize() {
        DoubleUnaryOperator s = GradedGrid.wanted(0.1, 1.1, 250, 28e3);
        double[] above = GradedGrid.segment(0, 28e3, s);
        double[] below = GradedGrid.segment(28e3, 60e3, s);
        double sum = 0;
        double z = 0;
        for (double d : GradedGrid.join(above, below)) {
            // never coarser than wanted (a cell spans [z, z + d]; the wanted size at its nearer end bounds it)
            assertTrue(d <= Math.max(s.applyAsDouble(z), s.applyAsDouble(z + d)) * (1 + 1e-6), "cell " + d + " at " + z);
            sum += d;
            z += d;
        }
        assertEquals(60e3, sum, 1e-6);
        assertEquals(28e3, sumOf(above), 1e-9, "the sill face is a face of the grid");
        // finest at the refined face, largest far from it: a range of more than 1000
        // the cell beside the refined face is the finest size to within the growth over its own width
        assertTrue(above[above.length - 1] <= 0.1 * 1.1 && below[0] <= 0.1 * 1.1, above[above.length - 1] + " " + below[0]);
        assertTrue(above[0] > 240 && below[below.length - 1] > 240, above[0] + " " + below[below.length - 1]);
    }

    @Test
    void neighbouringCellsDifferByAboutTheGrowthRatio() {
        double[] cells = GradedGrid.segment(0, 500, GradedGrid.wanted(0.05, 1.1, 20, 0, 500));
        for (int i = 1; i < cells.length; i++) {
            double ratio = Math.max(cells[i] / cells[i - 1], cells[i - 1] / cells[i]);
            assertTrue(ratio < 1.1 * 1.01, "cells " + (i - 1) + "," + i + ": ratio " + ratio);
        }
        // symmetric refinement at both ends: the two end cells alike
        assertEquals(cells[0], cells[cells.length - 1], 0.01 * cells[0]);
    }

    @Test
    void aSegmentNeedsALength() {
        assertThrows(EngineException.class, () -> GradedGrid.segment(5, 5, z -> 1));
    }

    private static double sumOf(double[] a) {
        double s = 0;
        for (double d : a) {
            s += d;
        }
        return s;
    }
}
