package org.tectomelt.engine.melting;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.function.DoubleFunction;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;

/**
 * A crustal rock or an intrusion whose melting is described by an experimental melt-fraction
 * curve F(T) ({@link MeltCurve}), with the thermal properties the crustal heating models need.
 *
 * <p>The default curves are approximate (REFERENCES.md §3.4 marks the recalled ones ±10 %
 * absolute); every lithology accepts a caller's own curve through {@link #withCurve}, which is
 * then used at every pressure. Bulk water is not an input: each curve already fixes the water
 * conditions (water-saturated granite, fluid-absent metapelite and amphibolite).
 *
 * <ul>
 *   <li>{@link #graniteWaterSaturated()}: solidus and liquidus after Huang &amp; Wyllie (1973),
 *   pressure-dependent ({@link HuangWyllie1973Granite});</li>
 *   <li>{@link #metapelite()}: fluid-absent muscovite then biotite breakdown melting, F(T, P) over
 *   0.5–1.5 GPa (Le Breton &amp; Thompson 1988; Vielzeuf &amp; Holloway 1988; Patiño Douce &amp; Johnston
 *   1991), the table {@code /melting/metapelite-fluid-absent.tsv};</li>
 *   <li>{@link #amphibolite()}: dehydration melting from 850 °C, F(T, P) over 0.3–2.0 GPa (Beard &amp;
 *   Lofgren 1991; Wolf &amp; Wyllie 1994; Rapp &amp; Watson 1995), the table
 *   {@code /melting/amphibolite-fluid-absent.tsv};</li>
 *   <li>{@link #basalt()}: an intrusion crystallising over 1200 → 1000 °C (common practice).</li>
 * </ul>
 *
 * <p>Instances are immutable.
 */
public final class CrustalLithology implements Lithology {

    /** Highest pressure (GPa) at which any crustal curve is used at all. */
    public static final double HARD_MAX_GPA = 3.0;

    /** Pressure range of the metapelite table (GPa); outside it the nearest row is used, with a warning. */
    public static final double METAPELITE_MIN_GPA = 0.5, METAPELITE_MAX_GPA = 1.5;
    /** Pressure range of the amphibolite table (GPa); outside it the nearest row is used, with a warning. */
    public static final double AMPHIBOLITE_MIN_GPA = 0.3, AMPHIBOLITE_MAX_GPA = 2.0;
    /** The metapelite F(T, P) table (classpath resource). */
    public static final String METAPELITE_TABLE = "/melting/metapelite-fluid-absent.tsv";
    /** The amphibolite F(T, P) table (classpath resource). */
    public static final String AMPHIBOLITE_TABLE = "/melting/amphibolite-fluid-absent.tsv";
    private static final MeltTable METAPELITE = MeltTable.resource(METAPELITE_TABLE);
    private static final MeltTable AMPHIBOLITE = MeltTable.resource(AMPHIBOLITE_TABLE);
    /** Pressure range of the basalt crystallisation interval (GPa): crustal intrusions. */
    public static final double BASALT_MIN_GPA = 0.0, BASALT_MAX_GPA = 1.5;

    /** Note attached to results that used a default (approximate) curve. */
    public static final String APPROXIMATE_CURVE_NOTE =
            "default melt curve is approximate (about ±10 % absolute in melt fraction); supply meltCurve "
                    + "with your own experiments where it matters";

    private static final double ZERO_C = 273.15;
    /** Room temperature (K) at which the default conductivities are quoted. */
    private static final double ROOM_K = 293.15;
    /** Granite conductivity law k = 1/(0.24094 + 4.6019e-4 T[K]) (Miao et al. 2014), at room temperature. */
    static final double FELSIC_CONDUCTIVITY = 1.0 / (0.24094 + 4.6019e-4 * ROOM_K);
    /** Gabbro conductivity law k = 1/(0.33727 + 3.5002e-4 T[K]) (Miao et al. 2014), at room temperature. */
    static final double MAFIC_CONDUCTIVITY = 1.0 / (0.33727 + 3.5002e-4 * ROOM_K);

