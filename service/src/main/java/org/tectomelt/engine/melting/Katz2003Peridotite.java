package org.tectomelt.engine.melting;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.function.DoubleUnaryOperator;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;

/**
 * Peridotite melting after Katz, Spiegelman &amp; Langmuir (2003), dry and hydrous.
 *
 * <p>Equations (P in GPa, T in °C, water X in wt% inside the formulas):
 * <pre>
 *   anhydrous solidus    Ts = A1 + A2 P + A3 P²
 *   lherzolite liquidus  Tl = B1 + B2 P + B3 P²
 *   liquidus             Tq = C1 + C2 P + C3 P²
 *   Rcpx = r1 + r2 P,  F_cpx-out = Mcpx / Rcpx,  T_cpx-out = F_cpx-out^(1/β1) (Tl − Ts) + Ts
 *   F = [(T − Ts)/(Tl − Ts)]^β1                                        F ≤ F_cpx-out
 *   F = F_cpx-out + (1 − F_cpx-out) [(T − T_cpx-out)/(Tq − T_cpx-out)]^β2   above
 *   water: all curves are lowered by ΔT = K X^γ, X = Xbulk / (D + F (1 − D)),
 *          X ≤ Xsat = χ1 P^λ + χ2 P
 * </pre>
 * With water F appears on both sides; it is solved with a bracketing root finder (Brent), which
 * always converges because F − F(T + ΔT(F)) increases monotonically in F on [0, 1].
 *
 * <p>Source: Katz, R.F., Spiegelman, M. &amp; Langmuir, C.H. (2003) A new parameterization of
 * hydrous mantle melting. Geochemistry, Geophysics, Geosystems 4(9), 1073,
 * doi:10.1029/2002GC000433; parameters of their Table 2 as listed in REFERENCES.md §2.1 (from
 * memory there; A2 and A3 coincide with Hirschmann 2000).
 *
 * <p>Validity: calibrated on experiments from 0 to about {@value #CALIBRATED_MAX_GPA} GPa; results up
 * to {@value #HARD_MAX_GPA} GPa carry a warning, beyond that the model refuses. Bulk water up to
 * {@value #MAX_BULK_WATER_WT_PCT} wt%. Accuracy: the fits reproduce the experimental melt
 * fractions to a few percent absolute and the solidus to some tens of kelvin; the
 * cpx mode {@code Mcpx} (0.17, fertile) is the least certain parameter.
 *
 * <p>Water-saturated solidus. With {@link WetSolidus#KATZ2003} (the default) the law is the paper's.
 * With {@link WetSolidus#EXPERIMENTAL} the lowering is rescaled with pressure so that the saturated
 * solidus is the experimental one of {@link WaterSaturatedPeridotiteSolidus} (Grove et al. 2006; Till
 * et al. 2012): ΔT = s(P)·K·X^γ with s(P) = [Ts(P) − T_sat,exp(P)] / (K·Xsat(P)^γ). The shape of the
 * lowering in X (γ = 0.75), the saturation water Xsat and the dry law are Katz's; only the size of the
 * lowering changes: about +15 % at 2 GPa and +25 to +30 % from 3 to 6 GPa, so there less water
 * starts melting at a given wedge temperature and more melt forms at a given water (tested); near
 * 1 GPa the experimental curve (about 1000 °C) is the hotter one and the lowering is smaller. s(P) is
 * held at its 1 and 6 GPa values outside the experiments. This is a choice made here to let the wedge
 * reach the experimental solidus, not a published law.
 *
 * @param cpxMode    modal (mass) fraction Mcpx of clinopyroxene in the source (0.17 fertile; Katz et al.
 *                   give 0.10–0.17 from depleted to fertile)
 * @param wetSolidus which water-saturated solidus the lowering reaches
 */
public record Katz2003Peridotite(double cpxMode, WetSolidus wetSolidus) implements MantleLithology {

    /** Which water-saturated solidus the hydrous lowering reaches. */
    public enum WetSolidus {
        /** Katz et al. (2003) as published: ΔT = K·X^γ. */
        KATZ2003,
        /** Rescaled to the experimental saturated solidus of Grove et al. (2006) and Till et al. (2012). */
        EXPERIMENTAL
    }

