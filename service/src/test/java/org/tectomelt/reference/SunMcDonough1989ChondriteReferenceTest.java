package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.LinkedHashMap;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.composition.CompositionTables;
import org.tectomelt.engine.composition.Element;
import org.tectomelt.engine.composition.ElementAbundances;

/**
 * The CI-chondrite table the diagram and the ratios are normalised by agrees with the listing of Sun &amp;
 * McDonough (1989, Geol. Soc. Spec. Publ. 42, 313) in the project's shared reference notes (REFERENCES §4,
 * tagged "from memory" there as in the table): an independent copy of the same recalled values, so a slip
 * in either shows. Not a reproduction of a published pattern.
 */
class SunMcDonough1989ChondriteReferenceTest {

    @Test
    void theFourteenRareEarthValuesAreThoseOfTheReferenceListing() {
        // REFERENCES §4 [mem], ppm
        Map<Element, Double> listed = new LinkedHashMap<>();
        listed.put(Element.LA, 0.237);
        listed.put(Element.CE, 0.612);
        listed.put(Element.PR, 0.095);
        listed.put(Element.ND, 0.467);
        listed.put(Element.SM, 0.153);
        listed.put(Element.EU, 0.058);
        listed.put(Element.GD, 0.2055);
        listed.put(Element.TB, 0.0374);
        listed.put(Element.DY, 0.254);
        listed.put(Element.HO, 0.0566);
        listed.put(Element.ER, 0.1655);
        listed.put(Element.TM, 0.0255);
        listed.put(Element.YB, 0.170);
        listed.put(Element.LU, 0.0254);
        assertEquals(Element.rareEarths(), java.util.List.copyOf(listed.keySet()), "La to Lu, Pm left out");
        ElementAbundances ci = CompositionTables.normalisation("ci-chondrite-sun-mcdonough1989").orElseThrow();
        // the same printed digits: equal to the last digit given
        listed.forEach((e, ppm) -> assertEquals(ppm, ci.ppm(e), 0.0, e.symbol()));
    }
}
