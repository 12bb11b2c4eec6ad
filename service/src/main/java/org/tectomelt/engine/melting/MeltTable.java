package org.tectomelt.engine.melting;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.TreeMap;
import org.tectomelt.engine.EngineException;

/**
 * A pressure-dependent melt-fraction table F(T, P): a melt curve ({@link MeltCurve}, F piecewise
 * linear in T) at each of several pressures, for crustal rocks whose melting reactions move with
 * pressure.
 *
 * <p>Between two tabulated pressures the curve is interpolated along its isopleths: the temperature at
 * which the rock reaches a melt fraction F is interpolated linearly in pressure, for every F at which
 * either neighbouring curve has a point. The solidus and every step of the curve therefore move
 * continuously with pressure (interpolating F at fixed T instead would let a low-pressure onset
 * leak into every pressure above it). F(T, P) is continuous in T and P and non-decreasing in T at
 * every pressure.
 *
 * <p>Invariants (checked, the message names the row and point): at least one row, pressures strictly
 * increasing, each row a valid melt curve starting at F = 0 (its solidus), and every row reaching the
 * same largest melt fraction (so that each isopleth exists at every pressure). Outside the tabulated
 * pressures the nearest row is used; {@link #covers} tells a caller whether a range is inside.
 * Pressures in Pa, temperatures in K. Immutable.
 */
public final class MeltTable {

    private static final double GPA = 1e9;
    private static final double ZERO_C = 273.15;
    /** Smallest temperature step (K) kept between interpolated points, so that temperatures increase strictly. */
    private static final double MIN_STEP_K = 1e-6;

    private final double[] pressures;
    private final MeltCurve[] rows;

    /**
     * @param pressures pressures (Pa), strictly increasing
     * @param rows      the melt curve at each pressure
     * @throws EngineException when an invariant fails (the message names the row)
     */
    public MeltTable(double[] pressures, List<MeltCurve> rows) {
        if (pressures.length == 0 || pressures.length != rows.size()) {
            throw new EngineException("a melt table needs at least one pressure, each with a melt curve");
        }
        for (int i = 0; i < pressures.length; i++) {
            if (!Double.isFinite(pressures[i]) || !(pressures[i] >= 0)) {
                throw new EngineException("melt table row " + i + ": pressure must be at least 0");
            }
            if (i > 0 && !(pressures[i] > pressures[i - 1])) {
                throw new EngineException("melt table row " + i + ": pressures must increase strictly");
            }
            MeltCurve c = rows.get(i);
            if (c.fraction(0) != 0) {
                throw new EngineException("melt table row " + i + ": the curve must start at melt fraction 0 (its solidus)");
            }
            if (Math.abs(c.maxFraction() - rows.get(0).maxFraction()) > 1e-12) {
                throw new EngineException(String.format(Locale.ROOT, "melt table row %d: every row must reach the same "
                        + "largest melt fraction (row 0 reaches %.4g, this row %.4g)", i, rows.get(0).maxFraction(),
                        c.maxFraction()));
            }
        }
        this.pressures = pressures.clone();
        this.rows = rows.toArray(new MeltCurve[0]);
    }

    /** Number of tabulated pressures. */
    public int size() {
        return pressures.length;
    }

    /** Pressure (Pa) of row {@code i}. */
    public double pressure(int i) {
        return pressures[i];
    }

    /** Melt curve of row {@code i}. */
    public MeltCurve row(int i) {
        return rows[i];
    }

    /** Lowest tabulated pressure (Pa). */
    public double minPressure() {
        return pressures[0];
    }

    /** Highest tabulated pressure (Pa). */
    public double maxPressure() {
        return pressures[pressures.length - 1];
    }

    /** True when the tabulated pressures span [{@code low}, {@code high}] (Pa), to 1 Pa. */
    public boolean covers(double low, double high) {
        return low >= pressures[0] - 1 && high <= pressures[pressures.length - 1] + 1;
    }

    /** The melt curve at pressure {@code p} (Pa): the nearest row outside the table, isopleths interpolated inside. */
    public MeltCurve curveAt(double p) {
        int n = pressures.length;
        if (n == 1 || p <= pressures[0]) {
            return rows[0];
        }
        if (p >= pressures[n - 1]) {
            return rows[n - 1];
        }
        int hi = Arrays.binarySearch(pressures, p);
        if (hi >= 0) {
            return rows[hi];
        }
        hi = -hi - 1;
        int lo = hi - 1;
        double w = (p - pressures[lo]) / (pressures[hi] - pressures[lo]);
        return between(rows[lo], rows[hi], w);
    }

    /** Melt fraction at temperature {@code t} (K) and pressure {@code p} (Pa). */
    public double fractionAt(double t, double p) {
        return curveAt(p).fractionAt(t);
    }

