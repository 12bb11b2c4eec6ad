package org.tectomelt.engine.composition;

import java.util.EnumMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;

/**
 * A table of mineral/melt partition coefficients Kᵢ = C(mineral i)/C(melt), one row per element
 * with one value per {@link Mineral}. Immutable; every value finite and positive.
 */
public final class PartitionCoefficients {

    private final String id;
    private final List<ModelInfo> models;
    private final Map<Element, double[]> rows;
    private final Map<Element, String> provenance;

    /**
     * A table.
     *
     * @param id         identifier of the table
     * @param models     published sources of the values (empty for values of one's own)
     * @param rows       per element, one coefficient per mineral in {@link Mineral} order
     * @param provenance per element, where its values come from (may be empty)
     */
    public PartitionCoefficients(String id, List<ModelInfo> models, Map<Element, double[]> rows,
                                 Map<Element, String> provenance) {
        this.id = id;
        this.models = List.copyOf(models);
        EnumMap<Element, double[]> copy = new EnumMap<>(Element.class);
        rows.forEach((e, k) -> copy.put(e, checkedRow(e, k)));
        this.rows = copy;
        this.provenance = provenance.isEmpty() ? Map.of() : new EnumMap<>(provenance);
    }

    private static double[] checkedRow(Element e, double[] k) {
        if (k == null || k.length != Mineral.COUNT) {
            throw new EngineException("partition coefficients of " + e.symbol() + " need one value per mineral");
        }
        for (int i = 0; i < k.length; i++) {
            if (!Double.isFinite(k[i]) || !(k[i] > 0)) {
                throw new EngineException(String.format(Locale.ROOT,
                        "partition coefficient of %s in %s must be finite and positive, got %s", e.symbol(),
                        Mineral.values()[i].id(), k[i]));
            }
        }
        return k.clone();
    }

    /** Identifier of the table. */
    public String id() {
        return id;
    }

    /** Published sources of the values. */
    public List<ModelInfo> models() {
        return models;
    }

    /** True when the table has a row for {@code e}. */
    public boolean covers(Element e) {
        return rows.containsKey(e);
    }

    /** Kᵢ of element {@code e} in mineral {@code m}. */
    public double k(Element e, Mineral m) {
        return row(e)[m.ordinal()];
    }

    /** The row of {@code e} (a copy), one value per mineral. */
    public double[] coefficients(Element e) {
        return row(e).clone();
    }

    /** Where the values of {@code e} come from, if the table says. */
    public Optional<String> provenance(Element e) {
        return Optional.ofNullable(provenance.get(e));
    }

    double[] row(Element e) {
        double[] k = rows.get(e);
        if (k == null) {
            throw new EngineException("no partition coefficients for " + e.symbol() + " in table " + id);
        }
        return k;
    }

    /** This table with every coefficient multiplied by {@code factor} (&gt; 0), for sensitivity studies. */
    public PartitionCoefficients scaled(double factor) {
        if (!(factor > 0) || !Double.isFinite(factor)) {
            throw new EngineException("the scale on partition coefficients must be finite and positive");
        }
        if (factor == 1.0) {
            return this;
        }
        EnumMap<Element, double[]> scaled = new EnumMap<>(Element.class);
        rows.forEach((e, k) -> {
            double[] s = k.clone();
            for (int i = 0; i < s.length; i++) {
                s[i] *= factor;
            }
            scaled.put(e, s);
        });
        return new PartitionCoefficients(id, models, scaled, provenance);
    }

    /**
     * This table with some rows replaced by values of one's own (their provenance becomes "supplied").
     *
     * @param overrides per element, one coefficient per mineral
     */
    public PartitionCoefficients withRows(Map<Element, double[]> overrides) {
        if (overrides.isEmpty()) {
            return this;
        }
        EnumMap<Element, double[]> merged = new EnumMap<>(rows);
        EnumMap<Element, String> prov = new EnumMap<>(Element.class);
        prov.putAll(provenance);
        overrides.forEach((e, k) -> {
            merged.put(e, k);
            prov.put(e, "supplied with the request");
        });
        return new PartitionCoefficients(id + "+supplied", models, merged, prov);
    }
}
