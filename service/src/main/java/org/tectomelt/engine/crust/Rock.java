package org.tectomelt.engine.crust;

import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.melting.MeltCurve;
import org.tectomelt.engine.melting.MeltTable;

/**
 * Thermal and melting properties of one rock in the sill model: crust or intrusion.
 *
 * @param density      density ρ (kg/m³), the same for solid and melt (the model does not track volume change)
 * @param heatCapacity specific heat c (J/kg/K), constant
 * @param latentHeat   latent heat of melting L (J/kg); 0 for a rock whose melting absorbs no heat
 * @param conductivity conductivity law k(T)
 * @param meltCurve    melt fraction F(T); {@code null} for a rock that does not melt in the model. With a
 *                     table, the curve used where no pressure is known
 * @param meltTable    melt fraction F(T, P), or {@code null} when one curve serves at every pressure; the sill
 *                     model then gives each cell of this rock the curve at its pressure
 */
public record Rock(double density, double heatCapacity, double latentHeat, ConductivityLaw conductivity,
                   MeltCurve meltCurve, MeltTable meltTable) {

    /** A rock with one melt curve at every pressure. */
    public Rock(double density, double heatCapacity, double latentHeat, ConductivityLaw conductivity,
                MeltCurve meltCurve) {
        this(density, heatCapacity, latentHeat, conductivity, meltCurve, null);
    }

    /** A rock melting by a table F(T, P); its curve where no pressure is known is the table's at {@code reference} (Pa). */
    public static Rock withTable(double density, double heatCapacity, double latentHeat, ConductivityLaw conductivity,
                                 MeltTable table, double reference) {
        return new Rock(density, heatCapacity, latentHeat, conductivity, table.curveAt(reference), table);
    }

    /** Validates the properties. */
    public Rock {
        if (meltTable != null && meltCurve == null) {
            throw new EngineException("a rock with a melt table needs its curve at a reference pressure");
        }
        if (!(density > 0) || !(heatCapacity > 0) || !(latentHeat >= 0) || !Double.isFinite(density)
                || !Double.isFinite(heatCapacity) || !Double.isFinite(latentHeat)) {
            throw new EngineException("a rock needs positive density and heat capacity and a latent heat of at least 0");
        }
        if (conductivity == null) {
            throw new EngineException("a rock needs a conductivity law");
        }
    }

    /** Melt fraction at temperature {@code t} (K): 0 for a rock without melt curve. */
    public double meltFraction(double t) {
        return meltCurve == null ? 0.0 : meltCurve.fractionAt(t);
    }

    /** The melt curve at pressure {@code p} (Pa): the table's there, or the one curve. */
    public MeltCurve curveAt(double p) {
        return meltTable == null ? meltCurve : meltTable.curveAt(p);
    }

    /** The same rock with melt curve {@code curve} and no table (the rock at one pressure). */
    public Rock atCurve(MeltCurve curve) {
        return new Rock(density, heatCapacity, latentHeat, conductivity, curve, null);
    }

    /** Volumetric enthalpy ρ c T + ρ L F(T) (J/m³), with T in K (reference: 0 K, solid). */
    public double enthalpy(double t) {
        return density * (heatCapacity * t + latentHeat * meltFraction(t));
    }

    /** Thermal diffusivity κ = k / (ρ c) (m²/s) at temperature {@code t} (K). */
    public double diffusivity(double t) {
        return conductivity.at(t) / (density * heatCapacity);
    }
}