    /** Le Breton &amp; Thompson (1988), fluid-absent melting of metapelites. */
    public static final ModelInfo METAPELITE_INFO = new ModelInfo("metapelite",
            "Le Breton, N. & Thompson, A.B. (1988) Fluid-absent (dehydration) melting of biotite in metapelites "
                    + "in the early stages of crustal anatexis. Contributions to Mineralogy and Petrology 99, 226-237; "
                    + "with the sources below, an approximate F(T, P) table over 0.5-1.5 GPa (values from memory)",
            "10.1007/BF00371463");
    /** Beard &amp; Lofgren (1991), dehydration melting of amphibolites. */
    public static final ModelInfo AMPHIBOLITE_INFO = new ModelInfo("amphibolite",
            "Beard, J.S. & Lofgren, G.E. (1991) Dehydration melting and water-saturated melting of basaltic and "
                    + "andesitic greenstones and amphibolites at 1, 3, and 6.9 kb. Journal of Petrology 32(2), 365-401; "
                    + "approximate melt curve",
            "10.1093/petrology/32.2.365");
    /** Wolf &amp; Wyllie (1994), amphibolite melting at 1 GPa. */
    public static final ModelInfo AMPHIBOLITE_WOLF_WYLLIE_INFO = new ModelInfo("amphibolite",
            "Wolf, M.B. & Wyllie, P.J. (1994) Dehydration-melting of amphibolite at 10 kbar: the effects of "
                    + "temperature and time. Contributions to Mineralogy and Petrology 115, 369-383",
            "10.1007/BF00320972");
    /** Vielzeuf &amp; Holloway (1988), fluid-absent melting of a pelite. */
    public static final ModelInfo VIELZEUF_HOLLOWAY_INFO = new ModelInfo("metapelite",
            "Vielzeuf, D. & Holloway, J.R. (1988) Experimental determination of the fluid-absent melting relations in "
                    + "the pelitic system. Contributions to Mineralogy and Petrology 98, 257-276 (DOI from memory)",
            "10.1007/BF00375178");
    /** Patiño Douce &amp; Johnston (1991), melt productivity of a pelite at 0.7–1.3 GPa. */
    public static final ModelInfo PATINO_DOUCE_JOHNSTON_INFO = new ModelInfo("metapelite",
            "Patino Douce, A.E. & Johnston, A.D. (1991) Phase equilibria and melt productivity in the pelitic system: "
                    + "implications for the origin of peraluminous granitoids and aluminous granulites. Contributions to "
                    + "Mineralogy and Petrology 107, 202-218 (DOI from memory)",
            "10.1007/BF00310707");
    /** Rapp &amp; Watson (1995), dehydration melting of metabasalt at 0.8–3.2 GPa. */
    public static final ModelInfo RAPP_WATSON_INFO = new ModelInfo("amphibolite",
            "Rapp, R.P. & Watson, E.B. (1995) Dehydration melting of metabasalt at 8-32 kbar: implications for "
                    + "continental growth and crust-mantle recycling. Journal of Petrology 36, 891-931 (DOI from memory)",
            "10.1093/petrology/36.4.891");
    /** Basalt crystallisation interval, common practice. */
    public static final ModelInfo BASALT_INFO = new ModelInfo("basalt",
            "Basalt crystallising between about 1200 and 1000 °C (common practice, no single source); "
                    + "melt fraction linear in between (approximate)",
            "");

    /** Where the melt curve at a pressure comes from. */
    private final DoubleFunction<MeltCurve> curves;
    /** The F(T, P) table behind {@link #curves}, or {@code null} for a curve used at every pressure or a closed form. */
    private final MeltTable table;
    private final ModelInfo info;
    private final List<ModelInfo> citations;
    private final String name;
    private final Kind kind;
    private final double minPressure;
    private final double maxPressure;
    private final ThermalProperties thermal;
    private final boolean waterSaturated;
    private final boolean callerCurve;
    private final HuangWyllie1973Granite granite;

    private CrustalLithology(DoubleFunction<MeltCurve> curves, ModelInfo info, List<ModelInfo> citations, String name,
                             Kind kind, double minPressure, double maxPressure, ThermalProperties thermal,
                             boolean waterSaturated, boolean callerCurve, HuangWyllie1973Granite granite) {
        this(curves, null, info, citations, name, kind, minPressure, maxPressure, thermal, waterSaturated, callerCurve,
                granite);
    }

