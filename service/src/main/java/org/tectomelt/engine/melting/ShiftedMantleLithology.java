package org.tectomelt.engine.melting;

import java.util.List;
import java.util.Locale;
import java.util.function.DoubleUnaryOperator;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;

/**
 * A mantle lithology whose whole melting interval is moved by ΔT: solidus, liquidus and every
 * isopleth of melt fraction T(P, F) lie ΔT higher (ΔT &lt; 0: lower), so F(P, T) = F₀(P, T − ΔT).
 * It lets a caller sample the scatter of a parameterization around its experiments (a solidus fit
 * is typically good to some tens of kelvin; Katz et al. 2003, Hirschmann 2000) without changing
 * its shape. The thermodynamic constants, validity range and water behaviour are the base law's.
 *
 * @param base  the published law
 * @param shift ΔT (K), within ±{@value #MAX_SHIFT_K} K
 */
public record ShiftedMantleLithology(MantleLithology base, double shift) implements MantleLithology {

    /** Largest accepted shift (K) either way. */
    public static final double MAX_SHIFT_K = 200.0;

    /** Validates the shift. */
    public ShiftedMantleLithology {
        if (base == null) {
            throw new IllegalArgumentException("base is required");
        }
        if (!(Math.abs(shift) <= MAX_SHIFT_K)) {
            throw new EngineException(String.format(Locale.ROOT, "a solidus shift must lie within ±%.0f K, got %s",
                    MAX_SHIFT_K, shift));
        }
    }

    /** {@code base} moved by {@code shift} (K), or {@code base} itself when the shift is 0. */
    public static MantleLithology of(MantleLithology base, double shift) {
        return shift == 0 ? base : new ShiftedMantleLithology(base, shift);
    }

    @Override
    public ModelInfo info() {
        return base.info();
    }

    @Override
    public List<ModelInfo> citations() {
        return base.citations();
    }

    @Override
    public String name() {
        return String.format(Locale.ROOT, "%s, melting interval moved by %+.1f K", base.name(), shift);
    }

    @Override
    public Kind kind() {
        return base.kind();
    }

    @Override
    public boolean hydrous() {
        return base.hydrous();
    }

    @Override
    public double minPressure() {
        return base.minPressure();
    }

    @Override
    public double maxPressure() {
        return base.maxPressure();
    }

    @Override
    public double hardMaxPressure() {
        return base.hardMaxPressure();
    }

    @Override
    public double maxBulkWater() {
        return base.maxBulkWater();
    }

    @Override
    public MantleThermodynamics thermodynamics() {
        return base.thermodynamics();
    }

    @Override
    public double drySolidus(double p) {
        return base.drySolidus(p) + shift;
    }

    @Override
    public double solidus(double p, double bulkWater) {
        return base.solidus(p, bulkWater) + shift;
    }

    @Override
    public double liquidus(double p, double bulkWater) {
        return base.liquidus(p, bulkWater) + shift;
    }

    @Override
    public double meltFraction(double p, double t, double bulkWater) {
        return base.meltFraction(p, t - shift, bulkWater);
    }

    @Override
    public DoubleUnaryOperator meltFractionAt(double p, double bulkWater) {
        DoubleUnaryOperator law = base.meltFractionAt(p, bulkWater);
        return t -> law.applyAsDouble(t - shift);
    }

    @Override
    public MeltState melt(double p, double t, double bulkWater) {
        MeltState s = base.melt(p, t - shift, bulkWater);
        return new MeltState(s.meltFraction(), s.solidus() + shift, s.drySolidus() + shift, s.liquidus() + shift,
                s.waterInMelt(), s.waterSaturated(), s.cpxExhausted(), s.warnings());
    }

    @Override
    public double temperatureAt(double p, double f, double bulkWater) {
        return base.temperatureAt(p, f, bulkWater) + shift;
    }

    @Override
    public double exhaustionMeltFraction(double p) {
        return base.exhaustionMeltFraction(p);
    }

    @Override
    public double branchExponent(boolean afterExhaustion) {
        return base.branchExponent(afterExhaustion);
    }

    @Override
    public double temperatureOnBranch(double p, double f, double bulkWater, boolean afterExhaustion) {
        return base.temperatureOnBranch(p, f, bulkWater, afterExhaustion) + shift;
    }

    @Override
    public double waterInMelt(double p, double f, double bulkWater) {
        return base.waterInMelt(p, f, bulkWater);
    }

    @Override
    public double temperatureBelowSaturation(double p, double f, double bulkWater, boolean afterExhaustion) {
        return base.temperatureBelowSaturation(p, f, bulkWater, afterExhaustion) + shift;
    }

    @Override
    public double waterSaturationMargin(double p, double f, double bulkWater) {
        return base.waterSaturationMargin(p, f, bulkWater);
    }

    @Override
    public double waterPartition() {
        return base.waterPartition();
    }

    @Override
    public double meltFractionAtMeltWater(double p, double t, double waterInMelt) {
        return base.meltFractionAtMeltWater(p, t - shift, waterInMelt);
    }
}
