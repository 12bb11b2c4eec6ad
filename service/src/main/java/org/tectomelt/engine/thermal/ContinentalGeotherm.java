package org.tectomelt.engine.thermal;

import java.util.List;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.units.Units;

/**
 * Steady conductive continental geotherm with radiogenic heat production in the crust.
 *
 * <p>The surface heat flow q0 splits into a reduced (mantle) part qm = f·q0 and a crustal
 * radiogenic part (1 − f)·q0. Two distributions of the heat production are offered
 * ({@link HeatProduction}):
 * <pre>
 *   EXPONENTIAL  H(z) = A0 exp(−z/hr),  A0 = (1 − f) q0 / hr
 *                T(z) = T0 + qm z / k + (A0 hr² / k) (1 − exp(−z/hr))
 *   TWO_LAYER    uniform A = (1 − f) q0 / D in 0 ≤ z ≤ D (D = hr), none below
 *                T(z) = T0 + q0 z / k − A z² / (2k)          (z ≤ D)
 *                T(z) = T(D) + qm (z − D) / k                 (z > D)
 * </pre>
 * (A0 and A are volumetric heat production ρH in W/m³.) Temperature rise above T0 is
 * proportional to q0/k: doubling both leaves the profile unchanged.
 *
 * <p>Sources: Turcotte, D.L. &amp; Schubert, G. (2014) <i>Geodynamics</i>, 3rd ed., chapter 4
 * (steady conduction with exponentially decreasing heat production), doi:10.1017/CBO9780511843877;
 * the exponential distribution and the linear heat-flow–heat-production relation follow
 * Lachenbruch, A.H. (1970) J. Geophys. Res. 75, 3291–3300, doi:10.1029/JB075i017p03291; the
 * default reduced fraction 0.6 and scale 10 km follow Pollack, H.N. &amp; Chapman, D.S. (1977)
 * Tectonophysics 38, 279–296, doi:10.1016/0040-1951(77)90215-3.
 *
 * <p>Validity: steady state (no recent tectonic or magmatic disturbance), uniform conductivity,
 * surface heat flow {@link #MIN_SURFACE_HEAT_FLOW} to {@link #MAX_SURFACE_HEAT_FLOW}. Accuracy:
 * exact for the model; against real lithosphere the temperature-dependent conductivity and the
 * uncertainty of the heat-production distribution give errors of order 100 K at the Moho and
 * more below. Not meaningful below the depth where it meets the mantle adiabat (see
 * {@link Geotherm}).
 *
 * @param surfaceHeatFlow         surface heat flow q0 (W/m²)
 * @param reducedFraction         reduced (mantle) heat flow as a fraction f of q0, 0–1
 * @param heatProductionScale     exponential decay scale hr, or layer thickness D for two-layer (m)
 * @param conductivity            thermal conductivity k (W/m/K)
 * @param surfaceTemperature      surface temperature T0 (K)
 * @param crustThickness          crust thickness (m), for the Moho temperature
 * @param heatProduction          distribution of the crustal heat production
 */
