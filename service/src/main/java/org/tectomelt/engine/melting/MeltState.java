package org.tectomelt.engine.melting;

import java.util.List;

/**
 * The melt state of a rock at one pressure, temperature and bulk water content.
 *
 * @param meltFraction   melt mass fraction F, 0–1
 * @param solidus        solidus (K) lowered by the bulk water (equal to {@code drySolidus} when dry)
 * @param drySolidus     solidus of the dry rock (K); {@code NaN} where the model has no dry
 *                       counterpart (water-saturated granite)
 * @param liquidus       liquidus (K) at this water content; {@code NaN} when the model never
 *                       reaches full melting (crustal curves that stop short of F = 1)
 * @param waterInMelt    water dissolved in the melt (mass fraction); 0 when no melt is present
 *                       and for models that do not track water
 * @param waterSaturated true when the melt holds all the water it can and the rest is free fluid
 *                       (always true for curves that assume a free water phase)
 * @param cpxExhausted   true when clinopyroxene is used up (mantle models that track it)
 * @param warnings       validity-range and other notes for the caller (empty when none)
 */
public record MeltState(double meltFraction, double solidus, double drySolidus, double liquidus,
                        double waterInMelt, boolean waterSaturated, boolean cpxExhausted,
                        List<String> warnings) {

    /** Defensive copy of the warnings. */
    public MeltState {
        warnings = List.copyOf(warnings);
    }
}
