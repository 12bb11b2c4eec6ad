package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.ProfilePoint;
import org.tectomelt.engine.melting.Katz2003Peridotite;

/**
 * The ridge rule of thumb of Klein &amp; Langmuir (1987, JGR 92(B8), 8089, doi:10.1029/JB092iB08p08089)
 * and Langmuir, Klein &amp; Plank (1992, AGU Geophysical Monograph 71, 183,
 * doi:10.1029/GM071p0183): about 10 % mean melting of a melting column about 60 km tall gives about
 * 6 km of oceanic crust [pub, quoted in REFERENCES §2.5]. And the productivity near the top of a dry
 * column lies in the commonly quoted 10–20 %/GPa (common practice, REFERENCES §2.5 [trade]).
 * The rule carries one significant figure, so the tolerances are about a third of each value.
 */
class KleinLangmuir1987RuleOfThumbReferenceTest {

    private static final double C = 273.15;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();

    @Test
    void aSixtyKmColumnMeltsAboutTenPerCentOnAverageAndMakesAboutSixKmOfCrust() {
        double tp = new BrentSolver(1e-6).solve(100,
                t -> DecompressionColumn.of(katz, t, 0.0).onsetDepth().getAsDouble() - 60e3, 1200 + C, 1400 + C);
        ColumnResult r = DecompressionColumn.of(katz, tp, 0.0).solve();
        assertEquals(60e3, r.meltingHeight(), 1.0);
        // Klein & Langmuir (1987); Langmuir et al. (1992): ~10 % mean melting, ~6 km of crust
        assertEquals(0.10, r.meanMeltFraction(), 0.03);
        assertEquals(6e3, r.crustalThickness(), 1.5e3);
        assertEquals(r.meanMeltFraction() * r.meltingHeight(), r.meltThickness(), 1e-6);
    }

    @Test
    void theProductivityNearTheTopOfADryColumnIsTenToTwentyPerCentPerGpa() {
        for (double tp = 1280; tp <= 1400; tp += 40) {
            List<ProfilePoint> p = DecompressionColumn.of(katz, tp + C, 0.0).solve().profile();
            double top = p.get(p.size() - 1).productivity() * 1e11; // %/GPa
            // common practice: 10–20 %/GPa beneath ridges (REFERENCES §2.5 [trade])
            assertTrue(top >= 10 && top <= 20, "Tp " + tp + ": " + top + " %/GPa");
        }
    }
}
