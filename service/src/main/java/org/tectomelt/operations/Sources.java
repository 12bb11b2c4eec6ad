package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.column.MeltingMode;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.melting.ShiftedMantleLithology;

/**
 * The mantle-source fields every decompression operation accepts (melting mode, cpx mass fraction,
 * solidus shifts, a pyroxenite fraction) and the engine source they make. The spec bounds each field;
 * the rules that tie fields together are here.
 */
final class Sources {

    /** Retained melt fraction of near-fractional melting when none is given (1 %). */
    static final double DEFAULT_RETAINED_MELT_FRACTION = 0.01;
    /** The only second lithology offered. */
    static final String DEFAULT_PYROXENITE = "pyroxenite-pertermann-hirschmann2003";

    private Sources() {
    }

    /**
     * The source fields of a request (boxed: null = absent). The column, ridge, hotspot and rift
     * requests implement it with their own record components of these names.
     */
    interface Fields {
        String meltingMode();

        Double retainedMeltFraction();

        Double cpxMassFraction();

        Double solidusShiftK();

        Double pyroxeniteFraction();

        String pyroxenite();

        Double pyroxeniteSolidusShiftK();
    }

    /** Inputs a sweep or a sample may address, for {@code GET /v1/operations}. */
    static List<Input> inputs() {
        return List.of(
                new Input("cpxMassFraction", "1", "cpx mass fraction of a Katz et al. (2003) peridotite source "
                        + "(0.10 depleted – 0.17 fertile)", true),
                new Input("solidusShiftK", "K", "shift of the peridotite's whole melting interval", true),
                new Input("pyroxeniteFraction", "1", "mass fraction of pyroxenite in the source", true),
                new Input("pyroxeniteSolidusShiftK", "K", "shift of the pyroxenite's whole melting interval", true),
                new Input("retainedMeltFraction", "1", "melt kept in the residue (near-fractional melting)", true));
    }

    /** {@code own} inputs followed by the source inputs. */
    static List<Input> with(Input... own) {
        List<Input> all = new ArrayList<>(List.of(own));
        all.addAll(inputs());
        return List.copyOf(all);
    }

    /**
     * The source, or null after recording violations.
     *
     * @param lithology the main lithology chosen by the request (null when already refused)
     * @param waterWtPct the bulk water the request asks for (wt%, as given, before any refusal)
     */
    static MantleSource source(Rules rules, MantleLithology lithology, double waterWtPct, Fields f) {
        if (lithology == null) {
            return null;
        }
        MeltingMode mode = mode(f.meltingMode());
        MantleLithology main = lithology;
        if (f.cpxMassFraction() != null) {
            if (lithology instanceof Katz2003Peridotite katz) {
                main = new Katz2003Peridotite(f.cpxMassFraction(), katz.wetSolidus());
            } else {
                rules.error("cpxMassFraction", "applies to peridotite-katz2003 only (Katz et al. 2003 Mcpx); '"
                        + lithology.id() + "' has no cpx parameter: leave it out");
            }
        }
        if (f.solidusShiftK() != null) {
            main = ShiftedMantleLithology.of(main, f.solidusShiftK());
        }
        double retained = 0;
        if (mode == MeltingMode.NEAR_FRACTIONAL) {
            retained = f.retainedMeltFraction() == null ? DEFAULT_RETAINED_MELT_FRACTION : f.retainedMeltFraction();
        } else if (f.retainedMeltFraction() != null) {
            rules.error("retainedMeltFraction", "applies to meltingMode near-fractional only; got meltingMode "
                    + mode.apiName() + ": leave it out or choose near-fractional");
        }
        if (mode != MeltingMode.BATCH && waterWtPct > 0 && !(lithology.waterPartition() > 0)) {
            rules.error("meltingMode", "'" + lithology.id() + "' is a dry-only law and cannot run hydrous "
                    + mode.apiName() + " melting: allowed values with water are [batch]");
        }
        double fraction = f.pyroxeniteFraction() == null ? 0 : f.pyroxeniteFraction();
        MantleLithology second = null;
        if (fraction > 0) {
            String id = f.pyroxenite() == null ? DEFAULT_PYROXENITE : f.pyroxenite();
            second = Lithologies.mantleById(id).filter(l -> l.maxBulkWater() == 0).orElse(null);
            if (second == null) {
                rules.error("pyroxenite", "must be one of [" + DEFAULT_PYROXENITE + "], got '"
                        + Choices.abbreviate(id) + "'");
            } else if (f.pyroxeniteSolidusShiftK() != null) {
                second = ShiftedMantleLithology.of(second, f.pyroxeniteSolidusShiftK());
            }
        } else {
            if (f.pyroxenite() != null) {
                rules.error("pyroxenite", "needs a pyroxeniteFraction above 0 (got "
                        + Rules.format(fraction) + "): leave it out or give the fraction");
            }
            if (f.pyroxeniteSolidusShiftK() != null) {
                rules.error("pyroxeniteSolidusShiftK", "needs a pyroxeniteFraction above 0 (got "
                        + Rules.format(fraction) + "): leave it out or give the fraction");
            }
        }
        if (!rules.ok()) {
            return null;
        }
        return new MantleSource(main, second, second == null ? 0 : fraction, mode, retained);
    }

    /** The engine mode for the spec's enum value (batch when absent). */
    static MeltingMode mode(String name) {
        if (name == null) {
            return MeltingMode.BATCH;
        }
        for (MeltingMode m : MeltingMode.values()) {
            if (m.apiName().equals(name)) {
                return m;
            }
        }
        return MeltingMode.BATCH;
    }
}
