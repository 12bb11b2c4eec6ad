package org.tectomelt.engine.column;

import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.tectomelt.engine.ModelInfo;

/**
 * What a decompression melting column produces. SI units.
 *
 * @param column              the column that was run (its inputs, models and assumptions)
 * @param onset               where the solid adiabat meets the solidus (melt fraction 0); empty when
 *                            the adiabat stays below the solidus at every pressure up to the surface
 * @param top                 where melting stops (base of the lid, or the surface); empty when nothing
 *                            melts in the column (no onset, or a lid deeper than the onset)
 * @param maxMeltFraction     the largest melt fraction reached in the column (over the integrator's
 *                            steps, the output points and the top)
 * @param meanMeltFraction    column average (1/H)∫F dz over the melting height H (0 without melting)
 * @param meltIntegral        ∫F dz over the melting column (m)
 * @param meltThickness       melt thickness (m): ∫F dz for passive upwelling, F_max·H for active
 * @param crustalThickness    crust made from that melt (m): meltThickness·ρs/ρc
 * @param meanMeltingPressure mean pressure of melting (Pa), weighted by melt production as in the
 *                            chosen upwelling regime; empty when nothing melts
 * @param profile             output points from the onset up to the top (empty when nothing melts)
 * @param warnings            validity notes for the caller (empty when none)
 * @param lithologies         how each lithology of the source melted, in the order of
 *                            {@link ProfilePoint#meltFractions()} (one entry for a single-lithology source)
 */
public record ColumnResult(MeltingColumn column, Optional<ColumnState> onset, Optional<ColumnState> top,
                           double maxMeltFraction, double meanMeltFraction, double meltIntegral,
                           double meltThickness, double crustalThickness, OptionalDouble meanMeltingPressure,
                           List<ProfilePoint> profile, List<String> warnings, List<LithologyMelting> lithologies) {

    /** Defensive copies. */
    public ColumnResult {
        profile = List.copyOf(profile);
        warnings = List.copyOf(warnings);
        lithologies = List.copyOf(lithologies);
    }

    /** How melt left the residue. */
    public MeltingMode mode() {
        return column.mode();
    }

    /** True when some melt forms in the column. */
    public boolean melts() {
        return top.isPresent();
    }

    /** Melting height H (m): onset depth minus top depth, 0 when nothing melts. */
    public double meltingHeight() {
        return melts() ? onset.orElseThrow().depth() - top.orElseThrow().depth() : 0.0;
    }

    /** The upwelling regime used. */
    public Upwelling upwelling() {
        return column.upwelling();
    }

    /** Depth of the lid base (m); 0 when melting may continue to the surface. */
    public double lidDepth() {
        return column.lidDepth();
    }

    /** Every published model the result rests on. */
    public List<ModelInfo> models() {
        return column.models();
    }

    /** The assumptions made, in words, with the constants used. */
    public List<String> assumptions() {
        return column.assumptions();
    }
}
