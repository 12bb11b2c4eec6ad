package org.tectomelt.engine.crust;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.tectomelt.engine.BudgetExceededException;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;

/**
 * Transient 1-D vertical conduction with latent heat in a crustal column intruded by one sill or a
 * stack of sills: temperature and melt fraction of the crust and the intrusions through time.
 *
 * <h2>Equation and discretisation</h2>
 * Conservation of enthalpy per unit volume H = ρ c T + ρ L F(T) (the enthalpy formulation of
 * conduction with phase change; Voller, Swaminathan &amp; Thomas 1990, Int. J. Numer. Methods Eng.
 * 30, 875–898, doi:10.1002/nme.1620300419):
 * <pre>
 *   ∂H/∂t = ∂/∂z ( k(T) ∂T/∂z ) + A(z)
 * </pre>
 * on cell-centred finite volumes, uniform or graded ({@link GridPlan}: fine at the sill contacts,
 * growing smoothly away from them), with the face conductance the two half-cell resistances in series
 * (exact flux continuity across a rock contact; the harmonic mean of the conductivities on a uniform
 * grid). On a graded grid the fine cells are planned before the run: the face new sills enter at and
 * both contacts of every sill are fine, and the fine cells beside the entry face travel with the rock
 * they belong to as sills are inserted, so no refinement (and no remapping error) is needed; at each later
 * emplacement the fine cells of sills already in place are merged again where their profile has become
 * smooth ({@link GridPlan}), which keeps Σ H Δz exactly and each merged cell's mean temperature. Time stepping is backward Euler
 * (fully implicit): H_i^{n+1} − H_i^n = Δt [fluxes and source at n+1]. Backward Euler is chosen over
 * Crank–Nicolson because it is L-stable and, with the M-matrix of implicit conduction, obeys a
 * discrete maximum principle: the sharp temperature step of a freshly emplaced sill and the kinks of
 * the melt curve produce no spurious oscillations (Crank–Nicolson rings at such steps unless Δt is
 * kept near the explicit limit, and a ringing temperature creates spurious melt). Its first-order
 * time error is held in check by the adaptive step below.
 *
 * <h2>Nonlinear solve</h2>
 * Each step solves the discrete balance for H by Newton's method on the piecewise-linear relation
 * T(H) (see {@code EnthalpyCurve}): each iteration linearises T about the current segment of every
 * cell (dT/dH = 1/(ρc) in solid or fully molten rock, smaller inside the melting interval, 0 on an
 * isothermal jump), solves the tridiagonal system by the Thomas algorithm, and stops a cell that
 * would leave its segment at the segment's end, so the next iteration uses the new slope (the
 * source-update idea of Voller &amp; Swaminathan 1991, Numer. Heat Transfer B 19, 175–189,
 * doi:10.1080/10407799108944962, DOI from memory). Iterations stop when every cell's residual is
 * below {@link #NEWTON_TOLERANCE_K} (as a temperature); with constant conductivity an iteration in
 * which no cell changes segment is exact and ends the step. A temperature-dependent conductivity is
 * lagged one iteration (Picard) inside the same loop. Isothermal melting (equal solidus and
 * liquidus) is handled exactly, which is what the Stefan check needs.
 *
 * <h2>Adaptive time step</h2>
 * The local error of backward Euler is estimated from the change of the enthalpy temperature
 * θ = H/(ρc) against the previous step's rate, e ≈ Δt_n/(Δt_n + Δt_{n−1}) · max|Δθ_n − (Δt_n/Δt_{n−1}) Δθ_{n−1}|,
 * and the next step is Δt·min(2, max(0.2, 0.9 √(tol/e))); a step with e &gt; 4 tol or without Newton
 * convergence is redone smaller. Steps land exactly on emplacement, output and profile times; after
 * each emplacement the step restarts at 0.05 Δz²/κ with Δz the finest cell.
 *
 * <h2>Boundary conditions and initial state</h2>
 * The top of the column (z = 0) is held at the initial state's surface temperature; the base
 * receives the initial state's basal heat flow, held fixed (0 for a uniform initial temperature, so
 * the base is insulated). See {@link InitialState}; a steady geotherm ({@link GeothermInitialState})
 * is first relaxed to the steady state of the grid, so that the column does not drift.
 *
 * <h2>Intrusions</h2>
 * Sills are emplaced instantaneously at their emplacement temperature and melt fraction F(T). A new
 * sill of m cells is inserted at a cell face: everything below the face moves down by the sill's
 * thickness, keeping its temperature (the column grows; the base and its boundary condition move
 * down with it). {@link Stacking#UNDER} inserts each new sill beneath the previous ones (under-
 * accretion, the roof stays at the first sill's top); {@link Stacking#OVER} inserts it at the top depth
 * above the previous ones, pushing them down (over-accretion). These are the under- and over-accretion
 * cases of Annen &amp; Sparks (2002). An insertion costs one array shift, O(cells); its real cost is that
 * every later step works on a longer column.
 *
 * <h2>Cost</h2>
 * Each Newton iteration is two O(cells) passes over preallocated arrays (the Thomas algorithm's
 * forward sweep fused with the assembly, its back substitution fused with the update; nothing is
 * allocated per step), and a step takes one or two iterations unless the
 * melting fronts cross cell segments, so a run costs O(cells × steps). The step count grows with the
 * number of emplacements (each restarts the step) and only logarithmically with the duration. Merging the
 * fine cells of buried sills halves the cells of a long stack (80 sills of 250 m: 2,490 cells at the end
 * instead of 5,220) at a change of the reported results of a few parts per million.
 *
 * <h2>Resolution</h2>
 * The time of first crustal melt is when the crust first holds a melt layer ∫F dz of
 * {@link #MELT_ONSET_FRACTION} of one sill's thickness, a quantity that converges as the grid is refined.
 * Near the crust's solidus it falls within hours to years of the emplacement, while the heated layer of
 * crust is only a few metres thick, so it needs finer cells than the sill's own cooling, and the time
 * error of backward Euler (first order) moves it, and the solidification time, by 1–2 % at the 0.5 K
 * tolerance of {@link Numerics#DEFAULT}. The check therefore refines space and time together:
 * {@link Setup#coarser()} doubles the finest cell and quadruples the tolerance (the step of the error
 * control grows as √tol, so the time step about doubles), {@link Setup#finer()} does the reverse.
 * {@link #runWithConvergenceCheck} checks a run against the run one level coarser; {@link #runRefined}
 * starts from {@link #resolvingSpacing} and {@link #resolvingTolerance} and refines until two successive
 * runs agree within 1 % or its budget is spent (adaptive refinement of the whole run). The time
 * of the melt peak is ill-conditioned (a flat maximum): it is refined by a parabola through the
 * largest step value and its neighbours, but can still move by about 1–2 % between grids.
 *
 * <h2>Energy check</h2>
 * The run tracks the column's total enthalpy Σ H Δz, the heat through the top and base, the
 * radiogenic heat and the enthalpy of each sill emplaced; their imbalance, divided by the heat moved
 * (Σ |H − H_origin| Δz, with H_origin the enthalpy of each cell's rock when it entered the column),
 * is reported as {@link SillResult.Summary#energyErrorFraction()}.
 *
 * <h2>Rocks</h2>
 * Three rocks: the crust (country rock, whose melting is tracked), the intrusion, and optionally a
 * non-melting mantle below a Moho depth. Each has its own density, heat capacity, latent heat,
 * conductivity law and melt curve.
 *
 * <p>Limitations: conduction only (no convection in the magma, no melt extraction or advection of
 * heat by melt), constant density (no thermal contraction or volume change on melting), constant
 * heat capacity, one melt curve per rock whatever the depth, and a mantle that does not melt.
 */
public final class SillModel {

    /** Provenance of the incremental-emplacement setting. */
    public static final ModelInfo ANNEN_SPARKS_2002 = new ModelInfo("sill-stacking-annen-sparks2002",
            "Annen, C. & Sparks, R.S.J. (2002) Effects of repetitive emplacement of basaltic intrusions on thermal "
                    + "evolution and melt generation in the crust. Earth and Planetary Science Letters 203, 937-955",
            "10.1016/S0012-821X(02)00929-9");
    /** Provenance of the convecting-sill flux law. */
    public static final ModelInfo HUPPERT_SPARKS_1988 = new ModelInfo("convecting-sill-huppert-sparks1988",
            "Huppert, H.E. & Sparks, R.S.J. (1988) The generation of granitic magmas by intrusion of basalt into "
                    + "continental crust. Journal of Petrology 29, 599-624; turbulent convective heat flux "
                    + "q = 0.1 k (g alpha / (kappa nu))^(1/3) dT^(4/3) (form and constant from memory)",
            "10.1093/petrology/29.3.599");
    /** Provenance of the enthalpy method. */
    public static final ModelInfo ENTHALPY_METHOD = new ModelInfo("enthalpy-method-voller1990",
            "Voller, V.R., Swaminathan, C.R. & Thomas, B.G. (1990) Fixed grid techniques for phase change "
                    + "problems: a review. International Journal for Numerical Methods in Engineering 30, 875-898",
            "10.1002/nme.1620300419");

    private static final byte CRUST = 0;
    private static final byte INTRUSION = 1;
    private static final byte MANTLE = 2;
    private static final SillResult.Material[] MATERIALS = {SillResult.Material.CRUST, SillResult.Material.INTRUSION,
        SillResult.Material.MANTLE};

