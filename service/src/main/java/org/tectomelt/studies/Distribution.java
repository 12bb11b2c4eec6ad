package org.tectomelt.studies;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.apache.commons.math3.special.Erf;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.sampling.distribution.ZigguratSampler;

/**
 * The uncertainty of one input: a probability distribution in the input's own (API) unit.
 *
 * <p>Families, named as a request names them: {@code normal {mean, sd}}, {@code truncatedNormal
 * {mean, sd, min, max}}, {@code lognormal {mu, sigma}} (ln X ~ normal(mu, sigma)), {@code uniform
 * {min, max}}, {@code triangular {min, mode, max}}.
 *
 * <p>Draws are never clipped. Before a study starts, {@link #problems} compares the distribution
 * with the field's range: a bounded family must lie inside it, an unbounded one (normal, lognormal)
 * must keep its central ±4 sd (4 sigma of ln X) inside it, else the request is refused and the
 * truncated form suggested. A normal admitted that way still leaves the range with probability
 * about 6·10⁻⁵ per draw; such a draw is counted as out of range by the study, not moved.
 */
public sealed interface Distribution {

    /** How many standard deviations of an unbounded family must fit inside the field's range. */
    double SUPPORT_SIGMAS = 4.0;

    /** The family's name as a request writes it ({@code normal}, {@code truncatedNormal}, ...). */
    String family();

    /** One draw from the distribution with the given generator. */
    double sample(UniformRandomProvider rng);

    /** The distribution's mean (closed form). */
    double mean();

    /** The distribution's standard deviation (closed form). */
    double sd();

    /**
     * What is wrong with this distribution for a field: bad parameters, or a support leaving the
     * field's range.
     *
     * @param field dotted path of the field the distribution is given for (named in the problems)
     * @param range the field's accepted values
     * @return problems, empty when the distribution may be sampled for this field
     */
    List<InputProblem> problems(String field, FieldRange range);

    /** Normal distribution. @param mean mean @param sd standard deviation, positive */
    record Normal(double mean, double sd) implements Distribution {
        @Override
        public String family() {
            return "normal";
        }

        @Override
        public double sample(UniformRandomProvider rng) {
            return mean + sd * ZigguratSampler.NormalizedGaussian.of(rng).sample();
        }

        @Override
        public List<InputProblem> problems(String field, FieldRange range) {
            List<InputProblem> out = new ArrayList<>();
            String at = field + "." + family();
            finite(out, at + ".mean", mean);
            positive(out, at + ".sd", sd);
            if (out.isEmpty()) {
                central(out, field, range, "normal(mean " + FieldRange.num(mean) + ", sd " + FieldRange.num(sd)
                        + "): mean ± 4 sd", mean - SUPPORT_SIGMAS * sd, mean + SUPPORT_SIGMAS * sd, "a smaller sd");
            }
            return out;
        }
    }

    /**
     * Normal distribution restricted to [min, max] (renormalised). Sampled exactly by the rejection
     * schemes of Robert (1995), Statistics and Computing 5, 121–125, doi:10.1007/BF00143942: plain
     * normal rejection when the interval holds enough mass, else a uniform proposal (narrow
     * intervals) or a translated exponential proposal (tails).
     *
     * @param mean mean of the parent normal
     * @param sd   standard deviation of the parent normal, positive
     * @param min  lower truncation bound
     * @param max  upper truncation bound, above {@code min}
     */
    record TruncatedNormal(double mean, double sd, double min, double max) implements Distribution {

        /** Farther than this (in sd) from the mean the interval's mass underflows; refused. */
        static final double MAX_STANDARD_DISTANCE = 37.0;
        private static final int MAX_TRIES = 100_000;

        @Override
        public String family() {
            return "truncatedNormal";
        }

        @Override
        public double sample(UniformRandomProvider rng) {
            double a = (min - mean) / sd;
            double b = (max - mean) / sd;
            return mean + sd * standardSample(a, b, rng);
        }