    /** Provenance of the variant whose saturated solidus is the experimental one. */
    public static final ModelInfo EXPERIMENTAL_WET_INFO = new ModelInfo("peridotite-katz2003-experimental-wet",
            "Katz, R.F., Spiegelman, M. & Langmuir, C.H. (2003) G-cubed 4(9), 1073, with the hydrous solidus "
                    + "lowering rescaled to the experimental water-saturated solidus of Grove et al. (2006) and "
                    + "Till, Grove & Withers (2012)",
            "10.1029/2002GC000433");
    /** Lowest cpx mass fraction of the paper's depleted-to-fertile range. */
    public static final double DEPLETED_CPX_MODE = 0.10;

    /** Provenance. */
    public static final ModelInfo INFO = new ModelInfo("peridotite-katz2003",
            "Katz, R.F., Spiegelman, M. & Langmuir, C.H. (2003) A new parameterization of hydrous mantle "
                    + "melting. Geochemistry, Geophysics, Geosystems 4(9), 1073",
            "10.1029/2002GC000433");

    /** Upper end of the experimental calibration (GPa). */
    public static final double CALIBRATED_MAX_GPA = 8.0;
    /** Beyond this pressure (GPa) the model refuses. */
    public static final double HARD_MAX_GPA = 10.0;
    /** Largest accepted bulk water (wt%). */
    public static final double MAX_BULK_WATER_WT_PCT = 5.0;
    /** Default modal cpx of a fertile source. */
    public static final double FERTILE_CPX_MODE = 0.17;

    // Table 2 of Katz et al. (2003): °C, °C/GPa, °C/GPa².
    static final double A1 = 1085.7, A2 = 132.9, A3 = -5.1;
    static final double B1 = 1475.0, B2 = 80.0, B3 = -3.2;
    static final double C1 = 1780.0, C2 = 45.0, C3 = -2.0;
    static final double R1 = 0.50, R2 = 0.08;
    static final double BETA1 = 1.50, BETA2 = 1.50;
    /** K (°C / wt%^γ) and γ of the solidus depression ΔT = K X^γ. */
    static final double K = 43.0, GAMMA = 0.75;
    /** Bulk/melt partition coefficient of water. */
    static final double D_WATER = 0.01;
    /** Saturation: Xsat = χ1 P^λ + χ2 P (wt%). */
    static final double CHI1 = 12.0, CHI2 = 1.0, LAMBDA = 0.6;

    /** Table 2 thermodynamic constants. */
    public static final MantleThermodynamics THERMODYNAMICS =
            new MantleThermodynamics(1000.0, 300.0, 4.0e-5, 6.8e-5, 3300.0, 2900.0);

    private static final double ZERO_C = 273.15;
    private static final double ROOT_ACCURACY = 1e-12;
    private static final int MAX_EVALUATIONS = 200;

    /** Validates the cpx mode. */
    public Katz2003Peridotite {
        if (!(cpxMode > 0 && cpxMode <= 0.5)) {
            throw new EngineException("cpx mode must be between 0 and 0.5, got " + cpxMode);
        }
        if (wetSolidus == null) {
            throw new IllegalArgumentException("wetSolidus is required");
        }
    }

    /** The published law with cpx mass fraction {@code cpxMode}. */
    public Katz2003Peridotite(double cpxMode) {
        this(cpxMode, WetSolidus.KATZ2003);
    }

    /** The same source with its saturated solidus pinned to the experiments. */
    public Katz2003Peridotite withExperimentalWetSolidus() {
        return new Katz2003Peridotite(cpxMode, WetSolidus.EXPERIMENTAL);
    }

    /** The fertile source of the paper (Mcpx = 0.17). */
    public static Katz2003Peridotite fertile() {
        return new Katz2003Peridotite(FERTILE_CPX_MODE);
    }

    @Override
    public ModelInfo info() {
        return wetSolidus == WetSolidus.KATZ2003 ? INFO : EXPERIMENTAL_WET_INFO;
    }

    @Override
    public List<ModelInfo> citations() {
        return wetSolidus == WetSolidus.KATZ2003 ? List.of(INFO)
                : List.of(EXPERIMENTAL_WET_INFO, INFO, WaterSaturatedPeridotiteSolidus.INFO);
    }

