package org.tectomelt.engine.thermal;

import java.util.List;
import org.apache.commons.math3.special.Erf;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.units.Units;

/**
 * Oceanic lithosphere cooling as a semi-infinite half-space.
 *
 * <p>Equations (Turcotte &amp; Schubert, chapter 4, cooling of the oceanic lithosphere):
 * <pre>
 *   T(z, t) = T0 + (Tm − T0) · erf( z / (2 √(κ t)) )
 *   q0(t)   = k (Tm − T0) / √(π κ t)
 *   yL(t)   = 2 erf⁻¹(0.9) √(κ t) ≈ 2.326 √(κ t)                      (0.9 isotherm)
 *   d(t)    = dr + 2 ρm α (Tm − T0) / (ρm − ρw) · √(κ t / π)          (sea-floor depth)
 * </pre>
 * erf and erf⁻¹ come from Apache Commons Math ({@link Erf}); for profiles, erf is read from a
 * table of Commons Math's values with cubic Hermite interpolation ({@code TabulatedErf}, error
 * below 1e-10), because the direct call would cost a 300-point profile several hundred µs.
 *
 * <p>Source: Turcotte, D.L. &amp; Schubert, G. (2014) <i>Geodynamics</i>, 3rd ed., Cambridge
 * University Press, chapter 4, doi:10.1017/CBO9780511843877. The ridge-crest depth default
 * {@link #RIDGE_DEPTH} = 2500 m is the intercept of the Parsons &amp; Sclater (1977, JGR 82, 803,
 * doi:10.1029/JB082i005p00803) depth–age fit.
 *
 * <p>Validity: ages {@link #MIN_AGE_S} to {@link #MAX_AGE_S}. Accuracy: the model reproduces
 * observed heat flow and depth to within the scatter of the data for sea floor younger than
 * about 70–80 Myr; older sea floor is shallower and hotter at its surface than this model
 * predicts (the flattening that the plate model, {@link PlateCooling}, captures). The
 * temperatures are exact for the model to within 1e-10 × (Tm − T0).
 *
 * @param age                age of the sea floor (s)
 * @param surfaceTemperature sea-floor temperature T0 (K)
 * @param mantleTemperature  mantle temperature Tm beneath the lithosphere (K)
 * @param conductivity       thermal conductivity k (W/m/K)
 * @param diffusivity        thermal diffusivity κ (m²/s)
 */
public record HalfSpaceCooling(double age, double surfaceTemperature, double mantleTemperature,
                               double conductivity, double diffusivity) implements OceanicLithosphere {

    /** Provenance reported with results that used this model. */
    public static final ModelInfo INFO = new ModelInfo("oceanic-half-space-cooling",
            "Turcotte, D.L. & Schubert, G. (2014) Geodynamics, 3rd ed., Cambridge University Press, "
                    + "chapter 4 (half-space cooling of the oceanic lithosphere)",
            "10.1017/CBO9780511843877");

    /** Youngest age accepted (s): 0.01 Myr; the heat flow diverges at age 0. */
    public static final double MIN_AGE_S = 0.01 * Units.SECONDS_PER_MYR;
    /** Oldest age accepted (s): 200 Myr, older than any sea floor in place today. */
    public static final double MAX_AGE_S = 200 * Units.SECONDS_PER_MYR;
    /** Age beyond which the model departs from observed depth and heat flow (s): 80 Myr. */
    public static final double RELIABLE_AGE_S = 80 * Units.SECONDS_PER_MYR;

    /** Usual conductivity of the oceanic lithosphere in Turcotte &amp; Schubert (W/m/K). */
    public static final double CONDUCTIVITY = 3.3;
    /** Usual thermal diffusivity in Turcotte &amp; Schubert (m²/s). */
    public static final double DIFFUSIVITY = 1e-6;
    /** Usual sea-floor temperature (K): 0 °C. */
    public static final double SURFACE_TEMPERATURE = Units.celsiusToKelvin(0);
    /** Usual mantle temperature (K): Tm − T0 = 1300 K with T0 = 0 °C. */
    public static final double MANTLE_TEMPERATURE = Units.celsiusToKelvin(1300);
    /** Volumetric thermal expansivity for the subsidence (1/K). */
    public static final double THERMAL_EXPANSIVITY = 3e-5;
    /** Mantle density for the subsidence (kg/m³). */
    public static final double MANTLE_DENSITY = 3300;
    /** Sea-water density for the subsidence (kg/m³). */
    public static final double WATER_DENSITY = 1000;
    /** Depth of the ridge crest below sea level (m), intercept of the Parsons &amp; Sclater (1977) fit. */
    public static final double RIDGE_DEPTH = 2500;

    /** 2 erf⁻¹(0.9): the 0.9-isotherm depth in units of √(κt). */
    private static final double THICKNESS_FACTOR = 2 * Erf.erfInv(THICKNESS_ISOTHERM_FRACTION);

    /** Validates the inputs. */
    public HalfSpaceCooling {
        if (!(age >= MIN_AGE_S && age <= MAX_AGE_S)) {
            throw new EngineException("half-space cooling needs an age between 0.01 and 200 Myr");
        }
        if (!(surfaceTemperature > 0) || !(mantleTemperature > surfaceTemperature)) {
            throw new EngineException("half-space cooling needs a mantle temperature above the surface temperature");
        }
        if (!(conductivity > 0) || !(diffusivity > 0)) {
            throw new EngineException("half-space cooling needs a positive conductivity and diffusivity");
        }
    }

    /** The model with the usual parameters of Turcotte &amp; Schubert at age {@code ageS} (s). */
    public static HalfSpaceCooling of(double ageS) {
        return new HalfSpaceCooling(ageS, SURFACE_TEMPERATURE, MANTLE_TEMPERATURE, CONDUCTIVITY, DIFFUSIVITY);
    }

    /** √(κ t), the diffusion length (m). */
    public double diffusionLength() {
        return Math.sqrt(diffusivity * age);
    }

    @Override
    public double temperatureAt(double zMetres) {
        if (zMetres <= 0) {
            return surfaceTemperature;
        }
        return surfaceTemperature + (mantleTemperature - surfaceTemperature)
                * TabulatedErf.erf(zMetres / (2 * diffusionLength()));
    }

    @Override
    public double surfaceHeatFlow() {
        return conductivity * (mantleTemperature - surfaceTemperature) / Math.sqrt(Math.PI * diffusivity * age);
    }

    @Override
    public double thermalThickness() {
        return THICKNESS_FACTOR * diffusionLength();
    }

    /** Sea-floor depth (m) with the default subsidence parameters of this class. */
    @Override
    public double seafloorDepth() {
        return seafloorDepth(THERMAL_EXPANSIVITY, MANTLE_DENSITY, WATER_DENSITY, RIDGE_DEPTH);
    }

    /**
     * Sea-floor depth below sea level (m) for the given subsidence parameters.
     *
     * @param thermalExpansivity volumetric expansivity α (1/K)
     * @param mantleDensity      ρm (kg/m³)
     * @param waterDensity       ρw (kg/m³)
     * @param ridgeDepth         depth of the ridge crest dr (m)
     */
    public double seafloorDepth(double thermalExpansivity, double mantleDensity, double waterDensity,
                                double ridgeDepth) {
        return ridgeDepth + 2 * mantleDensity * thermalExpansivity * (mantleTemperature - surfaceTemperature)
                / (mantleDensity - waterDensity) * Math.sqrt(diffusivity * age / Math.PI);
    }

    @Override
    public List<ModelInfo> models() {
        return List.of(INFO);
    }
}
