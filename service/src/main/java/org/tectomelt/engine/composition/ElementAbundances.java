package org.tectomelt.engine.composition;

import java.util.EnumMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;

/**
 * Concentrations of trace elements (ppm by mass) in a reservoir: a mantle source or a reference
 * used to normalise (chondrite, primitive mantle). Immutable; every value finite and positive.
 */
public final class ElementAbundances {

    private final String id;
    private final List<ModelInfo> models;
    private final Map<Element, Double> ppm;

    /**
     * A table.
     *
     * @param id     identifier
     * @param models published sources (empty for values of one's own)
     * @param ppm    concentration of each element it covers (ppm)
     */
    public ElementAbundances(String id, List<ModelInfo> models, Map<Element, Double> ppm) {
        this.id = id;
        this.models = List.copyOf(models);
        EnumMap<Element, Double> copy = new EnumMap<>(Element.class);
        ppm.forEach((e, c) -> {
            if (c == null || !Double.isFinite(c) || !(c > 0)) {
                throw new EngineException(String.format(Locale.ROOT,
                        "concentration of %s in %s must be finite and positive, got %s", e.symbol(), id, c));
            }
            copy.put(e, c);
        });
        this.ppm = copy;
    }

    /** Identifier. */
    public String id() {
        return id;
    }

    /** Published sources. */
    public List<ModelInfo> models() {
        return models;
    }

    /** True when the table has a value for {@code e}. */
    public boolean covers(Element e) {
        return ppm.containsKey(e);
    }

    /** Concentration of {@code e} (ppm). */
    public double ppm(Element e) {
        Double c = ppm.get(e);
        if (c == null) {
            throw new EngineException("no concentration of " + e.symbol() + " in " + id);
        }
        return c;
    }

    /** Concentration of {@code e} (ppm), if covered. */
    public Optional<Double> find(Element e) {
        return Optional.ofNullable(ppm.get(e));
    }

    /** This table with some values replaced by values of one's own. */
    public ElementAbundances withValues(Map<Element, Double> overrides) {
        if (overrides.isEmpty()) {
            return this;
        }
        EnumMap<Element, Double> merged = new EnumMap<>(ppm);
        merged.putAll(overrides);
        return new ElementAbundances(id + "+supplied", models, merged);
    }
}
