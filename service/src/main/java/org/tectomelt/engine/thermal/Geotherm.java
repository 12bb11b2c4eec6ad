package org.tectomelt.engine.thermal;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.function.DoubleFunction;
import java.util.function.DoubleUnaryOperator;
import org.apache.commons.math3.analysis.UnivariateFunction;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;

/**
 * A geotherm from the surface down: a conductive lithosphere, a mantle adiabat, or both joined
 * where they meet.
 *
 * <p>Combined: T(z) = Tcond(z) above the first depth zL where the conductive profile becomes at
 * least as hot as the adiabat, T(z) = Tad(z) below; zL is reported as the base of the thermal
 * lithosphere. The crossing is bracketed by scanning down from the surface in steps of
 * {@link #SCAN_STEP_M} and refined with Commons Math's bracketing {@link BrentSolver} to
 * {@link #CROSSING_ACCURACY_M}; two crossings closer together than the scan step would be
 * missed (none of the conductive models here turns over that fast). The profile is
 * continuous at zL; its gradient jumps there, which is the usual construction (e.g. McKenzie
 * &amp; Bickle 1988, doi:10.1093/petrology/29.3.625).
 *
 * <p>Without an adiabat the conductive model alone is used at every depth; without a
 * conductive model the adiabat reaches the surface.
 */
public final class Geotherm {

    /** Deepest depth a geotherm is evaluated or searched for its crossing (m). */
    public static final double MAX_DEPTH_M = MantleAdiabat.MAX_DEPTH_M;
    /** Step of the scan that brackets the crossing (m). */
    public static final double SCAN_STEP_M = 2e3;
    /** Accuracy of the crossing depth (m). */
    public static final double CROSSING_ACCURACY_M = 1e-3;

    private final ConductiveGeotherm conductive;
    private final MantleAdiabat adiabat;
    private final double base;

    private Geotherm(ConductiveGeotherm conductive, MantleAdiabat adiabat, double base) {
        this.conductive = conductive;
        this.adiabat = adiabat;
        this.base = base;
    }

    /** The pure conductive geotherm. */
    public static Geotherm conductive(ConductiveGeotherm conductive) {
        if (conductive == null) {
            throw new EngineException("a conductive geotherm is required");
        }
        return new Geotherm(conductive, null, Double.NaN);
    }

    /** The adiabat alone, up to the surface. */
    public static Geotherm adiabatic(MantleAdiabat adiabat) {
        if (adiabat == null) {
            throw new EngineException("an adiabat is required");
        }
        return new Geotherm(null, adiabat, 0.0);
    }

    /**
     * The conductive lithosphere above its first crossing with the adiabat, the adiabat below.
     *
     * @throws EngineException when the conductive profile stays colder than the adiabat down to {@link #MAX_DEPTH_M}
     */
    public static Geotherm combined(ConductiveGeotherm conductive, MantleAdiabat adiabat) {
        if (conductive == null || adiabat == null) {
            throw new EngineException("a combined geotherm needs a conductive geotherm and an adiabat");
        }
        OptionalDouble base = lithosphereBase(conductive, adiabat);
        if (base.isEmpty()) {
            throw new EngineException("the conductive geotherm stays colder than the mantle adiabat down to "
                    + Math.round(MAX_DEPTH_M / 1e3) + " km, so they never meet; lower the potential temperature "
                    + "or make the lithosphere hotter");
        }
        return new Geotherm(conductive, adiabat, base.getAsDouble());
    }

    /**
     * The first depth (m) at which {@code conductive} is at least as hot as {@code adiabat}, or
     * empty when that does not happen above {@link #MAX_DEPTH_M}.
     */
    public static OptionalDouble lithosphereBase(ConductiveGeotherm conductive, MantleAdiabat adiabat) {
        return firstCrossing(z -> conductive.temperatureAt(z) - adiabat.temperatureAt(z), MAX_DEPTH_M);
    }

    /** The first depth in [0, maxDepth] where {@code excess} becomes ≥ 0: scan by {@link #SCAN_STEP_M}, then Brent. */
    private static OptionalDouble firstCrossing(UnivariateFunction excess, double maxDepth) {
        double previous = 0;
        if (excess.value(0) >= 0) {
            return OptionalDouble.of(0);
        }
        while (previous < maxDepth) {
            double z = Math.min(previous + SCAN_STEP_M, maxDepth);
            double f = excess.value(z);
            if (f == 0) {
                return OptionalDouble.of(z);
            }
            if (f > 0) {
                return OptionalDouble.of(new BrentSolver(1e-14, CROSSING_ACCURACY_M)
                        .solve(200, excess, previous, z));
            }
            previous = z;
        }
        return OptionalDouble.empty();
    }

    /**
     * Where this geotherm lies at or above a solidus, searched from the surface down to {@code maxDepth}
     * (m) by the same scan and Brent refinement as the lithosphere base: the shallowest depth where it
     * reaches the solidus (0 when it is above it at the surface, as an adiabat is) and the depth below
     * that where it falls back below the solidus (for an adiabat, where rising mantle would start to
     * melt). Empty when the geotherm stays below the solidus.
     *
     * @param solidusAtDepth the solidus temperature (K) as a function of depth (m): the caller composes a
     *                       lithology's solidus with its pressure column
     * @param maxDepth       deepest depth searched (m), at most {@link #MAX_DEPTH_M}
     */
    public Optional<SolidusInterval> solidusInterval(DoubleUnaryOperator solidusAtDepth, double maxDepth) {
        double limit = Math.min(maxDepth, MAX_DEPTH_M);
        UnivariateFunction excess = z -> temperatureAt(z) - solidusAtDepth.applyAsDouble(z);
        OptionalDouble top = firstCrossing(excess, limit);
        if (top.isEmpty()) {
            return Optional.empty();
        }
        double from = top.getAsDouble();
        OptionalDouble below = firstCrossing(z -> -excess.value(z + from) - 1e-9, limit - from);
        return Optional.of(new SolidusInterval(from, below.isPresent()
                ? OptionalDouble.of(from + below.getAsDouble()) : OptionalDouble.empty()));
    }

