package org.tectomelt.engine.crust;

import java.util.List;

/**
 * What a {@link SillModel} run produced. SI units: s, m, K.
 *
 * @param series    the state at every output time, in time order (the first at t = 0, just after the
 *                  first emplacement)
 * @param summary   the run's key numbers
 * @param profiles  temperature and melt-fraction profiles at the requested times
 * @param numerics  cost and control figures of the run
 * @param warnings  notes for the caller (rounding of the geometry, extrapolated laws, a sill that never
 *                  solidified, ...)
 * @param convergence the grid-convergence check, or {@code null} when the run was not checked
 */
public record SillResult(List<Sample> series, Summary summary, List<Profile> profiles, Numerics numerics,
                         List<String> warnings, Convergence convergence) {

    /** A result without convergence check. */
    public SillResult(List<Sample> series, Summary summary, List<Profile> profiles, Numerics numerics,
                      List<String> warnings) {
        this(series, summary, profiles, numerics, warnings, null);
    }

    /** Defensive copies. */
    public SillResult {
        series = List.copyOf(series);
        profiles = List.copyOf(profiles);
        warnings = List.copyOf(warnings);
    }

    /**
     * The column at one time.
     *
     * @param time                          time since the first emplacement (s)
     * @param crustMeltThickness            ∫ F dz over the crust (m): the thickness of crustal melt if it were segregated
     * @param crustPartiallyMoltenThickness thickness of crust holding at least {@link SillModel#MELT_PRESENT} melt (m)
     * @param maxCrustMeltFraction          largest melt fraction in the crust
     * @param intrusionMeltFraction         mean melt fraction of all intrusion material emplaced so far
     * @param contactTemperature            temperature at the roof of the intrusions (K)
     * @param maxTemperature                highest temperature in the column (K)
     * @param roofHeatFlux                  heat flux up through the roof of the intrusions (W/m²)
     * @param firstSillTemperature          mean temperature of the first sill (K)
     */
    public record Sample(double time, double crustMeltThickness, double crustPartiallyMoltenThickness,
                         double maxCrustMeltFraction, double intrusionMeltFraction, double contactTemperature,
                         double maxTemperature, double roofHeatFlux, double firstSillTemperature) {
    }

    /**
     * Key numbers of the run.
     *
     * @param solidificationTime        time (s) at which the first sill held no melt any more; {@code null} if it
     *                                  still held melt at the end
     * @param timeToFirstCrustMelt      first time (s) the crust held a melt layer ∫F dz of at least
     *                                  {@link SillModel#MELT_ONSET_FRACTION} of one sill's thickness (0 when it
     *                                  held melt from the start); {@code null} if never
     * @param peakCrustMeltThickness    largest crust melt thickness (m) over all time steps
     * @param peakTime                  when it occurred (s); {@code null} when the crust never melted
     * @param energyErrorFraction       |enthalpy change − (boundary and source heat + emplaced enthalpy)| divided by
     *                                  the heat moved, Σ |ΔH| over the column: the discrete energy-conservation error
     * @param sillsEmplaced             number of sills emplaced within the run
     * @param emplacedThickness         total thickness of intrusion emplaced (m), after rounding to whole cells
     * @param topDepth                  depth of the roof of the intrusions (m), after rounding to a cell face
     * @param maxMantleTemperature      highest temperature (K) the mantle below the Moho reached; {@code null}
     *                                  without a mantle
     * @param lockUpTime                time (s) at which the first sill's melt fraction fell to the lock-up
     *                                  fraction and it stopped convecting; {@code null} without convection or
     *                                  when it still convected at the end
     */
    public record Summary(Double solidificationTime, Double timeToFirstCrustMelt, double peakCrustMeltThickness,
                          Double peakTime, double energyErrorFraction, int sillsEmplaced, double emplacedThickness,
                          double topDepth, Double maxMantleTemperature, Double lockUpTime) {
    }

    /** What a cell holds. */
    public enum Material {
        /** Country rock above the Moho (the rock whose melting is tracked). */
        CRUST,
        /** Emplaced intrusion. */
        INTRUSION,
        /** Non-melting rock below the Moho. */
        MANTLE
    }

    /**
     * Temperature and melt fraction with depth at one time, sampled at cell centres.
     *
     * @param time         time (s)
     * @param depth        depths (m)
     * @param temperature  temperatures (K)
     * @param meltFraction melt fractions
     * @param material     what each sampled cell holds
     */
    public record Profile(double time, double[] depth, double[] temperature, double[] meltFraction,
                          Material[] material) {

        /** True where the sample is intrusion. */
        public boolean intrusion(int i) {
            return material[i] == Material.INTRUSION;
        }
    }

    /**
     * Cost and control of the run.
     *
     * @param cells            cells at the end (the column grows by each sill)
     * @param timeSteps        accepted time steps
     * @param rejectedSteps    steps redone with a smaller time step
     * @param linearSolves     tridiagonal solves (Newton iterations) in all
     * @param cellSteps        Σ cells over accepted and rejected steps: the work measure the limits apply to
     * @param smallestCell     smallest cell at the end (m)
     * @param largestCell      largest cell at the end (m)
     * @param gridSpacing      the finest cell the grid was planned with (m)
     * @param toleranceK       the time-step tolerance of the run (K)
     */
    public record Numerics(int cells, int timeSteps, int rejectedSteps, long linearSolves, long cellSteps,
                           double smallestCell, double largestCell, double gridSpacing, double toleranceK) {
    }

    /**
     * The convergence check: the same run one level coarser in space and time (the finest cell doubled and
     * the time-step tolerance quadrupled, at most {@link SillModel.Numerics#DEFAULT}'s, so that the time step
     * about doubles too: see {@link SillModel.Setup#coarser()}), and the relative change of each reported
     * time and melt thickness from that coarser run to this one, |fine − coarse| / max(|fine|, |coarse|)
     * ({@code null} where either run has no value, 0 where both are 0). For a scheme of first order the
     * error of this run is about the change; for one of second order about a third of it.
     *
     * @param coarseSpacing              finest cell of the coarser run (m)
     * @param coarseTolerance            time-step tolerance of the coarser run (K)
     * @param coarse                     the coarser run's key numbers (the other answer of the pair)
     * @param solidificationTimeChange   change of the solidification time of the first sill
     * @param timeToFirstCrustMeltChange change of the time to first crustal melt
     * @param peakCrustMeltChange        change of the peak crust melt thickness
     * @param peakTimeChange             change of the time of that peak
     * @param lockUpTimeChange           change of the lock-up time of a convecting first sill
     * @param largestChange              the largest of the changes of the solidification time, the first-melt
     *                                   time, the peak melt thickness and the lock-up time (0 when none applies);
     *                                   the time of the peak, a flat maximum and ill-conditioned, is reported but
     *                                   not included
     * @param converged                  true when the largest change is below {@link #TOLERANCE}
     * @param refinements                how many times the run was refined (finest cell halved, tolerance
     *                                   quartered) from its starting setup before this pair
     *                                   ({@link SillModel#runRefined}); 0 for a single check
     */
    public record Convergence(double coarseSpacing, double coarseTolerance, Summary coarse,
                              Double solidificationTimeChange, Double timeToFirstCrustMeltChange,
                              Double peakCrustMeltChange, Double peakTimeChange, Double lockUpTimeChange,
                              double largestChange, boolean converged, int refinements) {

        /** The resolution criterion: 1 % relative change on doubling the finest cell and the time step. */
        public static final double TOLERANCE = 0.01;
    }

    /** This result with its convergence check attached. */
    public SillResult withConvergence(Convergence check, List<String> moreWarnings) {
        List<String> all = new java.util.ArrayList<>(warnings);
        all.addAll(moreWarnings);
        return new SillResult(series, summary, profiles, numerics, all, check);
    }
}