    @Override
    public String name() {
        return wetSolidus == WetSolidus.KATZ2003 ? "Peridotite (Katz, Spiegelman & Langmuir 2003), dry and hydrous"
                : "Peridotite (Katz et al. 2003), hydrous lowering reaching the experimental water-saturated solidus";
    }

    /** Bulk/melt partition coefficient of water, D = 0.01. */
    @Override
    public double waterPartition() {
        return D_WATER;
    }

    /** Dry melt fraction at t raised by the lowering for water {@code waterInMelt} in the melt (capped at saturation). */
    @Override
    public double meltFractionAtMeltWater(double p, double t, double waterInMelt) {
        return dryMeltFraction(p, t + depression(p, Math.min(waterInMelt, waterSaturation(p))));
    }

    @Override
    public Kind kind() {
        return Kind.MANTLE;
    }

    @Override
    public boolean hydrous() {
        return true;
    }

    @Override
    public double minPressure() {
        return 0.0;
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
        return MAX_BULK_WATER_WT_PCT / 100.0;
    }

    @Override
    public MantleThermodynamics thermodynamics() {
        return THERMODYNAMICS;
    }

    /** Anhydrous solidus Ts (K). */
    @Override
    public double drySolidus(double p) {
        double g = gpa(p);
        return A1 + A2 * g + A3 * g * g + ZERO_C;
    }

    /** Lherzolite liquidus Tl (K): where the dry cpx-bearing assemblage would be fully molten. */
    public double lherzoliteLiquidus(double p) {
        double g = gpa(p);
        return B1 + B2 * g + B3 * g * g + ZERO_C;
    }

    /** Dry liquidus Tq (K). */
    public double dryLiquidus(double p) {
        double g = gpa(p);
        return C1 + C2 * g + C3 * g * g + ZERO_C;
    }

    /** Melt fraction at which cpx is exhausted, F_cpx-out = Mcpx / (r1 + r2 P), capped at 1. */
    public double cpxExhaustionFraction(double p) {
        return Math.min(1.0, cpxMode / (R1 + R2 * gpa(p)));
    }

    /** Dry temperature of cpx exhaustion T_cpx-out (K). */
    public double cpxExhaustionTemperature(double p) {
        double ts = drySolidus(p);
        return Math.pow(cpxExhaustionFraction(p), 1.0 / BETA1) * (lherzoliteLiquidus(p) - ts) + ts;
    }

    /** Water content of a water-saturated melt, Xsat (mass fraction). */
    public double waterSaturation(double p) {
        double g = gpa(p);
        return (CHI1 * Math.pow(g, LAMBDA) + CHI2 * g) / 100.0;
    }

    /** Lowering of the curves ΔT = K X^γ (K) for water {@code waterInMelt} (mass fraction) in the melt. */
    public static double solidusDepression(double waterInMelt) {
        return waterInMelt <= 0 ? 0.0 : K * Math.pow(waterInMelt * 100.0, GAMMA);
    }

    /**
     * Lowering (K) of the curves at pressure {@code p} (Pa) for water {@code waterInMelt} (mass
     * fraction) in the melt: K·X^γ, times the experimental rescaling s(P) for
     * {@link WetSolidus#EXPERIMENTAL}.
     */
    public double depression(double p, double waterInMelt) {
        double d = solidusDepression(waterInMelt);
        return wetSolidus == WetSolidus.KATZ2003 || d == 0 ? d : d * experimentalScale(p);
    }

    /** s(P) = [Ts(P) − T_sat,exp(P)] / (K·Xsat(P)^γ); the experimental curve is held at its ends outside 1–6 GPa. */
    double experimentalScale(double p) {
        double pc = Math.min(Math.max(p, WaterSaturatedPeridotiteSolidus.MIN_GPA * 1e9),
                WaterSaturatedPeridotiteSolidus.MAX_GPA * 1e9);
        double target = drySolidus(pc) - WaterSaturatedPeridotiteSolidus.temperature(pc);
        return target / solidusDepression(waterSaturation(pc));
    }

    /** The water-saturated solidus (K): the dry solidus lowered by ΔT(Xsat). */
    public double saturatedSolidus(double p) {
        return drySolidus(p) - depression(p, waterSaturation(p));
    }

    /** Solidus (K) lowered by bulk water: incipient melt carries Xbulk / D, capped at saturation. */
    public double wetSolidus(double p, double bulkWater) {
        return drySolidus(p) - depression(p, waterInMelt(p, 0.0, bulkWater));
    }

