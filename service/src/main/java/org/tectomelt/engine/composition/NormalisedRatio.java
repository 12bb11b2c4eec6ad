package org.tectomelt.engine.composition;

import java.util.OptionalDouble;

/**
 * Ratios of normalised concentrations commonly read off melt compositions (common practice): (La/Sm)N
 * tracks the degree of melting and source enrichment, (Sm/Yb)N, (Dy/Yb)N and (La/Yb)N the garnet left
 * in the residue (garnet holds the heavy rare-earth elements).
 */
public enum NormalisedRatio {
    LA_SM("La/Sm", Element.LA, Element.SM), SM_YB("Sm/Yb", Element.SM, Element.YB),
    DY_YB("Dy/Yb", Element.DY, Element.YB), LA_YB("La/Yb", Element.LA, Element.YB);

    private final String label;
    private final Element numerator;
    private final Element denominator;

    NormalisedRatio(String label, Element numerator, Element denominator) {
        this.label = label;
        this.numerator = numerator;
        this.denominator = denominator;
    }

    /** "La/Sm". */
    public String label() {
        return label;
    }

    /** The element on top. */
    public Element numerator() {
        return numerator;
    }

    /** The element below. */
    public Element denominator() {
        return denominator;
    }

    /**
     * (a/b)N = (a/a_ref)/(b/b_ref) for concentrations {@code a}, {@code b} of the numerator and
     * denominator; empty when the reference lacks either element.
     */
    public OptionalDouble of(double a, double b, ElementAbundances reference) {
        if (!reference.covers(numerator) || !reference.covers(denominator)) {
            return OptionalDouble.empty();
        }
        return OptionalDouble.of((a / reference.ppm(numerator)) / (b / reference.ppm(denominator)));
    }
}