    /**
     * The depths where a geotherm lies at or above a solidus (m).
     *
     * @param topDepth  the shallowest depth at or above the solidus (0 when the surface is)
     * @param baseDepth where the geotherm falls below the solidus again; empty when it stays above to the
     *                  depth searched
     */
    public record SolidusInterval(double topDepth, OptionalDouble baseDepth) {
    }

    /**
     * Thickness of the thermal lithosphere (m) this geotherm implies: for half-space cooling the depth of
     * the 0.9 isotherm ratio, 2.32·√(κt) (Turcotte &amp; Schubert, Geodynamics, ch. 4); for a plate model the
     * plate thickness; otherwise the depth where the conductive part meets the adiabat. Empty for an
     * adiabat alone, or a conductive profile that never meets one.
     */
    public OptionalDouble thermalLithosphereThickness() {
        if (conductive instanceof HalfSpaceCooling h) {
            return OptionalDouble.of(h.thermalThickness());
        }
        if (conductive instanceof PlateCooling p) {
            return OptionalDouble.of(p.parameters().plateThickness());
        }
        return conductive == null ? OptionalDouble.empty() : lithosphereBaseDepth();
    }

    /**
     * The lowest value of one parameter for which a family of conductive geotherms meets the
     * adiabat above {@link #MAX_DEPTH_M}, by bisection; for telling a caller how much hotter a
     * lithosphere must be. Assumes that raising the parameter warms the profile at every depth.
     *
     * @param family    builds the geotherm for a parameter value
     * @param adiabat   the adiabat to meet
     * @param low       a value at which the family may fail to meet it
     * @param high      the highest value worth considering
     * @param tolerance width of the final bracket, in the parameter's unit
     * @return the lowest meeting value (within {@code tolerance}, rounded up), or empty when even {@code high} fails
     */
    public static OptionalDouble lowestMeetingValue(DoubleFunction<ConductiveGeotherm> family, MantleAdiabat adiabat,
                                                    double low, double high, double tolerance) {
        if (lithosphereBase(family.apply(high), adiabat).isEmpty()) {
            return OptionalDouble.empty();
        }
        if (lithosphereBase(family.apply(low), adiabat).isPresent()) {
            return OptionalDouble.of(low);
        }
        double lo = low;
        double hi = high;
        while (hi - lo > tolerance) {
            double mid = 0.5 * (lo + hi);
            if (lithosphereBase(family.apply(mid), adiabat).isPresent()) {
                hi = mid;
            } else {
                lo = mid;
            }
        }
        return OptionalDouble.of(hi);
    }

    /** Temperature (K) at depth {@code zMetres} (m). */
    public double temperatureAt(double zMetres) {
        if (adiabat == null) {
            return conductive.temperatureAt(zMetres);
        }
        if (conductive == null || zMetres >= base) {
            return adiabat.temperatureAt(zMetres);
        }
        return conductive.temperatureAt(zMetres);
    }

    /** Temperatures (K) at each of {@code depths} (m). */
    public double[] temperaturesAt(double[] depths) {
        double[] t = new double[depths.length];
        for (int i = 0; i < depths.length; i++) {
            t[i] = temperatureAt(depths[i]);
        }
        return t;
    }

    /** Base of the thermal lithosphere (m): where the conductive part meets the adiabat; empty without an adiabat. */
    public OptionalDouble lithosphereBaseDepth() {
        return adiabat == null ? OptionalDouble.empty() : OptionalDouble.of(base);
    }

    /** The conductive part, if any. */
    public Optional<ConductiveGeotherm> conductivePart() {
        return Optional.ofNullable(conductive);
    }

    /** The adiabat, if any. */
    public Optional<MantleAdiabat> adiabat() {
        return Optional.ofNullable(adiabat);
    }

    /** Every published model this geotherm uses (not the pressure column). */
    public List<ModelInfo> models() {
        List<ModelInfo> all = new ArrayList<>();
        if (conductive != null) {
            all.addAll(conductive.models());
        }
        if (adiabat != null) {
            all.add(MantleAdiabat.INFO);
        }
        return List.copyOf(all);
    }

    /**
     * Number of depths {@link #depths} returns for this range and step: 0, step, 2·step, … up to
     * {@code maxDepth}, plus {@code maxDepth} itself when it is not on the grid.
     */
    public static long pointCount(double maxDepth, double step) {
        if (!(maxDepth > 0) || !(step > 0)) {
            throw new EngineException("a depth grid needs a positive depth range and step");
        }
        long whole = (long) Math.floor(maxDepth / step * (1 + 1e-12));
        boolean onGrid = Math.abs(whole * step - maxDepth) <= 1e-9 * maxDepth;
        return whole + 1 + (onGrid ? 0 : 1);
    }

    /** The depth grid (m) described in {@link #pointCount}. */
    public static double[] depths(double maxDepth, double step) {
        long n = pointCount(maxDepth, step);
        if (n > Integer.MAX_VALUE - 8) {
            throw new EngineException("too many depths for one geotherm");
        }
        double[] z = new double[(int) n];
        for (int i = 0; i < n; i++) {
            z[i] = Math.min(i * step, maxDepth);
        }
        z[(int) n - 1] = maxDepth;
        return z;
    }
}
