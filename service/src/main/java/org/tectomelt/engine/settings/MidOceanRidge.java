package org.tectomelt.engine.settings;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.Upwelling;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.units.Units;

/**
 * A mid-ocean ridge: passive, plate-driven upwelling melts the mantle in a triangular region up to
 * the sea floor, and all the melt makes the oceanic crust.
 *
 * <pre>
 *   crust thickness  h_c = (ρs/ρc) ∫F dz              (McKenzie &amp; Bickle 1988)
 *   melt production  Q = h_c · v_full                (new crust per unit ridge length, m³/s per m)
 * </pre>
 * The column melts up to the surface, the limit of infinite stretching of White &amp; McKenzie
 * (1989) that describes sea-floor spreading. Conductive cooling from above, which thins the crust
 * at full spreading rates below about {@value #SLOW_SPREADING_MM_PER_YR} mm/yr (Bown &amp; White 1994,
 * EPSL 121, 435; from memory), is not modelled: the crust is then an upper bound, and the result
 * says so.
 *
 * @param lithology            mantle melting law
 * @param potentialTemperature mantle potential temperature (K)
 * @param bulkWater            bulk water of the source (mass fraction)
 * @param fullSpreadingRate    full (both-sided) spreading rate (m/s)
 */
public record MidOceanRidge(MantleLithology lithology, double potentialTemperature, double bulkWater,
                            double fullSpreadingRate) {

    /** Below this full rate (mm/yr) conductive cooling reduces melting (Bown &amp; White 1994, from memory). */
    public static final double SLOW_SPREADING_MM_PER_YR = 20.0;
    /** Profile spacing used for settings (m). */
    public static final double PROFILE_STEP = 1000.0;

    /** Validates the rate. */
    public MidOceanRidge {
        if (!(fullSpreadingRate > 0)) {
            throw new EngineException("the full spreading rate must be positive");
        }
    }

    /**
     * The result of a ridge.
     *
     * @param column           the passive melting column up to the sea floor
     * @param crustalThickness igneous crust thickness (m)
     * @param meltProduction   new crust volume per unit ridge length per unit time (m³/s per m = m²/s)
     * @param models           published models used
     * @param assumptions      assumptions in words
     * @param warnings         validity notes
     */
    public record Result(ColumnResult column, double crustalThickness, double meltProduction, List<ModelInfo> models,
                         List<String> assumptions, List<String> warnings) {
        /** Defensive copies. */
        public Result {
            models = List.copyOf(models);
            assumptions = List.copyOf(assumptions);
            warnings = List.copyOf(warnings);
        }
    }

    /** Runs the ridge column. */
    public Result solve() {
        ColumnResult c = DecompressionColumn.of(lithology, potentialTemperature, bulkWater)
                .withUpwelling(Upwelling.PASSIVE).withOutputStep(PROFILE_STEP).solve();
        double crust = c.crustalThickness();
        List<String> assumptions = new ArrayList<>(c.assumptions());
        assumptions.add("ridge: passive triangular melting region up to the sea floor (the infinite-stretching "
                + "limit of White & McKenzie 1989); melt production = crustal thickness × full spreading rate; "
                + "no conductive cooling from above");
        List<String> warnings = new ArrayList<>(c.warnings());
        double mmPerYr = Units.mPerSToMmPerYr(fullSpreadingRate);
        if (mmPerYr < SLOW_SPREADING_MM_PER_YR) {
            warnings.add(String.format(Locale.ROOT, "full spreading rate %.1f mm/yr is below about %.0f mm/yr, where "
                    + "conductive cooling thins the crust (Bown & White 1994): the crust here is an upper bound",
                    mmPerYr, SLOW_SPREADING_MM_PER_YR));
        }
        return new Result(c, crust, crust * fullSpreadingRate, c.models(), assumptions, warnings);
    }
}
