package org.tectomelt.engine.melting;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.function.DoubleUnaryOperator;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;

/**
 * Anhydrous melting of a MORB-like pyroxenite (eclogite "G2") in the form of Pertermann &amp;
 * Hirschmann (2003).
 *
 * <p>Equations (P in GPa, T in °C inside the formulas):
 * <pre>
 *   solidus             Ts = S1 + S2 P
 *   liquidus            Tl = L1 + L2 P
 *   reduced temperature T′ = (T − Ts) / (Tl − Ts)
 *   melt fraction       F  = a T′² + b T′,   a + b = 1     (0 ≤ T′ ≤ 1)
 *   inverse             T′ = [−b + √(b² + 4 a F)] / (2a)
 * </pre>
 * F rises with T′ ever faster (dF/dT′ = b at the solidus, 2a + b at the liquidus), the rapid
 * near-liquidus melting of a rock with no olivine buffer.
 *
 * <p>Source: Pertermann, M. &amp; Hirschmann, M.M. (2003) Partial melting experiments on a MORB-like
 * pyroxenite between 2 and 3 GPa: constraints on the presence of pyroxenite in basalt source regions
 * from solidus location and melting rate. Journal of Geophysical Research 108(B2), 2125,
 * doi:10.1029/2000JB000118 (DOI from memory). <b>What is recalled and what is chosen here.</b> The
 * quadratic form in T′ and a = 0.7368, b = 0.2632 are from memory of that parameterization. The
 * solidus and liquidus coefficients are <em>not</em> recalled with confidence; they are chosen here
 * as straight lines through the experimental brackets as remembered — solidus about 1220 °C at
 * 2 GPa and 1300 °C at 3 GPa, a melting interval of about 230 K — so that the solidus lies 110–140 K
 * below the Katz et al. (2003) peridotite solidus at 2–3 GPa, inside the 100–200 K that
 * Pertermann &amp; Hirschmann (2003), Kogiso et al. (2004) and Hirschmann &amp; Stolper (1996) report for
 * such pyroxenites (REFERENCES §6, from memory). Check a result that matters against the paper.
 *
 * <p>Thermodynamic constants: those of the peridotite of Katz et al. (2003, Table 2), so that in a
 * two-lithology column the rocks differ only in their melting laws (Shorttle et al. 2014 likewise
 * give both rocks one heat capacity; from memory). Real eclogite is denser (about 3.4–3.5 t/m³).
 *
 * <p>Validity: the experiments span {@value #EXPERIMENT_MIN_GPA}–{@value #EXPERIMENT_MAX_GPA} GPa;
 * results from {@value #CALIBRATED_MIN_GPA} to {@value #CALIBRATED_MAX_GPA} GPa are given without
 * warning, outside with a warning (the lines are extrapolated: a hot plume meets this solidus near
 * 5–7 GPa), and beyond {@value #HARD_MAX_GPA} GPa the model refuses. Dry only. Accuracy: the solidus
 * to some tens of kelvin near 2–3 GPa, F to several per cent absolute; far less certain outside.
 */
public record PertermannHirschmann2003Pyroxenite() implements MantleLithology {

    /** Provenance. */
    public static final ModelInfo INFO = new ModelInfo("pyroxenite-pertermann-hirschmann2003",
            "Pertermann, M. & Hirschmann, M.M. (2003) Partial melting experiments on a MORB-like pyroxenite "
                    + "between 2 and 3 GPa: constraints on the presence of pyroxenite in basalt source regions from "
                    + "solidus location and melting rate. Journal of Geophysical Research 108(B2), 2125 (G2 "
                    + "eclogite; solidus and liquidus lines chosen through the recalled brackets)",
            "10.1029/2000JB000118");

    /** Lowest pressure of the experiments (GPa). */
    public static final double EXPERIMENT_MIN_GPA = 2.0;
    /** Highest pressure of the experiments (GPa). */
    public static final double EXPERIMENT_MAX_GPA = 3.0;
    /** Lower end of the range given without warning (GPa). */
    public static final double CALIBRATED_MIN_GPA = 1.5;
    /** Upper end of the range given without warning (GPa). */
    public static final double CALIBRATED_MAX_GPA = 3.5;
    /** Beyond this pressure (GPa) the model refuses. */
    public static final double HARD_MAX_GPA = 8.0;

