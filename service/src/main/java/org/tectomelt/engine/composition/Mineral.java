package org.tectomelt.engine.composition;

import java.util.Optional;

/** The minerals of mantle peridotite that hold trace elements in the residue of melting. */
public enum Mineral {
    OLIVINE("olivine", "ol"), ORTHOPYROXENE("orthopyroxene", "opx"), CLINOPYROXENE("clinopyroxene", "cpx"),
    GARNET("garnet", "grt"), SPINEL("spinel", "sp");

    /** Number of minerals (the length of every per-mineral array in this package). */
    public static final int COUNT = values().length;

    private final String id;
    private final String abbreviation;

    Mineral(String id, String abbreviation) {
        this.id = id;
        this.abbreviation = abbreviation;
    }

    /** Lower-case name used in tables and the API ("clinopyroxene"). */
    public String id() {
        return id;
    }

    /** The usual abbreviation ("cpx"). */
    public String abbreviation() {
        return abbreviation;
    }

    /** The mineral with this id, if any. */
    public static Optional<Mineral> byId(String id) {
        for (Mineral m : values()) {
            if (m.id.equals(id)) {
                return Optional.of(m);
            }
        }
        return Optional.empty();
    }
}