    private CrustalLithology(MeltTable table, ModelInfo info, List<ModelInfo> citations, String name, Kind kind,
                             double minPressure, double maxPressure, ThermalProperties thermal, boolean callerCurve) {
        this(table::curveAt, table, info, citations, name, kind, minPressure, maxPressure, thermal, false, callerCurve,
                null);
    }

    private CrustalLithology(DoubleFunction<MeltCurve> curves, MeltTable table, ModelInfo info, List<ModelInfo> citations,
                             String name, Kind kind, double minPressure, double maxPressure, ThermalProperties thermal,
                             boolean waterSaturated, boolean callerCurve, HuangWyllie1973Granite granite) {
        this.curves = curves;
        this.table = table;
        this.info = info;
        this.citations = List.copyOf(citations);
        this.name = name;
        this.kind = kind;
        this.minPressure = minPressure;
        this.maxPressure = maxPressure;
        this.thermal = thermal;
        this.waterSaturated = waterSaturated;
        this.callerCurve = callerCurve;
        this.granite = granite;
    }

    private static MeltCurve celsiusCurve(double[] temperaturesC, double[] fractions) {
        double[] k = new double[temperaturesC.length];
        for (int i = 0; i < k.length; i++) {
            k[i] = temperaturesC[i] + ZERO_C;
        }
        return new MeltCurve(k, fractions);
    }

    /**
     * Granite with excess water: solidus and liquidus after Huang &amp; Wyllie (1973), pressure
     * dependent, F linear in between. Thermal properties: ρ = 2650 kg/m³ (common practice),
     * c = 1100 J/kg/K and L = 270 kJ/kg (within 1000–1200 J/kg/K and 250–300 kJ/kg, REFERENCES §3.5,
     * from memory), k from the granite law of Miao et al. (2014) at 20 °C (2.66 W/m/K).
     */
    public static CrustalLithology graniteWaterSaturated() {
        HuangWyllie1973Granite g = new HuangWyllie1973Granite();
        return new CrustalLithology(g::curveAt, HuangWyllie1973Granite.INFO, List.of(HuangWyllie1973Granite.INFO),
                "Granite, water-saturated (Huang & Wyllie 1973)", Kind.CRUST,
                HuangWyllie1973Granite.ANCHOR_LOW_GPA * 1e9, HuangWyllie1973Granite.ANCHOR_HIGH_GPA * 1e9,
                new ThermalProperties(2650, 1100, 270e3, FELSIC_CONDUCTIVITY), true, false, g);
    }

    /**
     * Metapelite, fluid-absent: melt fraction F(T, P) from the table {@link #METAPELITE_TABLE}, whose
     * header names its sources (Le Breton &amp; Thompson 1988; Vielzeuf &amp; Holloway 1988; Patiño
     * Douce &amp; Johnston 1991; values from memory, about ±0.10 in F and ±25 K). At 1 GPa: 0 at 750 °C,
     * 5 % at 800, 25 % at 850, 45 % at 900 and 60 % at 1000 °C (REFERENCES §3.4); the onset rises from
     * 700 °C at 0.5 GPa to 790 °C at 1.5 GPa with the dehydration-melting reactions. The curve stops
     * at 60 %: no liquidus. Thermal properties: ρ = 2750 kg/m³ (common practice), c = 1100 J/kg/K,
     * L = 270 kJ/kg (REFERENCES §3.5, from memory), felsic k (Miao et al. 2014, granite law at 20 °C).
     */
    public static CrustalLithology metapelite() {
        return new CrustalLithology(METAPELITE, METAPELITE_INFO, List.of(METAPELITE_INFO, VIELZEUF_HOLLOWAY_INFO,
                PATINO_DOUCE_JOHNSTON_INFO), "Metapelite, fluid-absent (approximate F(T, P), 0.5-1.5 GPa)", Kind.CRUST,
                METAPELITE_MIN_GPA * 1e9, METAPELITE_MAX_GPA * 1e9,
                new ThermalProperties(2750, 1100, 270e3, FELSIC_CONDUCTIVITY), false);
    }

