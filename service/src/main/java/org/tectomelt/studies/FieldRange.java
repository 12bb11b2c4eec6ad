package org.tectomelt.studies;

import java.util.Locale;

/**
 * The accepted values of a numeric input field, as its contract states them: a lower and an upper
 * bound, each optional and inclusive or exclusive (JSON Schema {@code minimum} /
 * {@code exclusiveMinimum}).
 *
 * @param min          lower bound, or {@code null} for none
 * @param minExclusive true when the lower bound itself is not accepted
 * @param max          upper bound, or {@code null} for none
 * @param maxExclusive true when the upper bound itself is not accepted
 */
public record FieldRange(Double min, boolean minExclusive, Double max, boolean maxExclusive) {

    /** Bounds must be finite and ordered. */
    public FieldRange {
        if (min != null && !Double.isFinite(min) || max != null && !Double.isFinite(max)) {
            throw new IllegalArgumentException("range bounds must be finite");
        }
        if (min != null && max != null && min > max) {
            throw new IllegalArgumentException("range min " + min + " is above max " + max);
        }
    }

    /** An inclusive range [min, max]. */
    public static FieldRange closed(double min, double max) {
        return new FieldRange(min, false, max, false);
    }

    /** No bounds at all. */
    public static FieldRange unbounded() {
        return new FieldRange(null, false, null, false);
    }

    /** True when {@code x} is an accepted value. */
    public boolean contains(double x) {
        if (!Double.isFinite(x)) {
            return false;
        }
        if (min != null && (minExclusive ? x <= min : x < min)) {
            return false;
        }
        return max == null || (maxExclusive ? x < max : x <= max);
    }

    /** The range in words, e.g. {@code [0, 200]} or {@code (0, 300]} or {@code ≥ 0}. */
    public String describe() {
        if (min == null && max == null) {
            return "any value";
        }
        if (max == null) {
            return (minExclusive ? "> " : "≥ ") + num(min);
        }
        if (min == null) {
            return (maxExclusive ? "< " : "≤ ") + num(max);
        }
        return (minExclusive ? "(" : "[") + num(min) + ", " + num(max) + (maxExclusive ? ")" : "]");
    }

    static String num(double x) {
        if (x == Math.rint(x) && Math.abs(x) < 1e15) {
            return String.format(Locale.ROOT, "%d", (long) x);
        }
        return String.format(Locale.ROOT, "%.6g", x).replaceAll("(\\.\\d*?)0+(e|$)", "$1$2").replace(".e", "e")
                .replaceAll("\\.$", "");
    }
}
