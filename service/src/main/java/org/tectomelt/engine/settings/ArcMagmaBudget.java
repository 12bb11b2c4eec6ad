package org.tectomelt.engine.settings;

import java.util.Locale;
import org.tectomelt.engine.EngineException;

/**
 * Arc magma budget from the slab's water flux: if the melt carries away all the water the slab
 * supplies to the wedge, the melt mass produced per unit arc length and time is the water flux
 * divided by the melt's water content.
 *
 * <pre>
 *   ṁ_melt = J_w / X_melt                 (kg of melt per m of arc per s)
 *   Q      = J_w / (X_melt · ρ_melt)       (m³ of melt per m of arc per s, i.e. m²/s)
 * </pre>
 * with J_w the water flux into the wedge (kg per m of arc per s), X_melt the mass fraction of
 * water dissolved in the melt, and ρ_melt the melt density (kg/m³). In the API's units,
 * Q [km³/yr per km of arc] = J_w [kg/m/yr] / (X_melt ρ_melt) × 10⁻⁶.
 *
 * <p>This is a steady-state mass balance of water, not a published model. Its limits:
 * <ul>
 *   <li>All the supplied water leaves in the melt. Water kept in the residue (a fraction
 *       D(1 − F) / (D + F(1 − D)) of the bulk water in the Katz et al. 2003 partitioning, about
 *       8 % at F = 0.1, D = 0.01), in hydrous minerals, or escaping as free fluid would make
 *       less melt, so the estimate is an upper bound for the given melt water content.</li>
 *   <li>One melt water content stands for all the melt; real arc melts aggregate batches from a
 *       range of depths and temperatures with different water contents, and Q scales as
 *       1 / X_melt.</li>
 *   <li>It is primary melt leaving the wedge, not erupted or intruded volume: crystallisation,
 *       degassing and the intrusive-to-extrusive ratio are outside it.</li>
 *   <li>ρ_melt is a constant (2900 kg/m³ from Katz et al. 2003, Table 2, for the default
 *       peridotite); hydrous melts at low pressure are lighter, which would raise the volume.</li>
 * </ul>
 *
 * <p>SI throughout.
 *
 * @param waterFlux   water flux into the wedge J_w (kg per m of arc per s), ≥ 0
 * @param meltWater   water dissolved in the melt X_melt (mass fraction), &gt; 0 and ≤ 1
 * @param meltDensity melt density ρ_melt (kg/m³), &gt; 0
 */
public record ArcMagmaBudget(double waterFlux, double meltWater, double meltDensity) {

    /** The formula and its limits in one sentence, for responses. */
    public static final String ASSUMPTION = "arc magma budget Q = J_w / (X_melt * rho_melt): the melt carries "
            + "away all the water the slab supplies (none stays in the residue, in hydrous minerals or as free "
            + "fluid), one melt water content stands for all the melt, and Q is primary melt leaving the wedge, "
            + "not erupted volume; water kept elsewhere would make less melt, so Q is an upper bound for this "
            + "melt water content";

    /** Checks the inputs. */
    public ArcMagmaBudget {
        if (!(waterFlux >= 0) || Double.isInfinite(waterFlux)) {
            throw new EngineException("the slab water flux must be a finite number ≥ 0");
        }
        if (!(meltWater > 0 && meltWater <= 1)) {
            throw new EngineException(String.format(Locale.ROOT,
                    "the magma budget needs a melt that holds water (between 0 and 100 wt%%), got %.3g wt%%",
                    meltWater * 100));
        }
        if (!(meltDensity > 0) || Double.isInfinite(meltDensity)) {
            throw new EngineException("the melt density must be a positive finite number");
        }
    }

    /** Melt mass production per metre of arc (kg/m/s): J_w / X_melt. */
    public double meltMassRate() {
        return waterFlux / meltWater;
    }

    /** Melt volume production per metre of arc (m³/s per m, i.e. m²/s): J_w / (X_melt ρ_melt). */
    public double meltVolumeRate() {
        return meltMassRate() / meltDensity;
    }
}
