package org.tectomelt.engine.composition;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * The trace elements the service models, declared in the order of an extended normalised
 * ("spider") diagram: by decreasing incompatibility during mantle melting, the rare-earth elements in
 * atomic order with Sr, Zr, Hf, Ti and Y slotted among them (a convention of the trade, after the
 * element order of Sun &amp; McDonough 1989; common practice).
 */
public enum Element {
    RB("Rb", 37), BA("Ba", 56), TH("Th", 90), U("U", 92), NB("Nb", 41), TA("Ta", 73),
    LA("La", 57), CE("Ce", 58), PR("Pr", 59), SR("Sr", 38), ND("Nd", 60), ZR("Zr", 40), HF("Hf", 72),
    SM("Sm", 62), EU("Eu", 63), TI("Ti", 22), GD("Gd", 64), TB("Tb", 65), DY("Dy", 66), HO("Ho", 67),
    Y("Y", 39), ER("Er", 68), TM("Tm", 69), YB("Yb", 70), LU("Lu", 71);

    private final String symbol;
    private final int atomicNumber;

    Element(String symbol, int atomicNumber) {
        this.symbol = symbol;
        this.atomicNumber = atomicNumber;
    }

    /** The chemical symbol ("La"). */
    public String symbol() {
        return symbol;
    }

    /** The atomic number Z. */
    public int atomicNumber() {
        return atomicNumber;
    }

    /** True for the fourteen naturally occurring lanthanides La–Lu (Pm has no stable isotope). */
    public boolean isRareEarth() {
        return atomicNumber >= 57 && atomicNumber <= 71;
    }

    /** The element with this symbol, exactly as written ("La", not "la" or "LA"). */
    public static Optional<Element> bySymbol(String symbol) {
        for (Element e : values()) {
            if (e.symbol.equals(symbol)) {
                return Optional.of(e);
            }
        }
        return Optional.empty();
    }

    /** The fourteen rare-earth elements, La to Lu. */
    public static List<Element> rareEarths() {
        List<Element> r = new ArrayList<>();
        for (Element e : values()) {
            if (e.isRareEarth()) {
                r.add(e);
            }
        }
        r.sort((a, b) -> Integer.compare(a.atomicNumber, b.atomicNumber));
        return List.copyOf(r);
    }

    /** Every element in diagram order. */
    public static List<Element> all() {
        return List.of(values());
    }
}