public record ContinentalGeotherm(double surfaceHeatFlow, double reducedFraction, double heatProductionScale,
                                  double conductivity, double surfaceTemperature, double crustThickness,
                                  HeatProduction heatProduction) implements ConductiveGeotherm {

    /** How the radiogenic heat production is distributed with depth. */
    public enum HeatProduction {
        /** A0 exp(−z/hr), the default. */
        EXPONENTIAL,
        /** Uniform A in the top hr of the crust, none below. */
        TWO_LAYER
    }

    /** Provenance reported with results that used this model. */
    public static final ModelInfo INFO = new ModelInfo("continental-steady-conductive",
            "Turcotte, D.L. & Schubert, G. (2014) Geodynamics, 3rd ed., Cambridge University Press, chapter 4 "
                    + "(steady continental geotherm with crustal heat production, after Lachenbruch 1970 and "
                    + "Pollack & Chapman 1977)",
            "10.1017/CBO9780511843877");

    /** Lowest surface heat flow accepted (W/m²): 15 mW/m². */
    public static final double MIN_SURFACE_HEAT_FLOW = 0.015;
    /** Highest surface heat flow accepted (W/m²): 200 mW/m². */
    public static final double MAX_SURFACE_HEAT_FLOW = 0.200;
    /** Default reduced heat flow fraction (Pollack &amp; Chapman 1977). */
    public static final double REDUCED_FRACTION = 0.6;
    /** Default heat-production scale (m): 10 km (Pollack &amp; Chapman 1977). */
    public static final double HEAT_PRODUCTION_SCALE = 10e3;
    /** Default crustal conductivity (W/m/K). */
    public static final double CONDUCTIVITY = 2.5;
    /** Default surface temperature (K): 0 °C. */
    public static final double SURFACE_TEMPERATURE = Units.celsiusToKelvin(0);
    /** Default crust thickness (m): 35 km, a common average for continents. */
    public static final double CRUST_THICKNESS = 35e3;

    /** Validates the inputs. */
    public ContinentalGeotherm {
        if (!(surfaceHeatFlow >= MIN_SURFACE_HEAT_FLOW && surfaceHeatFlow <= MAX_SURFACE_HEAT_FLOW)) {
            throw new EngineException("continental geotherm needs a surface heat flow between 15 and 200 mW/m²");
        }
        if (!(reducedFraction >= 0 && reducedFraction <= 1)) {
            throw new EngineException("continental geotherm needs a reduced heat flow fraction between 0 and 1");
        }
        if (!(heatProductionScale > 0) || !(conductivity > 0) || !(surfaceTemperature > 0) || !(crustThickness >= 0)) {
            throw new EngineException("continental geotherm needs a positive heat-production scale, conductivity "
                    + "and surface temperature, and a crust thickness of at least 0");
        }
        if (heatProduction == null) {
            throw new EngineException("continental geotherm needs a heat-production distribution");
        }
    }

    /**
     * The geotherm from its defining quantities (the canonical constructor, named for callers
     * that build an initial state from it).
     *
     * @param surfaceHeatFlowWPerM2 q0 (W/m²)
     * @param reducedFraction       qm / q0, 0–1
     * @param scaleMetres           heat-production scale hr (m)
     * @param conductivity          k (W/m/K)
     * @param surfaceTemperatureK   T0 (K)
     * @param crustThicknessMetres  crust thickness (m)
     * @param heatProduction        distribution of the heat production
     */
    public static ContinentalGeotherm of(double surfaceHeatFlowWPerM2, double reducedFraction, double scaleMetres,
                                         double conductivity, double surfaceTemperatureK,
                                         double crustThicknessMetres, HeatProduction heatProduction) {
        return new ContinentalGeotherm(surfaceHeatFlowWPerM2, reducedFraction, scaleMetres, conductivity,
                surfaceTemperatureK, crustThicknessMetres, heatProduction);
    }

    /** The geotherm for a surface heat flow (W/m²) with every other input at its default. */
    public static ContinentalGeotherm of(double surfaceHeatFlowWPerM2) {
        return of(surfaceHeatFlowWPerM2, REDUCED_FRACTION, HEAT_PRODUCTION_SCALE, CONDUCTIVITY, SURFACE_TEMPERATURE,
                CRUST_THICKNESS, HeatProduction.EXPONENTIAL);
    }

    /** Reduced (mantle) heat flow qm = f q0 (W/m²). */
    public double reducedHeatFlow() {
        return reducedFraction * surfaceHeatFlow;
    }

    /** Volumetric heat production at the surface, A0 or A (W/m³). */
    public double surfaceHeatProduction() {
        return (1 - reducedFraction) * surfaceHeatFlow / heatProductionScale;
    }

    /** Volumetric heat production at depth {@code zMetres} (W/m³). */
    public double heatProductionAt(double zMetres) {
        if (zMetres < 0) {
            return 0;
        }
        return switch (heatProduction) {
            case EXPONENTIAL -> surfaceHeatProduction() * Math.exp(-zMetres / heatProductionScale);
            case TWO_LAYER -> zMetres <= heatProductionScale ? surfaceHeatProduction() : 0;
        };
    }

    /** Upward conductive heat flow at depth {@code zMetres} (W/m²): q0 less the heat produced above. */
    public double heatFlowAt(double zMetres) {
        double z = Math.max(zMetres, 0);
        double crustal = (1 - reducedFraction) * surfaceHeatFlow;
        return switch (heatProduction) {
            case EXPONENTIAL -> reducedHeatFlow() + crustal * Math.exp(-z / heatProductionScale);
            case TWO_LAYER -> z <= heatProductionScale
                    ? surfaceHeatFlow - surfaceHeatProduction() * z : reducedHeatFlow();
        };
    }

    /** Temperature gradient dT/dz at depth {@code zMetres} (K/m). */
    public double gradientAt(double zMetres) {
        return heatFlowAt(zMetres) / conductivity;
    }

    @Override
    public double temperatureAt(double zMetres) {
        if (zMetres <= 0) {
            return surfaceTemperature;
        }
        double k = conductivity;
        double hr = heatProductionScale;
        return switch (heatProduction) {
            case EXPONENTIAL -> surfaceTemperature + reducedHeatFlow() * zMetres / k
                    + surfaceHeatProduction() * hr * hr / k * -Math.expm1(-zMetres / hr);
            case TWO_LAYER -> {
                double z = Math.min(zMetres, hr);
                double top = surfaceTemperature + surfaceHeatFlow * z / k - surfaceHeatProduction() * z * z / (2 * k);
                yield top + reducedHeatFlow() * (zMetres - z) / k;
            }
        };
    }

    /** Temperature at the base of the crust (K). */
    public double mohoTemperature() {
        return temperatureAt(crustThickness);
    }

    @Override
    public List<ModelInfo> models() {
        return List.of(INFO);
    }
}
