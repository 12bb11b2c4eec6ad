package org.tectomelt.engine.thermal;

/**
 * Cooling oceanic lithosphere of a given age: a conductive geotherm that also predicts the
 * sea-floor depth and the thermal thickness. SI units: s, m, K, W/m².
 */
public interface OceanicLithosphere extends ConductiveGeotherm {

    /** Thermal-thickness isotherm: the depth where T − T0 reaches this fraction of Tm − T0. */
    double THICKNESS_ISOTHERM_FRACTION = 0.9;

    /** Age of the sea floor (s). */
    double age();

    /** Temperature of the mantle beneath the cooling lithosphere (K). */
    double mantleTemperature();

    /** Depth of the sea floor below sea level (m), from isostatic subsidence of the cooling lithosphere. */
    double seafloorDepth();

    /** Thermal thickness (m): depth of the isotherm T0 + 0.9 (Tm − T0). */
    double thermalThickness();
}