    /** Melt fraction from which rock counts as partially molten (and crustal melting as started). */
    public static final double MELT_PRESENT = 1e-3;
    /**
     * Crust melt thickness ∫F dz, as a fraction of one sill's thickness, that marks the first crustal
     * melt. A thickness of melt rather than the melt fraction of one cell: the fraction a cell holds
     * next to a hot contact depends on how thin the cell is (on a fine enough grid, any crust touched
     * by a contact above its solidus melts at once), while the time a melt layer of given thickness
     * takes to form converges as the grid is refined. Relative to the sill, so that the time scales
     * with the square of the thickness as conduction does.
     */
    public static final double MELT_ONSET_FRACTION = 1e-2;
    /** Newton stops when every cell's residual, as a temperature H/(ρc), is below this (K). */
    public static final double NEWTON_TOLERANCE_K = 1e-6;
    /** Least temperature drop (K) across a convective boundary layer used for its conductance (keeps it positive). */
    static final double MIN_BOUNDARY_DROP_K = 1e-3;
    /** Most Newton iterations in one step before the step is redone smaller. */
    public static final int MAX_NEWTON_ITERATIONS = 40;
    /** Fewer cells across a sill than this and the results carry a resolution warning. */
    public static final int MIN_CELLS_PER_SILL_FOR_ACCURACY = 10;
    /**
     * Finest cell of the default graded grid as a fraction of the sill thickness (see
     * {@link #resolvingSpacing}).
     */
    public static final double DEFAULT_FINEST_FRACTION = 1.0 / 400;
    /**
     * Time-step tolerance (K) of a run at the default finest cell ({@link #resolvingTolerance}): a quarter of
     * {@link Numerics#DEFAULT}'s 0.5 K. Backward Euler is of first order in time, and at 0.5 K its time error
     * alone moves the time to first crustal melt and the solidification time by 1–2 % (measured: quartering
     * the tolerance halves the step and moves them by 0.7–0.9 %), which a check of the grid alone does not see.
     */
    public static final double RESOLVING_TOLERANCE_K = 0.125;
    /**
     * Most refinements {@link #runRefined} makes beyond its starting setup: down to 1/8 of its finest cell
     * and 1/64 of its tolerance (from the default, 1/3200 of the sill and about 0.002 K).
     */
    public static final int MAX_REFINEMENTS = 3;
    /**
     * Work of a refined run relative to the run it refines, used to decide before starting it whether it fits
     * the work limits: about 2.2 measured (twice the time steps, a few more cells), with a margin.
     */
    public static final double REFINEMENT_WORK_FACTOR = 2.5;

    private SillModel() {
    }

    /** Where each new sill of a stack goes. */
    public enum Stacking {
        /** Beneath the previous sills (under-accretion): the roof stays at the top depth. */
        UNDER,
        /** At the top depth, above the previous sills, which are pushed down (over-accretion). */
        OVER
    }

    /**
     * The intrusion schedule: {@code count} sills of equal thickness and temperature, the first at time 0,
     * then one every {@code interval}.
     *
     * @param thickness   thickness of each sill (m)
     * @param topDepth    depth of the first sill's top (m)
     * @param temperature emplacement temperature (K)
     * @param count       number of sills, at least 1
     * @param interval    time between emplacements (s); ignored for a single sill
     * @param stacking    where later sills go
     */
    public record Intrusions(double thickness, double topDepth, double temperature, int count, double interval,
                             Stacking stacking) {

        /** Validates the schedule. */
        public Intrusions {
            if (!(thickness > 0) || !(topDepth >= 0) || !(temperature > 0) || count < 1
                    || (count > 1 && !(interval > 0)) || stacking == null) {
                throw new EngineException("an intrusion needs a positive thickness and temperature, a top depth of at "
                        + "least 0, at least one sill and, for several, a positive interval");
            }
        }

        /** One sill. */
        public static Intrusions single(double thickness, double topDepth, double temperature) {
            return new Intrusions(thickness, topDepth, temperature, 1, 0.0, Stacking.UNDER);
        }
    }

    /**
     * Accuracy and work limits of a run.
     *
     * @param toleranceK    local time-error tolerance of the adaptive step, as a temperature (K)
     * @param maxSteps      most accepted time steps before the run is refused
     * @param maxCellSteps  most cell-steps (Σ cells over all steps) before the run is refused
     */
    public record Numerics(double toleranceK, int maxSteps, long maxCellSteps) {

        /** Defaults: 0.5 K, 100,000 steps, 4·10⁸ cell-steps (a few seconds on one core). */
        public static final Numerics DEFAULT = new Numerics(0.5, 100_000, 400_000_000L);

        /** Validates the limits. */
        public Numerics {
            if (!(toleranceK > 0) || maxSteps < 1 || maxCellSteps < 1) {
                throw new EngineException("numerics need a positive tolerance and positive limits");
            }
        }
    }

    /**
     * Convection in a molten intrusion (Huppert &amp; Sparks 1988, J. Petrology 29, 599–624,
     * doi:10.1093/petrology/29.3.599). While a sill's melt fraction is above {@code lockMeltFraction}
     * its interior is well mixed (one temperature; the solver lumps its cells into one node, so mixing
     * is exact and conserves energy) and it gives heat to its roof and floor by the flux law of
     * turbulent thermal convection at high Rayleigh number used there,
     * <pre>
     *   q = λ k (g α / (κ ν))^(1/3) ΔT^(4/3),   ν = μ / ρ,
     * </pre>
     * with ΔT the drop from the well-mixed interior to the contact, k, κ and ρ the magma's conductivity,
     * diffusivity and density, μ its viscosity, α its thermal expansivity and λ = 0.1 (the constant of
     * the flux law for a layer cooled from a boundary, as used by Huppert &amp; Sparks 1988; value from
     * memory). The flux does not depend on the layer's thickness. Once its melt fraction falls to the
     * threshold (crystal lock-up: a crystal framework stops convection near 50–60 % crystals, Marsh
     * 1981, Contrib. Mineral. Petrol. 78, 85–98, doi:10.1007/BF00371146, from memory) the sill conducts,
     * as without convection. Viscosity and expansivity are constant (a crystallising magma stiffens:
     * a constant μ overstates the late flux).
     *
     * @param lockMeltFraction melt fraction below which the sill stops convecting, in (0, 1)
     * @param viscosity        magma viscosity μ (Pa s)
     * @param expansivity      thermal expansivity α (1/K)
     * @param coefficient      λ of the flux law
     */
    public record Convection(double lockMeltFraction, double viscosity, double expansivity, double coefficient) {

        /** Default lock-up melt fraction: 0.5 (about 50 % crystals; Marsh 1981, from memory). */
        public static final double DEFAULT_LOCK_MELT_FRACTION = 0.5;
        /** Default viscosity of a crystal-poor basaltic magma (Pa s): 100, within the 10–1000 Pa s of such melts (common practice). */
        public static final double DEFAULT_VISCOSITY = 100;
        /** Default thermal expansivity of basaltic melt (1/K): 5e-5 (from memory). */
        public static final double DEFAULT_EXPANSIVITY = 5e-5;
        /** λ of the turbulent flux law (Huppert &amp; Sparks 1988; from memory). */
        public static final double HUPPERT_SPARKS_COEFFICIENT = 0.1;
        /** Gravity (m/s²). */
        private static final double G = 9.81;

        /** Validates the parameters. */
        public Convection {
            if (!(lockMeltFraction > 0 && lockMeltFraction < 1)) {
                throw new EngineException("the lock-up melt fraction must lie strictly between 0 and 1, got "
                        + lockMeltFraction);
            }
            if (!(viscosity > 0) || !(expansivity > 0) || !(coefficient > 0) || !Double.isFinite(viscosity + expansivity
                    + coefficient)) {
                throw new EngineException("convection needs a positive viscosity, expansivity and coefficient");
            }
        }

        /** The defaults with lock-up at {@code lockMeltFraction}. */
        public static Convection withLockAt(double lockMeltFraction) {
            return new Convection(lockMeltFraction, DEFAULT_VISCOSITY, DEFAULT_EXPANSIVITY, HUPPERT_SPARKS_COEFFICIENT);
        }

        /** A = λ k (g α ρ / (κ μ))^(1/3) (W/m²/K^(4/3)) for a magma of conductivity k, diffusivity κ, density ρ. */
        public double fluxFactor(double conductivity, double diffusivity, double density) {
            return coefficient * conductivity * Math.cbrt(G * expansivity * density / (diffusivity * viscosity));
        }

        /** The convective heat flux q = A ΔT^(4/3) (W/m²) for a drop {@code dT} (K) from the interior to the wall. */
        public double heatFlux(double dT, double conductivity, double diffusivity, double density) {
            return fluxFactor(conductivity, diffusivity, density) * Math.pow(Math.abs(dT), 4.0 / 3.0);
        }
    }

    /**
     * How the column is divided into cells. {@link #UNIFORM}: every cell is the grid spacing (the column,
     * the sills and the top depth rounded to whole cells). Otherwise a graded grid ({@link GradedGrid}):
     * the grid spacing is the finest cell, at the face where the sills are emplaced (the roof of the first
     * sill, which under- and over-accretion both keep as the face new sills enter, the fine cells on its
     * two sides travelling with the rock they belong to) and at both contacts of every sill; cells grow by
     * the factor {@code growth} per cell away from those faces, up to {@code largestCell}. The column, the
     * sills, the top depth and the Moho are then exact faces.
     *
     * <p>On a graded grid the fine cells of sills already in place are merged again once they are no
     * longer needed ({@code coarsen}, see {@link #COARSEN_STEP_K}): at each later emplacement, two
     * neighbouring cells of the same sill on the same segment of its enthalpy relation (so that the
     * merged cell has exactly the mean temperature and melt fraction of the two, and the column's energy
     * is unchanged) are merged when the temperature steps from the cell above the pair to the cell below
     * it are all below {@link #COARSEN_STEP_K}. Cells next to a contact with other rock, cells of a
     * convecting sill and crust cells are never merged, and a sill keeps cells of at most its planned
     * largest cell, so at least {@link #MIN_CELLS_PER_SILL_FOR_ACCURACY} cells. This is the re-gridding of
     * adaptive refinement (coarsening where the solution is smooth); it keeps a stack of many sills from
     * carrying the fine contacts of every buried sill to the end of the run.
     *
     * @param growth      ratio of neighbouring cell sizes away from a contact, 1 for a uniform grid, at most 1.5
     * @param largestCell largest cell (m)
     * @param coarsen     whether buried sills' fine cells are merged again (graded grids only)
     */
    public record GridPlan(double growth, double largestCell, boolean coarsen) {

        /**
         * Largest temperature step (K) between neighbouring cells, across and around a pair of cells, for
         * which the pair is merged: a step of 0.5 K, the default time-error tolerance, where the sill was
         * emplaced with steps of hundreds of kelvin at its contacts.
         */
        public static final double COARSEN_STEP_K = 0.5;

        /** A uniform grid of the grid spacing. */
        public static final GridPlan UNIFORM = new GridPlan(1.0, Double.POSITIVE_INFINITY, false);
        /** Default growth ratio of a graded grid: 10 % per cell (common practice for smooth stretching). */
        public static final double DEFAULT_GROWTH = 1.1;
        /** Default largest cell of a graded grid (m). */
        public static final double DEFAULT_LARGEST_CELL = 250;
        /** Largest growth ratio accepted. */
        public static final double MAX_GROWTH = 1.5;
        /** The default graded grid. */
        public static final GridPlan GRADED = new GridPlan(DEFAULT_GROWTH, DEFAULT_LARGEST_CELL);

