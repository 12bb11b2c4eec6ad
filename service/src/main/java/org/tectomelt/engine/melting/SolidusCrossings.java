package org.tectomelt.engine.melting;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.function.DoubleUnaryOperator;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.thermal.LithostaticColumn;

/**
 * Where a pressure–temperature path crosses the solidus and liquidus of a lithology, and how much
 * melt the rock holds along it.
 *
 * <p>A path is a list of samples (depth, temperature); pressure comes from a
 * {@link LithostaticColumn}. Between two consecutive samples depth and temperature vary linearly
 * with a parameter s ∈ [0, 1]. Where T − Ts changes sign over a segment, the crossing is located by
 * Brent's method on s (to 1e-12 of the segment), not reported at the nearest sample; the same for
 * the liquidus where the lithology has one. At most one crossing of each curve per segment is
 * resolved, so a path should be sampled more finely than the curvature of the curves (a few km is
 * ample for every model here).
 *
 * <p>Direction follows the path order: {@link Direction#INTO_MELT} when the melt fraction grows
 * across the crossing (the path passes from below to above the curve), {@link Direction#OUT_OF_MELT}
 * when it shrinks. The melt fraction along the path is the equilibrium melt fraction at each
 * sample's pressure and temperature.
 */
public final class SolidusCrossings {

    /** Most samples in one path. */
    public static final int MAX_SAMPLES = 20_000;

    private static final double ROOT_ACCURACY = 1e-12;
    private static final int MAX_EVALUATIONS = 200;

    private SolidusCrossings() {
    }

    /** Which curve a crossing is of. */
    public enum Curve {
        /** The (wet, where water is given) solidus. */
        SOLIDUS,
        /** The liquidus. */
        LIQUIDUS
    }

    /** Whether melt appears or disappears across a crossing, following the path order. */
    public enum Direction {
        /** Melt fraction increases across the crossing. */
        INTO_MELT,
        /** Melt fraction decreases across the crossing. */
        OUT_OF_MELT
    }

    /**
     * One sample of a path.
     *
     * @param depth       depth below the surface (m)
     * @param temperature temperature (K)
     */
    public record PathPoint(double depth, double temperature) {
    }

    /**
     * A crossing located between two samples.
     *
     * @param curve       solidus or liquidus
     * @param direction   into or out of melt, along the path order
     * @param depth       depth (m)
     * @param pressure    pressure (Pa)
     * @param temperature temperature (K), equal to the curve's temperature there
     */
    public record Crossing(Curve curve, Direction direction, double depth, double pressure, double temperature) {
    }

    /**
     * The path at one sample.
     *
     * @param depth        depth (m)
     * @param pressure     pressure (Pa)
     * @param temperature  path temperature (K)
     * @param solidus      solidus (K) at this pressure and the bulk water
     * @param liquidus     liquidus (K), {@code NaN} where the lithology has none
     * @param meltFraction equilibrium melt fraction, 0–1
     */
    public record ProfilePoint(double depth, double pressure, double temperature, double solidus, double liquidus,
                               double meltFraction) {
    }

    /**
     * Crossings and profile of one path.
     *
     * @param crossings       every crossing, in path order
     * @param profile         the path at each sample, in path order
     * @param meltPresent     true when any sample holds melt or the path crosses the solidus
     * @param maxMeltFraction largest melt fraction over the samples
     * @param warnings        validity notes (deduplicated)
     */
    public record Result(List<Crossing> crossings, List<ProfilePoint> profile, boolean meltPresent,
                         double maxMeltFraction, List<String> warnings) {

        /** Defensive copies. */
        public Result {
            crossings = List.copyOf(crossings);
            profile = List.copyOf(profile);
            warnings = List.copyOf(warnings);
        }
    }

