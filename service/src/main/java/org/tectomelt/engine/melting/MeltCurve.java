package org.tectomelt.engine.melting;

import java.util.Arrays;
import org.tectomelt.engine.EngineException;

/**
 * A melt-fraction curve F(T) given as points joined by straight lines, for crustal rocks and
 * intrusions whose melting is described by experiments rather than a closed-form law. Below the
 * first point F = 0; above the last point F stays at the last value. A first point with F &gt; 0
 * therefore melts that fraction at a single temperature.
 *
 * <p>Invariants (checked): at least two points, temperatures strictly increasing, F
 * non-decreasing and within 0–1. Temperatures in K.
 */
public final class MeltCurve {

    private final double[] temperatures;
    private final double[] fractions;

    /**
     * @param temperatures temperatures (K), strictly increasing
     * @param fractions    melt fractions at those temperatures, non-decreasing, in 0–1
     * @throws EngineException when the invariants do not hold (the message names the point)
     */
    public MeltCurve(double[] temperatures, double[] fractions) {
        if (temperatures.length != fractions.length || temperatures.length < 2) {
            throw new EngineException("a melt curve needs at least two points with a temperature and a melt fraction each");
        }
        for (int i = 0; i < temperatures.length; i++) {
            if (!Double.isFinite(temperatures[i]) || !(fractions[i] >= 0 && fractions[i] <= 1)) {
                throw new EngineException("melt curve point " + i + ": melt fraction must be between 0 and 1");
            }
            if (i > 0 && !(temperatures[i] > temperatures[i - 1])) {
                throw new EngineException("melt curve point " + i + ": temperatures must increase strictly");
            }
            if (i > 0 && fractions[i] < fractions[i - 1]) {
                throw new EngineException("melt curve point " + i + ": melt fraction must not decrease with temperature");
            }
        }
        this.temperatures = temperatures.clone();
        this.fractions = fractions.clone();
    }

    /** Number of points. */
    public int size() {
        return temperatures.length;
    }

    /** Temperature (K) of point {@code i}. */
    public double temperature(int i) {
        return temperatures[i];
    }

    /** Melt fraction of point {@code i}. */
    public double fraction(int i) {
        return fractions[i];
    }

    /** Melt fraction at temperature {@code t} (K). */
    public double fractionAt(double t) {
        if (t < temperatures[0]) {
            return 0.0;
        }
        int n = temperatures.length;
        if (t >= temperatures[n - 1]) {
            return fractions[n - 1];
        }
        int i = Arrays.binarySearch(temperatures, t);
        if (i >= 0) {
            return fractions[i];
        }
        int hi = -i - 1;
        int lo = hi - 1;
        double w = (t - temperatures[lo]) / (temperatures[hi] - temperatures[lo]);
        return fractions[lo] + w * (fractions[hi] - fractions[lo]);
    }

    /**
     * The lowest temperature (K) at which the curve reaches melt fraction {@code f}; for
     * {@code f} above the curve's maximum, the last temperature.
     */
    public double temperatureAt(double f) {
        if (f <= fractions[0]) {
            return temperatures[0];
        }
        for (int i = 1; i < fractions.length; i++) {
            if (fractions[i] >= f) {
                double df = fractions[i] - fractions[i - 1];
                double w = df == 0 ? 0 : (f - fractions[i - 1]) / df;
                return temperatures[i - 1] + w * (temperatures[i] - temperatures[i - 1]);
            }
        }
        return temperatures[temperatures.length - 1];
    }

    /** Solidus (K): the highest temperature at which F is still 0 (the first point if F starts above 0). */
    public double solidus() {
        int i = 0;
        while (i + 1 < fractions.length && fractions[i + 1] == 0) {
            i++;
        }
        return temperatures[i];
    }

    /** Liquidus (K): the first temperature at which F reaches 1, or the last point when it never does. */
    public double liquidus() {
        for (int i = 0; i < fractions.length; i++) {
            if (fractions[i] >= 1.0) {
                return temperatures[i];
            }
        }
        return temperatures[temperatures.length - 1];
    }

    /** The largest melt fraction the curve reaches. */
    public double maxFraction() {
        return fractions[fractions.length - 1];
    }
}
