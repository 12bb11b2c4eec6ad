package org.tectomelt.engine.settings;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
import org.apache.commons.math3.analysis.UnivariateFunction;
import org.apache.commons.math3.analysis.solvers.AllowedSolution;
import org.apache.commons.math3.analysis.solvers.BracketingNthOrderBrentSolver;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.Lithology;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.melting.MeltState;
import org.tectomelt.engine.units.Units;

/**
 * Flux melting of the mantle wedge above a subducting slab: water released by the slab lowers the
 * solidus of the hot wedge peridotite, so rock that is solid when dry melts once water is added.
 * This class asks a hydrous-capable {@link Lithology} (by default the Katz, Spiegelman &amp;
 * Langmuir 2003 peridotite, G-cubed 4(9) 1073, doi:10.1029/2002GC000433) the questions an arc
 * petrologist puts at one pressure and temperature:
 * <ul>
 *   <li>the melt state for an added bulk water content (melt fraction, water in the melt,
 *       saturation, dry and wet solidus, solidus lowering) — the lithology's own law;</li>
 *   <li>the water-saturated solidus at that pressure: the solidus at the largest bulk water the
 *       model accepts (for Katz et al. 2003, 5 wt%, far beyond the D·X<sub>sat</sub> ≈ 0.1–0.4 wt%
 *       at which the first melt is already saturated);</li>
 *   <li>the least bulk water that starts melting: the root of T<sub>solidus</sub>(X<sub>bulk</sub>)
 *       − T = 0 on [0, X<sub>max</sub>], found with Commons Math's bracketing Brent solver of order
 *       5 ({@link BracketingNthOrderBrentSolver}); 0 when T is at or above the dry solidus, none
 *       when T is at or below the water-saturated solidus (water alone cannot melt the rock
 *       there: any more water stays a free fluid);</li>
 *   <li>the least bulk water at which a free fluid appears (bisection on the lithology's saturation
 *       flag, which switches once as water increases);</li>
 *   <li>melt fraction against bulk water (by default {@value #CURVE_POINTS} evenly spaced points
 *       from 0 to a maximum) and its slope at the requested water (see {@link #meltPerWater}).</li>
 * </ul>
 * The optional arc magma budget is {@link ArcMagmaBudget}.
 *
 * <p>Limits of the underlying model, which the wedge inherits: the Katz et al. (2003)
 * parameterization has no hydrous minerals (amphibole, chlorite, phlogopite). Where such minerals
 * would be stable (roughly below 3 GPa and 1000 °C, from memory) they would hold water and their
 * breakdown would set the solidus; here the water is dissolved in the nominally anhydrous residue
 * or is free fluid. Its water-saturated solidus is 120–200 K hotter than the experiments of Till,
 * Grove &amp; Withers (2012, Contrib. Mineral. Petrol. 163, 669, doi:10.1007/s00410-011-0692-6,
 * DOI from memory) at 3–6 GPa, inside the spread between experimental groups; it is reported, not
 * tuned. Pressure only: the wedge's flow, the slab's thermal structure and melt migration are not
 * modelled.
 *
 * <p>Immutable and thread-safe. SI units: Pa, K, mass fractions.
 */
public final class SubductionWedge {

    /** Points on the melt fraction against water curve. */
    public static final int CURVE_POINTS = 101;
    /** Step of the slope's difference quotient, relative to the bulk water. */
    public static final double SLOPE_RELATIVE_STEP = 1e-4;
    /** Melt density (kg/m³) used when the lithology does not state one: Katz et al. (2003), Table 2. */
    public static final double DEFAULT_MELT_DENSITY = 2900.0;
    /** What the wedge calculation assumes, for responses and documentation. */
    public static final String MODEL_ASSUMPTION = "wedge melting: batch equilibrium of the rock with all of its "
            + "added water at one pressure and temperature, by the lithology's hydrous law (Katz et al. 2003: the "
            + "solidus falls by K*X^gamma with X the water in the melt, capped at saturation); no hydrous minerals "
            + "(amphibole, chlorite, phlogopite) hold water, so water the melt and residue cannot dissolve is free "
            + "fluid; the water-saturated solidus is the solidus at the largest accepted water; the water for onset "
            + "is the root of wet solidus = temperature, found with a bracketing Brent solver";
    /** How the slope is computed, for responses and documentation. */
    public static final String SLOPE_METHOD = "slope of melt with water: one-sided three-point difference of "
            + "the model's melt fraction in bulk water, step 1e-4 times the bulk water, taken forward (as water is added) "
            + "unless a regime change (onset, saturation, cpx exhaustion, complete melting) lies within two "
            + "steps ahead, then backward; 0 once the melt is water-saturated; null at zero water (below 1e-10 wt%) when the rock "
            + "already melts dry, where the Katz et al. (2003) lowering K*X^0.75 makes it unbounded";

