package org.tectomelt.engine.melting;

import org.tectomelt.engine.EngineException;

/**
 * Thermal properties of a crustal rock or intrusion, as the crustal heating models need them.
 * SI units. The defaults attached to each {@link CrustalLithology} are representative values
 * from the ranges in REFERENCES.md §3.5 (see there for the sources); a caller with measured
 * values should supply its own.
 *
 * @param density      density ρ (kg/m³)
 * @param heatCapacity specific heat c (J/kg/K)
 * @param latentHeat   latent heat of melting L (J/kg), released over the melting interval
 * @param conductivity thermal conductivity k (W/m/K) at room temperature
 */
public record ThermalProperties(double density, double heatCapacity, double latentHeat, double conductivity) {

    /** Validates that every property is positive and finite. */
    public ThermalProperties {
        if (!(density > 0 && heatCapacity > 0 && latentHeat >= 0 && conductivity > 0)
                || !Double.isFinite(density + heatCapacity + latentHeat + conductivity)) {
            throw new EngineException("thermal properties must be positive and finite");
        }
    }

    /** Thermal diffusivity κ = k / (ρ c) (m²/s). */
    public double diffusivity() {
        return conductivity / (density * heatCapacity);
    }
}