    /** Same as {@link #wetSolidus}. */
    @Override
    public double solidus(double p, double bulkWater) {
        return wetSolidus(p, bulkWater);
    }

    /** Same as {@link #wetLiquidus}. */
    @Override
    public double liquidus(double p, double bulkWater) {
        return wetLiquidus(p, bulkWater);
    }

    /** Liquidus (K) at bulk water: the melt carries all the water, capped at saturation. */
    public double wetLiquidus(double p, double bulkWater) {
        return dryLiquidus(p) - depression(p, waterInMelt(p, 1.0, bulkWater));
    }

    /** Water in the melt (mass fraction) at melt fraction {@code f}: Xbulk / (D + F(1 − D)), capped at Xsat. */
    @Override
    public double waterInMelt(double p, double f, double bulkWater) {
        if (bulkWater <= 0) {
            return 0.0;
        }
        return Math.min(bulkWater / (D_WATER + f * (1.0 - D_WATER)), waterSaturation(p));
    }

    /** Xsat(P) − Xbulk / (D + F(1 − D)): where it crosses zero, {@link #waterInMelt} meets its cap. */
    @Override
    public double waterSaturationMargin(double p, double f, double bulkWater) {
        if (bulkWater <= 0) {
            return Double.POSITIVE_INFINITY;
        }
        return waterSaturation(p) - bulkWater / (D_WATER + f * (1.0 - D_WATER));
    }

    /** Dry melt fraction at an effective temperature (K) at pressure p. */
    double dryMeltFraction(double p, double t) {
        double ts = drySolidus(p);
        if (t <= ts) {
            return 0.0;
        }
        return dryLaw(p, ts).meltFraction(t);
    }

    /** The dry law's curves at pressure {@code p} whose dry solidus is {@code ts} (K). */
    private DryLaw dryLaw(double p, double ts) {
        double tl = lherzoliteLiquidus(p);
        double fCpx = cpxExhaustionFraction(p);
        return new DryLaw(ts, tl, dryLiquidus(p), fCpx, Math.pow(fCpx, 1.0 / BETA1) * (tl - ts) + ts);
    }

    /**
     * The dry melt-fraction law at one pressure, its curves evaluated once (all K): solidus, lherzolite
     * liquidus, liquidus, and the melt fraction and temperature of cpx exhaustion.
     */
    private record DryLaw(double ts, double tl, double tq, double fCpx, double tCpx) {
        double meltFraction(double t) {
            if (t <= ts) {
                return 0.0;
            }
            if (t < tCpx) {
                return Math.pow((t - ts) / (tl - ts), BETA1);
            }
            if (t >= tq) {
                return 1.0;
            }
            return fCpx + (1.0 - fCpx) * Math.pow((t - tCpx) / (tq - tCpx), BETA2);
        }
    }

    @Override
    public MeltState melt(double p, double t, double bulkWater) {
        List<String> warnings = check(p, bulkWater);
        double f = meltFraction(p, t, bulkWater);
        double xMelt = f > 0 ? waterInMelt(p, f, bulkWater) : 0.0;
        boolean saturated = bulkWater > 0 && bulkWater / (D_WATER + f * (1.0 - D_WATER)) >= waterSaturation(p);
        if (saturated) {
            warnings.add("water exceeds what the melt can dissolve at this pressure: the excess is a free fluid phase");
        }
        boolean cpxOut = f > 0 && f >= cpxExhaustionFraction(p) - 1e-12;
        return new MeltState(f, wetSolidus(p, bulkWater), drySolidus(p), wetLiquidus(p, bulkWater), xMelt,
                saturated, cpxOut, warnings);
    }

    /** The dry law's curves at {@code p} evaluated once; hydrous water contents use {@link #meltFraction}. */
    @Override
    public DoubleUnaryOperator meltFractionAt(double p, double bulkWater) {
        if (bulkWater > 0) {
            return t -> meltFraction(p, t, bulkWater);
        }
        return dryLaw(p, drySolidus(p))::meltFraction;
    }

