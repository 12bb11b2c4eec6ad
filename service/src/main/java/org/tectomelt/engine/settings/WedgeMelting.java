package org.tectomelt.engine.settings;

import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.tectomelt.engine.melting.MeltState;

/**
 * Flux melting of a mantle wedge at one pressure, temperature and bulk water content, as
 * computed by {@link SubductionWedge#evaluate}. SI units: Pa, K, mass fractions.
 *
 * @param pressure           pressure (Pa)
 * @param temperature        wedge temperature (K)
 * @param bulkWater          bulk water added to the rock (mass fraction)
 * @param state              melt state at that water: melt fraction, water in melt, saturation,
 *                           dry and wet solidus
 * @param solidusDepression  dry solidus minus wet solidus (K), ≥ 0
 * @param saturatedSolidus   water-saturated solidus at this pressure (K): the lowest solidus water
 *                           can give
 * @param waterForOnset      the least bulk water (mass fraction) whose wet solidus is at or below
 *                           the temperature; 0 when the rock is at or above its dry solidus; empty
 *                           when even water saturation cannot melt it (at or below the saturated
 *                           solidus)
 * @param waterForSaturation the least bulk water (mass fraction) at which a free fluid appears at
 *                           this pressure and temperature; empty when the model's accepted water
 *                           range does not reach saturation
 * @param freeFluid          bulk water beyond saturation (mass fraction of the rock), 0 when
 *                           unsaturated; it neither dissolves nor lowers the solidus further
 * @param meltPerWater       slope dF/dX_bulk of melt fraction with bulk water at {@code bulkWater}
 *                           (dimensionless, equal to percent melt per wt% water), taken as water is
 *                           added; empty where it is unbounded (zero water, rock already melting)
 * @param waterCurve         melt fraction against bulk water from 0 to the curve maximum
 * @param budget             arc magma budget, when a slab water flux was given and melt carries water
 * @param warnings           validity warnings and notes for the caller (empty when none)
 */
public record WedgeMelting(double pressure, double temperature, double bulkWater, MeltState state,
                           double solidusDepression, double saturatedSolidus, OptionalDouble waterForOnset,
                           OptionalDouble waterForSaturation, double freeFluid, OptionalDouble meltPerWater,
                           List<CurvePoint> waterCurve, Optional<ArcMagmaBudget> budget, List<String> warnings) {

    /** Defensive copies. */
    public WedgeMelting {
        waterCurve = List.copyOf(waterCurve);
        warnings = List.copyOf(warnings);
    }

    /**
     * One point of the melt fraction against water curve.
     *
     * @param bulkWater      bulk water (mass fraction)
     * @param meltFraction   melt fraction F, 0–1
     * @param waterSaturated true when part of this water is free fluid
     */
    public record CurvePoint(double bulkWater, double meltFraction, boolean waterSaturated) {
    }
}
