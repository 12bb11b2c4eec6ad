package org.tectomelt.engine.melting;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

/** The catalogue. */
class LithologiesTest {

    @Test
    void offersTheSevenLithologiesInTheDocumentedOrder() {
        assertEquals(List.of("peridotite-katz2003", "peridotite-mckenzie-bickle1988", "granite-water-saturated",
                "metapelite", "amphibolite", "basalt", "pyroxenite-pertermann-hirschmann2003"), Lithologies.ids());
        assertTrue(Lithologies.mantleById("peridotite-mckenzie-bickle1988").isPresent());
        assertTrue(Lithologies.mantleById("metapelite").isEmpty());
        assertTrue(Lithologies.crustalById("basalt").isPresent());
        assertTrue(Lithologies.crustalById("peridotite-katz2003").isEmpty());
        assertTrue(Lithologies.byId("lherzolite").isEmpty());
    }

    @Test
    void everyLithologyHasACitationAndAConsistentPressureRange() {
        for (Lithology l : Lithologies.all()) {
            assertTrue(!l.citations().isEmpty() && !l.citations().get(0).citation().isBlank(), l.id());
            assertTrue(l.minPressure() >= 0 && l.minPressure() < l.maxPressure(), l.id());
            assertTrue(l.maxPressure() <= l.hardMaxPressure(), l.id());
        }
    }
}