        /** Validates the plan. */
        public GridPlan {
            if (!(growth >= 1 && growth <= MAX_GROWTH) || !(largestCell > 0)) {
                throw new EngineException("a grid plan needs a growth ratio between 1 and " + MAX_GROWTH
                        + " and a positive largest cell");
            }
            coarsen = coarsen && growth != 1.0;
        }

        /** A plan that merges buried sills' fine cells again when it is graded. */
        public GridPlan(double growth, double largestCell) {
            this(growth, largestCell, true);
        }

        /** The same plan without merging cells again (every planned cell kept to the end). */
        public GridPlan withoutCoarsening() {
            return new GridPlan(growth, largestCell, false);
        }

        /** True for a uniform grid. */
        public boolean uniform() {
            return growth == 1.0;
        }
    }

    /**
     * Finest cell (m) the default graded grid starts from for sills of {@code thickness} (m): a fixed fraction
     * of the thickness, {@link #DEFAULT_FINEST_FRACTION}. With {@link #resolvingTolerance} it resolves a sill
     * in crust well below its solidus to the 1 % criterion (a 50 m sill in 450 °C crust, an 80-sill stack);
     * where the crust melts within hours to years of the emplacement, {@link #runRefined} refines it.
     */
    public static double resolvingSpacing(double thickness) {
        return thickness * DEFAULT_FINEST_FRACTION;
    }

    /**
     * Time-step tolerance (K) that goes with a finest cell of {@code spacing} (m) for sills of {@code thickness}
     * (m): {@link #RESOLVING_TOLERANCE_K} at {@link #resolvingSpacing}, scaled with the square of the spacing
     * (the step of the error control grows as the square root of the tolerance, so the time step scales with
     * the cell, as the refinement of {@link #runRefined} keeps it), and at most {@link Numerics#DEFAULT}'s.
     */
    public static double resolvingTolerance(double thickness, double spacing) {
        double ratio = spacing / resolvingSpacing(thickness);
        return Math.min(Numerics.DEFAULT.toleranceK(), RESOLVING_TOLERANCE_K * ratio * ratio);
    }

    /**
     * Everything a run needs.
     *
     * @param crust           the country rock
     * @param intrusion       the intruding magma
     * @param initial         initial temperature, heat production and boundary values
     * @param intrusions      the emplacement schedule
     * @param columnDepth     depth of the base of the column before any emplacement (m)
     * @param gridSpacing     cell size Δz of a uniform grid, the finest cell of a graded one (m)
     * @param duration        simulated time from the first emplacement (s)
     * @param outputEvery     spacing of the series (s)
     * @param profileTimes    times (s) at which to return whole profiles (may be empty)
     * @param profileSpacing  spacing of profile samples (m): on a uniform grid rounded to whole cells, at
     *                        least one cell; on a graded grid the least distance between samples (each
     *                        sample a cell centre, every cell coarser than the spacing sampled)
     * @param numerics        tolerance and work limits
     * @param mantle          non-melting rock below the Moho, or {@code null} when the whole column is crust
     * @param mohoDepth       depth of the crust's base (m); ignored without a mantle
     * @param grid            how the column is divided into cells
     * @param convection      convection in the molten intrusions, or {@code null} for conduction only
     */
    public record Setup(Rock crust, Rock intrusion, InitialState initial, Intrusions intrusions, double columnDepth,
                        double gridSpacing, double duration, double outputEvery, List<Double> profileTimes,
                        double profileSpacing, Numerics numerics, Rock mantle, double mohoDepth, GridPlan grid,
                        Convection convection) {

        /** A column without convection in the intrusions. */
        public Setup(Rock crust, Rock intrusion, InitialState initial, Intrusions intrusions, double columnDepth,
                     double gridSpacing, double duration, double outputEvery, List<Double> profileTimes,
                     double profileSpacing, Numerics numerics, Rock mantle, double mohoDepth, GridPlan grid) {
            this(crust, intrusion, initial, intrusions, columnDepth, gridSpacing, duration, outputEvery, profileTimes,
                    profileSpacing, numerics, mantle, mohoDepth, grid, null);
        }

        /** A column of crust only, from the surface to its base, on a uniform grid. */
        public Setup(Rock crust, Rock intrusion, InitialState initial, Intrusions intrusions, double columnDepth,
                     double gridSpacing, double duration, double outputEvery, List<Double> profileTimes,
                     double profileSpacing, Numerics numerics) {
            this(crust, intrusion, initial, intrusions, columnDepth, gridSpacing, duration, outputEvery, profileTimes,
                    profileSpacing, numerics, null, Double.POSITIVE_INFINITY, GridPlan.UNIFORM);
        }

        /** A column on a uniform grid. */
        public Setup(Rock crust, Rock intrusion, InitialState initial, Intrusions intrusions, double columnDepth,
                     double gridSpacing, double duration, double outputEvery, List<Double> profileTimes,
                     double profileSpacing, Numerics numerics, Rock mantle, double mohoDepth) {
            this(crust, intrusion, initial, intrusions, columnDepth, gridSpacing, duration, outputEvery, profileTimes,
                    profileSpacing, numerics, mantle, mohoDepth, GridPlan.UNIFORM);
        }

        /** Validates the geometry and times. */
        public Setup {
            if (mantle != null && !(mohoDepth > 0)) {
                throw new EngineException("a mantle needs a Moho deeper than the surface");
            }
            if (mantle != null && mantle.meltCurve() != null) {
                throw new EngineException("the mantle below the Moho does not melt in this model");
            }
            if (crust == null || intrusion == null || initial == null || intrusions == null || numerics == null
                    || grid == null) {
                throw new EngineException("a sill model needs crust, intrusion, initial state, intrusions, numerics "
                        + "and a grid plan");
            }
            if (!(gridSpacing > 0) || !(columnDepth >= 2 * gridSpacing) || !(duration > 0) || !(outputEvery > 0)
                    || !(profileSpacing > 0)) {
                throw new EngineException("a sill model needs a positive grid spacing, duration, output spacing "
                        + "and profile spacing, and a column of at least two cells");
            }
            if (!grid.uniform() && !(grid.largestCell() >= gridSpacing)) {
                throw new EngineException("the largest cell of a graded grid must not be below its finest");
            }
            if (!(intrusions.topDepth() + intrusions.thickness() <= columnDepth)) {
                throw new EngineException("the first sill must lie within the column");
            }
            profileTimes = profileTimes == null ? List.of() : List.copyOf(profileTimes);
            for (double t : profileTimes) {
                if (!(t >= 0 && t <= duration)) {
                    throw new EngineException("profile times must lie between 0 and the duration");
                }
            }
        }

        /** The same setup with another finest spacing (the convergence check halves or doubles it). */
        public Setup withGridSpacing(double spacing) {
            return new Setup(crust, intrusion, initial, intrusions, columnDepth, spacing, duration, outputEvery,
                    profileTimes, profileSpacing, numerics, mantle, mohoDepth, grid, convection);
        }

        /** The same setup with another time-step tolerance (K), keeping the work limits. */
        public Setup withTolerance(double toleranceK) {
            return new Setup(crust, intrusion, initial, intrusions, columnDepth, gridSpacing, duration, outputEvery,
                    profileTimes, profileSpacing,
                    new Numerics(toleranceK, numerics.maxSteps(), numerics.maxCellSteps()), mantle, mohoDepth, grid,
                    convection);
        }

        /**
         * One level coarser in space and time, the partner of the convergence check: the finest cell doubled
         * and the tolerance quadrupled (the time step about doubled), the tolerance at most
         * {@link Numerics#DEFAULT}'s (so a run at 0.5 K is checked on the grid alone, at the same tolerance).
         */
        public Setup coarser() {
            return withGridSpacing(2 * gridSpacing)
                    .withTolerance(Math.min(Numerics.DEFAULT.toleranceK(), 4 * numerics.toleranceK()));
        }

        /** One level finer: the finest cell halved and the tolerance quartered (the time step about halved). */
        public Setup finer() {
            return withGridSpacing(gridSpacing / 2).withTolerance(numerics.toleranceK() / 4);
        }

        /** True when the finest cell can be doubled: the column, and the largest cell of a graded grid, allow it. */
        public boolean canCoarsen() {
            double coarse = 2 * gridSpacing;
            return columnDepth >= 2 * coarse && (grid.uniform() || grid.largestCell() >= coarse);
        }

        /** The same setup on another grid plan. */
        public Setup withGrid(GridPlan plan) {
            return new Setup(crust, intrusion, initial, intrusions, columnDepth, gridSpacing, duration, outputEvery,
                    profileTimes, profileSpacing, numerics, mantle, mohoDepth, plan, convection);
        }

        /** The same setup with convection in the intrusions ({@code null}: conduction only). */
        public Setup withConvection(Convection c) {
            return new Setup(crust, intrusion, initial, intrusions, columnDepth, gridSpacing, duration, outputEvery,
                    profileTimes, profileSpacing, numerics, mantle, mohoDepth, grid, c);
        }

        /** Sizes (m) of the cells of the column before any emplacement, from the top down. */
        public double[] initialCellSizes() {
            if (grid.uniform()) {
                double[] sizes = new double[(int) Math.round(columnDepth / gridSpacing)];
                java.util.Arrays.fill(sizes, gridSpacing);
                return sizes;
            }
            double top = intrusions.topDepth();
            java.util.function.DoubleUnaryOperator s = GradedGrid.wanted(gridSpacing, grid.growth(),
                    grid.largestCell(), top);
            java.util.TreeSet<Double> faces = new java.util.TreeSet<>(List.of(0.0, top, columnDepth));
            if (mantle != null && mohoDepth > 0 && mohoDepth < columnDepth) {
                faces.add(mohoDepth);
            }
            List<double[]> parts = new ArrayList<>();
            Double prev = null;
            for (double f : faces) {
                if (prev != null && f > prev) {
                    parts.add(GradedGrid.segment(prev, f, s));
                }
                prev = f;
            }
            return GradedGrid.join(parts.toArray(new double[0][]));
        }

        /** Cells of the column above the first sill's top: the index of the face new sills enter at. */
        public int topCell() {
            if (grid.uniform()) {
                return (int) Math.round(intrusions.topDepth() / gridSpacing);
            }
            double[] sizes = initialCellSizes();
            double z = 0;
            int i = 0;
            while (i < sizes.length && z + sizes[i] / 2 < intrusions.topDepth()) {
                z += sizes[i];
                i++;
            }
            return i;
        }

        /** Sizes (m) of the cells of one sill, from its top down: whole cells on a uniform grid, at least one. */
        public double[] sillCellSizes() {
            double b = intrusions.thickness();
            if (grid.uniform()) {
                double[] sizes = new double[Math.max(1, (int) Math.round(b / gridSpacing))];
                java.util.Arrays.fill(sizes, gridSpacing);
                return sizes;
            }
            double largest = Math.max(gridSpacing, Math.min(grid.largestCell(), b / MIN_CELLS_PER_SILL_FOR_ACCURACY));
            return GradedGrid.segment(0, b, GradedGrid.wanted(gridSpacing, grid.growth(), largest, 0, b));
        }

        /** Cells of the column before any emplacement. */
        public int initialCells() {
            return initialCellSizes().length;
        }

        /** Cells of one sill. */
        public int cellsPerSill() {
            return sillCellSizes().length;
        }
        /** Sills actually emplaced: those whose emplacement time falls before the end of the run. */
        public int sillsWithinDuration() {
            if (intrusions.count() == 1) {
                return 1;
            }
            long fit = (long) Math.ceil(duration / intrusions.interval() - 1e-9);
            return (int) Math.max(1, Math.min(intrusions.count(), fit));
        }

        /** Cells at the end, when every sill within the duration is in place. */
        public int finalCells() {
            return initialCells() + sillsWithinDuration() * cellsPerSill();
        }

        /**
         * The time step (s) each emplacement restarts from: 0.05 Δz²/κ with the largest diffusivity
         * either rock reaches between 0 °C and the emplacement temperature.
         */
        public double restartStep() {
            double kappa = 0;
            for (Rock r : mantle == null ? new Rock[] {crust, intrusion} : new Rock[] {crust, intrusion, mantle}) {
                for (double t : new double[] {273.15, intrusions.temperature(), initial.surfaceTemperature()}) {
                    kappa = Math.max(kappa, r.diffusivity(t));
                }
            }
            return 0.05 * gridSpacing * gridSpacing / kappa;
        }

        /** The largest time step (s): the output spacing, and the emplacement interval when there are several sills. */
        public double maxStep() {
            double cap = Math.min(outputEvery, duration);
            return sillsWithinDuration() > 1 ? Math.min(cap, intrusions.interval()) : cap;
        }

        /**
         * A lower bound on the cell-steps (Σ cells over time steps) of the run, known before it starts:
         * after each emplacement the step restarts at {@link #restartStep()} and at most doubles, and
         * it never exceeds {@link #maxStep()}. Real runs take several times more.
         */
        public double minimumCellSteps() {
            int sills = sillsWithinDuration();
            double restart = restartStep();
            double cap = maxStep();
            double work = 0;
            double column = initialCells();
            double perSill = cellsPerSill();
            for (int k = 0; k < sills; k++) {
                double span = k + 1 < sills ? intrusions.interval() : duration - k * intrusions.interval();
                double steps = Math.max(Math.ceil(span / cap),
                        Math.ceil(Math.log(Math.max(1.0, Math.min(span, cap) / restart)) / Math.log(2.0)));
                work += steps * (column + (k + 1) * perSill);
            }
            return work;
        }
    }

