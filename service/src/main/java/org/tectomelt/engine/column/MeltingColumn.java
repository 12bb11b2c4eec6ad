package org.tectomelt.engine.column;

import java.util.List;
import java.util.OptionalDouble;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.MantleThermodynamics;
import org.tectomelt.engine.thermal.LithostaticColumn;

/**
 * A decompression melting column, ready to run: {@link DecompressionColumn} (one lithology, batch
 * melting, integrated as an ODE) or {@link SourceColumn} (a mantle source of one or two lithologies in
 * any {@link MeltingMode}, stepped in depth). SI units.
 */
public interface MeltingColumn {

    /** Runs the column. */
    ColumnResult solve();

    /** The thermodynamic constants of the rising rock (mass-weighted over the lithologies of a mixed source). */
    MantleThermodynamics thermodynamics();

    /** Mantle potential temperature Tp (K). */
    double potentialTemperature();

    /** Bulk water of the (peridotite of the) source (mass fraction). */
    double bulkWater();

    /** Depth of the lid base (m), where melting stops; 0 for the surface. */
    double lidDepth();

    /** Passive (triangular) or active (columnar) upwelling. */
    Upwelling upwelling();

    /** Pressure with depth along the column. */
    LithostaticColumn pressures();

    /** Density of the crust the melt makes (kg/m³). */
    double crustDensity();

    /** How melt leaves the residue. */
    MeltingMode mode();

    /** This column with melting stopped at a lid base at {@code depth} (m). */
    MeltingColumn withLidDepth(double depth);

    /** This column with another upwelling regime. */
    MeltingColumn withUpwelling(Upwelling regime);

    /** This column with output points every {@code step} (m). */
    MeltingColumn withOutputStep(double step);

    /** This column with another pressure–depth relation. */
    MeltingColumn withPressures(LithostaticColumn column);

    /** Temperature (K) of the melt-free solid adiabat at pressure {@code p} (Pa). */
    double adiabatTemperature(double p);

    /** Pressure (Pa) where the rock first meets a solidus on the way up, or empty when it never does. */
    OptionalDouble onsetPressure();

    /** Depth (m) of the onset, or empty. */
    default OptionalDouble onsetDepth() {
        OptionalDouble p = onsetPressure();
        return p.isPresent() ? OptionalDouble.of(pressures().depthAt(p.getAsDouble())) : OptionalDouble.empty();
    }

    /** Every published model the result rests on. */
    List<ModelInfo> models();

    /** The assumptions, in words, with the constants used. */
    List<String> assumptions();
}