    /** Solidus Ts = S1 + S2 P (°C, °C/GPa): chosen here through 1220 °C at 2 GPa and 1300 °C at 3 GPa. */
    static final double S1 = 1060.0, S2 = 80.0;
    /** Liquidus Tl = L1 + L2 P (°C, °C/GPa): 230 K above the solidus (chosen here). */
    static final double L1 = 1290.0, L2 = 80.0;
    /** F = a T′² + b T′ (from memory). */
    static final double A = 0.7368, B = 0.2632;

    /** Thermodynamic constants: Katz et al. (2003, Table 2), as for the peridotite. */
    public static final MantleThermodynamics THERMODYNAMICS = Katz2003Peridotite.THERMODYNAMICS;

    private static final double ZERO_C = 273.15;

    @Override
    public ModelInfo info() {
        return INFO;
    }

    @Override
    public String name() {
        return "Pyroxenite, MORB-like eclogite G2 (Pertermann & Hirschmann 2003), dry";
    }

    @Override
    public Kind kind() {
        return Kind.MANTLE;
    }

    @Override
    public boolean hydrous() {
        return false;
    }

    @Override
    public double minPressure() {
        return CALIBRATED_MIN_GPA * 1e9;
    }

    @Override
    public double maxPressure() {
        return CALIBRATED_MAX_GPA * 1e9;
    }

    @Override
    public double hardMaxPressure() {
        return HARD_MAX_GPA * 1e9;
    }

    @Override
    public double maxBulkWater() {
        return 0.0;
    }

    @Override
    public MantleThermodynamics thermodynamics() {
        return THERMODYNAMICS;
    }

    @Override
    public double drySolidus(double p) {
        return S1 + S2 * p * 1e-9 + ZERO_C;
    }

    /** Liquidus (K). */
    public double dryLiquidus(double p) {
        return L1 + L2 * p * 1e-9 + ZERO_C;
    }

    @Override
    public double solidus(double p, double bulkWater) {
        return drySolidus(p);
    }

    @Override
    public double liquidus(double p, double bulkWater) {
        return dryLiquidus(p);
    }

    /** F(T′) = a T′² + b T′ on [0, 1], clamped outside. */
    public static double meltFractionAtReducedTemperature(double tPrime) {
        if (tPrime <= 0) {
            return 0.0;
        }
        if (tPrime >= 1) {
            return 1.0;
        }
        return (A * tPrime + B) * tPrime;
    }

    @Override
    public double meltFraction(double p, double t, double bulkWater) {
        double ts = drySolidus(p);
        return meltFractionAtReducedTemperature((t - ts) / (dryLiquidus(p) - ts));
    }

    /** The solidus and liquidus at {@code p} evaluated once. */
    @Override
    public DoubleUnaryOperator meltFractionAt(double p, double bulkWater) {
        double ts = drySolidus(p);
        double tq = dryLiquidus(p);
        return t -> meltFractionAtReducedTemperature((t - ts) / (tq - ts));
    }

    @Override
    public double temperatureAt(double p, double f, double bulkWater) {
        if (!(f >= 0 && f <= 1)) {
            throw new EngineException("melt fraction must be between 0 and 1, got " + f);
        }
        double tPrime = (-B + Math.sqrt(B * B + 4 * A * f)) / (2 * A);
        double ts = drySolidus(p);
        return ts + tPrime * (dryLiquidus(p) - ts);
    }

    @Override
    public MeltState melt(double p, double t, double bulkWater) {
        if (!(p >= 0) || p > hardMaxPressure()) {
            throw new EngineException(String.format(Locale.ROOT,
                    "Pertermann & Hirschmann (2003) pyroxenite gives no number at %.3g GPa: pressure must be between "
                            + "0 and %.0f GPa", p * 1e-9, HARD_MAX_GPA));
        }
        if (bulkWater != 0) {
            throw new EngineException("Pertermann & Hirschmann (2003) pyroxenite is a dry model: bulk water must be 0");
        }
        List<String> warnings = new ArrayList<>(1);
        if (p < minPressure() || p > maxPressure()) {
            warnings.add(String.format(Locale.ROOT, "pressure %.2f GPa is outside the %.1f–%.1f GPa where the "
                    + "Pertermann & Hirschmann (2003) pyroxenite lines are anchored (experiments at 2–3 GPa): "
                    + "extrapolated", p * 1e-9, CALIBRATED_MIN_GPA, CALIBRATED_MAX_GPA));
        }
        double ts = drySolidus(p);
        double tl = dryLiquidus(p);
        return new MeltState(meltFractionAtReducedTemperature((t - ts) / (tl - ts)), ts, ts, tl, 0.0, false, false,
                warnings);
    }
}