    /**
     * Amphibolite, fluid-absent (dehydration melting): melt fraction F(T, P) from the table
     * {@link #AMPHIBOLITE_TABLE}, whose header names its sources (Beard &amp; Lofgren 1991 at 0.3 GPa;
     * Wolf &amp; Wyllie 1994 at 1 GPa; Rapp &amp; Watson 1995 at 0.8–3.2 GPa; values from memory, about
     * ±0.10 in F and ±25 K). Onset 850 °C up to 1.6 GPa, 875 °C at 2 GPa; at 1 GPa 12 % at 900, 20 % at
     * 950, 30 % at 1000 and 40 % at 1050 °C (REFERENCES §3.4). The curve stops at 40 %: no liquidus. Thermal properties:
     * ρ = 3000 kg/m³ (common practice), c = 1100 J/kg/K, L = 270 kJ/kg (REFERENCES §3.5, from memory),
     * mafic k (Miao et al. 2014, gabbro law at 20 °C, 2.27 W/m/K).
     */
    public static CrustalLithology amphibolite() {
        return new CrustalLithology(AMPHIBOLITE, AMPHIBOLITE_INFO, List.of(AMPHIBOLITE_INFO,
                AMPHIBOLITE_WOLF_WYLLIE_INFO, RAPP_WATSON_INFO), "Amphibolite, fluid-absent (approximate F(T, P), "
                + "0.3-2.0 GPa)", Kind.CRUST, AMPHIBOLITE_MIN_GPA * 1e9, AMPHIBOLITE_MAX_GPA * 1e9,
                new ThermalProperties(3000, 1100, 270e3, MAFIC_CONDUCTIVITY), false);
    }

    /**
     * Basalt as an intrusion: fully molten at 1200 °C, solid at 1000 °C, F linear in between
     * (common practice). Thermal properties: ρ = 2900 kg/m³ (common practice), c = 1200 J/kg/K
     * (REFERENCES §3.5, from memory), L = 350 kJ/kg (within the 320–400 kJ/kg used in models,
     * REFERENCES §3.5), mafic k (Miao et al. 2014, gabbro law at 20 °C).
     */
    public static CrustalLithology basalt() {
        MeltCurve c = celsiusCurve(new double[] {1000, 1200}, new double[] {0, 1});
        return new CrustalLithology(p -> c, BASALT_INFO, List.of(BASALT_INFO),
                "Basalt intrusion crystallising over 1200-1000 °C", Kind.INTRUSION,
                BASALT_MIN_GPA * 1e9, BASALT_MAX_GPA * 1e9,
                new ThermalProperties(2900, 1200, 350e3, MAFIC_CONDUCTIVITY), false, false, null);
    }

    /**
     * The same rock with the caller's melt curve, used at every pressure (no calibration warnings:
     * the caller vouches for the curve).
     *
     * @param curve the caller's F(T), temperatures in K
     */
    public CrustalLithology withCurve(MeltCurve curve) {
        ModelInfo callers = new ModelInfo(info.id(), "melt curve supplied by the caller (used at every pressure)", "");
        return new CrustalLithology(p -> curve, info, List.of(callers), baseName() + " (caller's melt curve)", kind,
                0.0, HARD_MAX_GPA * 1e9, thermal, waterSaturated, true, null);
    }

    /**
     * The same rock with the caller's F(T, P) table, used within its pressures (the nearest row beyond
     * them; a caller such as the sill model checks that the table covers its column).
     *
     * @param callers the caller's table, temperatures in K, pressures in Pa
     */
    public CrustalLithology withTable(MeltTable callers) {
        ModelInfo own = new ModelInfo(info.id(), "melt table F(T, P) supplied by the caller", "");
        return new CrustalLithology(callers, info, List.of(own), baseName() + " (caller's melt table)", kind,
                callers.minPressure(), callers.maxPressure(), thermal, true);
    }

    /** The same rock with other thermal properties. */
    public CrustalLithology withThermalProperties(ThermalProperties properties) {
        return new CrustalLithology(curves, table, info, citations, name, kind, minPressure, maxPressure, properties,
                waterSaturated, callerCurve, granite);
    }

    /** The F(T, P) table behind the melt curves, or {@code null} when the curve does not come from one. */
    public MeltTable meltTable() {
        return table;
    }

