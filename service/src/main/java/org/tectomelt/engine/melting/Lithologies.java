package org.tectomelt.engine.melting;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/** The catalogue of lithologies the service offers, by id, in a stable order. */
public final class Lithologies {

    private static final Map<String, Lithology> BY_ID = new LinkedHashMap<>();

    static {
        register(Katz2003Peridotite.fertile());
        register(new McKenzieBickle1988Peridotite());
        register(CrustalLithology.graniteWaterSaturated());
        register(CrustalLithology.metapelite());
        register(CrustalLithology.amphibolite());
        register(CrustalLithology.basalt());
        register(new PertermannHirschmann2003Pyroxenite());
    }

    private Lithologies() {
    }

    private static void register(Lithology l) {
        BY_ID.put(l.id(), l);
    }

    /** Every lithology, in catalogue order. */
    public static List<Lithology> all() {
        return List.copyOf(BY_ID.values());
    }

    /** Every id, in catalogue order. */
    public static List<String> ids() {
        return List.copyOf(BY_ID.keySet());
    }

    /** The lithology with this id, if any. */
    public static Optional<Lithology> byId(String id) {
        return Optional.ofNullable(BY_ID.get(id));
    }

    /** The crustal lithology (or intrusion) with this id, if any. */
    public static Optional<CrustalLithology> crustalById(String id) {
        return byId(id).filter(CrustalLithology.class::isInstance).map(CrustalLithology.class::cast);
    }

    /** The mantle lithology with this id, if any. */
    public static Optional<MantleLithology> mantleById(String id) {
        return byId(id).filter(MantleLithology.class::isInstance).map(MantleLithology.class::cast);
    }

    /** The default mantle lithology (Katz et al. 2003, fertile). */
    public static MantleLithology defaultMantle() {
        return (MantleLithology) BY_ID.get(Katz2003Peridotite.INFO.id());
    }
}
