package org.tectomelt.studies;

import java.util.Arrays;
import java.util.List;
import java.util.Objects;

/**
 * The distribution of one output over a study's samples.
 *
 * <p>Mean, sample standard deviation (n − 1), the standard error of the mean (sd/√n, REFERENCES
 * §5), the percentiles 2.5, 16, 50, 84 and 97.5 by linear interpolation between order statistics
 * (definition 7 of Hyndman &amp; Fan 1996, The American Statistician 50, 361, the default of R and
 * NumPy), the extremes and an equal-width histogram from min to max. The 16–84 and 2.5–97.5
 * intervals are the "1 σ" and "2 σ" bands of a normal output.
 *
 * @param unit                API unit of the output
 * @param n                   number of values summarised
 * @param mean                mean
 * @param sd                  sample standard deviation (0 for n = 1)
 * @param meanStandardError   sd / √n
 * @param p2_5                2.5th percentile
 * @param p16                 16th percentile
 * @param p50                 median
 * @param p84                 84th percentile
 * @param p97_5               97.5th percentile
 * @param min                 smallest value
 * @param max                 largest value
 * @param histogram           equal-width histogram over [min, max]
 */
public record Summary(String unit, int n, double mean, double sd, double meanStandardError, double p2_5, double p16,
                      double p50, double p84, double p97_5, double min, double max, Histogram histogram) {

    /** Bins of the histogram unless asked otherwise. */
    public static final int DEFAULT_BINS = 20;

    /**
     * An equal-width histogram.
     *
     * @param edges  bin edges, one more than the bins, increasing (two equal edges when all values coincide)
     * @param counts values per bin; the last bin includes its upper edge
     */
    public record Histogram(List<Double> edges, List<Integer> counts) {
        /** Defensive copies. */
        public Histogram {
            edges = List.copyOf(edges);
            counts = List.copyOf(counts);
        }
    }

    /**
     * Summarises values (finite; in the order given, which fixes the rounding of the sums).
     *
     * @param unit   the values' unit
     * @param values at least one finite value
     * @param bins   histogram bins, at least 1
     */
    public static Summary of(String unit, double[] values, int bins) {
        Objects.requireNonNull(unit, "unit");
        int n = values.length;
        if (n == 0) {
            throw new IllegalArgumentException("nothing to summarise");
        }
        if (bins < 1) {
            throw new IllegalArgumentException("bins must be at least 1");
        }
        double sum = 0;
        for (double v : values) {
            if (!Double.isFinite(v)) {
                throw new IllegalArgumentException("values to summarise must be finite, got " + v);
            }
            sum += v;
        }
        double mean = sum / n;
        double ss = 0;
        for (double v : values) {
            double d = v - mean;
            ss += d * d;
        }
        double sd = n > 1 ? Math.sqrt(ss / (n - 1)) : 0.0;
        double[] sorted = values.clone();
        Arrays.sort(sorted);
        double min = sorted[0];
        double max = sorted[n - 1];
        return new Summary(unit, n, mean, sd, sd / Math.sqrt(n), quantile(sorted, 0.025), quantile(sorted, 0.16),
                quantile(sorted, 0.5), quantile(sorted, 0.84), quantile(sorted, 0.975), min, max,
                histogram(sorted, bins));
    }

    /** {@link #of(String, double[], int)} with {@link #DEFAULT_BINS}. */
    public static Summary of(String unit, double[] values) {
        return of(unit, values, DEFAULT_BINS);
    }

    /** Quantile p of sorted values, linear between order statistics (Hyndman &amp; Fan definition 7). */
    static double quantile(double[] sorted, double p) {
        double h = (sorted.length - 1) * p;
        int lo = (int) Math.floor(h);
        int hi = Math.min(lo + 1, sorted.length - 1);
        return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
    }

    private static Histogram histogram(double[] sorted, int bins) {
        double min = sorted[0];
        double max = sorted[sorted.length - 1];
        if (max == min) {
            return new Histogram(List.of(min, max), List.of(sorted.length));
        }
        Double[] edges = new Double[bins + 1];
        for (int i = 0; i <= bins; i++) {
            edges[i] = i == bins ? max : min + (max - min) * i / bins;
        }
        Integer[] counts = new Integer[bins];
        Arrays.fill(counts, 0);
        for (double v : sorted) {
            int b = (int) Math.floor((v - min) / (max - min) * bins);
            counts[Math.min(Math.max(b, 0), bins - 1)]++;
        }
        return new Histogram(Arrays.asList(edges), Arrays.asList(counts));
    }
}
