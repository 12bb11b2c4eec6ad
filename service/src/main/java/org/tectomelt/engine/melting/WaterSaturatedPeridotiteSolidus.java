package org.tectomelt.engine.melting;

import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;

/**
 * The experimental water-saturated solidus of mantle peridotite, after Grove, Chatterjee, Parman
 * &amp; Médard (2006) and Till, Grove &amp; Withers (2012): a curve that falls from about 1000 °C at
 * 1 GPa to about 800–820 °C at 3 GPa and stays nearly isothermal at 800–820 °C between 3 and 6 GPa,
 * where chlorite and then other hydrous phases coexist with the first melt.
 *
 * <p>The curve is piecewise linear in P through the nodes of {@link #NODES_GPA} and
 * {@link #NODES_C}. From 3 to 6 GPa the nodes follow the 800–820 °C that Till et al. (2012) state
 * [pub, REFERENCES §2.4]; below 3 GPa they are read from memory of the figures of Grove et al.
 * (2006) and are approximate (±30 K). Stated experimental uncertainty: brackets of about ±10–20 K
 * (from memory). Other experimental groups place the water-saturated solidus up to about 200 K
 * hotter (REFERENCES §2.4): the curve is one experimental view, not a consensus.
 *
 * <p>Sources: Grove, T.L., Chatterjee, N., Parman, S.W. &amp; Médard, E. (2006) The influence of H2O
 * on mantle wedge melting. Earth and Planetary Science Letters 249, 74–89,
 * doi:10.1016/j.epsl.2006.06.043 (DOI from memory); Till, C.B., Grove, T.L. &amp; Withers, A.C.
 * (2012) The beginnings of hydrous mantle wedge melting. Contributions to Mineralogy and Petrology
 * 163, 669–688, doi:10.1007/s00410-011-0692-6 (DOI from memory).
 *
 * <p>Validity: {@value #MIN_GPA}–{@value #MAX_GPA} GPa; outside, {@link #temperature} refuses.
 */
public final class WaterSaturatedPeridotiteSolidus {

    /** Provenance (the more recent, higher-pressure study first). */
    public static final ModelInfo INFO = new ModelInfo("water-saturated-solidus-grove2006-till2012",
            "Till, C.B., Grove, T.L. & Withers, A.C. (2012) The beginnings of hydrous mantle wedge melting. "
                    + "Contributions to Mineralogy and Petrology 163, 669-688; Grove, T.L., Chatterjee, N., Parman, "
                    + "S.W. & Medard, E. (2006) The influence of H2O on mantle wedge melting. Earth and Planetary "
                    + "Science Letters 249, 74-89",
            "10.1007/s00410-011-0692-6");
    /** Lowest pressure of the curve (GPa). */
    public static final double MIN_GPA = 1.0;
    /** Highest pressure of the curve (GPa). */
    public static final double MAX_GPA = 6.0;
    /** Stated uncertainty of the experimental brackets (K), from memory. */
    public static final double EXPERIMENTAL_UNCERTAINTY_K = 20.0;
    /** Node pressures (GPa). */
    static final double[] NODES_GPA = {1.0, 1.5, 2.0, 2.5, 3.0, 4.0, 5.0, 6.0};
    /** Node temperatures (°C): below 3 GPa from memory (Grove et al. 2006), 3–6 GPa after Till et al. (2012). */
    static final double[] NODES_C = {1000.0, 925.0, 860.0, 825.0, 810.0, 805.0, 810.0, 820.0};

    private WaterSaturatedPeridotiteSolidus() {
    }

    /** The water-saturated solidus (K) at pressure {@code p} (Pa), within 1–6 GPa. */
    public static double temperature(double p) {
        double g = p * 1e-9;
        if (!(g >= MIN_GPA - 1e-12 && g <= MAX_GPA + 1e-12)) {
            throw new EngineException(String.format(java.util.Locale.ROOT,
                    "the experimental water-saturated solidus covers %.0f–%.0f GPa, got %.3g GPa", MIN_GPA, MAX_GPA, g));
        }
        g = Math.min(Math.max(g, MIN_GPA), MAX_GPA);
        int i = 0;
        while (i < NODES_GPA.length - 2 && g > NODES_GPA[i + 1]) {
            i++;
        }
        double w = (g - NODES_GPA[i]) / (NODES_GPA[i + 1] - NODES_GPA[i]);
        return NODES_C[i] + w * (NODES_C[i + 1] - NODES_C[i]) + 273.15;
    }
}
