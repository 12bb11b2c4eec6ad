package org.tectomelt.engine.column;

/**
 * One state along a melting column.
 *
 * @param depth        depth below the surface (m)
 * @param pressure     pressure (Pa)
 * @param temperature  temperature (K)
 * @param meltFraction melt mass fraction F, 0–1
 */
public record ColumnState(double depth, double pressure, double temperature, double meltFraction) {
}
