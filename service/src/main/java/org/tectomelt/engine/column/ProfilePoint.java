package org.tectomelt.engine.column;

import java.util.List;

/**
 * One output point of a melting column.
 *
 * @param depth         depth below the surface (m)
 * @param pressure      pressure (Pa)
 * @param temperature   temperature (K)
 * @param meltFraction  melt mass fraction F, 0–1 (for fractional modes the extent of melting: the
 *                      mass melted so far per unit mass of source; for a mixed source mass-weighted)
 * @param productivity  isentropic productivity −dF/dP (1/Pa): positive while the rock melts on the way up
 * @param waterInMelt   water dissolved in the melt present (mass fraction); 0 for a dry column
 * @param residueWater  water of the solid residue (mass fraction) of the (peridotite) source: the bulk
 *                      water below the solidus, D times the melt's water while melting
 * @param meltFractions extent of melting of each lithology, in the order of
 *                      {@link ColumnResult#lithologies()}
 */
public record ProfilePoint(double depth, double pressure, double temperature, double meltFraction,
                           double productivity, double waterInMelt, double residueWater, List<Double> meltFractions) {

    /** Defensive copy. */
    public ProfilePoint {
        meltFractions = List.copyOf(meltFractions);
    }

    /** A point of a single-lithology column. */
    public ProfilePoint(double depth, double pressure, double temperature, double meltFraction,
                        double productivity, double waterInMelt, double residueWater) {
        this(depth, pressure, temperature, meltFraction, productivity, waterInMelt, residueWater,
                List.of(meltFraction));
    }
}
