package org.tectomelt.engine.settings;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.tectomelt.engine.DeferredList;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.column.Upwelling;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.units.Units;

/**
 * A mid-ocean ridge: passive, plate-driven upwelling melts the mantle in a triangular region up to
 * the sea floor (or, at slow spreading, up to a conductive lid), and all the melt makes the oceanic
 * crust.
 *
 * <pre>
 *   crust thickness  h_c = (ρs/ρc) ∫F dz              (McKenzie &amp; Bickle 1988)
 *   melt production  Q = h_c · v_full                (new crust per unit ridge length, m³/s per m)
 * </pre>
 * At and above a full spreading rate of {@value SlowSpreadingConductiveLid#CRITICAL_FULL_RATE_MM_PER_YR}
 * mm/yr the column melts up to the surface, the limit of infinite stretching of White &amp; McKenzie
 * (1989) that describes sea-floor spreading. Below it conductive cooling from above thins the crust
 * (Bown &amp; White 1994): melting stops at the lid of {@link SlowSpreadingConductiveLid}, and the
 * result names that model.
 *
 * @param source               the mantle source (lithologies and melting mode)
 * @param potentialTemperature mantle potential temperature (K)
 * @param bulkWater            bulk water of the source (mass fraction)
 * @param fullSpreadingRate    full (both-sided) spreading rate (m/s)
 * @param cooling              the slow-spreading lid model
 */
public record MidOceanRidge(MantleSource source, double potentialTemperature, double bulkWater,
                            double fullSpreadingRate, SlowSpreadingConductiveLid cooling) {

    /** Below this full rate (mm/yr) conductive cooling reduces melting (Bown &amp; White 1994, from memory). */
    public static final double SLOW_SPREADING_MM_PER_YR = SlowSpreadingConductiveLid.CRITICAL_FULL_RATE_MM_PER_YR;
    /** Profile spacing used for settings (m). */
    public static final double PROFILE_STEP = 1000.0;

    /** A ridge over one lithology melting in batch, with the standard slow-spreading lid. */
    public MidOceanRidge(MantleLithology lithology, double potentialTemperature, double bulkWater,
                         double fullSpreadingRate) {
        this(MantleSource.of(lithology), potentialTemperature, bulkWater, fullSpreadingRate,
                SlowSpreadingConductiveLid.standard());
    }

    /** The source's main lithology. */
    public MantleLithology lithology() {
        return source.peridotite();
    }

    /** Validates the rate. */
    public MidOceanRidge {
        if (!(fullSpreadingRate > 0)) {
            throw new EngineException("the full spreading rate must be positive");
        }
        if (source == null || cooling == null) {
            throw new IllegalArgumentException("source and cooling are required");
        }
    }

    /**
     * The result of a ridge.
     *
     * @param column           the passive melting column up to the sea floor or the conductive lid
     * @param crustalThickness igneous crust thickness (m)
     * @param meltProduction   new crust volume per unit ridge length per unit time (m³/s per m = m²/s)
     * @param models           published models used
     * @param assumptions      assumptions in words
     * @param warnings         validity notes
     * @param conductiveLid    depth of the conductive lid (m); 0 at and above the critical rate
     * @param crustModel       id of the model that set the top of melting: {@code "infinite-stretching"}
     *                         (melting to the sea floor) or {@link SlowSpreadingConductiveLid#INFO}'s id
     */
    public record Result(ColumnResult column, double crustalThickness, double meltProduction, List<ModelInfo> models,
                         List<String> assumptions, List<String> warnings, double conductiveLid, String crustModel) {
        /** Defensive copies. */
        public Result {
            models = List.copyOf(models);
            assumptions = DeferredList.copyOf(assumptions);
            warnings = List.copyOf(warnings);
        }
    }

    /** Runs the ridge column. */
    public Result solve() {
        double lid = cooling.lidDepth(fullSpreadingRate, potentialTemperature);
        ColumnResult c = source.column(potentialTemperature, bulkWater)
                .withUpwelling(Upwelling.PASSIVE).withLidDepth(lid).withOutputStep(PROFILE_STEP).solve();
        double crust = c.crustalThickness();
        List<ModelInfo> models = new ArrayList<>(c.models());
        List<String> warnings = new ArrayList<>(c.warnings());
        double mmPerYr = Units.mPerSToMmPerYr(fullSpreadingRate);
        String model;
        if (lid > 0) {
            model = SlowSpreadingConductiveLid.INFO.id();
            models.add(SlowSpreadingConductiveLid.INFO);
            warnings.add(String.format(Locale.ROOT, "full spreading rate %.1f mm/yr is below %.0f mm/yr: conductive "
                    + "cooling thins the crust, modelled as a %.1f km lid on the melting column (Bown & White 1994 "
                    + "effect, parameterized here); crust at slow and ultraslow ridges is variable (Dick et al. 2003)",
                    mmPerYr, SLOW_SPREADING_MM_PER_YR, lid / 1e3));
        } else {
            model = "infinite-stretching";
        }
        // the text is built when read (an answer reads it, a run's point does not)
        List<String> assumptions = DeferredList.of(() -> {
            List<String> a = new ArrayList<>(c.assumptions());
            a.add(lid > 0
                    ? "ridge: passive triangular melting region; " + cooling.describe(fullSpreadingRate, lid)
                            + "; melt production = crustal thickness × full spreading rate"
                    : "ridge: passive triangular melting region up to the sea floor (the infinite-stretching "
                            + "limit of White & McKenzie 1989); melt production = crustal thickness × full spreading "
                            + "rate; at this rate conductive cooling from above does not thin the crust (Bown & White "
                            + "1994)");
            return a;
        });
        return new Result(c, crust, crust * fullSpreadingRate, models, assumptions, warnings, lid, model);
    }
}
