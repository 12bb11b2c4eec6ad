package org.tectomelt.studies;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;

/**
 * Where a relation y(x), known at increasing x (NaN where unknown), crosses a target value: the
 * sign changes of y − target between neighbouring known points, placed by linear interpolation.
 * Several crossings mean the relation is not monotonic over the interval; none means the target
 * lies above its maximum or below its minimum there. A touch without a sign change, or two
 * crossings between neighbouring points, is not seen.
 *
 * @param roots   x of each crossing, increasing
 * @param lowest  smallest known y (NaN when none is known)
 * @param xLowest x of the smallest y
 * @param highest largest known y
 * @param xHighest x of the largest y
 */
record Crossings(List<Double> roots, double lowest, double xLowest, double highest, double xHighest) {

    static Crossings of(double[] x, double[] y, double target) {
        List<Double> roots = new ArrayList<>();
        double lo = Double.NaN;
        double xLo = Double.NaN;
        double hi = Double.NaN;
        double xHi = Double.NaN;
        int prev = -1;
        for (int i = 0; i < x.length; i++) {
            if (Double.isNaN(y[i])) {
                continue;
            }
            if (Double.isNaN(lo) || y[i] < lo) {
                lo = y[i];
                xLo = x[i];
            }
            if (Double.isNaN(hi) || y[i] > hi) {
                hi = y[i];
                xHi = x[i];
            }
            double d = y[i] - target;
            if (d == 0) {
                roots.add(x[i]);
            } else if (prev >= 0) {
                double dp = y[prev] - target;
                if (dp != 0 && (dp < 0) != (d < 0)) {
                    roots.add(x[prev] + (x[i] - x[prev]) * dp / (dp - d));
                }
            }
            prev = i;
        }
        return new Crossings(List.copyOf(roots), lo, xLo, hi, xHi);
    }

    /** What a caller should be told about these crossings, if anything. */
    Optional<String> warning(String field, String output, double target, double[] x) {
        String interval = "[" + FieldRange.num(x[0]) + ", " + FieldRange.num(x[x.length - 1]) + "]";
        if (roots.size() > 1) {
            return Optional.of(String.format(Locale.ROOT, "%s is not monotonic in %s over %s: the observed %s "
                    + "= %s is reached at several values (near %s)", output, field, interval, output,
                    FieldRange.num(target), PosteriorInversion.formatList(roots)));
        }
        if (roots.isEmpty() && !Double.isNaN(highest)) {
            if (highest < target) {
                return Optional.of(String.format(Locale.ROOT, "the observed %s = %s is above the largest value "
                        + "reached over %s = %s (%.4g at %s = %s): it is out of reach there", output,
                        FieldRange.num(target), field, interval, highest, field, FieldRange.num(xHighest)));
            }
            if (lowest > target) {
                return Optional.of(String.format(Locale.ROOT, "the observed %s = %s is below the smallest value "
                        + "reached over %s = %s (%.4g at %s = %s): it is out of reach there", output,
                        FieldRange.num(target), field, interval, lowest, field, FieldRange.num(xLowest)));
            }
        }
        return Optional.empty();
    }
}
