package org.tectomelt.engine.crust;

import java.util.ArrayList;
import java.util.List;
import org.tectomelt.engine.melting.MeltCurve;

/**
 * The enthalpy–temperature relation of one rock, H(T) = ρ c T + ρ L F(T), inverted piecewise:
 * because the melt curve is piecewise linear, so is T(H), with knots where the melt curve has
 * points. Between knots T and F are affine in H; an isothermal jump in F becomes a segment on
 * which T is constant (slope dT/dH = 0), which is what lets the solver handle isothermal melting.
 *
 * <p>Segments are numbered 0..m for m knots: segment 0 lies below the first knot (solid, F = 0),
 * segment m above the last (F at its last value), segment s between knots s − 1 and s. The solver
 * keeps a segment per cell, so a cell sitting exactly on a knot has a definite slope.
 */
final class EnthalpyCurve {

    private final Rock rock;
    private final double rhoC;
    private final double invRhoC;
    /** Knots: enthalpy (J/m³), temperature (K), melt fraction. */
    private final double[] hKnot;
    private final double[] tKnot;
    private final double[] fKnot;
    /** Per segment: base enthalpy, temperature and melt fraction, and slopes dT/dH, dF/dH. */
    private final double[] hBase;
    private final double[] tBase;
    private final double[] fBase;
    private final double[] tSlope;
    private final double[] fSlope;
    /** True when a melt curve without latent heat is present: F then follows from T, not from H. */
    private final boolean curveWithoutLatentHeat;

    EnthalpyCurve(Rock rock) {
        this(rock, rock.meltCurve());
    }

    /** The relation of {@code rock} with melt curve {@code curve} (the rock's curve at one cell's pressure). */
    EnthalpyCurve(Rock rock, MeltCurve curve) {
        rock = curve == rock.meltCurve() ? rock : rock.atCurve(curve);
        this.rock = rock;
        this.rhoC = rock.density() * rock.heatCapacity();
        this.invRhoC = 1.0 / rhoC;
        double rhoL = rock.density() * rock.latentHeat();
        List<double[]> knots = new ArrayList<>();
        if (curve != null && rhoL > 0) {
            if (curve.fraction(0) > 0) {
                knots.add(new double[] {curve.temperature(0), 0.0});
            }
            for (int i = 0; i < curve.size(); i++) {
                knots.add(new double[] {curve.temperature(i), curve.fraction(i)});
            }
        }
        int m = knots.size();
        hKnot = new double[m];
        tKnot = new double[m];
        fKnot = new double[m];
        for (int i = 0; i < m; i++) {
            tKnot[i] = knots.get(i)[0];
            fKnot[i] = knots.get(i)[1];
            hKnot[i] = rhoC * tKnot[i] + rhoL * fKnot[i];
        }
        hBase = new double[m + 1];
        tBase = new double[m + 1];
        fBase = new double[m + 1];
        tSlope = new double[m + 1];
        fSlope = new double[m + 1];
        tSlope[0] = invRhoC;
        for (int s = 1; s < m; s++) {
            double dh = hKnot[s] - hKnot[s - 1];
            hBase[s] = hKnot[s - 1];
            tBase[s] = tKnot[s - 1];
            fBase[s] = fKnot[s - 1];
            tSlope[s] = (tKnot[s] - tKnot[s - 1]) / dh;
            fSlope[s] = (fKnot[s] - fKnot[s - 1]) / dh;
        }
        if (m > 0) {
            hBase[m] = hKnot[m - 1];
            tBase[m] = tKnot[m - 1];
            fBase[m] = fKnot[m - 1];
            tSlope[m] = invRhoC;
        }
        curveWithoutLatentHeat = curve != null && rhoL == 0;
    }

    Rock rock() {
        return rock;
    }

    double rhoC() {
        return rhoC;
    }

    double invRhoC() {
        return invRhoC;
    }

    /** Number of knots m (segments are 0..m). */
    int knots() {
        return hKnot.length;
    }

    /** Enthalpy (J/m³) of the rock at temperature {@code t} (K); at a jump, the molten side. */
    double enthalpy(double t) {
        return rock.enthalpy(t);
    }

    /** The segment holding enthalpy {@code h}: the s with knot[s − 1] ≤ h &lt; knot[s]. */
    int segment(double h) {
        int s = 0;
        while (s < hKnot.length && h >= hKnot[s]) {
            s++;
        }
        return s;
    }

    /** Lower end of segment {@code s} (J/m³), −∞ for the first. */
    double lower(int s) {
        return s == 0 ? Double.NEGATIVE_INFINITY : hKnot[s - 1];
    }

    /** Upper end of segment {@code s} (J/m³), +∞ for the last. */
    double upper(int s) {
        return s == hKnot.length ? Double.POSITIVE_INFINITY : hKnot[s];
    }

    /** Temperature (K) at enthalpy {@code h} on segment {@code s}. */
    double temperature(double h, int s) {
        return tBase[s] + tSlope[s] * (h - hBase[s]);
    }

    /** dT/dH (K m³/J) on segment {@code s}; 0 on an isothermal jump. */
    double slope(int s) {
        return tSlope[s];
    }

    /** Melt fraction at enthalpy {@code h} on segment {@code s}, whose temperature is {@code t}. */
    double fraction(double h, int s, double t) {
        if (curveWithoutLatentHeat) {
            return rock.meltCurve().fractionAt(t);
        }
        return fBase[s] + fSlope[s] * (h - hBase[s]);
    }
}
