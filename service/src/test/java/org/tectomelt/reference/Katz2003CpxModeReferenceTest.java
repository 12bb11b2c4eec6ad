package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.melting.Katz2003Peridotite;

/**
 * The cpx mass fraction Mcpx of the source in Katz, Spiegelman &amp; Langmuir (2003, G-cubed 4(9) 1073):
 * 0.10–0.17 from depleted to fertile peridotite (their Table 2 and text, from memory); cpx is
 * exhausted at F_cpx-out = Mcpx/(r1 + r2 P) [REFERENCES §2.1], so a depleted source leaves the steep
 * solidus branch earlier and melts less.
 */
class Katz2003CpxModeReferenceTest {

    private static final double GPA = 1e9;
    private static final double C = 273.15;

    @Test
    void cpxRunsOutAtMcpxOverRcpx() {
        Katz2003Peridotite depleted = new Katz2003Peridotite(Katz2003Peridotite.DEPLETED_CPX_MODE);
        // REFERENCES §2.1: Rcpx = 0.5 + 0.08 P
        assertEquals(0.10 / 0.58, depleted.cpxExhaustionFraction(1 * GPA), 1e-12);
        assertEquals(0.17 / 0.66, Katz2003Peridotite.fertile().cpxExhaustionFraction(2 * GPA), 1e-12);
        assertEquals(depleted.drySolidus(2 * GPA), Katz2003Peridotite.fertile().drySolidus(2 * GPA), 0.0);
    }

    @Test
    void aDepletedSourceMakesLessCrustOnTheSameAdiabat() {
        double tp = 1400 + C;
        double fertile = DecompressionColumn.of(Katz2003Peridotite.fertile(), tp, 0).solve().crustalThickness();
        double depleted = DecompressionColumn.of(new Katz2003Peridotite(0.10), tp, 0).solve().crustalThickness();
        assertTrue(depleted < fertile, depleted + " vs " + fertile);
        double top = DecompressionColumn.of(new Katz2003Peridotite(0.10), tp, 0).solve().top().get().meltFraction();
        assertTrue(top > 0.10 / 0.5, "the depleted column melts past cpx exhaustion: " + top);
    }
}
