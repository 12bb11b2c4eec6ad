package org.tectomelt.contract;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.io.InputStream;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.operations.Violation;

/** Query parameters are read as the spec documents them: type, range, enum and default, no Java literal. */
class SpecQueryParametersTest {

    private static final SpecContract SPEC = SpecContract.standard();

    private static SpecContract.Query runs(SpecContract spec, Map<String, List<String>> given) {
        return spec.query("get", "/v1/runs", given);
    }

    @Test
    void absentParametersTakeTheSpecsDefaults() {
        SpecContract.Query q = runs(SPEC, Map.of("limit", List.of(" ")));
        assertTrue(q.violations().isEmpty(), q.violations().toString());
        assertEquals(SPEC.document().at("/paths/~1v1~1runs/get/parameters/3/schema/default").asLong(), q.integer("limit"));
        assertEquals(0, q.integer("offset"));
        assertNull(q.text("status"));
        assertEquals(7, runs(SPEC, Map.of("limit", List.of("7"))).integer("limit"));
    }

    @Test
    void aValueOutsideItsSchemaIsNamedWithTheRule() {
        List<Violation> v = runs(SPEC, Map.of("limit", List.of("0"), "offset", List.of("x"),
                "status", List.of("sleeping"))).violations();
        assertEquals(List.of("limit", "offset", "status"), v.stream().map(Violation::field).sorted().toList(), v.toString());
        String limit = v.stream().filter(x -> x.field().equals("limit")).findFirst().orElseThrow().message();
        assertTrue(limit.contains("between 1 and 100, got 0"), limit);
        String offset = v.stream().filter(x -> x.field().equals("offset")).findFirst().orElseThrow().message();
        assertTrue(offset.contains("an integer") && offset.contains("'x'"), offset);
        String status = v.stream().filter(x -> x.field().equals("status")).findFirst().orElseThrow().message();
        assertTrue(status.contains("queued") && status.contains("'sleeping'"), status);
    }

    @Test
    void aCopyOfTheSpecWithAnotherRangeAndDefaultIsFollowed() throws Exception {
        ObjectMapper yaml = new ObjectMapper(new YAMLFactory());
        ObjectNode copy;
        try (InputStream in = SpecContract.class.getResourceAsStream(SpecContract.SPEC_RESOURCE)) {
            copy = (ObjectNode) yaml.readTree(in);
        }
        ObjectNode limit = (ObjectNode) copy.at("/paths/~1v1~1runs/get/parameters/3/schema");
        assertEquals("integer", limit.path("type").asText());
        limit.put("maximum", 5).put("default", 3);
        SpecContract narrowed = SpecContract.fromYaml(yaml.writeValueAsBytes(copy));
        assertEquals(3, runs(narrowed, Map.of()).integer("limit"));
        assertEquals("limit", runs(narrowed, Map.of("limit", List.of("6"))).violations().get(0).field());
        assertTrue(runs(SPEC, Map.of("limit", List.of("6"))).violations().isEmpty());
    }
}
