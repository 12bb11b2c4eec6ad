package org.tectomelt.engine.melting;

/**
 * Thermodynamic constants a mantle melting model pairs with, used for adiabats and isentropic
 * decompression melting. SI units.
 *
 * @param heatCapacity       cp (J/kg/K)
 * @param entropyOfFusion    ΔS (J/kg/K)
 * @param solidExpansivity   αs (1/K)
 * @param meltExpansivity    αf (1/K)
 * @param solidDensity       ρs (kg/m³)
 * @param meltDensity        ρf (kg/m³)
 */
public record MantleThermodynamics(double heatCapacity, double entropyOfFusion, double solidExpansivity,
                                   double meltExpansivity, double solidDensity, double meltDensity) {
}
