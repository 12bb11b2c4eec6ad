package org.tectomelt.studies;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Map;
import org.junit.jupiter.api.Test;

/** Failed samples are counted by the kind of failure, not by each sample's own numbers. */
class FailureTallyTest {

    @Test
    void drawsFailingForOneCauseAreOneLineWithTheirNumbersReplaced() {
        FailureTally t = new FailureTally();
        t.add("the adiabat of potential temperature 1350 °C is above the solidus of Peridotite (Katz, "
                + "Spiegelman & Langmuir 2003), dry and hydrous even at 10.0 GPa");
        t.add("the adiabat of potential temperature 1362.5 °C is above the solidus of Peridotite (Katz, "
                + "Spiegelman & Langmuir 2003), dry and hydrous even at 10.0 GPa");
        t.add("pressure 2.5e9 Pa is out of range");
        t.add(null);
        assertEquals(4, t.count());
        assertEquals(Map.of(
                "the adiabat of potential temperature … °C is above the solidus of Peridotite (Katz, "
                        + "Spiegelman & Langmuir 2003), dry and hydrous even at … GPa", 2,
                "pressure … Pa is out of range", 1,
                "no reason given", 1), t.reasons());
    }

    @Test
    void numbersInsideWordsAndYearsAreKept() {
        assertEquals("peridotite-katz2003 at … km, Shaw (1970) law, H2O", FailureTally.kind(
                "peridotite-katz2003 at 12.5 km, Shaw (1970) law, H2O"));
        assertEquals("between … and … wt%", FailureTally.kind("between −0.5 and 2 wt%"));
    }
}
