package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.Upwelling;
import org.tectomelt.engine.melting.Katz2003Peridotite;

/**
 * The lid effect: a lithospheric lid truncates the melting column at its base, so a thicker lid
 * gives less melt, a lower final melt fraction and a higher mean pressure of melting
 * (Ellam 1992, Geology 20, 153, doi:10.1130/0091-7613(1992)020&lt;0153:LTAACO&gt;2.3.CO;2 [pub],
 * REFERENCES §2.6); a lid deeper than the onset leaves nothing to melt.
 */
class Ellam1992LidEffectReferenceTest {

    private static final double C = 273.15;

    @Test
    void aThickerLidAlwaysGivesLessMeltAndNoneBelowTheOnset() {
        for (double tp : new double[] {1300, 1400, 1500}) {
            for (Upwelling regime : Upwelling.values()) {
                DecompressionColumn c = DecompressionColumn.of(Katz2003Peridotite.fertile(), tp + C, 0.0)
                        .withUpwelling(regime);
                double onset = c.onsetDepth().getAsDouble();
                ColumnResult previous = null;
                for (double lid = 0; lid <= 200e3; lid += 5e3) {
                    ColumnResult r = c.withLidDepth(lid).solve();
                    if (lid >= onset) {
                        // Ellam (1992): nothing melts beneath a lid deeper than the solidus crossing
                        assertEquals(0.0, r.meltThickness(), 0.0, "Tp " + tp + " lid " + lid);
                        assertTrue(r.top().isEmpty());
                    } else if (previous != null) {
                        assertTrue(r.meltThickness() < previous.meltThickness(), "Tp " + tp + " lid " + lid);
                        assertTrue(r.top().get().meltFraction() < previous.top().get().meltFraction());
                        assertTrue(r.meanMeltingPressure().getAsDouble() > previous.meanMeltingPressure().getAsDouble());
                    }
                    previous = r;
                }
            }
        }
    }
}
