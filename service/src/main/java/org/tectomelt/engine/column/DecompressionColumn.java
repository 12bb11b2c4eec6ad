package org.tectomelt.engine.column;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.Set;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.exception.MathIllegalStateException;
import org.apache.commons.math3.ode.FirstOrderDifferentialEquations;
import org.apache.commons.math3.ode.events.EventHandler;
import org.apache.commons.math3.ode.nonstiff.DormandPrince853Integrator;
import org.apache.commons.math3.ode.sampling.StepHandler;
import org.apache.commons.math3.ode.sampling.StepInterpolator;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.melting.MantleThermodynamics;
import org.tectomelt.engine.thermal.LithostaticColumn;

/**
 * An isentropic (adiabatic, reversible) decompression melting column for any
 * {@link MantleLithology}.
 *
 * <p><b>Below the solidus</b> the rock follows the solid adiabat
 * <pre>  T = Tp · exp(αs P / (ρs cp))            (T in K, P in Pa)</pre>
 * The onset is the deepest pressure at which this adiabat reaches the (wet) solidus
 * T(P, F = 0, Xbulk) of the lithology; it is bracketed by a scan from the model's deepest pressure
 * upwards and refined with Brent's method to 1 Pa.
 *
 * <p><b>While melting</b> entropy is conserved, cp dT/T − [F αf/ρf + (1 − F) αs/ρs] dP + ΔS dF = 0,
 * which gives the isentropic productivity of Katz et al. (2003), written by them as
 * <pre>  dF/dP = −[(cp/T)(∂T/∂P)_F − F αf/ρf − (1 − F) αs/ρs] / [ΔS + (cp/T)(∂T/∂F)_P]</pre>
 * with T(P, F) the lithology's {@link MantleLithology#temperatureAt inverse melting law}. Because
 * (∂T/∂F)_P is infinite at the start of a branch of that law whenever F − F₀ ∝ (T − T₀)ⁿ with
 * n &gt; 1 (n = β1 = 1.5 at the solidus and β2 = 1.5 after cpx exhaustion for Katz et al. 2003), the
 * column integrates instead in the regular variable
 * <pre>  u = ((F − F₀(P)) / (1 − F₀(P)))^(1/n)     (u = F^(1/β1) on the solidus branch, F₀ = 0)</pre>
 * in which T(P, u) and F(P, u) are both smooth, and the same entropy balance reads
 * <pre>  du/dP = −[(cp/T) T_P − A(F) + ΔS F_P] / [(cp/T) T_u + ΔS F_u]</pre>
 * (partials at constant u and P; at u = 0 the denominator stays finite, so the integration leaves
 * F = 0 by itself). T_P and T_u are central differences of the law on the current branch
 * ({@link MantleLithology#temperatureOnBranch}; steps of {@value #PRESSURE_STEP_PA} Pa and
 * {@value #U_STEP} in u, second-order one-sided at P = 0 and u = 0); F_u and F_P are analytic. Each
 * branch is integrated in σ = √(height above its start) rather than in height, because u itself
 * grows as s + s^1.5 + … with the distance s from the start: in σ it is analytic and the
 * integrator takes full-sized steps from the first one.
 *
 * <p><b>Kinks.</b> Where a phase is exhausted ({@link MantleLithology#exhaustionMeltFraction}, cpx
 * for Katz et al. 2003) (∂T/∂F)_P jumps. The solidus branch is integrated with its own formula
 * continued past that point, an event handler stops the integration exactly where F reaches the
 * exhaustion fraction, and it restarts on the next branch with u = 0. A branch that runs back to
 * u = 0 returns to the previous one; a column that freezes completely (F back to 0, possible with
 * water near the surface) follows the solid adiabat again until it may meet the solidus once more.
 *
 * <p><b>Integrator.</b> Dormand–Prince 8(5,3) (Apache Commons Math) with relative tolerance
 * {@value #RELATIVE_TOLERANCE} and absolute tolerance {@value #ABSOLUTE_TOLERANCE} on u; output
 * points come from its dense (7th-order) output; ∫F dz and the moments for the mean pressure are
 * integrated as further components of the same system. Where a hydrous melt's water reaches its
 * saturation cap on the way up (within metres of a top at zero pressure), T(P, F) has a kink: the
 * integration runs up to it on the law continued below saturation, stops there (an event), and
 * goes on with the capped law, towards a top at zero pressure in a variable that keeps that end
 * regular and with finite differences on the saturated side scaled to the pressure. This changes
 * the answers by a few parts in 10⁹ and spares the integrator some two thirds of its work there.
 *
 * <p><b>Water.</b> Batch melting: the melt stays with its residue up to the top of the column, so
 * the bulk water stays in the system and partitions between residue and melt with the
 * lithology's bulk/melt partition coefficient (X_melt = Xbulk/(D + F(1 − D)) for Katz et al.
 * 2003), as in the adiabatic melting calculations of Katz et al. (2003, §5; from memory). With
 * fractional melting the residue would dry out as melt is extracted (after a per cent or so of
 * melting for D = 0.01) and the hydrous tail would be even less productive.
 *
 * <p><b>Melt and crust.</b> Melt thickness is ∫F dz for passive, triangular upwelling beneath a
 * spreading centre (McKenzie &amp; Bickle 1988; Plank &amp; Langmuir 1992) and F_max·H for active,
 * columnar upwelling (H the melting height). All melt is extracted and makes crust of density ρc:
 * the melt mass per unit area is ρs·h, so the crust is h·ρs/ρc thick (the melt's own density ρf
 * cancels between its volume as liquid, ρs h/ρf, and its compaction to crust). The mean pressure of
 * melting weights each pressure by the melt produced there: for passive upwelling by −dF/dz times
 * the fraction of columns that reach that level, (z − z_top)/H, after Plank &amp; Langmuir (1992);
 * for active upwelling by −dF/dz alone.
 *
 * <p><b>Accuracy.</b> The integration error is far below the model error: results change by less
 * than 1e-6 relative when the tolerance is tightened tenfold, and with αf/ρf = αs/ρs the entropy
 * identity F·ΔS = cp·ln(T_adiabat/T) holds to 1e-7 (tested). The physical accuracy is that of the
 * melting law (tens of kelvin in the solidus, a few per cent in F) and of the assumptions above: no
 * conductive cooling (slow ridges make less melt), no melt segregation during ascent.
 *
 * @param lithology            the melting law
 * @param thermodynamics       cp, ΔS, αs, αf, ρs, ρf (usually the lithology's own; overridable)
 * @param potentialTemperature mantle potential temperature Tp (K)
 * @param bulkWater            bulk water (mass fraction)
 * @param lidDepth             depth of the lid base (m), where melting stops; 0 for the surface
 * @param upwelling            passive (triangular) or active (columnar) upwelling
 * @param outputStep           depth spacing of the output profile (m)
 * @param pressures            pressure with depth along the column
 * @param crustDensity         density ρc of the crust the melt makes (kg/m³)
 */