    /**
     * Bulk water (mass fraction, 10⁻¹⁰ wt%) below which the slope of melt with water is taken as at
     * zero water: the difference step 10⁻⁴ × X would otherwise underflow toward subnormal numbers
     * and the quotient would lose every digit (or overflow).
     */
    public static final double MIN_RESOLVED_WATER = 1e-12;

    /** Bulk water below which a bracket is considered closed (mass fraction). */
    private static final double WATER_ACCURACY = 1e-15;
    private static final int MAX_EVALUATIONS = 200;

    private final Lithology lithology;

    /**
     * @param lithology a hydrous-capable lithology
     * @throws EngineException when the lithology ignores water
     */
    public SubductionWedge(Lithology lithology) {
        if (!lithology.hydrous()) {
            throw new EngineException("flux melting needs a hydrous-capable lithology; " + lithology.id()
                    + " ignores water");
        }
        this.lithology = lithology;
    }

    /** The wedge of fertile Katz et al. (2003) peridotite. */
    public static SubductionWedge katzPeridotite() {
        return new SubductionWedge(Katz2003Peridotite.fertile());
    }

    /** The wedge's rock. */
    public Lithology lithology() {
        return lithology;
    }

    /** Melt density (kg/m³): the lithology's own where it states one, else {@value #DEFAULT_MELT_DENSITY}. */
    public double meltDensity() {
        return lithology instanceof MantleLithology m ? m.thermodynamics().meltDensity() : DEFAULT_MELT_DENSITY;
    }

    /** Melt state at pressure {@code p} (Pa), temperature {@code t} (K) and bulk water (mass fraction). */
    public MeltState melt(double p, double t, double bulkWater) {
        return lithology.melt(p, t, bulkWater);
    }

    /**
     * The water-saturated solidus (K) at {@code p} (Pa): the solidus at the largest bulk water the
     * lithology accepts. The solidus falls as water is added and stops falling once the first melt
     * is saturated, so this is the lowest solidus water can give.
     */
    public double saturatedSolidus(double p) {
        return lithology.melt(p, lithology.drySolidus(p), lithology.maxBulkWater()).solidus();
    }

    /**
     * The least bulk water (mass fraction) whose wet solidus is at or below {@code t}.
     *
     * @param p pressure (Pa)
     * @param t temperature (K)
     * @return 0 when {@code t} is at or above the dry solidus; empty when {@code t} is at or below
     *         the water-saturated solidus (no amount of water melts the rock); otherwise the root
     */
    public OptionalDouble waterForOnset(double p, double t) {
        if (t >= lithology.drySolidus(p)) {
            return OptionalDouble.of(0.0);
        }
        double wMax = lithology.maxBulkWater();
        if (t <= saturatedSolidus(p)) {
            return OptionalDouble.empty();
        }
        // The wet solidus falls strictly with water until the first melt is saturated, then stays at
        // the saturated solidus (< t here): exactly one sign change on [0, wMax].
        UnivariateFunction excess = w -> lithology.melt(p, t, w).solidus() - t;
        BracketingNthOrderBrentSolver solver = new BracketingNthOrderBrentSolver(1e-12, WATER_ACCURACY, 1e-9, 5);
        return OptionalDouble.of(solver.solve(MAX_EVALUATIONS, excess, 0.0, wMax, AllowedSolution.ANY_SIDE));
    }

    /**
     * The least bulk water (mass fraction) at which the rock holds a free fluid at {@code p} (Pa) and
     * {@code t} (K): bisection on the lithology's saturation flag, which switches from false to true
     * once as water increases. Empty when the lithology's accepted range does not reach saturation.
     */
    public OptionalDouble waterForSaturation(double p, double t) {
        double hi = lithology.maxBulkWater();
        if (!lithology.melt(p, t, hi).waterSaturated()) {
            return OptionalDouble.empty();
        }
        double lo = 0.0;
        while (hi - lo > WATER_ACCURACY + 1e-12 * hi) {
            double mid = 0.5 * (lo + hi);
            if (lithology.melt(p, t, mid).waterSaturated()) {
                hi = mid;
            } else {
                lo = mid;
            }
        }
        return OptionalDouble.of(hi);
    }

