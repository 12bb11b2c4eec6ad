package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.McKenzieBickle1988Peridotite;
import org.tectomelt.engine.melting.MeltState;
import org.tectomelt.engine.thermal.LithostaticColumn;

/**
 * A loose flux-melting check, common practice: peridotite near 100 km depth at about 1300 °C is
 * solid when dry (beneath ocean basins rock near 100 km is solid at roughly 1300 °C, REFERENCES
 * §1.6 [trade]) but partially molten once water is added — the reason arcs sit above wedges whose
 * temperatures would not melt dry mantle.
 */
class FluxMeltingCommonPracticeTest {

    private static final double C = 273.15;
    private final double p = LithostaticColumn.mantleOnly().pressureAt(100e3);

    @Test
    void dryPeridotiteIsSolidAt100KmAnd1300C() {
        assertEquals(3.24e9, p, 0.01e9);
        assertEquals(0.0, Katz2003Peridotite.fertile().melt(p, 1300 + C, 0).meltFraction(), 0);
        assertEquals(0.0, new McKenzieBickle1988Peridotite().melt(p, 1300 + C, 0).meltFraction(), 0);
    }

    @Test
    void wetPeridotiteIsPartiallyMoltenThere() {
        for (double wtPct : new double[] {0.1, 0.3, 1.0}) {
            MeltState s = Katz2003Peridotite.fertile().melt(p, 1300 + C, wtPct / 100);
            assertTrue(s.meltFraction() > 0 && s.meltFraction() < 1, wtPct + " wt%: F = " + s.meltFraction());
            assertTrue(s.solidus() < 1300 + C);
        }
    }
}