    /** Thrown when a run would exceed its work limits; the message says which and what to change. */
    public static final class WorkLimitExceeded extends RuntimeException {

        private static final long serialVersionUID = 1L;

        WorkLimitExceeded(String message) {
            super(message);
        }
    }

    /** Runs the model without a wall-clock budget. */
    public static SillResult run(Setup setup) {
        return run(setup, Deadline.none());
    }

    /**
     * Runs the model, polling {@code deadline} before every time step.
     *
     * @throws BudgetExceededException when the deadline passes; the run is abandoned
     */
    public static SillResult run(Setup setup, Deadline deadline) {
        return new Run(setup, deadline).run();
    }

    /**
     * Runs the model, then again one level coarser ({@link Setup#coarser()}: the finest cell doubled and the
     * tolerance quadrupled, at most 0.5 K), and attaches the relative change of every reported time and melt
     * thickness between the two ({@link SillResult.Convergence}), with a warning when a change exceeds
     * {@link SillResult.Convergence#TOLERANCE}. The coarser run costs about half of the first one on a
     * graded grid at the same tolerance (the cell count grows only with the logarithm of the spacing range;
     * the time steps restart from a step four times longer), about a quarter at four times the tolerance.
     *
     * @throws BudgetExceededException when the deadline passes during either run
     */
    public static SillResult runWithConvergenceCheck(Setup setup, Deadline deadline) {
        return refine(setup, 0, Integer.MAX_VALUE, deadline);
    }

    /**
     * Runs the model refined until it is converged (adaptive refinement of the whole run): the run of
     * {@code setup} is checked against the run one level coarser ({@link Setup#coarser()}); while the
     * largest change exceeds {@link SillResult.Convergence#TOLERANCE}, the run is repeated one level finer
     * ({@link Setup#finer()}: the finest cell halved, the tolerance quartered) and checked against the run
     * before it, until two successive runs agree within the tolerance or the budget is reached. Budget: at most
     * {@link #MAX_REFINEMENTS} refinements; a refinement is not started when its expected work
     * ({@link #REFINEMENT_WORK_FACTOR} × the last run's cell-steps and time steps) or its planned cells
     * would exceed the setup's work limits or {@code maxCells}, and a refinement that exceeds them or the
     * deadline is abandoned; the last pair is then reported, not converged, with a warning saying why. The
     * result is the finest run of the last pair, with that pair's check and the number of refinements.
     *
     * @param maxCells most cells a refined column may plan (column plus all sills)
     * @throws BudgetExceededException when the deadline passes during the first two runs
     */
    public static SillResult runRefined(Setup setup, int maxCells, Deadline deadline) {
        return refine(setup, MAX_REFINEMENTS, maxCells, deadline);
    }

    /**
     * The run of {@code setup} checked against the run one level coarser, refined at most
     * {@code maxRefinements} times while they disagree ({@link #runRefined}; 0 is
     * {@link #runWithConvergenceCheck}, whose unconverged answer advises a finer spacing).
     */
    private static SillResult refine(Setup setup, int maxRefinements, int maxCells, Deadline deadline) {
        SillResult fine = run(setup, deadline);
        if (!setup.canCoarsen()) {
            return fine.withConvergence(null, List.of("no grid-convergence check: the grid spacing is too coarse "
                    + "to double"));
        }
        Setup coarseSetup = setup.coarser();
        SillResult coarse = run(coarseSetup, deadline);
        Setup fineSetup = setup;
        int refinements = 0;
        String stopped = null;
        while (maxRefinements > 0 && largestChange(fine, coarse) >= SillResult.Convergence.TOLERANCE) {
            Setup next = fineSetup.finer();
            SillResult.Numerics last = fine.numerics();
            if (refinements == maxRefinements) {
                stopped = "after " + maxRefinements + " refinements, the most allowed";
                break;
            }
            if (REFINEMENT_WORK_FACTOR * last.cellSteps() > setup.numerics().maxCellSteps()
                    || REFINEMENT_WORK_FACTOR * last.timeSteps() > setup.numerics().maxSteps()
                    || (long) next.initialCells() + (long) next.sillsWithinDuration() * next.cellsPerSill() > maxCells) {
                stopped = "because the next refinement would exceed the work limits (cells, time steps or cell-steps)";
                break;
            }
            SillResult refined;
            try {
                refined = run(next, deadline);
            } catch (WorkLimitExceeded e) {
                stopped = "because the next refinement exceeded the work limits: " + e.getMessage();
                break;
            } catch (BudgetExceededException e) {
                stopped = "because the next refinement ran out of the time budget";
                break;
            }
            coarseSetup = fineSetup;
            coarse = fine;
            fineSetup = next;
            fine = refined;
            refinements++;
        }
        return checked(fineSetup, fine, coarseSetup, coarse, refinements, stopped);
    }

    /** The largest change between two runs of the quantities held to the criterion (see {@link #checked}). */
    private static double largestChange(SillResult fine, SillResult coarse) {
        double largest = 0;
        for (Double c : changes(fine.summary(), coarse.summary())) {
            if (c != null && c > largest) {
                largest = c;
            }
        }
        return largest;
    }

    /** Changes of the solidification time, the first-melt time, the peak melt and the lock-up time. */
    private static Double[] changes(SillResult.Summary a, SillResult.Summary b) {
        return new Double[] {change(a.solidificationTime(), b.solidificationTime()),
            change(a.timeToFirstCrustMelt(), b.timeToFirstCrustMelt()),
            change(a.peakCrustMeltThickness(), b.peakCrustMeltThickness()), change(a.lockUpTime(), b.lockUpTime())};
    }

    /** The fine run with the check against the coarse one attached, and a warning when it is not converged. */
    private static SillResult checked(Setup fineSetup, SillResult fine, Setup coarseSetup, SillResult coarse,
                                      int refinements, String stopped) {
        SillResult.Summary a = fine.summary();
        SillResult.Summary b = coarse.summary();
        Double[] changes = changes(a, b);
        double largest = 0;
        String worst = null;
        // the time of a flat peak is ill-conditioned (reported, not held to the criterion)
        String[] names = {"solidification time", "time to first crustal melt", "peak crust melt thickness",
            "lock-up time"};
        for (int k = 0; k < changes.length; k++) {
            if (changes[k] != null && changes[k] > largest) {
                largest = changes[k];
                worst = names[k];
            }
        }
        boolean ok = largest < SillResult.Convergence.TOLERANCE;
        List<String> notes = new ArrayList<>();
        if (!ok) {
            notes.add(String.format(Locale.ROOT, "doubling the finest cell from %.3g m to %.3g m and the time-step "
                    + "tolerance from %.3g K to %.3g K changes the %s by %.1f %%: the results are not converged to "
                    + "1 %%%s", fineSetup.gridSpacing(), coarseSetup.gridSpacing(), fineSetup.numerics().toleranceK(),
                    coarseSetup.numerics().toleranceK(), worst, 100 * largest,
                    stopped == null ? "; use a finer grid spacing" : "; the refinement stopped " + stopped));
        }
        return fine.withConvergence(new SillResult.Convergence(coarseSetup.gridSpacing(),
                coarseSetup.numerics().toleranceK(), b, changes[0], changes[1], changes[2],
                change(a.peakTime(), b.peakTime()), changes[3], largest, ok, refinements), notes);
    }

    /** |fine − coarse| / max(|fine|, |coarse|); null when either is absent, 0 when both are 0. */
    private static Double change(Double fine, Double coarse) {
        if (fine == null || coarse == null) {
            return null;
        }
        double scale = Math.max(Math.abs(fine), Math.abs(coarse));
        return scale == 0 ? 0.0 : Math.abs(fine - coarse) / scale;
    }

