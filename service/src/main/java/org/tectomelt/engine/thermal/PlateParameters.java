package org.tectomelt.engine.thermal;

import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.units.Units;

/**
 * The parameters of the oceanic plate-cooling model ({@link PlateCooling}): a published set
 * ({@link #GDH1}, {@link #PS77}) or one derived from it with {@code with…} methods. SI units.
 *
 * @param name               short name of the set ({@code GDH1}, {@code PS77}); kept when modified
 * @param plateThickness     plate thickness a (m)
 * @param surfaceTemperature sea-floor temperature T0 (K)
 * @param mantleTemperature  temperature at the base of the plate Tm (K)
 * @param conductivity       thermal conductivity k (W/m/K)
 * @param diffusivity        thermal diffusivity κ (m²/s)
 * @param thermalExpansivity volumetric thermal expansivity α (1/K)
 * @param mantleDensity      mantle density ρm (kg/m³)
 * @param waterDensity       sea-water density ρw (kg/m³)
 * @param ridgeDepth         depth of the ridge crest below sea level dr (m)
 * @param source             where the set was published
 */
public record PlateParameters(String name, double plateThickness, double surfaceTemperature,
                              double mantleTemperature, double conductivity, double diffusivity,
                              double thermalExpansivity, double mantleDensity, double waterDensity,
                              double ridgeDepth, ModelInfo source) {

    /**
     * GDH1 (Stein &amp; Stein 1992, Nature 359, 123–129, doi:10.1038/359123a0): a = 95 km,
     * Tm = 1450 °C, α = 3.1e-5 /K, k = 3.138 W/m/K, cp = 1171 J/kg/K, ρm = 3330, ρw = 1000 kg/m³,
     * ridge depth 2600 m; κ = k / (ρm cp) = 8.05e-7 m²/s. The set reproduces the published
     * GDH1 heat-flow and depth fits (checked in {@code SteinStein1992Gdh1ReferenceTest}).
     */
    public static final PlateParameters GDH1 = new PlateParameters("GDH1", 95e3, Units.celsiusToKelvin(0),
            Units.celsiusToKelvin(1450), 3.138, 3.138 / (3330 * 1171.0), 3.1e-5, 3330, 1000, 2600,
            new ModelInfo("plate-parameters-gdh1",
                    "Stein, C.A. & Stein, S. (1992) A model for the global variation in oceanic depth and heat "
                            + "flow with lithospheric age. Nature 359, 123-129 (GDH1 parameters)",
                    "10.1038/359123a0"));

    /**
     * Parsons &amp; Sclater (1977, J. Geophys. Res. 82, 803–827, doi:10.1029/JB082i005p00803):
     * a = 125 km, Tm = 1350 °C, α = 3.2e-5 /K; k = 3.138 W/m/K, κ = 8e-7 m²/s, ρm = 3330,
     * ρw = 1000 kg/m³, ridge depth 2500 m. With these values the young-age limit is their
     * d = 2500 + 350 √t m and q = 476 / √t mW/m² (published fit 473 / √t).
     */
    public static final PlateParameters PS77 = new PlateParameters("PS77", 125e3, Units.celsiusToKelvin(0),
            Units.celsiusToKelvin(1350), 3.138, 8e-7, 3.2e-5, 3330, 1000, 2500,
            new ModelInfo("plate-parameters-ps77",
                    "Parsons, B. & Sclater, J.G. (1977) An analysis of the variation of ocean floor bathymetry "
                            + "and heat flow with age. Journal of Geophysical Research 82(5), 803-827",
                    "10.1029/JB082i005p00803"));

    /** Validates the parameters. */
    public PlateParameters {
        if (name == null || source == null) {
            throw new EngineException("plate parameters need a name and a source");
        }
        if (!(plateThickness > 0) || !(surfaceTemperature > 0) || !(mantleTemperature > surfaceTemperature)
                || !(conductivity > 0) || !(diffusivity > 0) || !(thermalExpansivity > 0)
                || !(mantleDensity > waterDensity) || !(waterDensity >= 0) || !(ridgeDepth >= 0)) {
            throw new EngineException("plate parameters need a positive plate thickness, conductivity and "
                    + "diffusivity, a mantle temperature above the surface temperature and a mantle denser than water");
        }
    }

    /** This set with another plate thickness (m). */
    public PlateParameters withPlateThickness(double a) {
        return new PlateParameters(name, a, surfaceTemperature, mantleTemperature, conductivity, diffusivity,
                thermalExpansivity, mantleDensity, waterDensity, ridgeDepth, source);
    }

    /** This set with another sea-floor temperature (K). */
    public PlateParameters withSurfaceTemperature(double t0) {
        return new PlateParameters(name, plateThickness, t0, mantleTemperature, conductivity, diffusivity,
                thermalExpansivity, mantleDensity, waterDensity, ridgeDepth, source);
    }

    /** This set with another basal (mantle) temperature (K). */
    public PlateParameters withMantleTemperature(double tm) {
        return new PlateParameters(name, plateThickness, surfaceTemperature, tm, conductivity, diffusivity,
                thermalExpansivity, mantleDensity, waterDensity, ridgeDepth, source);
    }

    /** This set with another conductivity (W/m/K); the diffusivity is left as it is. */
    public PlateParameters withConductivity(double k) {
        return new PlateParameters(name, plateThickness, surfaceTemperature, mantleTemperature, k, diffusivity,
                thermalExpansivity, mantleDensity, waterDensity, ridgeDepth, source);
    }

    /** This set with another diffusivity (m²/s). */
    public PlateParameters withDiffusivity(double kappa) {
        return new PlateParameters(name, plateThickness, surfaceTemperature, mantleTemperature, conductivity, kappa,
                thermalExpansivity, mantleDensity, waterDensity, ridgeDepth, source);
    }
}
