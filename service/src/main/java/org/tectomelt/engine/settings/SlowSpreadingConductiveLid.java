package org.tectomelt.engine.settings;

import java.util.Locale;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.units.Units;

/**
 * Conductive cooling of the mantle rising beneath a slow-spreading ridge, as a lid on the melting
 * column that thickens as spreading slows.
 *
 * <p>Bown &amp; White (1994) showed with a thermal model of passive upwelling that conduction to the
 * sea floor cools the top of the melting region enough to thin the crust below a full spreading rate
 * of about {@value #CRITICAL_FULL_RATE_MM_PER_YR} mm/yr, while above it the crust does not depend on
 * the rate (the compilation of White, McKenzie &amp; O'Nions 1992 and White et al. 2001: 6–7 km; Dick,
 * Lin &amp; Schouten 2003: thin and variable crust at ultraslow ridges; all from memory; DOI of Bown &amp;
 * White from memory). Their model is
 * numerical; this class is a parameterization of that effect chosen here, not their equations:
 * mantle rising at W (half the full rate, passive corner flow) towards a sea floor at T0 has the
 * steady advective–diffusive profile T0 + (Tp − T0)(1 − e^(−Wz/κ)), cooled by more than ΔTc above
 * z = (κ/W)·ln((Tp − T0)/ΔTc). The part of that boundary layer beyond its thickness at the critical
 * rate is taken as a lid where melting stops:
 * <pre>
 *   z_lid = max(0, κ/W − κ/W_c) · ln((Tp − T0)/ΔTc),    W = U_full/2,  W_c = U_c/2
 * </pre>
 * so z_lid is 0 at and above U_c, grows as 1/U below and kills melting at a few mm/yr. With κ = 1e-6
 * m²/s, T0 = 0 °C, ΔTc = {@value #DEFICIT_K} K and Tp = 1330 °C, z_lid is 12.6 km at 10 mm/yr and 38 km
 * at 5 mm/yr. Accuracy: the shape and magnitude of the published crust–rate relation (tested against
 * its bands), no better; melt focusing, along-axis variation and mantle temperature trade off
 * strongly at ultraslow ridges.
 *
 * @param diffusivity  thermal diffusivity κ (m²/s)
 * @param criticalRate full spreading rate U_c (m/s) above which conduction does not thin the crust
 * @param seaFloorTemperature sea-floor temperature T0 (K)
 */
public record SlowSpreadingConductiveLid(double diffusivity, double criticalRate, double seaFloorTemperature) {

    /** Provenance: the effect and its critical rate. */
    public static final ModelInfo INFO = new ModelInfo("slow-spreading-conductive-lid",
            "Conductive lid on the melting column at slow spreading (parameterization chosen here) after Bown, J.W. "
                    + "& White, R.S. (1994) Variation with spreading rate of oceanic crustal thickness and "
                    + "geochemistry. Earth and Planetary Science Letters 121, 435-449",
            "10.1016/0012-821X(94)90082-5");
    /** Full spreading rate (mm/yr) below which conduction thins the crust (Bown &amp; White 1994, from memory). */
    public static final double CRITICAL_FULL_RATE_MM_PER_YR = 20.0;
    /** Mantle thermal diffusivity (m²/s): common practice. */
    public static final double DEFAULT_DIFFUSIVITY = 1e-6;
    /** Cooling (K) that marks the base of the conductive boundary layer (chosen here). */
    public static final double DEFICIT_K = 25.0;

    /** Validates the constants. */
    public SlowSpreadingConductiveLid {
        if (!(diffusivity > 0) || !(criticalRate > 0) || !(seaFloorTemperature > 0)) {
            throw new EngineException("diffusivity, critical rate and sea-floor temperature must be positive");
        }
    }

    /** κ = 1e-6 m²/s, U_c = 20 mm/yr, T0 = 0 °C. */
    public static SlowSpreadingConductiveLid standard() {
        return new SlowSpreadingConductiveLid(DEFAULT_DIFFUSIVITY,
                Units.mmPerYrToMPerS(CRITICAL_FULL_RATE_MM_PER_YR), 273.15);
    }

    /**
     * Depth of the lid base (m) at full spreading rate {@code fullRate} (m/s) for potential
     * temperature {@code tp} (K); 0 at and above the critical rate.
     */
    public double lidDepth(double fullRate, double tp) {
        if (!(fullRate > 0)) {
            throw new EngineException("the full spreading rate must be positive");
        }
        if (fullRate >= criticalRate || tp <= seaFloorTemperature + DEFICIT_K) {
            return 0.0;
        }
        double excess = diffusivity / (0.5 * fullRate) - diffusivity / (0.5 * criticalRate);
        return excess * Math.log((tp - seaFloorTemperature) / DEFICIT_K);
    }

    /** The assumption in words, for a lid of {@code lid} m at a full rate of {@code fullRate} m/s. */
    public String describe(double fullRate, double lid) {
        return String.format(Locale.ROOT, "slow spreading: conductive cooling modelled as a lid at %.1f km "
                + "(z = (κ/W − κ/W_c)·ln((Tp − T0)/%.0f K), W = half the full rate %.1f mm/yr, W_c at %.0f mm/yr, "
                + "κ = %.1e m²/s; a parameterization of the effect shown by Bown & White 1994)", lid / 1e3, DEFICIT_K,
                Units.mPerSToMmPerYr(fullRate), Units.mPerSToMmPerYr(criticalRate), diffusivity);
    }
}