    private String baseName() {
        int i = name.indexOf(" (");
        return i < 0 ? name : name.substring(0, i);
    }

    /** Default thermal properties of the rock (SI). */
    public ThermalProperties thermalProperties() {
        return thermal;
    }

    /** True when the melt curve was supplied by the caller. */
    public boolean callerCurve() {
        return callerCurve;
    }

    /** True when the curve assumes a free water phase (water-saturated granite). */
    public boolean waterSaturated() {
        return waterSaturated;
    }

    /** The melt curve used at pressure {@code p} (Pa). */
    public MeltCurve curveAt(double p) {
        return curves.apply(p);
    }

    @Override
    public ModelInfo info() {
        return info;
    }

    @Override
    public List<ModelInfo> citations() {
        return citations;
    }

    @Override
    public String name() {
        return name;
    }

    @Override
    public Kind kind() {
        return kind;
    }

    /** Always false: bulk water is not an input (the curve fixes the water conditions). */
    @Override
    public boolean hydrous() {
        return false;
    }

    @Override
    public double minPressure() {
        return minPressure;
    }

    @Override
    public double maxPressure() {
        return maxPressure;
    }

    @Override
    public double hardMaxPressure() {
        return HARD_MAX_GPA * 1e9;
    }

    /** Always 0: bulk water is not an input. */
    @Override
    public double maxBulkWater() {
        return 0.0;
    }

    /**
     * Solidus of the rock without added water (K): the curve's solidus for fluid-absent rocks and
     * intrusions; {@code NaN} for water-saturated granite, whose curve says nothing about the dry rock.
     */
    @Override
    public double drySolidus(double p) {
        return waterSaturated ? Double.NaN : curveAt(p).solidus();
    }

    /** The curve's solidus (K) at pressure {@code p}; water is not an input. */
    @Override
    public double solidus(double p, double bulkWater) {
        return granite != null ? granite.solidus(p) : curveAt(p).solidus();
    }

    /** The curve's liquidus (K), or {@code NaN} when the curve stops short of full melting. */
    @Override
    public double liquidus(double p, double bulkWater) {
        if (granite != null) {
            return granite.liquidus(p);
        }
        MeltCurve c = curveAt(p);
        return c.maxFraction() >= 1.0 ? c.liquidus() : Double.NaN;
    }

    /** Melt fraction from the curve at pressure {@code p} (Pa) and temperature {@code t} (K); no range check. */
    @Override
    public double meltFraction(double p, double t, double bulkWater) {
        return curveAt(p).fractionAt(t);
    }

    /** The lowest temperature (K) at which the curve reaches melt fraction {@code f}. */
    public double temperatureAt(double p, double f) {
        return curveAt(p).temperatureAt(f);
    }

    @Override
    public MeltState melt(double p, double t, double bulkWater) {
        if (!(p >= 0) || p > hardMaxPressure()) {
            throw new EngineException(String.format(Locale.ROOT,
                    "%s gives no number at %.3g GPa: pressure must be between 0 and %.0f GPa",
                    id(), p * 1e-9, HARD_MAX_GPA));
        }
        if (bulkWater != 0) {
            throw new EngineException(id() + " does not take bulk water: its melt curve already fixes the water conditions");
        }
        List<String> warnings = new ArrayList<>(2);
        if (p < minPressure || p > maxPressure) {
            warnings.add(String.format(Locale.ROOT,
                    "pressure %.2f GPa is outside the %.1f-%.1f GPa range behind the %s curve: used as is",
                    p * 1e-9, minPressure * 1e-9, maxPressure * 1e-9, id()));
        }
        if (!callerCurve) {
            warnings.add(APPROXIMATE_CURVE_NOTE);
        }
        MeltCurve c = curveAt(p);
        double liquidus = c.maxFraction() >= 1.0 ? c.liquidus() : Double.NaN;
        return new MeltState(c.fractionAt(t), c.solidus(), drySolidus(p), liquidus, 0.0, waterSaturated, false,
                warnings);
    }

    @Override
    public String toString() {
        return "CrustalLithology[" + id() + (callerCurve ? ", caller's curve" : "") + "]";
    }
}