    /**
     * Slope dF/dX<sub>bulk</sub> of the melt fraction with bulk water at {@code bulkWater}, as water
     * is added (dimensionless; equal to percent melt per wt% water). Numerical: a one-sided
     * three-point difference, second-order accurate, with step h = {@value #SLOPE_RELATIVE_STEP} ×
     * X<sub>bulk</sub>:
     * <pre>
     *   forward   (−3 F(X) + 4 F(X + h) − F(X + 2h)) / 2h
     *   backward  ( 3 F(X) − 4 F(X − h) + F(X − 2h)) / 2h
     * </pre>
     * Forward by default; backward when the regime (melting or not, saturated or not, cpx exhausted
     * or not, fully molten or not) changes within two steps ahead or the step would pass the
     * largest accepted water, so that the quotient never straddles a kink of F. With the root
     * accuracy of the melt fraction (10⁻¹²) the rounding error is below 10⁻⁶ relative for bulk water
     * above 10⁻⁴ wt%.
     *
     * @param p         pressure (Pa)
     * @param t         temperature (K)
     * @param bulkWater bulk water (mass fraction)
     * @return 0 once the melt is water-saturated (more water is only free fluid) or while no melt
     *         forms; empty at zero water when the rock already melts dry (the slope is unbounded there
     *         because the lowering K·X<sup>γ</sup> has γ &lt; 1)
     */
    public OptionalDouble meltPerWater(double p, double t, double bulkWater) {
        MeltState here = lithology.melt(p, t, bulkWater);
        if (bulkWater < MIN_RESOLVED_WATER) {
            return here.meltFraction() > 0 ? OptionalDouble.empty() : OptionalDouble.of(0.0);
        }
        if (here.waterSaturated()) {
            return OptionalDouble.of(0.0);
        }
        double h = SLOPE_RELATIVE_STEP * bulkWater;
        int regime = regime(here);
        if (bulkWater + 2 * h <= lithology.maxBulkWater()) {
            MeltState one = lithology.melt(p, t, bulkWater + h);
            MeltState two = lithology.melt(p, t, bulkWater + 2 * h);
            if (regime(one) == regime && regime(two) == regime) {
                return OptionalDouble.of((-3 * here.meltFraction() + 4 * one.meltFraction() - two.meltFraction())
                        / (2 * h));
            }
        }
        double f1 = lithology.melt(p, t, bulkWater - h).meltFraction();
        double f2 = lithology.melt(p, t, bulkWater - 2 * h).meltFraction();
        return OptionalDouble.of((3 * here.meltFraction() - 4 * f1 + f2) / (2 * h));
    }

    /**
     * {@code points} evenly spaced bulk water contents from 0 to {@code maxWater} inclusive, each
     * computed as maxWater · i / (points − 1) (the grid of the water curve).
     */
    public static double[] evenWaterGrid(double maxWater, int points) {
        if (points < 2) {
            throw new EngineException("a water curve needs at least two points");
        }
        double[] grid = new double[points];
        for (int i = 0; i < points; i++) {
            grid[i] = maxWater * i / (points - 1);
        }
        return grid;
    }

    /**
     * Melt fraction at each of {@code bulkWaters} (mass fractions, each within the lithology's accepted
     * range): the melt fraction against water curve.
     */
    public List<WedgeMelting.CurvePoint> waterCurve(double p, double t, double[] bulkWaters) {
        List<WedgeMelting.CurvePoint> curve = new ArrayList<>(bulkWaters.length);
        for (double w : bulkWaters) {
            if (!(w >= 0 && w <= lithology.maxBulkWater())) {
                throw new EngineException(String.format(Locale.ROOT,
                        "water curve points must lie between 0 and %.3g wt%% for %s",
                        lithology.maxBulkWater() * 100, lithology.id()));
            }
            MeltState s = lithology.melt(p, t, w);
            curve.add(new WedgeMelting.CurvePoint(w, s.meltFraction(), s.waterSaturated()));
        }
        return curve;
    }

