package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.thermal.LithostaticColumn;

/**
 * Lithostatic pressure against independent values.
 *
 * <p>Sources: Turcotte &amp; Schubert (2014) §2.2, P = ρgh; REFERENCES.md §1.1, values computed
 * there independently [calc]; the 30–33 km per GPa rule of thumb is common practice.
 */
class LithostaticPressureReferenceTest {

    @Test
    void mantleColumnReachesOneTwoThreeGpaAt31_62_93Km() {
        LithostaticColumn c = LithostaticColumn.mantleOnly();
        // REFERENCES §1.1 [calc]: 30.9, 61.8, 92.7 km; the tolerance is the printed 0.05 km.
        assertEquals(30.9e3, c.depthAt(1e9), 50);
        assertEquals(61.8e3, c.depthAt(2e9), 50);
        assertEquals(92.7e3, c.depthAt(3e9), 50);
    }

    @Test
    void oneGpaLiesInTheCommonPractice30To33KmBand() {
        double z = LithostaticColumn.mantleOnly().depthAt(1e9);
        // common practice: 30–33 km per GPa in the upper mantle
        assertEquals(31.5e3, z, 1.5e3);
    }

    @Test
    void crustOfThirtyFiveKmShiftsTheDepths() {
        LithostaticColumn c = new LithostaticColumn(35e3, 2800, 3300, 9.81);
        // REFERENCES §1.1 [calc]: 36.2, 67.1, 98.0 km for 1, 2, 3 GPa
        assertEquals(36.2e3, c.depthAt(1e9), 50);
        assertEquals(67.1e3, c.depthAt(2e9), 50);
        assertEquals(98.0e3, c.depthAt(3e9), 50);
    }
}
