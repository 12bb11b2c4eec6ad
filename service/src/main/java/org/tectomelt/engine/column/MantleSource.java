package org.tectomelt.engine.column;

import java.util.Locale;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.melting.MantleLithology;

/**
 * What rises beneath a ridge, rift or plume: a peridotite, optionally with a mass fraction of a second
 * lithology (a pyroxenite) in thermal equilibrium with it, and how melt leaves the residue.
 *
 * @param peridotite           the main lithology (it carries the source's water)
 * @param pyroxenite           the second lithology, dry; null when the source is peridotite only
 * @param pyroxeniteFraction   mass fraction of the second lithology, 0–1 (0 when {@code pyroxenite} is null)
 * @param mode                 how melt leaves the residue
 * @param retainedMeltFraction melt kept in the residue for {@link MeltingMode#NEAR_FRACTIONAL}, 0–{@value
 *                             MeltingMode#MAX_RETAINED_MELT_FRACTION}; 0 otherwise
 */
public record MantleSource(MantleLithology peridotite, MantleLithology pyroxenite, double pyroxeniteFraction,
                           MeltingMode mode, double retainedMeltFraction) {

    /** Validates the fractions. */
    public MantleSource {
        if (peridotite == null || mode == null) {
            throw new IllegalArgumentException("peridotite and mode are required");
        }
        if (!(pyroxeniteFraction >= 0 && pyroxeniteFraction <= 1)) {
            throw new EngineException("the pyroxenite mass fraction must be between 0 and 1, got " + pyroxeniteFraction);
        }
        if (pyroxenite == null && pyroxeniteFraction != 0) {
            throw new EngineException("a pyroxenite fraction needs a pyroxenite lithology");
        }
        if (pyroxenite != null && pyroxenite.maxBulkWater() > 0) {
            throw new EngineException("the second lithology of a source is dry: choose a dry-only law");
        }
        if (!(retainedMeltFraction >= 0 && retainedMeltFraction <= MeltingMode.MAX_RETAINED_MELT_FRACTION)) {
            throw new EngineException(String.format(Locale.ROOT, "the retained melt fraction must be between 0 and %.2g, "
                    + "got %s", MeltingMode.MAX_RETAINED_MELT_FRACTION, retainedMeltFraction));
        }
        if (mode != MeltingMode.NEAR_FRACTIONAL && retainedMeltFraction != 0) {
            throw new EngineException("a retained melt fraction belongs to near-fractional melting only");
        }
    }

    /** A source of {@code lithology} alone, batch melting. */
    public static MantleSource of(MantleLithology lithology) {
        return new MantleSource(lithology, null, 0.0, MeltingMode.BATCH, 0.0);
    }

    /** This source with another melting mode (and retained melt fraction, 0 unless near-fractional). */
    public MantleSource withMode(MeltingMode m, double retained) {
        return new MantleSource(peridotite, pyroxenite, pyroxeniteFraction, m, retained);
    }

    /** This source with {@code fraction} of {@code second} mixed in. */
    public MantleSource withPyroxenite(MantleLithology second, double fraction) {
        return new MantleSource(peridotite, fraction > 0 ? second : null, fraction > 0 ? fraction : 0.0, mode,
                retainedMeltFraction);
    }

    /** True when the source is one lithology melting in batch: {@link DecompressionColumn} runs it. */
    public boolean singleBatch() {
        return pyroxeniteFraction == 0 && mode == MeltingMode.BATCH;
    }

    /**
     * The column of this source with the defaults of {@link DecompressionColumn#of}: the ODE column for a
     * single lithology melting in batch (its answers unchanged), else a {@link SourceColumn}.
     *
     * @param potentialTemperature Tp (K)
     * @param bulkWater            bulk water of the peridotite (mass fraction)
     */
    public MeltingColumn column(double potentialTemperature, double bulkWater) {
        return singleBatch() ? DecompressionColumn.of(peridotite, potentialTemperature, bulkWater)
                : SourceColumn.of(this, potentialTemperature, bulkWater);
    }
}