    /** Melt fraction only (the hot path of columns and batches); no range check. */
    @Override
    public double meltFraction(double p, double t, double bulkWater) {
        if (bulkWater <= 0) {
            return dryMeltFraction(p, t);
        }
        // the curves depend on pressure only: evaluate them once, outside the root finding
        DryLaw law = dryLaw(p, drySolidus(p));
        double xSat = waterSaturation(p);
        double scale = wetSolidus == WetSolidus.KATZ2003 ? 1.0 : experimentalScale(p);
        if (law.meltFraction(t + scale * solidusDepression(Math.min(bulkWater / D_WATER, xSat))) <= 0) {
            return 0.0;
        }
        if (law.meltFraction(t + scale * solidusDepression(Math.min(bulkWater, xSat))) >= 1.0) {
            return 1.0;
        }
        BrentSolver solver = new BrentSolver(ROOT_ACCURACY);
        return solver.solve(MAX_EVALUATIONS, f -> f - law.meltFraction(
                t + scale * solidusDepression(Math.min(bulkWater / (D_WATER + f * (1.0 - D_WATER)), xSat))), 0.0, 1.0);
    }

    @Override
    public double temperatureAt(double p, double f, double bulkWater) {
        return temperatureWith(p, f, depression(p, waterInMelt(p, f, bulkWater)));
    }

    /** T on the law for melt fraction f with the curves lowered by dT (K). */
    private double temperatureWith(double p, double f, double dT) {
        double ts = drySolidus(p);
        double fCpx = cpxExhaustionFraction(p);
        if (f <= fCpx) {
            return ts + Math.pow(f, 1.0 / BETA1) * (lherzoliteLiquidus(p) - ts) - dT;
        }
        double tCpx = cpxExhaustionTemperature(p);
        return tCpx + Math.pow((f - fCpx) / (1.0 - fCpx), 1.0 / BETA2) * (dryLiquidus(p) - tCpx) - dT;
    }

    /** Cpx exhaustion: the second branch of the melting law starts there. */
    @Override
    public double exhaustionMeltFraction(double p) {
        return cpxExhaustionFraction(p);
    }

    /** β1 above the solidus, β2 above cpx exhaustion: F − F₀ ∝ (T − T₀)^β there. */
    @Override
    public double branchExponent(boolean afterExhaustion) {
        return afterExhaustion ? BETA2 : BETA1;
    }

    /** The solidus branch [(T − Ts)/(Tl − Ts)]^β1 is continued past cpx exhaustion with its own formula. */
    @Override
    public double temperatureOnBranch(double p, double f, double bulkWater, boolean afterExhaustion) {
        return onBranch(p, f, afterExhaustion, depression(p, waterInMelt(p, f, bulkWater)));
    }

    /** The branch law with the melt's water Xbulk / (D + F(1 − D)) not capped at Xsat. */
    @Override
    public double temperatureBelowSaturation(double p, double f, double bulkWater, boolean afterExhaustion) {
        double water = bulkWater <= 0 ? 0.0 : bulkWater / (D_WATER + f * (1.0 - D_WATER));
        return onBranch(p, f, afterExhaustion, depression(p, water));
    }

    private double onBranch(double p, double f, boolean afterExhaustion, double dT) {
        if (afterExhaustion) {
            return temperatureWith(p, f, dT);
        }
        double ts = drySolidus(p);
        return ts + Math.pow(f, 1.0 / BETA1) * (lherzoliteLiquidus(p) - ts) - dT;
    }

    private List<String> check(double p, double bulkWater) {
        if (!(p >= 0) || p > hardMaxPressure()) {
            throw new EngineException(String.format(Locale.ROOT,
                    "Katz et al. (2003) peridotite gives no number at %.3g GPa: pressure must be between 0 and %.0f GPa",
                    gpa(p), HARD_MAX_GPA));
        }
        if (!(bulkWater >= 0) || bulkWater > maxBulkWater()) {
            throw new EngineException(String.format(Locale.ROOT,
                    "Katz et al. (2003) peridotite accepts bulk water between 0 and %.0f wt%%", MAX_BULK_WATER_WT_PCT));
        }
        List<String> warnings = new ArrayList<>(1);
        if (p > maxPressure()) {
            warnings.add(String.format(Locale.ROOT,
                    "pressure %.2f GPa is above the %.0f GPa calibration of Katz et al. (2003): extrapolated",
                    gpa(p), CALIBRATED_MAX_GPA));
        }
        return warnings;
    }

    private static double gpa(double p) {
        return p * 1e-9;
    }
}
