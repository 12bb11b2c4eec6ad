package org.tectomelt.engine.column;

/** How the mantle flows through the melting region, which sets how melt thickness is counted. */
public enum Upwelling {
    /**
     * Passive, plate-driven upwelling beneath a spreading centre: the melting region is a
     * triangle in cross-section and the melt thickness is h = ∫F dz over the column
     * (McKenzie &amp; Bickle 1988; Plank &amp; Langmuir 1992).
     */
    PASSIVE,
    /**
     * Active, buoyancy-driven columnar upwelling: every parcel rises through the whole column, so
     * the melt thickness is F_max times the melting height.
     */
    ACTIVE
}
