package org.tectomelt.contract;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.thermal.LithostaticColumn;

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
            new Pair("/v1/settings/mid-ocean-ridge", "lithology", Lithologies.defaultMantle().id()));

    @Test
    void everyPairedDefaultIsTheEnginesValue() {
        for (Pair p : PAIRS) {
            var d = SPEC.range(p.path(), p.field()).orElseThrow().defaultValue();
            Object spec = p.engine() instanceof String ? d.asText() : (Object) d.asDouble();
            assertEquals(p.engine(), spec, p.path() + " " + p.field());
        }
    }
}