    /**
     * Everything at once: melt state, onset and saturation water, slope, curve and (when a water
     * flux is given) the arc magma budget.
     *
     * @param p         pressure (Pa)
     * @param t         wedge temperature (K)
     * @param bulkWater bulk water added to the rock (mass fraction)
     * @param curveWaters bulk water contents of the curve (mass fractions), e.g. {@link #evenWaterGrid}
     * @param waterFlux slab water flux into the wedge (kg per m of arc per s), or empty for no budget
     * @throws EngineException when the lithology cannot give a number at these inputs
     */
    public WedgeMelting evaluate(double p, double t, double bulkWater, double[] curveWaters,
                                 OptionalDouble waterFlux) {
        MeltState state = lithology.melt(p, t, bulkWater);
        List<String> warnings = new ArrayList<>(state.warnings());
        double tsat = saturatedSolidus(p);
        OptionalDouble onset = waterForOnset(p, t);
        OptionalDouble saturation = waterForSaturation(p, t);
        double freeFluid = state.waterSaturated() && saturation.isPresent()
                ? Math.max(0.0, bulkWater - saturation.getAsDouble()) : 0.0;
        OptionalDouble slope = meltPerWater(p, t, bulkWater);
        List<WedgeMelting.CurvePoint> curve = waterCurve(p, t, curveWaters);

        if (onset.isEmpty()) {
            warnings.add(String.format(Locale.ROOT, "no amount of water melts this rock: %.0f °C is at or below the "
                    + "water-saturated solidus (%.0f °C) at %.2f GPa, so the water for onset is null; added water "
                    + "stays a free fluid", c(t), c(tsat), gpa(p)));
        } else if (onset.getAsDouble() == 0.0) {
            warnings.add(String.format(Locale.ROOT, "%.0f °C is at or above the dry solidus (%.0f °C) at %.2f GPa: "
                    + "the rock melts without water, so the water for onset is 0", c(t), c(state.drySolidus()),
                    gpa(p)));
        }
        if (freeFluid > 0) {
            warnings.add(String.format(Locale.ROOT, "%.3g wt%% of the rock is free fluid: beyond %.3g wt%% bulk water "
                    + "the rock (melt and residue) dissolves no more at this pressure and temperature; the excess "
                    + "neither lowers the solidus further nor makes more melt", Units.fractionToWtPct(freeFluid),
                    Units.fractionToWtPct(saturation.getAsDouble())));
        }
        if (slope.isEmpty()) {
            warnings.add("the slope of melt with water is null: at zero water the rock already melts dry, and the "
                    + "solidus lowering K*X^0.75 of Katz et al. (2003) rises infinitely steeply from zero water; ask "
                    + "at a small positive water content");
        }

        boolean meltsDry = onset.isPresent() && onset.getAsDouble() == 0.0;
        Optional<ArcMagmaBudget> budget = Optional.empty();
        if (waterFlux.isPresent()) {
            if (meltsDry) {
                // the melt is not made by the slab's water, so the flux does not set its amount:
                // dividing the flux by a vanishing melt water content would give any number at all
                warnings.add("no magma budget: the wedge is at or above its dry solidus and melts without added "
                        + "water (by decompression or heating, not flux melting), so the slab's water flux does "
                        + "not set how much melt forms");
            } else if (state.meltFraction() > 0 && state.waterInMelt() > 0) {
                budget = Optional.of(new ArcMagmaBudget(waterFlux.getAsDouble(), state.waterInMelt(), meltDensity()));
            } else {
                warnings.add(state.meltFraction() > 0
                        ? "no magma budget: the melt holds no water at zero bulk water, and the budget divides the "
                                + "water flux by the melt's water content"
                        : "no magma budget: no melt forms at this state to carry the slab's water away");
            }
        }
        WedgeMelting result = new WedgeMelting(p, t, bulkWater, state, state.drySolidus() - state.solidus(), tsat,
                onset, saturation, freeFluid, slope, curve, budget, warnings);
        requireFinite(result);
        return result;
    }

    /**
     * Refuses a result holding a non-finite number, naming the inputs, so that a corner of the
     * model never reaches a caller as NaN or Infinity.
     */
    private static void requireFinite(WedgeMelting m) {
        double[] values = {m.state().meltFraction(), m.state().waterInMelt(), m.state().solidus(),
                m.state().drySolidus(), m.solidusDepression(), m.saturatedSolidus(), m.freeFluid(),
                m.waterForOnset().orElse(0), m.waterForSaturation().orElse(0), m.meltPerWater().orElse(0),
                m.budget().map(ArcMagmaBudget::meltVolumeRate).orElse(0.0)};
        boolean finite = true;
        for (double v : values) {
            finite &= Double.isFinite(v);
        }
        for (WedgeMelting.CurvePoint c : m.waterCurve()) {
            finite &= Double.isFinite(c.meltFraction());
        }
        if (!finite) {
            throw new EngineException(String.format(Locale.ROOT, "the wedge model gives no finite result at "
                    + "%.6g GPa, %.6g °C and %.6g wt%% bulk water; move these inputs away from the edge of their "
                    + "ranges", gpa(m.pressure()), c(m.temperature()), Units.fractionToWtPct(m.bulkWater())));
        }
    }

    /** A code for the piecewise regime of the melt-fraction law, so differences never straddle a kink. */
    private static int regime(MeltState s) {
        return (s.meltFraction() > 0 ? 1 : 0)
                | (s.waterSaturated() ? 2 : 0)
                | (s.cpxExhausted() ? 4 : 0)
                | (s.meltFraction() >= 1.0 ? 8 : 0);
    }

    private static double c(double kelvin) {
        return Units.kelvinToCelsius(kelvin);
    }

    private static double gpa(double pa) {
        return Units.paToGpa(pa);
    }
}
