package org.tectomelt.bench;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.State;
import org.tectomelt.engine.thermal.ContinentalGeotherm;
import org.tectomelt.engine.thermal.ConductiveGeotherm;
import org.tectomelt.engine.thermal.Geotherm;
import org.tectomelt.engine.thermal.HalfSpaceCooling;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.thermal.MantleAdiabat;
import org.tectomelt.engine.thermal.PlateCooling;
import org.tectomelt.engine.thermal.PlateParameters;
import org.tectomelt.engine.units.Units;

/**
 * Cost of one 300-point geotherm (0–299 km every 1 km) of each type, as the engine computes it
 * for a request: build the model, find where it meets the adiabat, evaluate temperature and
 * pressure at every depth. Target: under 100 µs each.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
public class GeothermBenchmark {

    /** Inputs kept in fields so that the JIT cannot fold them. */
    private double ageMyr = 60;
    private double youngAgeMyr = 0.5;
    private double heatFlow = 0.055;
    private double tpKelvin = Units.celsiusToKelvin(1350);
    private double hotInteriorKelvin = Units.celsiusToKelvin(1500);
    private final double[] depths = Geotherm.depths(299e3, 1e3);

    private double sample(Geotherm g, LithostaticColumn column) {
        double sum = 0;
        for (double z : depths) {
            sum += g.temperatureAt(z) + 1e-9 * column.pressureAt(z);
        }
        return sum;
    }

    private double combined(ConductiveGeotherm model, LithostaticColumn column) {
        return sample(Geotherm.combined(model, MantleAdiabat.of(tpKelvin)), column);
    }

    /** Half-space (Tm 1500 °C, 60 Myr) joined to a 1350 °C adiabat. */
    @Benchmark
    public double halfSpaceOnAdiabat() {
        return combined(new HalfSpaceCooling(Units.myrToS(ageMyr), 273.15, hotInteriorKelvin, 3.3, 1e-6),
                LithostaticColumn.mantleOnly());
    }

    /** Half-space alone (T&amp;S parameters, 60 Myr). */
    @Benchmark
    public double halfSpaceConductive() {
        return sample(Geotherm.conductive(HalfSpaceCooling.of(Units.myrToS(ageMyr))), LithostaticColumn.mantleOnly());
    }

    /** GDH1 plate at 60 Myr joined to a 1350 °C adiabat. */
    @Benchmark
    public double plateOnAdiabat() {
        return combined(new PlateCooling(PlateParameters.GDH1, Units.myrToS(ageMyr)), LithostaticColumn.mantleOnly());
    }

    /** GDH1 plate at 0.5 Myr (many series terms) joined to a 1350 °C adiabat. */
    @Benchmark
    public double youngPlateOnAdiabat() {
        return combined(new PlateCooling(PlateParameters.GDH1, Units.myrToS(youngAgeMyr)),
                LithostaticColumn.mantleOnly());
    }

    /** Continental, 55 mW/m², exponential heat production, joined to a 1350 °C adiabat. */
    @Benchmark
    public double continentalOnAdiabat() {
        return combined(ContinentalGeotherm.of(heatFlow), new LithostaticColumn(35e3, 2800, 3300, 9.81));
    }

    /** The adiabat alone. */
    @Benchmark
    public double adiabatAlone() {
        return sample(Geotherm.adiabatic(MantleAdiabat.of(tpKelvin)), LithostaticColumn.mantleOnly());
    }
}