public record DecompressionColumn(MantleLithology lithology, MantleThermodynamics thermodynamics,
                                  double potentialTemperature, double bulkWater, double lidDepth,
                                  Upwelling upwelling, double outputStep, LithostaticColumn pressures,
                                  double crustDensity) implements MeltingColumn {

    /** The isentropic melting equation. */
    public static final ModelInfo INFO = new ModelInfo("isentropic-melting-katz2003",
            "Katz, R.F., Spiegelman, M. & Langmuir, C.H. (2003) A new parameterization of hydrous mantle "
                    + "melting. Geochemistry, Geophysics, Geosystems 4(9), 1073 (isentropic productivity dF/dP)",
            "10.1029/2002GC000433");
    /** Melt thickness of a passive, triangular melting regime, h = ∫F dz. */
    public static final ModelInfo PASSIVE_REGIME_INFO = new ModelInfo("melt-thickness-mckenzie-bickle1988",
            "McKenzie, D. & Bickle, M.J. (1988) The volume and composition of melt generated by extension "
                    + "of the lithosphere. Journal of Petrology 29(3), 625-679",
            "10.1093/petrology/29.3.625");
    /** Mean pressure of melting weighted by melt production in a triangular regime. */
    public static final ModelInfo MEAN_PRESSURE_INFO = new ModelInfo("mean-melting-pressure-plank-langmuir1992",
            "Plank, T. & Langmuir, C.H. (1992) Effects of the melting regime on the composition of the oceanic "
                    + "crust. Journal of Geophysical Research 97(B13), 19749-19770",
            "10.1029/92JB01769");

    /** Relative tolerance of the ODE integration. */
    public static final double RELATIVE_TOLERANCE = 1e-8;
    /** Absolute tolerance of the ODE integration on u (dimensionless). */
    public static final double ABSOLUTE_TOLERANCE = 1e-10;
    /** Default density of the igneous crust made from the melt (kg/m³): common practice for oceanic crust. */
    public static final double DEFAULT_CRUST_DENSITY = 2900.0;
    /** Default output spacing (m). */
    public static final double DEFAULT_OUTPUT_STEP = 1000.0;
    /** Finest output spacing accepted (m). */
    public static final double MIN_OUTPUT_STEP = 10.0;
    /** Pressure step of the finite differences (Pa): 0.01 MPa, about 0.3 m of mantle. */
    public static final double PRESSURE_STEP_PA = 1e4;
    /**
     * Pressure step of the finite differences past the melt's water-saturation point, as a fraction
     * of the pressure (below {@link #PRESSURE_STEP_PA}): there the saturated water Xsat ∝ P^0.6
     * makes T(P) change on the scale of P itself as P → 0, which a fixed 0.01 MPa step cannot
     * follow (the difference jumped where it turned one-sided, and the integrator crawled through
     * the top metres). Elsewhere the fixed step is used, so dry and undersaturated columns are
     * unchanged.
     */
    public static final double RELATIVE_PRESSURE_STEP = 0.01;
    /** Exponent of the integration variable towards a top at zero pressure (see {@code TowardTop}). */
    static final double TOP_EXPONENT = 12;

    /** Smallest pressure step of the finite differences (Pa). */
    public static final double MIN_PRESSURE_STEP_PA = 1e-3;

    /** Step in u of the finite differences. */
    public static final double U_STEP = 1e-6;

    private static final int SCAN_INTERVALS = 64;
    private static final int MAX_SEGMENTS = 50;
    /**
     * Events are checked at least every 25 √m of σ (every step end in practice). Their switching
     * functions, F − F_exhaustion and u, change sign at most once within such an interval, so
     * nothing is missed, and the check costs one interpolation per step instead of hundreds.
     */
    private static final double EVENT_CHECK_INTERVAL = 25.0;
    /** Event location to 1e-7 √m of σ (below a millimetre of height). */
    private static final double EVENT_CONVERGENCE = 1e-7;
    /** Below σ = 1 √m (1 m above a branch start) the productivity is computed directly, not from du/dσ. */
    private static final double SIGMA_DIRECT = 1.0;
    private static final int EVENT_MAX_ITERATIONS = 200;
    private static final double GRID_SLACK = 1e-6;

    /** Validates the inputs. */
    public DecompressionColumn {
        if (lithology == null || thermodynamics == null || upwelling == null || pressures == null) {
            throw new IllegalArgumentException("lithology, thermodynamics, upwelling and pressures are required");
        }
        checkCommon(potentialTemperature, lidDepth, outputStep, crustDensity);
        checkWater(lithology, bulkWater);
    }

    /**
     * A passive column up to the surface with the lithology's own thermodynamic constants, a
     * mantle-only lithostatic column of density ρs, 1 km output steps and crust of 2900 kg/m³.
     *
     * @param lithology            melting law
     * @param potentialTemperature Tp (K)
     * @param bulkWater            bulk water (mass fraction)
     */
    public static DecompressionColumn of(MantleLithology lithology, double potentialTemperature, double bulkWater) {
        MantleThermodynamics th = lithology.thermodynamics();
        return new DecompressionColumn(lithology, th, potentialTemperature, bulkWater, 0.0, Upwelling.PASSIVE,
                DEFAULT_OUTPUT_STEP, new LithostaticColumn(0.0, LithostaticColumn.CRUST_DENSITY, th.solidDensity(),
                LithostaticColumn.G), DEFAULT_CRUST_DENSITY);
    }

    /** This column with melting stopped at a lid base at {@code depth} (m). */
    public DecompressionColumn withLidDepth(double depth) {
        return new DecompressionColumn(lithology, thermodynamics, potentialTemperature, bulkWater, depth, upwelling,
                outputStep, pressures, crustDensity);
    }

    /** This column with another upwelling regime. */
    public DecompressionColumn withUpwelling(Upwelling regime) {
        return new DecompressionColumn(lithology, thermodynamics, potentialTemperature, bulkWater, lidDepth, regime,
                outputStep, pressures, crustDensity);
    }

    /** This column with output points every {@code step} (m). */
    public DecompressionColumn withOutputStep(double step) {
        return new DecompressionColumn(lithology, thermodynamics, potentialTemperature, bulkWater, lidDepth, upwelling,
                step, pressures, crustDensity);
    }

    /** This column with other thermodynamic constants (tests set αf/ρf = αs/ρs with it). */
    public DecompressionColumn withThermodynamics(MantleThermodynamics th) {
        return new DecompressionColumn(lithology, th, potentialTemperature, bulkWater, lidDepth, upwelling,
                outputStep, pressures, crustDensity);
    }

    /** This column with another pressure–depth relation (a crust over the mantle, for instance). */
    public DecompressionColumn withPressures(LithostaticColumn column) {
        return new DecompressionColumn(lithology, thermodynamics, potentialTemperature, bulkWater, lidDepth, upwelling,
                outputStep, column, crustDensity);
    }

    /** This column with another crust density (kg/m³). */
    public DecompressionColumn withCrustDensity(double density) {
        return new DecompressionColumn(lithology, thermodynamics, potentialTemperature, bulkWater, lidDepth, upwelling,
                outputStep, pressures, density);
    }

    /** Batch: the solid residue holds D·X_melt while melting, all the bulk water below the solidus. */
    private double residueWater(double f, double waterInMelt) {
        return bulkWater > 0 && f > 0 ? lithology.waterPartition() * waterInMelt : bulkWater;
    }

    /** Batch melting, always. */
    @Override
    public MeltingMode mode() {
        return MeltingMode.BATCH;
    }

    /** Temperature (K) of the melt-free solid adiabat at pressure {@code p} (Pa). */
    public double adiabatTemperature(double p) {
        MantleThermodynamics th = thermodynamics;
        return potentialTemperature * Math.exp(th.solidExpansivity() * p / (th.solidDensity() * th.heatCapacity()));
    }

    /** Solidus (K) at pressure {@code p} (Pa) for this column's bulk water. */
    public double solidus(double p) {
        return lithology.temperatureAt(p, 0.0, bulkWater);
    }

    /**
     * Pressure (Pa) where the solid adiabat first meets the solidus on the way up, or empty when it
     * stays below the solidus all the way to the surface.
     *
     * @throws EngineException when the adiabat is above the solidus even at the deepest pressure the
     *                         lithology covers (melting would begin deeper than the model reaches)
     */
    public OptionalDouble onsetPressure() {
        return onsetBelow(lithology.hardMaxPressure(), true);
    }

    private double excess(double p) {
        return adiabatTemperature(p) - solidus(p);
    }

    /** First crossing from below to above the solidus at pressures up from {@code pStart}. */
    private OptionalDouble onsetBelow(double pStart, boolean fromModelBottom) {
        double gHi = excess(pStart);
        if (gHi >= 0 && fromModelBottom) {
            throw new EngineException(String.format(Locale.ROOT,
                    "the adiabat of potential temperature %.0f °C is above the solidus of %s even at %.1f GPa: "
                            + "melting would begin deeper than the model reaches; lower the potential temperature or "
                            + "the water content", potentialTemperature - 273.15, lithology.name(),
                    lithology.hardMaxPressure() * 1e-9));
        }
        double dp = lithology.hardMaxPressure() / SCAN_INTERVALS;
        double hi = pStart;
        while (hi > 0) {
            double lo = Math.max(0.0, hi - dp);
            double gLo = excess(lo);
            if (gLo >= 0 && gHi < 0) {
                if (gLo == 0) {
                    return OptionalDouble.of(lo);
                }
                double root = new BrentSolver(1e-15, 1.0).solve(200, this::excess, lo, hi);
                return OptionalDouble.of(root);
            }
            hi = lo;
            gHi = gLo;
        }
        return OptionalDouble.empty();
    }

    /**
     * Runs the column.
     *
     * @throws EngineException when the lithology cannot give a number on the way (pressure beyond its
     *                         range, the melt fraction reaching 1)
     */
    public ColumnResult solve() {
        List<String> warnings = new ArrayList<>();
        OptionalDouble onsetP = onsetPressure();
        if (onsetP.isEmpty()) {
            warnings.add(String.format(Locale.ROOT,
                    "no melting: the adiabat of potential temperature %.0f °C stays below the solidus all the way "
                            + "to the surface", potentialTemperature - 273.15));
            return noMelt(Optional.empty(), warnings);
        }
        double p0 = onsetP.getAsDouble();
        double z0 = pressures.depthAt(p0);
        ColumnState onset = new ColumnState(z0, p0, adiabatTemperature(p0), 0.0);
        warnings.addAll(lithology.melt(p0, onset.temperature(), bulkWater).warnings());
        if (z0 <= lidDepth) {
            warnings.add(String.format(Locale.ROOT,
                    "no melting: the lid base at %.1f km is deeper than the onset of melting at %.1f km",
                    lidDepth / 1e3, z0 / 1e3));
            return noMelt(Optional.of(onset), warnings);
        }
        return new Run(onset).integrate(warnings);
    }

    private ColumnResult noMelt(Optional<ColumnState> onset, List<String> warnings) {
        return new ColumnResult(this, onset, Optional.empty(), 0.0, 0.0, 0.0, 0.0, 0.0, OptionalDouble.empty(),
                List.of(), dedupe(warnings), List.of(new LithologyMelting(lithology, 1.0,
                        onset.filter(o -> o.depth() > lidDepth), 0.0, 0.0, 0.0)));
    }

    /** Every model the result rests on. */
    public List<ModelInfo> models() {
        Set<ModelInfo> m = new LinkedHashSet<>(lithology.citations());
        m.add(INFO);
        if (upwelling == Upwelling.PASSIVE) {
            m.add(PASSIVE_REGIME_INFO);
        }
        m.add(MEAN_PRESSURE_INFO);
        m.add(LithostaticColumn.INFO);
        return List.copyOf(m);
    }

    /** The assumptions, in words, with the constants used. */
    public List<String> assumptions() {
        MantleThermodynamics th = thermodynamics;
        List<String> a = new ArrayList<>();
        a.add(String.format(Locale.ROOT, "isentropic decompression: below the solidus the solid adiabat "
                        + "T = Tp·exp(αs·P/(ρs·cp)); while melting the latent heat (ΔS = %.0f J/kg/K) cools the rock; "
                        + "no conductive heat loss, melt stays in equilibrium with its residue until the top; "
                        + "cp = %.0f J/kg/K, αs = %.2g /K, αf = %.2g /K, ρs = %.0f kg/m³, ρf = %.0f kg/m³",
                th.entropyOfFusion(), th.heatCapacity(), th.solidExpansivity(), th.meltExpansivity(),
                th.solidDensity(), th.meltDensity()));
        a.add("water: batch melting, the bulk water stays in the system and partitions between residue and melt "
                + "(as in the adiabatic calculations of Katz et al. 2003); fractional extraction would dry the "
                + "residue after about 1 % melting");
        a.addAll(regimeAssumptions(this));
        a.add(String.format(Locale.ROOT, "numerics: Dormand-Prince 8(5,3) adaptive integration in u = F^(1/n) "
                + "(restarted at cpx exhaustion), relative tolerance %.0e", RELATIVE_TOLERANCE));
        return a;
    }

    /** The lid, upwelling, crust and pressure assumptions every column states. */
    static List<String> regimeAssumptions(MeltingColumn c) {
        LithostaticColumn pressures = c.pressures();
        return List.of(c.lidDepth() > 0
                        ? String.format(Locale.ROOT, "melting stops at the base of a lid at %.1f km", c.lidDepth() / 1e3)
                        : "no lid: melting continues up to the surface",
                c.upwelling() == Upwelling.PASSIVE
                        ? "passive (triangular) upwelling: melt thickness = ∫F dz over the column (McKenzie & Bickle "
                                + "1988); mean melting pressure weighted by melt production and by the share of columns "
                                + "reaching each level (Plank & Langmuir 1992)"
                        : "active (columnar) upwelling: every parcel crosses the whole column, melt thickness = F_max × "
                                + "melting height; mean melting pressure weighted by melt production",
                String.format(Locale.ROOT, "crustal thickness = melt thickness × ρs/ρc with ρs = %.0f and ρc = %.0f "
                        + "kg/m³: all melt is extracted and crystallises as crust", c.thermodynamics().solidDensity(),
                        c.crustDensity()),
                String.format(Locale.ROOT, "pressure from depth: lithostatic, mantle %.0f kg/m³%s, g = %.2f m/s²",
                        pressures.mantleDensity(), pressures.crustThicknessM() > 0
                                ? String.format(Locale.ROOT, " below %.1f km of crust at %.0f kg/m³",
                                pressures.crustThicknessM() / 1e3, pressures.crustDensity()) : "", pressures.gravity()));
    }

    /** Checks the bulk water against what the lithology accepts. */
    static void checkWater(MantleLithology lithology, double bulkWater) {
        if (!(bulkWater >= 0) || bulkWater > lithology.maxBulkWater()) {
            throw new EngineException(String.format(Locale.ROOT, "%s accepts bulk water between 0 and %.3g wt%%",
                    lithology.name(), lithology.maxBulkWater() * 100));
        }
    }

    /** Checks the inputs every column shares. */
    static void checkCommon(double potentialTemperature, double lidDepth, double outputStep, double crustDensity) {
        if (!(potentialTemperature > 0) || !Double.isFinite(potentialTemperature)) {
            throw new EngineException("potential temperature must be a positive temperature in kelvin");
        }
        if (!(lidDepth >= 0) || lidDepth > LithostaticColumn.MAX_DEPTH_M) {
            throw new EngineException("lid depth must be between 0 and 700 km");
        }
        if (!(outputStep >= MIN_OUTPUT_STEP) || !Double.isFinite(outputStep)) {
            throw new EngineException("output step must be at least 10 m");
        }
        if (!(crustDensity > 0)) {
            throw new EngineException("crust density must be positive");
        }
    }

    // ---------------------------------------------------------------------------------------------
    // the melting state in the regular coordinate u, one branch of the melting law at a time

    /** dP/dz (Pa/m) at depth z. */
    private double pressureGradient(double z) {
        double rho = z < pressures.crustThicknessM() ? pressures.crustDensity() : pressures.mantleDensity();
        return rho * pressures.gravity();
    }

    /** Start fraction F₀ of a branch at pressure p. */
    private double branchStart(int branch, double p) {
        return branch == 0 ? 0.0 : lithology.exhaustionMeltFraction(p);
    }

    /** The finite-difference pressure step at {@code p} (Pa). */
    static double pressureStep(double p) {
        return Math.min(PRESSURE_STEP_PA, Math.max(RELATIVE_PRESSURE_STEP * p, MIN_PRESSURE_STEP_PA));
    }

    /** uⁿ, with the common n = 1.5 and n = 1 done without pow. */
    private static double power(double u, double n) {
        if (n == 1.5) {
            return u * Math.sqrt(u);
        }
        return n == 1.0 ? u : Math.pow(u, n);
    }

    /** F(P, u) on a branch, given uⁿ. */
    private double fraction(int branch, double p, double un) {
        double f0 = branchStart(branch, p);
        return f0 + (1.0 - f0) * un;
    }

    /** T(P, u) on a branch (K), given uⁿ; the solidus branch is continued smoothly past exhaustion. */
    private double temperature(int branch, double p, double un) {
        return lithology.temperatureOnBranch(p, fraction(branch, p, un), bulkWater, branch == 1);
    }

    /** True when (p, uⁿ) may be evaluated on the branch: p ≥ 0, and F ≤ 1 after exhaustion. */
    private boolean onBranch(int branch, double p, double un) {
        return p >= 0 && (branch == 0 || un <= 1);
    }

    /** The local state and rates at (P, u) on one branch: F, T and the isentropic du/dP, dF/dP. */
    private final class Rates {
        /** True while integrating up to the water-saturation point: the law continued uncapped. */
        boolean belowSaturation;
        /** True past the water-saturation point (the capped law, its kink just below). */
        boolean pastSaturation;
        double f;
        double t;
        double dudp;
        double dfdp;
        double fu;
        double fp;

        void at(int branch, double n, double p, double uRaw) {
            double u = Math.max(uRaw, 0.0);
            double un = power(u, n);
            double f0 = branchStart(branch, p);
            f = f0 + (1.0 - f0) * un;
            t = law(p, f, branch == 1);
            fu = u == 0 ? (n == 1 ? 1.0 - f0 : 0.0) : (1.0 - f0) * n * un / u;
            fp = branch == 1 ? startSlope(p) * (1.0 - un) : 0.0;
            double tp = pressureSlope(branch, p, un);
            double tu = uSlope(branch, n, p, u);
            MantleThermodynamics th = thermodynamics;
            double a = f * th.meltExpansivity() / th.meltDensity()
                    + (1.0 - f) * th.solidExpansivity() / th.solidDensity();
            double cpOverT = th.heatCapacity() / t;
            dudp = -(cpOverT * tp - a + th.entropyOfFusion() * fp) / (cpOverT * tu + th.entropyOfFusion() * fu);
            dfdp = fp + fu * dudp;
        }

        /** (∂T/∂P) at constant u (K/Pa). */
        private double pressureSlope(int branch, double p, double un) {
            double h = pastSaturation ? pressureStep(p) : PRESSURE_STEP_PA;
            boolean below = onBranch(branch, p - h, un);
            boolean above = onBranch(branch, p + h, un);
            if (pastSaturation && below && onBranch(branch, p - 2 * h, un)) {
                // past the saturation point: differences on the shallow (saturated) side only, so
                // that just above that point they do not reach across its kink
                return (3 * t - 4 * temp(branch, p - h, un) + temp(branch, p - 2 * h, un)) / (2 * h);
            }
            if (below && above) {
                return (temp(branch, p + h, un) - temp(branch, p - h, un)) / (2 * h);
            }
            if (above || !below) {
                return (-3 * t + 4 * temp(branch, p + h, un) - temp(branch, p + 2 * h, un)) / (2 * h);
            }
            return (3 * t - 4 * temp(branch, p - h, un) + temp(branch, p - 2 * h, un)) / (2 * h);
        }

        /** (∂T/∂u) at constant P (K). */
        private double uSlope(int branch, double n, double p, double u) {
            double h = U_STEP;
            boolean below = u >= h;
            boolean above = onBranch(branch, p, power(u + h, n));
            if (below && above) {
                return (temp(branch, p, power(u + h, n)) - temp(branch, p, power(u - h, n))) / (2 * h);
            }
            if (above || !below) {
                return (-3 * t + 4 * temp(branch, p, power(u + h, n))
                        - temp(branch, p, power(u + 2 * h, n))) / (2 * h);
            }
            return (3 * t - 4 * temp(branch, p, power(u - h, n))
                    + temp(branch, p, power(u - 2 * h, n))) / (2 * h);
        }

        /** T at (P, F) on the law this segment integrates (capped or continued below saturation). */
        private double law(double p, double fraction, boolean afterExhaustion) {
            return belowSaturation ? lithology.temperatureBelowSaturation(p, fraction, bulkWater, afterExhaustion)
                    : lithology.temperatureOnBranch(p, fraction, bulkWater, afterExhaustion);
        }

        private double temp(int branch, double p, double un) {
            return law(p, fraction(branch, p, un), branch == 1);
        }

        /** dF₀/dP of the exhaustion branch (1/Pa). */
        private double startSlope(double p) {
            double h = PRESSURE_STEP_PA;
            if (p >= h) {
                return (branchStart(1, p + h) - branchStart(1, p - h)) / (2 * h);
            }
            return (-3 * branchStart(1, p) + 4 * branchStart(1, p + h) - branchStart(1, p + 2 * h)) / (2 * h);
        }
    }

    /** Why an integration segment stopped. */
    private enum Stop { TOP, EXHAUSTED, BRANCH_BACK, FROZEN, LIQUIDUS, SATURATED }

    /**
     * One run of the column. Heights t = −z (m) increase upwards. Each segment (one branch of the
     * melting law) is integrated in σ = √(t − t_start), in which the solution is analytic at the
     * start of the branch (u ∝ σ² + σ³ + …), so the integrator does not crawl out of the
     * square-root singularity of F_u = n u^(n−1). State y = [u, ∫F dz, ∫P(−dF/dz)(z − z_top) dz,
     * ∫P(−dF/dz) dz].
     */
    private final class Run {
        private final ColumnState onset;
        private final double zTop;
        private final List<ProfilePoint> profile = new ArrayList<>();
        private final Rates rates = new Rates();
        private final double[] nByBranch = {lithology.branchExponent(false), lithology.branchExponent(true)};
        private final boolean hasExhaustion;
        private int branch;
        private Stop stop;
        private double nextGrid;
        private double maxF;
        private boolean solidAtTop;
        /** The melt's water has reached its saturation cap: the capped law from here on. */
        private boolean saturationPassed;

        Run(ColumnState onset) {
            this.onset = onset;
            this.zTop = lidDepth;
            this.nextGrid = Math.floor(onset.depth() / outputStep - GRID_SLACK) * outputStep;
            this.hasExhaustion = lithology.exhaustionMeltFraction(onset.pressure()) < 1.0
                    || lithology.exhaustionMeltFraction(pressures.pressureAt(zTop)) < 1.0;
        }

        ColumnResult integrate(List<String> warnings) {
            double[] y = new double[4];
            double t = -onset.depth();
            branch = 0;
            rates.at(0, nByBranch[0], onset.pressure(), 0.0);
            profile.add(point(onset.depth(), 0, 0.0, -rates.dfdp));
            int segments = 0;
            boolean towardTop = false;
            while (true) {
                if (++segments > MAX_SEGMENTS) {
                    throw new EngineException("the melting column switches between branches of the melting law "
                            + "too often to be integrated reliably");
                }
                t = segment(t, y, towardTop);
                towardTop = false;
                if (stop == Stop.TOP) {
                    break;
                }
                double z = -t;
                double p = pressures.pressureAt(z);
                if (stop == Stop.EXHAUSTED) {
                    branch = 1;
                    y[0] = 0.0;
                } else if (stop == Stop.BRANCH_BACK) {
                    branch = 0;
                    y[0] = Math.pow(lithology.exhaustionMeltFraction(p), 1.0 / nByBranch[0]);
                } else if (stop == Stop.SATURATED) {
                    // same branch and state; the rest on the capped law, up to a top at zero pressure
                    // in the variable that keeps that end regular
                    saturationPassed = true;
                    towardTop = pressures.pressureAt(zTop) == 0;
                } else if (stop == Stop.FROZEN) {
                    OptionalDouble again = onsetBelow(p, false);
                    double zAgain = again.isPresent() ? Math.max(pressures.depthAt(again.getAsDouble()), zTop) : zTop;
                    emitSolid(z, zAgain);
                    warnings.add(String.format(Locale.ROOT, "the melt freezes completely at %.1f km on the way up%s",
                            z / 1e3, zAgain > zTop ? String.format(Locale.ROOT, "; melting resumes at %.1f km",
                                    zAgain / 1e3) : ""));
                    y[0] = 0.0;
                    if (zAgain <= zTop) {
                        solidAtTop = true;
                        break;
                    }
                    t = -zAgain;
                } else {
                    throw new EngineException(String.format(Locale.ROOT,
                            "the column reaches the liquidus at %.1f km: the melting law gives no number beyond it; "
                                    + "lower the potential temperature", z / 1e3));
                }
            }
            return result(y, warnings);
        }

        private ColumnResult result(double[] y, List<String> warnings) {
            double pTop = pressures.pressureAt(zTop);
            rates.at(branch, nByBranch[branch], pTop, y[0]);
            double fTop = solidAtTop ? 0.0 : rates.f;
            double tTop = solidAtTop ? adiabatTemperature(pTop) : rates.t;
            maxF = Math.max(maxF, fTop);
            if (profile.get(profile.size() - 1).depth() > zTop + GRID_SLACK) {
                profile.add(solidAtTop ? new ProfilePoint(zTop, pTop, tTop, 0.0, 0.0, 0.0, bulkWater)
                        : point(zTop, branch, y[0], -rates.dfdp));
            }
            ColumnState top = new ColumnState(zTop, pTop, tTop, fTop);
            double height = onset.depth() - zTop;
            double integral = y[1];
            double thickness = upwelling == Upwelling.PASSIVE ? integral : maxF * height;
            OptionalDouble meanP;
            if (upwelling == Upwelling.PASSIVE) {
                meanP = integral > 0 ? OptionalDouble.of(y[2] / integral) : OptionalDouble.empty();
            } else {
                meanP = fTop > 0 ? OptionalDouble.of(y[3] / fTop) : OptionalDouble.empty();
            }
            double crust = thickness * thermodynamics.solidDensity() / crustDensity;
            if (bulkWater > 0 && fTop > 0 && lithology.melt(pTop, tTop, bulkWater).waterSaturated()) {
                warnings.add("the melt is water-saturated at the top of the column: water exsolves there and the "
                        + "melt partly crystallises as the solidus rises (degassing); close to zero pressure the "
                        + "saturation law makes the productivity strongly negative");
            }
            return new ColumnResult(DecompressionColumn.this, Optional.of(onset), Optional.of(top), maxF,
                    integral / height, integral, thickness, crust, meanP, profile, dedupe(warnings),
                    List.of(new LithologyMelting(lithology, 1.0, Optional.of(onset), maxF, fTop, integral > 0 ? 1.0 : 0.0)));
        }

        /**
         * Integrates the current branch from height t0 to the top or an event; returns the height
         * reached. From the start of a branch the variable is σ with t = t0 + σ² (the square-root
         * start); {@code towardTop} (past the water-saturation point, the top at zero pressure)
         * it is s with t = tTop − (S − s)^12 ({@link TowardTop}), which keeps the top regular where
         * the saturated water, and with it the solidus, changes without bound as P → 0.
         */
        private double segment(double t0, double[] y, boolean towardTop) {
            final double n = nByBranch[branch];
            final int b = branch;
            final Variable v = towardTop ? TowardTop.of(-zTop, t0) : new FromStart(t0);
            final double sigmaTop = v.s(-zTop);
            if (!(sigmaTop > 0)) {
                // an event (the saturation point of a nearly dry melt) at the top itself: nothing left
                stop = Stop.TOP;
                return -zTop;
            }
            DormandPrince853Integrator integrator = new DormandPrince853Integrator(1e-12, Math.max(sigmaTop, 1e-6),
                    new double[] {ABSOLUTE_TOLERANCE, 1e-6, 1e6, 1e-1},
                    new double[] {RELATIVE_TOLERANCE, RELATIVE_TOLERANCE, RELATIVE_TOLERANCE, RELATIVE_TOLERANCE});
            FirstOrderDifferentialEquations ode = new FirstOrderDifferentialEquations() {
                @Override
                public int getDimension() {
                    return 4;
                }

                @Override
                public void computeDerivatives(double sigma, double[] s, double[] ds) {
                    // σ² can overshoot the top by a rounding error: never evaluate above it
                    double z = Math.max(-v.t(sigma), zTop);
                    double p = pressures.pressureAt(z);
                    double dpdt = -pressureGradient(z);
                    rates.at(b, n, p, s[0]);
                    double dtds = v.dtds(sigma);
                    double dfdt = rates.dfdp * dpdt;
                    ds[0] = rates.dudp * dpdt * dtds;
                    ds[1] = rates.f * dtds;
                    ds[2] = p * dfdt * (z - zTop) * dtds;
                    ds[3] = p * dfdt * dtds;
                }
            };
            stop = Stop.TOP;
            if (b == 0) {
                if (hasExhaustion) {
                    integrator.addEventHandler(new Crossing(Stop.EXHAUSTED, true) {
                        @Override
                        public double g(double sigma, double[] s) {
                            double p = pressures.pressureAt(Math.max(-v.t(sigma), zTop));
                            return power(Math.max(s[0], 0), n) - lithology.exhaustionMeltFraction(p);
                        }
                    }, EVENT_CHECK_INTERVAL, EVENT_CONVERGENCE, EVENT_MAX_ITERATIONS);
                }
                integrator.addEventHandler(new Crossing(Stop.FROZEN, false) {
                    @Override
                    public double g(double sigma, double[] s) {
                        return s[0];
                    }
                }, EVENT_CHECK_INTERVAL, EVENT_CONVERGENCE, EVENT_MAX_ITERATIONS);
            } else {
                integrator.addEventHandler(new Crossing(Stop.BRANCH_BACK, false) {
                    @Override
                    public double g(double sigma, double[] s) {
                        return s[0];
                    }
                }, EVENT_CHECK_INTERVAL, EVENT_CONVERGENCE, EVENT_MAX_ITERATIONS);
                integrator.addEventHandler(new Crossing(Stop.LIQUIDUS, true) {
                    @Override
                    public double g(double sigma, double[] s) {
                        return s[0] - 1.0;
                    }
                }, EVENT_CHECK_INTERVAL, EVENT_CONVERGENCE, EVENT_MAX_ITERATIONS);
            }
            double pStart = pressures.pressureAt(-t0);
            double marginAtStart = bulkWater > 0 && !saturationPassed ? lithology.waterSaturationMargin(pStart,
                    fraction(b, pStart, power(Math.max(y[0], 0), n)), bulkWater) : Double.POSITIVE_INFINITY;
            boolean watchSaturation = marginAtStart > 0 && marginAtStart != Double.POSITIVE_INFINITY;
            rates.belowSaturation = watchSaturation;
            rates.pastSaturation = saturationPassed;
            if (watchSaturation) {
                // the melt's water meets its saturation cap on the way up (near a top at zero pressure,
                // where Xsat falls to nothing): T(P, F) has a kink there. Up to it the law is integrated
                // continued below saturation (smooth), the event stops there, and the rest follows the
                // capped law (towards a top at zero pressure in the variable that keeps it regular)
                integrator.addEventHandler(new Crossing(Stop.SATURATED, false) {
                    @Override
                    public double g(double sigma, double[] s) {
                        double p = pressures.pressureAt(Math.max(-v.t(sigma), zTop));
                        return lithology.waterSaturationMargin(p, fraction(b, p, power(Math.max(s[0], 0), n)),
                                bulkWater);
                    }
                }, EVENT_CHECK_INTERVAL, EVENT_CONVERGENCE, EVENT_MAX_ITERATIONS);
            }
            integrator.addStepHandler(new StepHandler() {
                @Override
                public void init(double s0, double[] y0, double s) {
                }

                @Override
                public void handleStep(StepInterpolator in, boolean isLast) {
                    double sPrev = in.getPreviousTime();
                    double sCur = in.getCurrentTime();
                    double tCur = Math.min(v.t(sCur), -zTop);
                    while (nextGrid > zTop + GRID_SLACK && -nextGrid <= tCur + GRID_SLACK) {
                        double sg = Math.min(v.s(-nextGrid), sCur);
                        if (sg < sPrev) {
                            sg = sPrev;
                        }
                        in.setInterpolatedTime(sg);
                        double u = in.getInterpolatedState()[0];
                        double duds = in.getInterpolatedDerivatives()[0];
                        double p = pressures.pressureAt(nextGrid);
                        double productivity;
                        double dtdsAt = v.dtds(sg);
                        if (dtdsAt > 2 * SIGMA_DIRECT) {
                            double dudp = duds / dtdsAt / -pressureGradient(nextGrid);
                            productivity = productivityFrom(b, n, p, u, dudp);
                        } else {
                            rates.at(b, n, p, u);
                            productivity = -rates.dfdp;
                        }
                        profile.add(point(nextGrid, b, u, productivity));
                        nextGrid -= outputStep;
                    }
                    in.setInterpolatedTime(sCur);
                    double u = Math.max(in.getInterpolatedState()[0], 0.0);
                    maxF = Math.max(maxF, fraction(b, pressures.pressureAt(-tCur), power(u, n)));
                }
            });
            try {
                double sEnd;
                try {
                    sEnd = integrator.integrate(ode, 0.0, y, sigmaTop, y);
                } finally {
                    rates.belowSaturation = false;
                    rates.pastSaturation = false;
                }
                double tEnd = stop == Stop.TOP ? -zTop : v.t(sEnd);
                maxF = Math.max(maxF, fraction(b, pressures.pressureAt(-tEnd), power(Math.max(y[0], 0.0), n)));
                return tEnd;
            } catch (MathIllegalStateException e) {
                throw new EngineException("the melting column could not be integrated to the requested tolerance: "
                        + e.getMessage());
            }
        }

        /** −dF/dP (1/Pa) at (P, u) on branch b, given du/dP. */
        private double productivityFrom(int b, double n, double p, double uRaw, double dudp) {
            double u = Math.max(uRaw, 0);
            double un = power(u, n);
            double f0 = branchStart(b, p);
            double fu = u == 0 ? (n == 1 ? 1.0 - f0 : 0.0) : (1.0 - f0) * n * un / u;
            double fp = b == 1 ? rates.startSlope(p) * (1.0 - un) : 0.0;
            return -(fp + fu * dudp);
        }

        /** A profile point at depth z for state u on branch b with productivity −dF/dP. */
        private ProfilePoint point(double z, int b, double u, double productivity) {
            double p = pressures.pressureAt(z);
            double f = fraction(b, p, power(Math.max(u, 0), nByBranch[b]));
            double t = lithology.temperatureOnBranch(p, f, bulkWater, b == 1);
            double water = bulkWater > 0 && f > 0 ? lithology.waterInMelt(p, f, bulkWater) : 0.0;
            maxF = Math.max(maxF, f);
            return new ProfilePoint(z, p, t, f, productivity + 0.0, water, residueWater(f, water));
        }

        /** Solid-adiabat points between a frozen depth and the next onset (or the top). */
        private void emitSolid(double zFrom, double zTo) {
            while (nextGrid > zTo + GRID_SLACK && nextGrid < zFrom) {
                double p = pressures.pressureAt(nextGrid);
                profile.add(new ProfilePoint(nextGrid, p, adiabatTemperature(p), 0.0, 0.0, 0.0, bulkWater));
                nextGrid -= outputStep;
            }
        }

        /** An event that stops the segment when g crosses zero in one direction. */
        /** The integration variable of a segment: height t(s), dt/ds, and s(t). */
        private interface Variable {
            double t(double s);

            double dtds(double s);

            double s(double t);
        }

        /** t = t0 + s² from the start of a branch. */
        private record FromStart(double t0) implements Variable {
            public double t(double s) {
                return t0 + s * s;
            }

            public double dtds(double s) {
                return 2 * s;
            }

            public double s(double t) {
                return Math.sqrt(Math.max(t - t0, 0.0));
            }
        }

        /**
         * t = tTop − (S − s)^k towards the top, k = {@value #TOP_EXPONENT}: s runs from 0 to
         * S = (tTop − t0)^(1/k). A saturated melt's water Xsat ∝ P^0.6 lowers the solidus by
         * ∝ Xsat^0.75 ∝ P^0.45 (Katz et al. 2003), so its slope grows without bound as P → 0; in s
         * the lowering goes as (S − s)^(0.45k), smooth enough for the integrator's order (k = 12:
         * the top centimetre took a tenth of the evaluations it took with k = 4).
         */
        private record TowardTop(double tTop, double span) implements Variable {
            static TowardTop of(double tTop, double t0) {
                return new TowardTop(tTop, Math.pow(Math.max(tTop - t0, 0.0), 1.0 / TOP_EXPONENT));
            }

            public double t(double s) {
                return tTop - Math.pow(Math.max(span - s, 0.0), TOP_EXPONENT);
            }

            public double dtds(double s) {
                return TOP_EXPONENT * Math.pow(Math.max(span - s, 0.0), TOP_EXPONENT - 1);
            }

            public double s(double t) {
                return span - Math.pow(Math.max(tTop - t, 0.0), 1.0 / TOP_EXPONENT);
            }
        }

        private abstract class Crossing implements EventHandler {
            private final Stop reason;
            private final boolean rising;

            Crossing(Stop reason, boolean rising) {
                this.reason = reason;
                this.rising = rising;
            }

            @Override
            public void init(double s0, double[] y0, double s) {
            }

            @Override
            public Action eventOccurred(double sigma, double[] s, boolean increasing) {
                if (increasing == rising) {
                    stop = reason;
                    return Action.STOP;
                }
                return Action.CONTINUE;
            }

            @Override
            public void resetState(double sigma, double[] s) {
            }
        }
    }

    private static List<String> dedupe(List<String> warnings) {
        return List.copyOf(new LinkedHashSet<>(warnings));
    }
}
