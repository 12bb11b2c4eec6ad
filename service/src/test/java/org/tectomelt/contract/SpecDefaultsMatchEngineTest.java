package org.tectomelt.contract;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.composition.CompositionTables;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.thermal.ContinentalGeotherm;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.thermal.MantleAdiabat;
import org.tectomelt.engine.units.Units;
import org.tectomelt.operations.SillModelOperation;

/**
 * Where a request default of the spec is also a physical constant of the engine (which engine
 * callers without the spec use), both must be the same number: the spec fills the request, the
 * engine is the source the value is cited in.
 */
class SpecDefaultsMatchEngineTest {

    private static final SpecContract SPEC = SpecContract.standard();

    /** (path, field, engine value). */
    private record Pair(String path, String field, Object engine) {
    }

    static final List<Pair> PAIRS = List.of(
            new Pair("/v1/pressure", "crustDensityKgPerM3", LithostaticColumn.CRUST_DENSITY),
            new Pair("/v1/pressure", "mantleDensityKgPerM3", LithostaticColumn.MANTLE_DENSITY),
            new Pair("/v1/pressure", "gravityMPerS2", LithostaticColumn.G),
            new Pair("/v1/solidus-crossings", "crustDensityKgPerM3", LithostaticColumn.CRUST_DENSITY),
            new Pair("/v1/solidus-crossings", "mantleDensityKgPerM3", LithostaticColumn.MANTLE_DENSITY),
            new Pair("/v1/decompression-melting", "stepKm", Units.mToKm(DecompressionColumn.DEFAULT_OUTPUT_STEP)),
            new Pair("/v1/decompression-melting", "lithology", Lithologies.defaultMantle().id()),
            new Pair("/v1/settings/mid-ocean-ridge", "lithology", Lithologies.defaultMantle().id()),
            new Pair("/v1/settings/hotspot", "lithology", Lithologies.defaultMantle().id()),
            new Pair("/v1/settings/continental-rift", "lithology", Lithologies.defaultMantle().id()),
            new Pair("/v1/settings/subduction", "lithology", Lithologies.defaultMantle().id()),
            // the sill's mantle when none is given uses the engine's values, with one given the spec's
            new Pair("/v1/crustal-heating/sill", "mantle.densityKgPerM3", LithostaticColumn.MANTLE_DENSITY),
            new Pair("/v1/crustal-heating/sill", "mantle.heatCapacityJPerKgK", MantleAdiabat.HEAT_CAPACITY),
            new Pair("/v1/crustal-heating/sill", "geotherm.reducedHeatFlowFraction",
                    ContinentalGeotherm.REDUCED_FRACTION),
            new Pair("/v1/crustal-heating/sill", "geotherm.heatProductionScaleKm",
                    Units.mToKm(ContinentalGeotherm.HEAT_PRODUCTION_SCALE)),
            new Pair("/v1/crustal-heating/sill", "geotherm.surfaceTemperatureC",
                    Units.kelvinToCelsius(ContinentalGeotherm.SURFACE_TEMPERATURE)),
            new Pair("/v1/melt-composition", "source", CompositionTables.defaultSource().id()),
            new Pair("/v1/melt-composition", "partitionCoefficients",
                    CompositionTables.defaultPartitionCoefficients().id()),
            new Pair("/v1/melt-composition", "normalisation", CompositionTables.defaultNormalisation().id()));

    @Test
    void theSillRepeatCountClampIsTheSpecsMaximum() {
        assertEquals((double) SillModelOperation.MAX_SILLS,
                SPEC.range("/v1/crustal-heating/sill", "intrusion.repeat.count").orElseThrow().maximum());
    }

    @Test
    void everyPairedDefaultIsTheEnginesValue() {
        for (Pair p : PAIRS) {
            var d = SPEC.range(p.path(), p.field()).orElseThrow().defaultValue();
            Object spec = p.engine() instanceof String ? d.asText() : (Object) d.asDouble();
            assertEquals(p.engine(), spec, p.path() + " " + p.field());
        }
    }
}
