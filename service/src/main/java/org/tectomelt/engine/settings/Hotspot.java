package org.tectomelt.engine.settings;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import org.tectomelt.engine.DeferredList;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.column.MeltingColumn;
import org.tectomelt.engine.column.Upwelling;
import org.tectomelt.engine.melting.MantleLithology;

/**
 * A hotspot: a mantle plume hotter than its surroundings rises actively beneath a lithospheric lid;
 * melting stops at the base of the lid (the lid effect, Ellam 1992).
 *
 * <p>Melt flux of a top-hat plume conduit of radius R rising at w, every parcel melting to the
 * melt fraction F_lid it has on reaching the lid (active, columnar upwelling):
 * <pre>
 *   mass flux of melt     ṁ = ρs · π R² · w · F_lid
 *   volume flux of melt   Q = ṁ / ρf = π R² · w · F_lid · ρs/ρf
 * </pre>
 * This is the steady mass balance of a one-dimensional column (McKenzie &amp; Bickle 1988). Real
 * plumes are hottest and fastest on their axis and cool and slow outwards, so a top-hat flux with
 * the axial Tp and w is an upper bound for a given radius; use the radius over which the
 * given Tp and w are representative. Excess temperature ΔT = Tp − Tp,ambient; published plume
 * excess temperatures span about 100–300 K and are debated.
 *
 * @param source                      the plume's mantle source (lithologies and melting mode)
 * @param potentialTemperature        plume potential temperature (K)
 * @param ambientPotentialTemperature potential temperature of the surrounding mantle (K)
 * @param lithosphereThickness        thickness of the lid (m)
 * @param plumeRadius                 radius R of the melting conduit (m)
 * @param upwellingVelocity           upwelling velocity w of the plume (m/s)
 * @param bulkWater                   bulk water of the plume source (mass fraction)
 */
public record Hotspot(MantleSource source, double potentialTemperature, double ambientPotentialTemperature,
                      double lithosphereThickness, double plumeRadius, double upwellingVelocity, double bulkWater) {

    /** The lid effect: melting beneath a plume stops at the base of the lithosphere. */
    public static final ModelInfo LID_EFFECT_INFO = new ModelInfo("lid-effect-ellam1992",
            "Ellam, R.M. (1992) Lithospheric thickness as a control on basalt geochemistry. Geology 20(2), 153-156",
            "10.1130/0091-7613(1992)020<0153:LTAACO>2.3.CO;2");
    /** Lower end of the commonly inferred plume excess temperature (K). */
    public static final double TYPICAL_MIN_EXCESS_K = 100.0;
    /** Upper end of the commonly inferred plume excess temperature (K). */
    public static final double TYPICAL_MAX_EXCESS_K = 300.0;

    /** A plume of one lithology melting in batch. */
    public Hotspot(MantleLithology lithology, double potentialTemperature, double ambientPotentialTemperature,
                   double lithosphereThickness, double plumeRadius, double upwellingVelocity, double bulkWater) {
        this(MantleSource.of(lithology), potentialTemperature, ambientPotentialTemperature, lithosphereThickness,
                plumeRadius, upwellingVelocity, bulkWater);
    }

    /** The source's main lithology. */
    public MantleLithology lithology() {
        return source.peridotite();
    }

    /** Validates the geometry. */
    public Hotspot {
        if (!(plumeRadius > 0) || !(upwellingVelocity > 0) || !(lithosphereThickness >= 0)) {
            throw new EngineException("plume radius and upwelling velocity must be positive, lithosphere thickness ≥ 0");
        }
    }

    /**
     * The result of a hotspot.
     *
     * @param column            the active melting column of the plume, capped at the lid
     * @param excessTemperature Tp − Tp,ambient (K)
     * @param onsetDepth        depth where the plume adiabat meets the solidus (m); empty when it never does
     * @param meltFractionAtLid melt fraction on reaching the lid (0 when the lid is deeper than the onset)
     * @param meltFlux          volume flux of melt (m³/s)
     * @param models            published models used
     * @param assumptions       assumptions in words
     * @param warnings          validity notes
     */
    public record Result(ColumnResult column, double excessTemperature, OptionalDouble onsetDepth,
                         double meltFractionAtLid, double meltFlux, List<ModelInfo> models, List<String> assumptions,
                         List<String> warnings) {
        /** Defensive copies. */
        public Result {
            models = List.copyOf(models);
            assumptions = DeferredList.copyOf(assumptions);
            warnings = List.copyOf(warnings);
        }
    }

    /** Runs the plume column. */
    public Result solve() {
        MeltingColumn col = source.column(potentialTemperature, bulkWater)
                .withUpwelling(Upwelling.ACTIVE).withLidDepth(lithosphereThickness)
                .withOutputStep(MidOceanRidge.PROFILE_STEP);
        ColumnResult c = col.solve();
        double fLid = c.top().map(t -> t.meltFraction()).orElse(0.0);
        double rhoS = col.thermodynamics().solidDensity();
        double rhoF = col.thermodynamics().meltDensity();
        double flux = Math.PI * plumeRadius * plumeRadius * upwellingVelocity * fLid * rhoS / rhoF;
        double excess = potentialTemperature - ambientPotentialTemperature;
        OptionalDouble onset = c.onset().isPresent() ? OptionalDouble.of(c.onset().get().depth()) : OptionalDouble.empty();
        List<ModelInfo> models = new ArrayList<>(c.models());
        models.add(LID_EFFECT_INFO);
        // the text is built when read (an answer reads it, a run's point does not)
        List<String> assumptions = DeferredList.of(() -> {
            List<String> a = new ArrayList<>(c.assumptions());
            a.add(String.format(Locale.ROOT, "hotspot: top-hat plume conduit, melt flux Q = π·R²·w·F_lid·ρs/ρf "
                    + "(ρs = %.0f, ρf = %.0f kg/m³): every parcel melts to the melt fraction it has at the base of the "
                    + "lid; an upper bound for a plume whose temperature and velocity fall off from its axis", rhoS, rhoF));
            return a;
        });
        List<String> warnings = new ArrayList<>(c.warnings());
        if (excess < TYPICAL_MIN_EXCESS_K || excess > TYPICAL_MAX_EXCESS_K) {
            warnings.add(String.format(Locale.ROOT, "excess temperature %.0f K lies outside the %.0f–%.0f K usually "
                    + "inferred for mantle plumes", excess, TYPICAL_MIN_EXCESS_K, TYPICAL_MAX_EXCESS_K));
        }
        return new Result(c, excess, onset, fLid, flux, models, assumptions, warnings);
    }
}
