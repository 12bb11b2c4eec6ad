package org.tectomelt.engine.column;

import java.util.Optional;
import org.tectomelt.engine.melting.MantleLithology;

/**
 * How one lithology of a column's source melted. SI units.
 *
 * @param lithology       the melting law
 * @param massFraction    its mass fraction in the source, 0–1
 * @param onset           where it starts to melt on the way up (melt fraction 0); empty when it never does
 *                        above the top of the column
 * @param maxMeltFraction the largest extent of melting it reaches
 * @param topMeltFraction its extent of melting at the top of the column
 * @param meltShare       the share of the column's melt it makes, 0–1 (passive: of ∫F dz; active: of the
 *                        melt at the top); 0 when the column makes none
 */
public record LithologyMelting(MantleLithology lithology, double massFraction, Optional<ColumnState> onset,
                               double maxMeltFraction, double topMeltFraction, double meltShare) {
}
