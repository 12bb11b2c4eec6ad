package org.tectomelt.engine.thermal;

import org.tectomelt.engine.EngineException;

/**
 * Lithostatic pressure in a two-layer column: a crust of uniform density over a mantle of
 * uniform density, P = ρc g z above the Moho and ρc g zM + ρm g (z − zM) below.
 *
 * <p>Source: the lithostatic relation of Turcotte &amp; Schubert, <i>Geodynamics</i>
 * (3rd ed., Cambridge University Press, 2014, §2.2), doi:10.1017/CBO9780511843877. Compressibility
 * is neglected: at 100 km depth this underestimates pressure by about 1–2 %, which is inside the
 * scatter of the melting parameterizations that use it. Valid for 0–700 km depth.
 *
 * <p>All quantities SI: m, kg/m³, m/s², Pa.
 *
 * @param crustThicknessM   crust thickness (m), 0 for a mantle-only column
 * @param crustDensity      crust density (kg/m³)
 * @param mantleDensity     mantle density (kg/m³)
 * @param gravity           gravitational acceleration (m/s²)
 */
public record LithostaticColumn(double crustThicknessM, double crustDensity, double mantleDensity,
                                double gravity) {

    /** Standard gravity used throughout (m/s²). */
    public static final double G = 9.81;
    /** Default mantle density (kg/m³), common practice. */
    public static final double MANTLE_DENSITY = 3300.0;
    /** Default continental crust density (kg/m³), common practice. */
    public static final double CRUST_DENSITY = 2800.0;
    /** Provenance reported with results that used this column. */
    public static final org.tectomelt.engine.ModelInfo INFO = new org.tectomelt.engine.ModelInfo(
            "lithostatic-two-layer",
            "Turcotte, D.L. & Schubert, G. (2014) Geodynamics, 3rd ed., Cambridge University Press, section 2.2",
            "10.1017/CBO9780511843877");
    /** Deepest depth the column is used for (m). */
    public static final double MAX_DEPTH_M = 700e3;

    /** Validates the layer properties. */
    public LithostaticColumn {
        if (!(crustThicknessM >= 0) || !(crustDensity > 0) || !(mantleDensity > 0) || !(gravity > 0)) {
            throw new EngineException("column needs crust thickness ≥ 0 and positive densities and gravity");
        }
    }

    /** A column of mantle only (ρ = 3300 kg/m³, g = 9.81 m/s²), as used for oceanic and sub-lithospheric paths. */
    public static LithostaticColumn mantleOnly() {
        return new LithostaticColumn(0.0, CRUST_DENSITY, MANTLE_DENSITY, G);
    }

    /**
     * A column of crust of density {@code crustDensity} (kg/m³) down to {@link #MAX_DEPTH_M}
     * (g = 9.81 m/s²): the pressure within a crustal layer, as the crustal heating models read their
     * melt curves at it.
     */
    public static LithostaticColumn crustOnly(double crustDensity) {
        return new LithostaticColumn(MAX_DEPTH_M, crustDensity, MANTLE_DENSITY, G);
    }

    /** Pressure (Pa) at depth {@code z} (m). */
    public double pressureAt(double z) {
        if (z <= crustThicknessM) {
            return crustDensity * gravity * z;
        }
        return crustDensity * gravity * crustThicknessM + mantleDensity * gravity * (z - crustThicknessM);
    }

    /** Depth (m) at which the pressure is {@code p} (Pa): the inverse of {@link #pressureAt}. */
    public double depthAt(double p) {
        double moho = crustDensity * gravity * crustThicknessM;
        if (p <= moho) {
            return p / (crustDensity * gravity);
        }
        return crustThicknessM + (p - moho) / (mantleDensity * gravity);
    }
}
