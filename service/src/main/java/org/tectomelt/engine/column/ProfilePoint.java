package org.tectomelt.engine.column;

/**
 * One output point of a melting column.
 *
 * @param depth        depth below the surface (m)
 * @param pressure     pressure (Pa)
 * @param temperature  temperature (K)
 * @param meltFraction melt mass fraction F, 0–1
 * @param productivity isentropic productivity −dF/dP (1/Pa): positive while the rock melts on the way up
 * @param waterInMelt  water dissolved in the melt (mass fraction); 0 for a dry column
 */
public record ProfilePoint(double depth, double pressure, double temperature, double meltFraction,
                           double productivity, double waterInMelt) {
}
