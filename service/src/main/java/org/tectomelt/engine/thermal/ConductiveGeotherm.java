package org.tectomelt.engine.thermal;

import java.util.List;
import org.tectomelt.engine.ModelInfo;

/**
 * A conductive temperature profile of the lithosphere: temperature as a function of depth below
 * the surface (the sea floor for oceanic lithosphere). Implementations are immutable and
 * thread-safe. All quantities SI: m, K, W/m².
 */
public interface ConductiveGeotherm {

    /**
     * Temperature at a depth.
     *
     * @param zMetres depth below the surface (m); depths above the surface return the surface temperature
     * @return temperature (K)
     */
    double temperatureAt(double zMetres);

    /** Surface temperature (K). */
    double surfaceTemperature();

    /** Conductive heat flow out of the surface (W/m²), positive upwards. */
    double surfaceHeatFlow();

    /** The published models behind this profile, for the responses' {@code models} lists. */
    List<ModelInfo> models();
}