    /** The mutable state of one run. */
    private static final class Run {

        private final Setup s;
        private final Deadline deadline;
        /** Finest cell (m): the grid spacing. */
        private final double dzMin;
        private final EnthalpyCurve[] rocks;
        private final ConductivityLaw[] laws;
        private final double[] constantK;
        private final boolean hasMantle;
        private final double[] invRhoC;
        private final boolean constK;
        private final double tolerance;
        private final double tTop;
        private final double qBase;
        private final int topIndex;
        private final int sillCells;
        private final double[] sillDz;
        /** Largest cell (m) of a sill as planned: merged sill cells stay within it. */
        private final double sillLargest;
        private final double sillThickness;
        /** Crust melt thickness (m) that marks the first crustal melt. */
        private final double onsetThickness;
        private final double sillEnthalpy;
        private final int sillSegment;
        private final double dtRestart;
        private final double dtMax;
        private final double[] emplacementTimes;

        private int n;
        /** Cell sizes (m) and their inverses. */
        private final double[] dzc;
        private final double[] invDz;
        private final double[] h;
        private final double[] hOld;
        private final double[] heat;
        private final double[] hOrigin;
        private final double[] temp;
        private final double[] beta;
        private final double[] kc;
        private double[] dTheta;
        private double[] dThetaPrev;
        private final double[] g;
        private final double[] lo;
        private final double[] di;
        private final double[] up;
        private final double[] rhs;
        private final double[] work;
        private final int[] seg;
        private final int[] segOld;
        private final int[] sill;
        private final byte[] rock;
        /** Enthalpy relation of each cell: its rock's, with the melt curve at its pressure for a rock with a table. */
        private final EnthalpyCurve[] curve;
        /**
         * The solver's nodes: a cell, or all cells of a convecting sill lumped into one (well mixed). At the
         * first cell of each node: the first cell of the next node and 1/(node thickness).
         */
        private final int[] nodeEnd;
        /**
         * True for a cell that is not the first of its node (inside a lumped convecting sill). The solver's
         * passes are counted loops over cells that skip these cells and treat a node's first cell outside the
         * loop over its other cells: stepping from node to node cost conducting runs about 60 % more time.
         */
        private final boolean[] inner;
        private final double[] nodeInv;
        /** Convection in the intrusions, or null; whether sill k (1-based) still convects; its last melt fraction. */
        private final Convection convection;
        private final boolean[] convecting;
        private final double[] sillMeltPrev;
        private final boolean nonlinearFaces;
        private Double lockUp;

        private int emplaced;
        private int emplacedCells;
        private double energyStart;
        private double energyIn;
        private double energyInserted;
        private double sourcePerArea;
        private double baseInitial;

        private int steps;
        private int rejected;
        private long solves;
        private long cellSteps;

        // per-step measurements
        private double crustMelt;
        private double crustPartial;
        private double maxCrustF;
        private double intrusionMeltMean;
        private double firstSillMelt;
        private double contactT;
        private double maxT;
        private double maxTAll;
        // accumulators of the measurement passes
        private double mMelt;
        private double mPartial;
        private double mMaxF;
        private double mIntrMelt;
        private double mIntrCells;
        private double mFirst;
        private double mFirstT;
        /** Heat flux up through the roof of the intrusions (W/m²) and the first sill's mean temperature (K). */
        private double roofFlux;
        private double firstSillT;
        private double mMaxT;
        private double mMaxMantleT;
        private double maxMantleAll = Double.NEGATIVE_INFINITY;
        /** Δt_n/Δt_{n−1} of the step being taken (0 after an emplacement) and the largest |Δθ − ratio·Δθ_prev|. */
        private double ratio;
        private double errMax;

        private Double solidification;
        private Double firstCrustMelt;
        private double peakMelt;
        private double peakTime = Double.NaN;
        /** The largest crust melt thickness over the steps and its time, and the last three (time, thickness). */
        private double peakSample = Double.NEGATIVE_INFINITY;
        private double peakSampleTime = Double.NaN;
        private final double[] histT = new double[3];
        private final double[] histM = new double[3];
        private int histCount;

        private final List<SillResult.Sample> series = new ArrayList<>();
        private final List<SillResult.Profile> profiles = new ArrayList<>();
        private final List<String> warnings = new ArrayList<>();

        Run(Setup setup, Deadline deadline) {
            this.s = setup;
            this.deadline = deadline;
            this.dzMin = setup.gridSpacing();
            Rock mantle = setup.mantle() == null ? setup.crust() : setup.mantle();
            this.hasMantle = setup.mantle() != null;
            this.rocks = new EnthalpyCurve[] {new EnthalpyCurve(setup.crust()), new EnthalpyCurve(setup.intrusion()),
                new EnthalpyCurve(mantle)};
            this.laws = new ConductivityLaw[] {setup.crust().conductivity(), setup.intrusion().conductivity(),
                mantle.conductivity()};
            this.constK = laws[0].isConstant() && laws[1].isConstant() && laws[2].isConstant();
            this.constantK = new double[] {laws[0].at(300), laws[1].at(300), laws[2].at(300)};
            this.invRhoC = new double[] {rocks[0].invRhoC(), rocks[1].invRhoC(), rocks[2].invRhoC()};
            this.tolerance = setup.numerics().toleranceK();
            this.tTop = setup.initial().surfaceTemperature();
            this.qBase = setup.initial().basalHeatFlow(setup.columnDepth());
            this.topIndex = setup.topCell();
            this.sillDz = setup.sillCellSizes();
            this.sillCells = sillDz.length;
            this.sillLargest = java.util.Arrays.stream(sillDz).max().orElse(0);
            double thick = 0;
            for (double d : sillDz) {
                thick += d;
            }
            this.sillThickness = thick;
            this.onsetThickness = MELT_ONSET_FRACTION * setup.intrusions().thickness();
            this.sillEnthalpy = rocks[1].enthalpy(setup.intrusions().temperature());
            this.sillSegment = rocks[1].segment(sillEnthalpy);

            int sills = setup.sillsWithinDuration();
            this.emplacementTimes = new double[sills];
            for (int k = 0; k < sills; k++) {
                emplacementTimes[k] = k * setup.intrusions().interval();
            }
            this.dtRestart = setup.restartStep();
            this.dtMax = setup.maxStep();

            double[] column = setup.initialCellSizes();
            n = column.length;
            int cap0 = n + sills * sillCells;
            dzc = new double[cap0];
            invDz = new double[cap0];
            System.arraycopy(column, 0, dzc, 0, n);
            h = new double[cap0];
            hOld = new double[cap0];
            heat = new double[cap0];
            hOrigin = new double[cap0];
            temp = new double[cap0];
            beta = new double[cap0];
            kc = new double[cap0];
            dTheta = new double[cap0];
            dThetaPrev = new double[cap0];
            g = new double[cap0];
            lo = new double[cap0];
            di = new double[cap0];
            up = new double[cap0];
            rhs = new double[cap0];
            work = new double[cap0];
            seg = new int[cap0];
            segOld = new int[cap0];
            sill = new int[cap0];
            rock = new byte[cap0];
            curve = new EnthalpyCurve[cap0];
            nodeEnd = new int[cap0];
            inner = new boolean[cap0];
            nodeInv = new double[cap0];
            convection = setup.convection();
            convecting = new boolean[sills + 1];
            sillMeltPrev = new double[sills + 1];
            nonlinearFaces = !constK || convection != null;
            double zTop = 0;
            for (int i = 0; i < n; i++) {
                invDz[i] = 1 / dzc[i];
                double z = zTop + 0.5 * dzc[i];
                zTop += dzc[i];
                rock[i] = (byte) (hasMantle && z >= setup.mohoDepth() ? MANTLE : CRUST);
                curve[i] = rock[i] == CRUST && setup.crust().meltTable() != null
                        ? new EnthalpyCurve(setup.crust(), setup.crust().curveAt(pressureAt(z))) : rocks[rock[i]];
                temp[i] = setup.initial().temperature(z);
                heat[i] = setup.initial().heatProduction(z);
                sourcePerArea += heat[i] * dzc[i];
            }
            if (setup.initial().steady()) {
                relaxToSteadyState();
            }
            for (int i = 0; i < n; i++) {
                h[i] = curve[i].enthalpy(temp[i]);
                seg[i] = curve[i].segment(h[i]);
                hOrigin[i] = h[i];
            }
            baseInitial = temp[n - 1];
            buildNodes();
            noteGeometry();
        }

        /**
         * Replaces the sampled initial temperatures by the steady state of this grid for the same surface
         * temperature, heat production and basal heat flow: one tridiagonal solve with constant
         * conductivity, Picard iterations on k(T) otherwise. Notes the largest change in the warnings when
         * it exceeds 1 K (a temperature-dependent conductivity makes the closed-form geotherm unsteady).
         */
        private void relaxToSteadyState() {
            double[] sampled = java.util.Arrays.copyOf(temp, n);
            double change = Double.POSITIVE_INFINITY;
            int iterations = 0;
            while (change > 1e-7 && iterations < 200) {
                iterations++;
                for (int i = 0; i < n; i++) {
                    kc[i] = laws[rock[i]].at(temp[i]);
                }
                faces();
                for (int i = 0; i < n; i++) {
                    double gA = g[i];
                    double gB = i == n - 1 ? 0 : g[i + 1];
                    di[i] = gA + gB;
                    lo[i] = i == 0 ? 0 : -gA;
                    up[i] = -gB;
                    rhs[i] = heat[i] * dzc[i] + (i == 0 ? gA * tTop : 0) + (i == n - 1 ? qBase : 0);
                }
                Tridiagonal.solve(lo, di, up, rhs, work, n);
                change = 0;
                for (int i = 0; i < n; i++) {
                    change = Math.max(change, Math.abs(rhs[i] - temp[i]));
                    temp[i] = rhs[i];
                }
                if (constK) {
                    change = 0; // one solve is exact when no conductivity depends on temperature
                    break;
                }
            }
            if (change > 1e-4) {
                throw new EngineException("the steady initial geotherm under the conductivity law did not converge");
            }
            double largest = 0;
            int where = 0;
            for (int i = 0; i < n; i++) {
                if (Math.abs(temp[i] - sampled[i]) > largest) {
                    largest = Math.abs(temp[i] - sampled[i]);
                    where = i;
                }
            }
            if (largest > 1.0) {
                warnings.add(String.format(Locale.ROOT, "the initial state is the steady geotherm under the rocks' "
                        + "conductivities, which differs from the constant-conductivity closed form by up to %.0f K "
                        + "(%.1f km deep)", largest, depthOf(where) / 1e3));
            }
        }