        /** A standard normal draw restricted to [a, b]. */
        static double standardSample(double a, double b, UniformRandomProvider rng) {
            if (b <= 0 && a < 0) {
                return -standardSample(-b, -a, rng);
            }
            ZigguratSampler.NormalizedGaussian gauss = ZigguratSampler.NormalizedGaussian.of(rng);
            boolean wide = standardMass(a, b) >= 0.3;
            for (int tries = 0; tries < MAX_TRIES; tries++) {
                double z;
                if (wide) {
                    z = gauss.sample();
                    if (z >= a && z <= b) {
                        return z;
                    }
                } else if (a <= 0) {
                    // narrow interval around 0: uniform proposal, accept with exp(-z²/2)
                    z = a + (b - a) * rng.nextDouble();
                    if (rng.nextDouble() <= Math.exp(-0.5 * z * z)) {
                        return z;
                    }
                } else if (b - a <= 1.0 / Math.max(a, 1.0)) {
                    // narrow interval in the upper tail: uniform proposal, accept with exp((a²-z²)/2)
                    z = a + (b - a) * rng.nextDouble();
                    if (rng.nextDouble() <= Math.exp(0.5 * (a * a - z * z))) {
                        return z;
                    }
                } else {
                    // upper tail: translated exponential with Robert's optimal rate
                    double lambda = 0.5 * (a + Math.sqrt(a * a + 4.0));
                    z = a - Math.log1p(-rng.nextDouble()) / lambda;
                    double d = z - lambda;
                    if (z <= b && rng.nextDouble() <= Math.exp(-0.5 * d * d)) {
                        return z;
                    }
                }
            }
            throw new IllegalStateException("truncated normal sampler did not accept in " + MAX_TRIES + " tries");
        }

        /** P(a ≤ Z ≤ b) for a standard normal Z, accurate in the tails. */
        static double standardMass(double a, double b) {
            if (a >= 0) {
                return 0.5 * (Erf.erfc(a / Math.sqrt(2)) - Erf.erfc(b / Math.sqrt(2)));
            }
            if (b <= 0) {
                return standardMass(-b, -a);
            }
            return 1.0 - 0.5 * Erf.erfc(-a / Math.sqrt(2)) - 0.5 * Erf.erfc(b / Math.sqrt(2));
        }

        @Override
        public double mean() {
            double a = (min - mean) / sd;
            double b = (max - mean) / sd;
            return mean + sd * (phi(a) - phi(b)) / standardMass(a, b);
        }

        @Override
        public double sd() {
            double a = (min - mean) / sd;
            double b = (max - mean) / sd;
            double z = standardMass(a, b);
            double m = (phi(a) - phi(b)) / z;
            double var = 1.0 + (a * phi(a) - b * phi(b)) / z - m * m;
            return sd * Math.sqrt(Math.max(0.0, var));
        }

        private static double phi(double x) {
            return Double.isInfinite(x) ? 0.0 : Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI);
        }