    /**
     * Crossings and melt along a path.
     *
     * @param lithology the rock
     * @param bulkWater bulk water (mass fraction); 0 for dry models
     * @param column    pressure with depth
     * @param path      at least two samples, in path order
     * @throws EngineException when the path leaves the range where the model gives a number
     */
    public static Result along(Lithology lithology, double bulkWater, LithostaticColumn column, List<PathPoint> path) {
        if (path.size() < 2 || path.size() > MAX_SAMPLES) {
            throw new EngineException("a path needs between 2 and " + MAX_SAMPLES + " samples, got " + path.size());
        }
        int n = path.size();
        List<ProfilePoint> profile = new ArrayList<>(n);
        Set<String> warnings = new LinkedHashSet<>();
        int outside = 0;
        String firstOutside = null;
        double maxF = 0;
        for (PathPoint pt : path) {
            if (!(pt.depth() >= 0) || !(pt.temperature() > 0)) {
                throw new EngineException("path samples need a depth of at least 0 m and a positive temperature");
            }
            double p = column.pressureAt(pt.depth());
            MeltState s = lithology.melt(p, pt.temperature(), bulkWater);
            boolean calibrated = p >= lithology.minPressure() && p <= lithology.maxPressure();
            if (!calibrated) {
                outside++;
                if (firstOutside == null && !s.warnings().isEmpty()) {
                    firstOutside = s.warnings().get(0);
                }
            } else {
                warnings.addAll(s.warnings());
            }
            profile.add(new ProfilePoint(pt.depth(), p, pt.temperature(), lithology.solidus(p, bulkWater),
                    lithology.liquidus(p, bulkWater), s.meltFraction()));
            maxF = Math.max(maxF, s.meltFraction());
        }
        List<String> notes = new ArrayList<>();
        if (outside > 0) {
            notes.add(String.format(Locale.ROOT, "%d of %d path samples lie outside the calibrated pressure range of %s%s",
                    outside, n, lithology.id(), firstOutside == null ? "" : "; the first: " + firstOutside));
        }
        notes.addAll(warnings);

        List<Crossing> crossings = new ArrayList<>();
        for (int i = 0; i + 1 < n; i++) {
            ProfilePoint a = profile.get(i);
            ProfilePoint b = profile.get(i + 1);
            Found solidus = crossing(Curve.SOLIDUS, a.temperature() - a.solidus(), b.temperature() - b.solidus(),
                    a, b, column, pr -> lithology.solidus(pr, bulkWater));
            Found liquidus = null;
            if (Double.isFinite(a.liquidus()) && Double.isFinite(b.liquidus())) {
                liquidus = crossing(Curve.LIQUIDUS, a.temperature() - a.liquidus(), b.temperature() - b.liquidus(),
                        a, b, column, pr -> lithology.liquidus(pr, bulkWater));
            }
            if (solidus != null && liquidus != null && liquidus.s() < solidus.s()) {
                crossings.add(liquidus.crossing());
                crossings.add(solidus.crossing());
            } else {
                if (solidus != null) {
                    crossings.add(solidus.crossing());
                }
                if (liquidus != null) {
                    crossings.add(liquidus.crossing());
                }
            }
        }
        return new Result(crossings, profile, maxF > 0 || !crossings.isEmpty(), maxF, notes);
    }

    /** A crossing and its position s ∈ [0, 1] along its segment. */
    private record Found(double s, Crossing crossing) {
    }

    /** The crossing of one curve over segment a–b, or null when the path stays on one side. */
    private static Found crossing(Curve curve, double ga, double gb, ProfilePoint a, ProfilePoint b,
                                     LithostaticColumn column, DoubleUnaryOperator curveAt) {
        boolean aboveA = ga > 0;
        boolean aboveB = gb > 0;
        if (aboveA == aboveB) {
            return null;
        }
        double dz = b.depth() - a.depth();
        double dt = b.temperature() - a.temperature();
        double s = new BrentSolver(ROOT_ACCURACY).solve(MAX_EVALUATIONS, x -> {
            double z = a.depth() + x * dz;
            return a.temperature() + x * dt - curveAt.applyAsDouble(column.pressureAt(z));
        }, 0.0, 1.0);
        double z = a.depth() + s * dz;
        return new Found(s, new Crossing(curve, aboveB ? Direction.INTO_MELT : Direction.OUT_OF_MELT, z,
                column.pressureAt(z), a.temperature() + s * dt));
    }

    /**
     * Samples of a solid adiabat from {@code maxDepth} up to the surface, every {@code step}
     * (the last step may be shorter), in the order an upwelling rock travels.
     *
     * @param adiabat  the adiabat
     * @param column   pressure with depth
     * @param maxDepth deepest sample (m), &gt; 0
     * @param step     spacing (m), &gt; 0
     */
    public static List<PathPoint> adiabatPath(SolidAdiabat adiabat, LithostaticColumn column, double maxDepth,
                                              double step) {
        if (!(maxDepth > 0) || !(step > 0)) {
            throw new EngineException("an adiabat path needs a positive depth and step");
        }
        long intervals = (long) Math.ceil(maxDepth / step - 1e-9);
        if (intervals + 1 > MAX_SAMPLES) {
            throw new EngineException("an adiabat path of " + (intervals + 1) + " samples exceeds " + MAX_SAMPLES);
        }
        List<PathPoint> path = new ArrayList<>((int) intervals + 1);
        for (long i = 0; i <= intervals; i++) {
            double z = Math.max(0.0, maxDepth - i * step);
            path.add(new PathPoint(z, adiabat.temperatureAt(column.pressureAt(z))));
        }
        return path;
    }

    /**
     * Crossings along the solid adiabat of a potential temperature, from {@code maxDepth} up to the
     * surface, with the lithology's own thermodynamic constants.
     *
     * @param lithology            a mantle model (it carries the constants)
     * @param bulkWater            bulk water (mass fraction)
     * @param column               pressure with depth
     * @param potentialTemperature Tp (K)
     * @param maxDepth             deepest sample (m)
     * @param step                 spacing (m)
     */
    public static Result alongAdiabat(MantleLithology lithology, double bulkWater, LithostaticColumn column,
                                      double potentialTemperature, double maxDepth, double step) {
        SolidAdiabat adiabat = new SolidAdiabat(potentialTemperature, lithology.thermodynamics());
        Result r = along(lithology, bulkWater, column, adiabatPath(adiabat, column, maxDepth, step));
        if (!r.meltPresent()) {
            return r;
        }
        List<String> warnings = new ArrayList<>(r.warnings());
        warnings.add("the path is the solid adiabat: above the solidus a melting rock consumes latent heat and "
                + "follows a cooler path, so the melt fractions shown above the solidus are upper bounds");
        return new Result(r.crossings(), r.profile(), r.meltPresent(), r.maxMeltFraction(), warnings);
    }
}