    /** The curve (1 − w) a + w b along isopleths. */
    private static MeltCurve between(MeltCurve a, MeltCurve b, double w) {
        TreeMap<Double, Boolean> levels = new TreeMap<>();
        for (MeltCurve c : new MeltCurve[] {a, b}) {
            for (int i = 0; i < c.size(); i++) {
                levels.put(c.fraction(i), Boolean.TRUE);
            }
        }
        List<double[]> points = new ArrayList<>(levels.size() + 1);
        for (double f : levels.keySet()) {
            double t = (1 - w) * isopleth(a, f) + w * isopleth(b, f);
            if (!points.isEmpty()) {
                double[] last = points.get(points.size() - 1);
                t = Math.max(t, last[0] + MIN_STEP_K);
            }
            points.add(new double[] {t, f});
        }
        // both rows stay at their largest fraction above their last point: so does the interpolated curve
        if (points.size() < 2) {
            double[] only = points.get(0);
            points.add(new double[] {only[0] + 1, only[1]});
        }
        double[] ts = new double[points.size()];
        double[] fs = new double[points.size()];
        for (int i = 0; i < ts.length; i++) {
            ts[i] = points.get(i)[0];
            fs[i] = points.get(i)[1];
        }
        return new MeltCurve(ts, fs);
    }

    /**
     * Temperature (K) at which the curve reaches {@code f}: for f = 0 its solidus (the last point still at
     * 0), otherwise the lowest temperature reaching f.
     */
    private static double isopleth(MeltCurve c, double f) {
        return f <= 0 ? c.solidus() : c.temperatureAt(f);
    }

    /**
     * The mean over pressures from {@code low} to {@code high} (Pa) of F(T, P) as one curve of T: the
     * average of the curves at {@code samples} equally spaced pressures (their midpoints), exact between
     * their points. For a layer whose pressure range matters (a heat budget over a thick crust).
     */
    public MeltCurve meanOver(double low, double high, int samples) {
        if (!(high >= low) || samples < 1) {
            throw new EngineException("a mean melt curve needs a pressure range and at least one sample");
        }
        MeltCurve[] curves = new MeltCurve[samples];
        java.util.TreeSet<Double> ts = new java.util.TreeSet<>();
        for (int k = 0; k < samples; k++) {
            curves[k] = curveAt(low + (k + 0.5) * (high - low) / samples);
            for (int i = 0; i < curves[k].size(); i++) {
                ts.add(curves[k].temperature(i));
            }
        }
        double[] t = ts.stream().mapToDouble(Double::doubleValue).toArray();
        double[] f = new double[t.length];
        for (int i = 0; i < t.length; i++) {
            double sum = 0;
            for (MeltCurve c : curves) {
                sum += c.fractionAt(t[i]);
            }
            f[i] = sum / samples;
        }
        if (t.length < 2) {
            return new MeltCurve(new double[] {t[0], t[0] + 1}, new double[] {f[0], f[0]});
        }
        return new MeltCurve(t, f);
    }

    /**
     * Reads a table from a classpath resource: lines of "pressureGPa temperatureC meltFraction"
     * (whitespace-separated), rows grouped by pressure in increasing order; '#' starts a comment.
     *
     * @throws EngineException when the resource is missing or malformed (the message names the line)
     */
    public static MeltTable resource(String name) {
        try (InputStream in = MeltTable.class.getResourceAsStream(name)) {
            if (in == null) {
                throw new EngineException("melt table resource " + name + " not found");
            }
            BufferedReader r = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8));
            List<Double> ps = new ArrayList<>();
            List<MeltCurve> curves = new ArrayList<>();
            List<double[]> current = new ArrayList<>();
            double currentP = Double.NaN;
            String line;
            int number = 0;
            while ((line = r.readLine()) != null) {
                number++;
                int hash = line.indexOf('#');
                String body = (hash < 0 ? line : line.substring(0, hash)).trim();
                if (body.isEmpty()) {
                    continue;
                }
                String[] f = body.split("\\s+");
                if (f.length != 3) {
                    throw new EngineException(name + " line " + number + ": expected pressureGPa temperatureC meltFraction");
                }
                double p = Double.parseDouble(f[0]) * GPA;
                if (!current.isEmpty() && p != currentP) {
                    ps.add(currentP);
                    curves.add(curve(current));
                    current.clear();
                }
                currentP = p;
                current.add(new double[] {Double.parseDouble(f[1]) + ZERO_C, Double.parseDouble(f[2])});
            }
            if (!current.isEmpty()) {
                ps.add(currentP);
                curves.add(curve(current));
            }
            return new MeltTable(ps.stream().mapToDouble(Double::doubleValue).toArray(), curves);
        } catch (IOException | NumberFormatException e) {
            throw new EngineException("melt table resource " + name + " could not be read: " + e.getMessage());
        }
    }

    private static MeltCurve curve(List<double[]> points) {
        double[] t = new double[points.size()];
        double[] f = new double[points.size()];
        for (int i = 0; i < t.length; i++) {
            t[i] = points.get(i)[0];
            f[i] = points.get(i)[1];
        }
        return new MeltCurve(t, f);
    }
}
