package org.tectomelt.engine.melting;

import org.tectomelt.engine.EngineException;

/**
 * Temperature of solid mantle rising (or sinking) isentropically from a potential temperature,
 * with the thermodynamic constants a melting model is paired with:
 * <pre>
 *   dT/dP = αs T / (ρs cp)   →   T(P) = Tp · exp(αs P / (ρs cp))      (T in K, P in Pa)
 * </pre>
 * Source: the isentropic gradient of solid mantle, as used by Katz, Spiegelman &amp; Langmuir
 * (2003), G-cubed 4(9) 1073, doi:10.1029/2002GC000433 (REFERENCES.md §2.5). Valid only below the
 * solidus: a melting rock consumes latent heat and follows a cooler path.
 *
 * @param potentialTemperature Tp (K), the temperature the solid would have at zero pressure
 * @param thermodynamics       αs, ρs and cp of the model
 */
public record SolidAdiabat(double potentialTemperature, MantleThermodynamics thermodynamics) {

    /** Validates the potential temperature. */
    public SolidAdiabat {
        if (!(potentialTemperature > 0) || !Double.isFinite(potentialTemperature)) {
            throw new EngineException("potential temperature must be a positive temperature in kelvin");
        }
    }

    /** Temperature (K) at pressure {@code p} (Pa). */
    public double temperatureAt(double p) {
        MantleThermodynamics m = thermodynamics;
        return potentialTemperature * Math.exp(m.solidExpansivity() * p / (m.solidDensity() * m.heatCapacity()));
    }
}
