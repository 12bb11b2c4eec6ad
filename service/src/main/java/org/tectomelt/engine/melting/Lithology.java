package org.tectomelt.engine.melting;

import java.util.List;
import java.util.function.DoubleUnaryOperator;
import org.tectomelt.engine.ModelInfo;

/**
 * A rock with a published melting law: solidus, liquidus and melt fraction as functions of
 * pressure, temperature and bulk water. SI throughout: pressure in Pa, temperature in K, water
 * as a mass fraction of the bulk rock.
 *
 * <p>Implementations are immutable and thread-safe.
 */
public interface Lithology {

    /** What the rock is in the settings that use it. */
    enum Kind {
        /** Mantle peridotite, melted by decompression or flux. */
        MANTLE,
        /** Crustal rock, melted by heating. */
        CRUST,
        /** Magma emplaced as an intrusion, crystallising over its melting interval. */
        INTRUSION
    }

    /** Identity and principal citation. */
    ModelInfo info();

    /** Every source the model draws on (the principal one first). */
    default List<ModelInfo> citations() {
        return List.of(info());
    }

    /** Stable identifier used by the API, e.g. {@code peridotite-katz2003}. */
    default String id() {
        return info().id();
    }

    /** Human-readable name. */
    String name();

    /** Role of the rock. */
    Kind kind();

    /** True when bulk water changes the result (the model is hydrous-capable). */
    boolean hydrous();

    /** Lowest pressure of the calibration (Pa). */
    double minPressure();

    /** Highest pressure of the calibration (Pa); beyond it results carry a warning. */
    double maxPressure();

    /**
     * Highest pressure (Pa) at which the model still gives a number at all; beyond it
     * {@link #melt} throws {@link org.tectomelt.engine.EngineException}.
     */
    default double hardMaxPressure() {
        return maxPressure();
    }

    /** Largest bulk water (mass fraction) the model accepts; 0 for dry-only models. */
    double maxBulkWater();

    /** Solidus of the dry rock (K) at pressure {@code p} (Pa). */
    double drySolidus(double p);

    /**
     * Solidus (K) at pressure {@code p} (Pa) for bulk water {@code bulkWater} (mass fraction): the
     * highest temperature at which the rock holds no melt. Dry models ignore the water.
     * Implementations override this with a direct formula; the default asks {@link #melt}.
     */
    default double solidus(double p, double bulkWater) {
        return melt(p, drySolidus(p), bulkWater).solidus();
    }

    /**
     * Liquidus (K) at pressure {@code p} (Pa) for bulk water {@code bulkWater}: the lowest
     * temperature at which the rock is fully molten, or {@code NaN} when the model never reaches
     * full melting (crustal curves that stop short of F = 1).
     */
    default double liquidus(double p, double bulkWater) {
        return melt(p, drySolidus(p), bulkWater).liquidus();
    }

    /**
     * Melt fraction only, without warnings or the curves (the hot path of paths and batches).
     * Performs no range check: callers that need one use {@link #melt}.
     */
    default double meltFraction(double p, double t, double bulkWater) {
        return melt(p, t, bulkWater).meltFraction();
    }

    /**
     * The melt-fraction law at one pressure and water content, T (K) → F: the same numbers as
     * {@link #meltFraction}, for root finders that try many temperatures at one pressure (the
     * stepped columns). A law whose curves depend on pressure only evaluates them once here.
     */
    default DoubleUnaryOperator meltFractionAt(double p, double bulkWater) {
        return t -> meltFraction(p, t, bulkWater);
    }

    /**
     * Melt state at a pressure, temperature and bulk water content.
     *
     * @param p         pressure (Pa)
     * @param t         temperature (K)
     * @param bulkWater bulk water (mass fraction); ignored by dry models
     * @return melt fraction, the curves at this pressure and water, and validity warnings
     * @throws org.tectomelt.engine.EngineException when the model cannot give a number
     */
    MeltState melt(double p, double t, double bulkWater);
}