        /**
         * Lithostatic pressure (Pa) at depth {@code z} (m) of the column before any emplacement, ρ g z with the
         * crust's density: the pressure at which a crust cell's melt curve is read. A cell keeps its curve when
         * later sills push it down (the weight of the sills above is not added), which keeps its enthalpy
         * relation, and so the energy balance, fixed.
         */
        private double pressureAt(double z) {
            return s.crust().density() * org.tectomelt.engine.thermal.LithostaticColumn.G * z;
        }

        /** Depth (m) of the centre of cell {@code i}. */
        private double depthOf(int i) {
            double z = 0;
            for (int k = 0; k < i; k++) {
                z += dzc[k];
            }
            return z + 0.5 * dzc[i];
        }

        /** Depth (m) of the face above cell {@code i}. */
        private double faceDepth(int i) {
            double z = 0;
            for (int k = 0; k < i; k++) {
                z += dzc[k];
            }
            return z;
        }

        private void noteGeometry() {
            Intrusions in = s.intrusions();
            if (Math.abs(sillThickness - in.thickness()) > 1e-9 * in.thickness()) {
                warnings.add(String.format(Locale.ROOT, "each sill is %.6g m thick (%d cells of %.6g m), not the "
                        + "%.6g m asked for: sills are whole cells", sillThickness, sillCells, dzMin, in.thickness()));
            }
            if (Math.abs(faceDepth(topIndex) - in.topDepth()) > 1e-6) {
                warnings.add(String.format(Locale.ROOT, "the sill top is placed at %.6g m, the cell face nearest "
                        + "the %.6g m asked for", faceDepth(topIndex), in.topDepth()));
            }
            if (Math.abs(faceDepth(n) - s.columnDepth()) > 1e-6) {
                warnings.add(String.format(Locale.ROOT, "the column is %.6g m deep (whole cells), not %.6g m",
                        faceDepth(n), s.columnDepth()));
            }
            if (sillCells < MIN_CELLS_PER_SILL_FOR_ACCURACY) {
                warnings.add(String.format(Locale.ROOT, "a sill spans only %d cells: solidification times and "
                        + "melt thicknesses are coarse; use a grid spacing of at most %.3g m", sillCells,
                        in.thickness() / MIN_CELLS_PER_SILL_FOR_ACCURACY));
            }
            org.tectomelt.engine.melting.MeltTable table = s.crust().meltTable();
            if (table != null) {
                double crustBase = hasMantle ? Math.min(s.mohoDepth(), s.columnDepth()) : s.columnDepth();
                if (!table.covers(0, pressureAt(crustBase))) {
                    warnings.add(String.format(Locale.ROOT, "the crust's melt table covers %.2f-%.2f GPa, its column "
                            + "0-%.2f GPa: beyond the table the nearest row is used", table.minPressure() * 1e-9,
                            table.maxPressure() * 1e-9, pressureAt(crustBase) * 1e-9));
                }
            }
            if (s.sillsWithinDuration() < in.count()) {
                warnings.add(String.format(Locale.ROOT, "only %d of the %d sills fall within the duration and were "
                        + "emplaced", s.sillsWithinDuration(), in.count()));
            }
        }

        SillResult run() {
            energyStart = totalEnergy();
            double duration = s.duration();
            double[] outputs = outputTimes();
            double[] profileTimes = s.profileTimes().stream().mapToDouble(Double::doubleValue).sorted().toArray();
            int nextEmplacement = 0;
            int nextOutput = 0;
            int nextProfile = 0;

            double t = 0;
            emplace();
            nextEmplacement = 1;
            System.arraycopy(h, 0, hOld, 0, n);
            evaluate();
            if (firstSillMelt <= 0) {
                solidification = 0.0;
                warnings.add("the sill is emplaced below its solidus: it holds no melt from the start");
            }
            boolean crustMoltenAtStart = maxCrustF >= MELT_PRESENT;
            if (crustMoltenAtStart) {
                firstCrustMelt = 0.0;
                warnings.add("the crust holds melt from the start: its initial temperature is above its solidus");
            }
            updatePeak(0);
            while (nextOutput < outputs.length && outputs[nextOutput] <= 0) {
                record(0);
                nextOutput++;
            }
            while (nextProfile < profileTimes.length && profileTimes[nextProfile] <= 0) {
                profile(0);
                nextProfile++;
            }

            double dt = dtRestart;
            double prevCrustMelt = crustMelt;
            double prevFirstSill = firstSillMelt;
            double prevStep = 0;
            boolean prevValid = false;
            while (t < duration) {
                deadline.check();
                double tEvent = duration;
                if (nextEmplacement < emplacementTimes.length) {
                    tEvent = Math.min(tEvent, emplacementTimes[nextEmplacement]);
                }
                if (nextOutput < outputs.length) {
                    tEvent = Math.min(tEvent, outputs[nextOutput]);
                }
                if (nextProfile < profileTimes.length) {
                    tEvent = Math.min(tEvent, profileTimes[nextProfile]);
                }
                double step = dt;
                boolean lands = false;
                if (t + 1.2 * dt >= tEvent) {
                    step = tEvent - t;
                    lands = true;
                }
                System.arraycopy(h, 0, hOld, 0, n);
                System.arraycopy(seg, 0, segOld, 0, n);
                cellSteps += n;
                if (cellSteps > s.numerics().maxCellSteps()) {
                    throw new WorkLimitExceeded(String.format(Locale.ROOT, "the run needs more than %d cell-steps "
                            + "(cells × time steps) and was stopped at %.3g of the duration", s.numerics().maxCellSteps(),
                            t / duration));
                }
                ratio = prevValid ? step / prevStep : 0;
                boolean converged = newton(step);
                double err = converged && prevValid ? errMax * step / (step + prevStep) : 0;
                if (!converged || (prevValid && err > 4 * tolerance)) {
                    System.arraycopy(hOld, 0, h, 0, n);
                    System.arraycopy(segOld, 0, seg, 0, n);
                    ratio = 0;
                    evaluate();
                    rejected++;
                    dt = converged ? step * Math.max(0.2, 0.9 * Math.sqrt(tolerance / err)) : step / 4;
                    if (dt < 1e-9 * dtRestart) {
                        throw new IllegalStateException("time step collapsed at t = " + t + " s");
                    }
                    continue;
                }
                // accepted
                double tPrev = t;
                t = lands ? tEvent : t + step;
                steps++;
                if (steps > s.numerics().maxSteps()) {
                    throw new WorkLimitExceeded(String.format(Locale.ROOT, "the run needs more than %d time steps and "
                            + "was stopped at %.3g of the duration", s.numerics().maxSteps(), t / duration));
                }
                energyIn += step * (g[0] * (tTop - temp[0]) + qBase + sourcePerArea);
                double[] swap = dThetaPrev;
                dThetaPrev = dTheta;
                dTheta = swap;
                if (convection != null) {
                    checkLockUp(tPrev, t);
                }
                track(tPrev, t, prevCrustMelt, prevFirstSill);
                prevCrustMelt = crustMelt;
                prevFirstSill = firstSillMelt;

                double factor = !prevValid || err <= 0 ? 2.0 : Math.min(2.0, Math.max(0.2, 0.9 * Math.sqrt(tolerance / err)));
                double next = step * factor;
                dt = lands && step < dt && factor >= 1 ? Math.max(dt, next) : next;
                dt = Math.min(dt, dtMax);
                prevStep = step;
                prevValid = true;

                if (nextEmplacement < emplacementTimes.length && t >= emplacementTimes[nextEmplacement]) {
                    emplace();
                    nextEmplacement++;
                    System.arraycopy(h, 0, hOld, 0, n);
                    ratio = 0;
                    evaluate();
                    updatePeak(t);
                    prevCrustMelt = crustMelt;
                    prevFirstSill = firstSillMelt;
                    dt = dtRestart;
                    prevValid = false;
                }
                while (nextOutput < outputs.length && outputs[nextOutput] <= t) {
                    record(t);
                    nextOutput++;
                }
                while (nextProfile < profileTimes.length && profileTimes[nextProfile] <= t) {
                    profile(t);
                    nextProfile++;
                }
            }
            return finish();
        }

        private double[] outputTimes() {
            double every = s.outputEvery();
            double duration = s.duration();
            int count = (int) Math.floor(duration / every + 1e-9);
            List<Double> times = new ArrayList<>(count + 2);
            for (int k = 0; k <= count; k++) {
                times.add(Math.min(k * every, duration));
            }
            if (times.get(times.size() - 1) < duration * (1 - 1e-12)) {
                times.add(duration);
            } else {
                times.set(times.size() - 1, duration);
            }
            return times.stream().mapToDouble(Double::doubleValue).toArray();
        }

        /**
         * Merges pairs of neighbouring cells of the sills in place where the profile is smooth (see
         * {@link GridPlan}): the merged cell holds the two cells' enthalpy, heat production and original
         * enthalpy per volume averaged by thickness, so Σ H Δz, the source and the energy check are
         * unchanged, and, both cells lying on one linear segment of T(H), its temperature and melt fraction
         * are the thickness-weighted means of theirs. One pass merges each cell at most once; repeated at
         * every emplacement, smooth stretches coarsen geometrically. Returns the number of merges.
         */
        private int coarsen() {
            int w = 0;
            int merges = 0;
            double step = GridPlan.COARSEN_STEP_K;
            for (int i = 0; i < n; i++) {
                int b = i + 1;
                boolean merge = b + 1 < n && w > 0 && rock[i] == INTRUSION && rock[b] == INTRUSION
                        && rock[w - 1] == INTRUSION && rock[b + 1] == INTRUSION && sill[i] == sill[b]
                        && seg[i] == seg[b] && curve[i] == curve[b] && !mixed(i)
                        && dzc[i] + dzc[b] <= sillLargest * (1 + 1e-12)
                        && Math.abs(temp[w - 1] - temp[i]) <= step && Math.abs(temp[i] - temp[b]) <= step
                        && Math.abs(temp[b] - temp[b + 1]) <= step;
                if (merge) {
                    double da = dzc[i];
                    double db = dzc[b];
                    double d = da + db;
                    double hm = (h[i] * da + h[b] * db) / d;
                    double om = (hOrigin[i] * da + hOrigin[b] * db) / d;
                    double qm = (heat[i] * da + heat[b] * db) / d;
                    double tm = (temp[i] * da + temp[b] * db) / d;
                    moveCell(i, w);
                    h[w] = hm;
                    hOrigin[w] = om;
                    heat[w] = qm;
                    temp[w] = tm;
                    dzc[w] = d;
                    invDz[w] = 1 / d;
                    merges++;
                    i = b;
                } else if (w != i) {
                    moveCell(i, w);
                }
                w++;
            }
            n = w;
            emplacedCells -= merges;
            return merges;
        }