        @Override
        public List<InputProblem> problems(String field, FieldRange range) {
            List<InputProblem> out = new ArrayList<>();
            String at = field + "." + family();
            finite(out, at + ".mean", mean);
            positive(out, at + ".sd", sd);
            finite(out, at + ".min", min);
            finite(out, at + ".max", max);
            if (out.isEmpty()) {
                bounded(out, field, at, min, max, range);
            }
            if (out.isEmpty() && Math.min(Math.abs(min - mean), Math.abs(max - mean)) / sd > MAX_STANDARD_DISTANCE
                    && (min - mean) * (max - mean) > 0) {
                out.add(new InputProblem(at, String.format(Locale.ROOT,
                        "[min, max] = [%s, %s] lies more than %.0f sd from the mean %s: move the mean or widen sd",
                        FieldRange.num(min), FieldRange.num(max), MAX_STANDARD_DISTANCE, FieldRange.num(mean))));
            }
            return out;
        }
    }

    /**
     * Lognormal distribution: ln X ~ normal(mu, sigma).
     *
     * @param mu    mean of ln X (ln of the field's unit)
     * @param sigma standard deviation of ln X, positive
     */
    record LogNormal(double mu, double sigma) implements Distribution {
        @Override
        public String family() {
            return "lognormal";
        }

        @Override
        public double sample(UniformRandomProvider rng) {
            return Math.exp(mu + sigma * ZigguratSampler.NormalizedGaussian.of(rng).sample());
        }

        @Override
        public double mean() {
            return Math.exp(mu + 0.5 * sigma * sigma);
        }

        @Override
        public double sd() {
            return mean() * Math.sqrt(Math.expm1(sigma * sigma));
        }

        @Override
        public List<InputProblem> problems(String field, FieldRange range) {
            List<InputProblem> out = new ArrayList<>();
            String at = field + "." + family();
            finite(out, at + ".mu", mu);
            positive(out, at + ".sigma", sigma);
            if (out.isEmpty()) {
                central(out, field, range, "lognormal(mu " + FieldRange.num(mu) + ", sigma " + FieldRange.num(sigma)
                        + "): exp(mu ± 4 sigma)", Math.exp(mu - SUPPORT_SIGMAS * sigma),
                        Math.exp(mu + SUPPORT_SIGMAS * sigma), "a smaller sigma");
            }
            return out;
        }
    }

    /** Uniform distribution on [min, max]. @param min lower end @param max upper end, above min */
    record Uniform(double min, double max) implements Distribution {
        @Override
        public String family() {
            return "uniform";
        }

        @Override
        public double sample(UniformRandomProvider rng) {
            return min + (max - min) * rng.nextDouble();
        }

        @Override
        public double mean() {
            return 0.5 * (min + max);
        }

        @Override
        public double sd() {
            return (max - min) / Math.sqrt(12.0);
        }

        @Override
        public List<InputProblem> problems(String field, FieldRange range) {
            List<InputProblem> out = new ArrayList<>();
            String at = field + "." + family();
            finite(out, at + ".min", min);
            finite(out, at + ".max", max);
            if (out.isEmpty()) {
                bounded(out, field, at, min, max, range);
            }
            return out;
        }
    }

    /**
     * Triangular distribution on [min, max] with its peak at {@code mode}, sampled by inversion of
     * its cumulative distribution.
     *
     * @param min  lower end
     * @param mode most probable value, in [min, max]
     * @param max  upper end, above min
     */
    record Triangular(double min, double mode, double max) implements Distribution {
        @Override
        public String family() {
            return "triangular";
        }

        @Override
        public double sample(UniformRandomProvider rng) {
            double u = rng.nextDouble();
            double width = max - min;
            double c = (mode - min) / width;
            if (u < c) {
                return min + Math.sqrt(u * width * (mode - min));
            }
            return max - Math.sqrt((1.0 - u) * width * (max - mode));
        }

        @Override
        public double mean() {
            return (min + mode + max) / 3.0;
        }

        @Override
        public double sd() {
            double v = (min * min + mode * mode + max * max - min * mode - min * max - mode * max) / 18.0;
            return Math.sqrt(v);
        }

        @Override
        public List<InputProblem> problems(String field, FieldRange range) {
            List<InputProblem> out = new ArrayList<>();
            String at = field + "." + family();
            finite(out, at + ".min", min);
            finite(out, at + ".mode", mode);
            finite(out, at + ".max", max);
            if (out.isEmpty() && (mode < min || mode > max)) {
                out.add(new InputProblem(at + ".mode", String.format(Locale.ROOT,
                        "mode %s must lie in [min, max] = [%s, %s]", FieldRange.num(mode), FieldRange.num(min),
                        FieldRange.num(max))));
            }
            if (out.isEmpty()) {
                bounded(out, field, at, min, max, range);
            }
            return out;
        }
    }

    private static void finite(List<InputProblem> out, String field, double x) {
        if (!Double.isFinite(x)) {
            out.add(new InputProblem(field, "must be a finite number"));
        }
    }

    private static void positive(List<InputProblem> out, String field, double x) {
        if (!(x > 0) || !Double.isFinite(x)) {
            out.add(new InputProblem(field, "must be a positive finite number, got " + FieldRange.num(x)));
        }
    }

    /** An unbounded family's central interval [lo, hi] (±4 sd) must lie inside the field's range. */
    private static void central(List<InputProblem> out, String field, FieldRange range, String what, double lo,
                                double hi, String alternative) {
        if (!Double.isFinite(lo) || !Double.isFinite(hi) || !range.contains(lo) || !range.contains(hi)) {
            out.add(new InputProblem(field, String.format(Locale.ROOT,
                    "%s = [%s, %s] leaves the field's range %s; draws are never clipped: give truncatedNormal {mean, "
                            + "sd, min, max} with min and max inside %s, or %s", what, FieldRange.num(lo),
                    FieldRange.num(hi), range.describe(), range.describe(), alternative)));
        }
    }

    /** A bounded family's [min, max]: ordered and inside the field's range. */
    private static void bounded(List<InputProblem> out, String field, String at, double min, double max,
                                FieldRange range) {
        if (!(max > min)) {
            out.add(new InputProblem(at + ".max", String.format(Locale.ROOT, "max %s must be above min %s",
                    FieldRange.num(max), FieldRange.num(min))));
            return;
        }
        // a bound equal to an exclusive limit is accepted: a draw exactly on it has probability ~0,
        // and would be counted out of range rather than moved
        boolean lowOk = range.min() == null || min >= range.min();
        boolean highOk = range.max() == null || max <= range.max();
        if (!lowOk || !highOk) {
            out.add(new InputProblem(field, String.format(Locale.ROOT,
                    "the distribution's support [%s, %s] leaves the field's range %s; draws are never clipped: keep "
                            + "min and max inside %s",
                    FieldRange.num(min), FieldRange.num(max), range.describe(), range.describe())));
        }
    }
}