        /** Copies cell {@code from} to position {@code to} (the arrays that stay with a cell between steps). */
        private void moveCell(int from, int to) {
            h[to] = h[from];
            hOrigin[to] = hOrigin[from];
            heat[to] = heat[from];
            temp[to] = temp[from];
            dzc[to] = dzc[from];
            invDz[to] = invDz[from];
            seg[to] = seg[from];
            rock[to] = rock[from];
            curve[to] = curve[from];
            sill[to] = sill[from];
        }

        /** Inserts one sill and books its enthalpy. */
        private void emplace() {
            if (emplaced > 0 && s.grid().coarsen()) {
                coarsen();
            }
            int m = sillCells;
            int j = s.intrusions().stacking() == Stacking.OVER ? topIndex : topIndex + emplacedCells;
            int tail = n - j;
            System.arraycopy(h, j, h, j + m, tail);
            System.arraycopy(seg, j, seg, j + m, tail);
            System.arraycopy(rock, j, rock, j + m, tail);
            System.arraycopy(curve, j, curve, j + m, tail);
            System.arraycopy(sill, j, sill, j + m, tail);
            System.arraycopy(heat, j, heat, j + m, tail);
            System.arraycopy(hOrigin, j, hOrigin, j + m, tail);
            System.arraycopy(dzc, j, dzc, j + m, tail);
            System.arraycopy(invDz, j, invDz, j + m, tail);
            emplaced++;
            for (int i = j; i < j + m; i++) {
                dzc[i] = sillDz[i - j];
                invDz[i] = 1 / dzc[i];
                h[i] = sillEnthalpy;
                seg[i] = sillSegment;
                rock[i] = INTRUSION;
                curve[i] = rocks[INTRUSION];
                sill[i] = emplaced;
                heat[i] = 0;
                hOrigin[i] = sillEnthalpy;
            }
            n += m;
            emplacedCells += m;
            energyInserted += sillThickness * sillEnthalpy;
            if (convection != null) {
                double f = rocks[INTRUSION].fraction(sillEnthalpy, sillSegment, rocks[INTRUSION].temperature(sillEnthalpy,
                        sillSegment));
                convecting[emplaced] = f > convection.lockMeltFraction();
                sillMeltPrev[emplaced] = f;
                if (!convecting[emplaced] && emplaced == 1) {
                    lockUp = 0.0;
                }
            }
            buildNodes();
        }

        /** True when cell {@code i} belongs to a sill that is still convecting. */
        private boolean mixed(int i) {
            return convection != null && rock[i] == INTRUSION && convecting[sill[i]];
        }

        /** Groups the cells into the solver's nodes: one per cell, one per convecting sill. */
        private void buildNodes() {
            int i = 0;
            while (i < n) {
                int e = i + 1;
                double size = dzc[i];
                if (mixed(i)) {
                    while (e < n && rock[e] == INTRUSION && sill[e] == sill[i]) {
                        size += dzc[e];
                        e++;
                    }
                }
                nodeEnd[i] = e;
                inner[i] = false;
                for (int j = i + 1; j < e; j++) {
                    inner[j] = true;
                }
                nodeInv[i] = 1 / size;
                i = e;
            }
        }

        /**
         * Conductance (W/m²/K) of face {@code f} between cells f − 1 and f when a convecting sill lies on one
         * or both sides: the convective boundary layer (q = A ΔT_bl^(4/3)) in series with the half cell on the
         * other side, solved for the boundary layer's share of the temperature difference (u = ΔT_bl^(1/3):
         * u³ + r A u⁴ = ΔT, by Newton's method from above; convex and increasing, so it converges).
         */
        private double convectiveFace(int f) {
            int a = f - 1;
            boolean ma = mixed(a);
            boolean mb = mixed(f);
            int magmaCell = ma ? a : f;
            double km = laws[INTRUSION].at(temp[magmaCell]);
            double factor = convection.fluxFactor(km, km * invRhoC[INTRUSION], s.intrusion().density());
            double dT = Math.max(Math.abs(temp[a] - temp[f]), MIN_BOUNDARY_DROP_K);
            if (ma && mb) {
                // two convecting bodies: two boundary layers sharing the drop equally
                return factor * Math.cbrt(dT / 2) / 2;
            }
            int other = ma ? f : a;
            double r = 0.5 * dzc[other] / kc[other];
            double u = Math.min(Math.cbrt(dT), Math.pow(dT / (r * factor), 0.25));
            for (int it = 0; it < 50; it++) {
                double u3 = u * u * u;
                double fu = u3 + r * factor * u3 * u - dT;
                double step = fu / (3 * u * u + 4 * r * factor * u3);
                u -= step;
                if (Math.abs(step) <= 1e-13 * u) {
                    break;
                }
            }
            double bl = Math.max(u * u * u, MIN_BOUNDARY_DROP_K);
            return 1 / (1 / (factor * Math.cbrt(bl)) + r);
        }

        /**
         * After an accepted step: each convecting sill whose melt fraction fell to the lock-up fraction stops
         * convecting (the time interpolated within the step for the first sill) and its cells become nodes of
         * their own.
         */
        private void checkLockUp(double t0, double t1) {
            boolean changed = false;
            for (int i = 0; i < n; i = nodeEnd[i]) {
                if (!mixed(i)) {
                    continue;
                }
                int k = sill[i];
                double f = curve[i].fraction(h[i], seg[i], temp[i]);
                double lock = convection.lockMeltFraction();
                if (f <= lock) {
                    convecting[k] = false;
                    changed = true;
                    if (k == 1 && lockUp == null) {
                        double w = (sillMeltPrev[k] - lock) / (sillMeltPrev[k] - f);
                        lockUp = t0 + (t1 - t0) * Math.max(0, Math.min(1, w));
                    }
                }
                sillMeltPrev[k] = f;
            }
            if (changed) {
                buildNodes();
                faces();
            }
        }

        /**
         * Face conductances (W/m²/K): face i lies above cell i, face 0 is the surface. Between cells the two
         * half-cell resistances Δz/(2k) in series, 1/(Δz₁/(2k₁) + Δz₂/(2k₂)) (the harmonic mean on a uniform
         * grid; exact flux continuity across a rock contact on any grid).
         */
        private void faces() {
            g[0] = 2 * kc[0] * invDz[0];
            for (int i = 1; i < n; i++) {
                double k1 = kc[i - 1];
                double k2 = kc[i];
                g[i] = 2 * k1 * k2 / (k1 * dzc[i] + k2 * dzc[i - 1]);
            }
            if (convection != null) {
                for (int i = 0; i < n; i = nodeEnd[i]) {
                    if (mixed(i)) {
                        if (i > 0) {
                            g[i] = convectiveFace(i);
                        }
                        if (nodeEnd[i] < n) {
                            g[nodeEnd[i]] = convectiveFace(nodeEnd[i]);
                        }
                    }
                }
            }
        }

        /**
         * Temperature, slope dT/dH, conductivity and melt fraction of every cell from its enthalpy and
         * segment, with the measurements (after emplacement, rejection and at the start).
         */
        private void evaluate() {
            resetMeasurements();
            double e = 0;
            for (int i = 0; i < n; i++) {
                if (constK) {
                    kc[i] = constantK[rock[i]];
                }
                evaluateCell(i);
                double d = (h[i] - hOld[i]) * invRhoC[rock[i]];
                dTheta[i] = d;
                e = Math.max(e, Math.abs(d - ratio * dThetaPrev[i]));
            }
            errMax = e;
            faces();
            finishMeasurements();
        }

        private void evaluateCell(int i) {
            int r = rock[i];
            EnthalpyCurve c = curve[i];
            int sg = seg[i];
            double hi = h[i];
            double t = c.temperature(hi, sg);
            temp[i] = t;
            beta[i] = c.slope(sg);
            if (!constK) {
                kc[i] = laws[r].at(t);
            }
            double f = c.fraction(hi, sg, t);
            if (r == MANTLE) {
                if (t > mMaxMantleT) {
                    mMaxMantleT = t;
                }
            } else if (r == CRUST) {
                mMelt += f * dzc[i];
                if (f >= MELT_PRESENT) {
                    mPartial += dzc[i];
                }
                if (f > mMaxF) {
                    mMaxF = f;
                }
            } else {
                mIntrMelt += f * dzc[i];
                mIntrCells += dzc[i];
                if (sill[i] == 1) {
                    mFirst += f * dzc[i];
                    mFirstT += t * dzc[i];
                }
            }
            if (t > mMaxT) {
                mMaxT = t;
            }
        }

        private void resetMeasurements() {
            mMelt = 0;
            mPartial = 0;
            mMaxF = 0;
            mIntrMelt = 0;
            mIntrCells = 0;
            mFirst = 0;
            mFirstT = 0;
            mMaxT = Double.NEGATIVE_INFINITY;
            mMaxMantleT = Double.NEGATIVE_INFINITY;
        }

        private void finishMeasurements() {
            crustMelt = mMelt;
            crustPartial = mPartial;
            maxCrustF = mMaxF;
            intrusionMeltMean = mIntrCells == 0 ? 0 : mIntrMelt / mIntrCells;
            firstSillMelt = mFirst;
            maxT = mMaxT;
            maxTAll = Math.max(maxTAll, mMaxT);
            maxMantleAll = Math.max(maxMantleAll, mMaxMantleT);
            int i = topIndex;
            if (i == 0) {
                contactT = tTop;
                roofFlux = 0;
            } else if (convection != null && (mixed(i) || mixed(i - 1)) && !(mixed(i) && mixed(i - 1))) {
                // the wall side of a convective boundary: the half cell beyond the magma carries the flux
                int wall = mixed(i) ? i - 1 : i;
                double flux = g[i] * (temp[i] - temp[i - 1]);
                double r = 0.5 * dzc[wall] / kc[wall];
                contactT = wall == i - 1 ? temp[wall] + flux * r : temp[wall] - flux * r;
                roofFlux = flux;
            } else {
                double wa = kc[i - 1] * invDz[i - 1];
                double wb = kc[i] * invDz[i];
                contactT = (wa * temp[i - 1] + wb * temp[i]) / (wa + wb);
                roofFlux = g[i] * (temp[i] - temp[i - 1]);
            }
            firstSillT = mFirstT / sillThickness;
        }

        /**
         * Newton iterations for one backward-Euler step of length {@code dt}, starting from the
         * evaluated state in {@code h} (equal to {@code hOld}). Returns false when they do not
         * converge. On success the cells are evaluated and measured, and {@code dTheta} holds the step's
         * change of θ = H/(ρc).
         */
        private boolean newton(double dt) {
            for (int it = 0; it <= MAX_NEWTON_ITERATIONS; it++) {
                double maxResidual = assembleAndEliminate(dt);
                if (maxResidual <= NEWTON_TOLERANCE_K) {
                    if (it == 0) {
                        evaluate();
                    }
                    return true;
                }
                if (it == MAX_NEWTON_ITERATIONS) {
                    break;
                }
                solves++;
                boolean clipped = substituteAndUpdate();
                if (!clipped && !nonlinearFaces) {
                    return true;
                }
            }
            return false;
        }

        /**
         * One pass: builds row i of the residual and Jacobian and eliminates it at once (the forward
         * sweep of the Thomas algorithm, Press et al., Numerical Recipes §2.4). Returns the largest
         * residual as a temperature (K); the eliminated right-hand side is left in {@code rhs}, the
         * sweep's factors in {@code work}.
         */
        private double assembleAndEliminate(double dt) {
            if (nonlinearFaces) {
                faces();
            }
            double maxR = 0;
            double invBet = 1;
            double upPrev = 0;
            double xPrev = 0;
            for (int i = 0; i < n; i++) {
                if (inner[i]) {
                    continue;
                }
                int next = nodeEnd[i];
                double ti = temp[i];
                double inv = nodeInv[i];
                double gA = g[i] * inv;
                double ta = i == 0 ? tTop : temp[i - 1];
                double gB;
                double fluxBelow;
                double upper;
                if (next < n) {
                    gB = g[next] * inv;
                    fluxBelow = gB * (temp[next] - ti);
                    upper = -dt * gB * beta[next];
                } else {
                    gB = 0;
                    fluxBelow = qBase * inv;
                    upper = 0;
                }
                double r = h[i] - hOld[i] - dt * (gA * (ta - ti) + fluxBelow + heat[i]);
                double ar = Math.abs(r) * invRhoC[rock[i]];
                if (ar > maxR) {
                    maxR = ar;
                }
                double diag = 1 + dt * (gA + gB) * beta[i];
                double x;
                if (i == 0) {
                    invBet = 1 / diag;
                    x = -r * invBet;
                } else {
                    double lower = -dt * gA * beta[i - 1];
                    double w = upPrev * invBet;
                    work[i] = w;
                    invBet = 1 / (diag - lower * w);
                    x = (-r - lower * xPrev) * invBet;
                }
                rhs[i] = x;
                xPrev = x;
                upPrev = upper;
            }
            return maxR;
        }

        /**
         * One pass: the back substitution of the Thomas algorithm, the Newton correction (each cell
         * stopped at the end of its segment), and the evaluation and measurement of the new state.
         * Returns true when some cell was stopped at a segment end.
         */
        private boolean substituteAndUpdate() {
            boolean clipped = false;
            resetMeasurements();
            double xNext = 0;
            double e = 0;
            for (int i = n - 1; i >= 0; i--) {
                if (inner[i]) {
                    continue;
                }
                int next = nodeEnd[i];
                double x = rhs[i];
                if (next < n) {
                    x -= work[next] * xNext;
                }
                xNext = x;
                EnthalpyCurve c = curve[i];
                int sg = seg[i];
                double hn = h[i] + x;
                double upper = c.upper(sg);
                double lower = c.lower(sg);
                if (hn > upper) {
                    hn = upper;
                    sg = sg + 1;
                    clipped = true;
                } else if (hn < lower) {
                    hn = lower;
                    sg = sg - 1;
                    clipped = true;
                }
                // the node's first cell straight, the rest of a lumped (convecting) node in the loop
                e = updateCell(i, hn, sg, c.invRhoC(), e);
                for (int j = i + 1; j < next; j++) {
                    e = updateCell(j, hn, sg, c.invRhoC(), e);
                }
            }
            errMax = e;
            finishMeasurements();
            return clipped;
        }

        /**
         * Sets cell {@code j} to enthalpy {@code hn} on segment {@code sg}, evaluates and measures it, and returns
         * the largest |Δθ − ratio·Δθ_prev| so far ({@code e} before this cell).
         */
        private double updateCell(int j, double hn, int sg, double invRc, double e) {
            h[j] = hn;
            seg[j] = sg;
            evaluateCell(j);
            double d = (hn - hOld[j]) * invRc;
            dTheta[j] = d;
            if (sg == segOld[j]) {
                double diff = Math.abs(d - ratio * dThetaPrev[j]);
                if (diff > e) {
                    return diff;
                }
            }
            return e;
        }

        /** Solidification of the first sill, first crustal melt and the melt peak, interpolated within the step. */
        private void track(double t0, double t1, double prevCrustMelt, double prevFirstSill) {
            if (solidification == null && prevFirstSill > 0 && firstSillMelt <= 1e-12 * dzMin) {
                solidification = t0 + (t1 - t0) * prevFirstSill / (prevFirstSill - firstSillMelt);
            }
            if (firstCrustMelt == null && crustMelt >= onsetThickness) {
                double w = (onsetThickness - prevCrustMelt) / (crustMelt - prevCrustMelt);
                firstCrustMelt = t0 + (t1 - t0) * Math.max(0, Math.min(1, w));
            }
            updatePeak(t1);
        }

        /**
         * Follows the peak of the crust melt thickness. The largest value over the time steps is refined by
         * the parabola through it and its two neighbours in time, so that the peak and its time do not
         * depend on where the adaptive steps happen to fall on a flat maximum.
         */
        private void updatePeak(double t) {
            if (histCount > 0 && t == histT[2]) {
                histM[2] = crustMelt;
            } else {
                histT[0] = histT[1];
                histM[0] = histM[1];
                histT[1] = histT[2];
                histM[1] = histM[2];
                histT[2] = t;
                histM[2] = crustMelt;
                histCount = Math.min(3, histCount + 1);
            }
            if (crustMelt > peakSample) {
                peakSample = crustMelt;
                peakSampleTime = t;
                peakMelt = crustMelt;
                peakTime = t;
            } else if (histCount == 3 && histT[1] == peakSampleTime && histM[1] > histM[0]) {
                double d1 = (histM[1] - histM[0]) / (histT[1] - histT[0]);
                double d2 = (histM[2] - histM[1]) / (histT[2] - histT[1]);
                double a = (d2 - d1) / (histT[2] - histT[0]);
                if (a < 0) {
                    double tv = 0.5 * (histT[0] + histT[1]) - d1 / (2 * a);
                    if (tv >= histT[0] && tv <= histT[2]) {
                        double mv = histM[0] + d1 * (tv - histT[0]) + a * (tv - histT[0]) * (tv - histT[1]);
                        peakMelt = Math.max(histM[1], mv);
                        peakTime = tv;
                    }
                }
            }
        }

        private void record(double t) {
            series.add(new SillResult.Sample(t, crustMelt, crustPartial, maxCrustF, intrusionMeltMean, contactT, maxT,
                    roofFlux, firstSillT));
        }

        /**
         * A profile of cell centres: on a uniform grid every stride-th cell (the spacing rounded to whole
         * cells), on a graded one each cell whose centre lies at least the spacing below the last sampled.
         */
        private void profile(double t) {
            double spacing = s.grid().uniform()
                    ? Math.max(1, Math.round(s.profileSpacing() / dzMin)) * dzMin : s.profileSpacing();
            int[] pick = new int[n];
            double[] centre = new double[n];
            int count = 0;
            double zTop = 0;
            double last = Double.NEGATIVE_INFINITY;
            for (int i = 0; i < n; i++) {
                double z = zTop + 0.5 * dzc[i];
                zTop += dzc[i];
                if (z >= last + spacing * (1 - 1e-9)) {
                    pick[count] = i;
                    centre[count] = z;
                    count++;
                    last = z;
                }
            }
            double[] depth = new double[count];
            double[] tt = new double[count];
            double[] ff = new double[count];
            SillResult.Material[] intr = new SillResult.Material[count];
            for (int k = 0; k < count; k++) {
                int i = pick[k];
                depth[k] = centre[k];
                tt[k] = temp[i];
                ff[k] = curve[i].fraction(h[i], seg[i], temp[i]);
                intr[k] = MATERIALS[rock[i]];
            }
            profiles.add(new SillResult.Profile(t, depth, tt, ff, intr));
        }

        private double totalEnergy() {
            double e = 0;
            for (int i = 0; i < n; i++) {
                e += h[i] * dzc[i];
            }
            return e;
        }

        private SillResult finish() {
            double moved = 0;
            double smallest = Double.POSITIVE_INFINITY;
            double largest = 0;
            for (int i = 0; i < n; i++) {
                moved += Math.abs(h[i] - hOrigin[i]) * dzc[i];
                smallest = Math.min(smallest, dzc[i]);
                largest = Math.max(largest, dzc[i]);
            }
            double imbalance = totalEnergy() - energyStart - energyInserted - energyIn;
            double errorFraction = moved > 0 ? Math.abs(imbalance) / moved : 0.0;
            if (solidification == null) {
                warnings.add("the first sill still holds melt at the end of the run: solidificationTime is null");
            }
            if (!constK) {
                if (maxTAll > Miao2014Conductivity.MAX_MEASURED_K) {
                    warnings.add(String.format(Locale.ROOT, "temperatures reach %.0f K: the conductivity law is "
                            + "extrapolated above %.0f K, the top of its measurements", maxTAll,
                            Miao2014Conductivity.MAX_MEASURED_K));
                }
            }
            double baseChange = Math.abs(temp[n - 1] - baseInitial);
            if (baseChange > 1.0) {
                warnings.add(String.format(Locale.ROOT, "the temperature at the base of the column changed by "
                        + "%.0f K: the base is close enough to the intrusions to affect the results; deepen the column",
                        baseChange));
            }
            SillResult.Summary summary = new SillResult.Summary(solidification, firstCrustMelt, peakMelt,
                    peakMelt > 0 ? peakTime : null, errorFraction, emplaced, emplaced * sillThickness, faceDepth(topIndex),
                    hasMantle && maxMantleAll > 0 ? maxMantleAll : null, lockUp);
            SillResult.Numerics numbers = new SillResult.Numerics(n, steps, rejected, solves, cellSteps, smallest,
                    largest, dzMin, tolerance);
            return new SillResult(series, summary, profiles, numbers, warnings);
        }
    }
}
