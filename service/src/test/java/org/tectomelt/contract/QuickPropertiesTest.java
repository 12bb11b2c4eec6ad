package org.tectomelt.contract;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.networknt.schema.Error;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaLocation;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.dialect.Dialect;
import com.networknt.schema.dialect.Dialects;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * The quick accept of {@link QuickProperties} passes and refuses exactly what networknt's own
 * {@code properties} does, with the same errors, on random objects of good and bad members, for a
 * schema of its own and for the spec's melt-fraction request (one point or a batch).
 */
class QuickPropertiesTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final String BASE = "https://example.org/props.json";
    private static final String DOC = """
            {"components": {"schemas": {
              "t": {"type": "number", "minimum": -50, "maximum": 3000, "exclusiveMinimum": true},
              "req": {"type": "object", "additionalProperties": false, "required": ["name"],
                      "properties": {"name": {"type": "string", "enum": ["alpha", "beta"]},
                                     "note": {"type": "string", "description": "free"},
                                     "p": {"type": "number", "minimum": 0, "maximum": 10, "default": 1},
                                     "t": {"$ref": "#/components/schemas/t"},
                                     "when": {"type": "string", "format": "date-time"},
                                     "list": {"type": "array", "maxItems": 2, "items": {"type": "number"}},
                                     "sub": {"type": "object", "properties": {"q": {"type": "number", "maximum": 1}}}}}
            }}}""";

    private static final String[][] MEMBERS = {
        {"name", "\"alpha\""}, {"name", "\"gamma\""}, {"name", "3"}, {"note", "\"x, y\""}, {"note", "1"},
        {"p", "1"}, {"p", "0"}, {"p", "10"}, {"p", "10.5"}, {"p", "\"1\""}, {"p", "9223372036854775807"},
        {"t", "-50"}, {"t", "-49.5"}, {"t", "2999.9999999999995"}, {"t", "3000.0000000000005"},
        {"when", "\"2026-12-02T17:00:00Z\""}, {"when", "\"soon\""}, {"list", "[1, 2]"}, {"list", "[1, 2, 3]"},
        {"sub", "{\"q\": 0.5}"}, {"sub", "{\"q\": 2}"}, {"extra", "1"}, {"p", "null"}, {"p", "true"}};

    private static List<String> errors(Dialect dialect, String base, String doc, String pointer, JsonNode instance) {
        SchemaRegistry registry = SchemaRegistry.withDefaultDialect(dialect, b -> b.schemas(Map.of(base, doc)));
        Schema schema = registry.getSchema(SchemaLocation.of(base + "#" + pointer));
        List<String> out = new ArrayList<>();
        for (Error e : schema.validate(instance)) {
            out.add(e.getInstanceLocation() + " " + e.getKeyword() + ": " + e.getMessage());
        }
        return out;
    }

    @Test
    void theQuickAcceptAgreesWithTheLibraryOnEveryObject() throws Exception {
        Dialect quick = QuickBounds.openApi30(JSON.readTree(DOC));
        Dialect library = Dialects.getOpenApi30();
        Random random = new Random(17);
        int refused = 0;
        int accepted = 0;
        for (int trial = 0; trial < 500; trial++) {
            StringBuilder sb = new StringBuilder("{\"name\": \"beta\"");
            java.util.Set<String> used = new java.util.HashSet<>(List.of("name"));
            int n = random.nextInt(5);
            for (int i = 0; i < n; i++) {
                // mostly good members, so that many objects pass and some fail at one member
                String[] m = random.nextInt(3) > 0 ? MEMBERS[new int[] {3, 5, 6, 12, 0}[random.nextInt(5)]]
                        : MEMBERS[random.nextInt(MEMBERS.length)];
                if (m[0].equals("name") && used.contains("name")) {
                    sb.replace(0, sb.indexOf(",") < 0 ? sb.length() : sb.indexOf(","), "{\"name\": " + m[1]);
                } else if (used.add(m[0])) {
                    sb.append(", \"").append(m[0]).append("\": ").append(m[1]);
                }
            }
            JsonNode body = JSON.readTree(sb.append("}").toString());
            List<String> expected = errors(library, BASE, DOC, "/components/schemas/req", body);
            assertEquals(expected, errors(quick, BASE, DOC, "/components/schemas/req", body), body.toString());
            if (expected.isEmpty()) {
                accepted++;
            } else {
                refused++;
            }
        }
        assertTrue(refused > 100 && accepted > 100, "both kinds tried: " + accepted + " accepted, " + refused
                + " refused");
    }

    @Test
    void theSpecsMeltFractionRequestIsCheckedAlikeBothWays() throws Exception {
        JsonNode spec = SpecContract.standard().document();
        String doc = spec.toString();
        String base = "https://example.org/spec.json";
        String pointer = "/components/schemas/MeltFractionRequest";
        Dialect quick = QuickBounds.openApi30(spec);
        Dialect library = Dialects.getOpenApi30();
        String[] bodies = {
            "{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 2, \"temperatureC\": 1400, \"bulkWaterWtPct\": 0.02}",
            "{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": -1, \"temperatureC\": 1400}",
            "{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 2, \"temperatureC\": 3001}",
            "{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 2, \"temperatureC\": 1400, \"bulkWaterWtPct\": 6}",
            "{\"lithology\": 7, \"pressureGPa\": 2, \"temperatureC\": 1400}",
            "{\"lithology\": \"basalt\", \"pressureGPa\": \"2\", \"temperatureC\": 1400}",
            "{\"lithology\": \"basalt\", \"pressureGPa\": 2, \"temperatureC\": 1400, \"colour\": \"red\"}",
            "{\"pressureGPa\": 2, \"temperatureC\": 1400}",
            "{\"lithology\": \"peridotite-katz2003\", \"points\": [{\"pressureGPa\": 1, \"temperatureC\": 1300}]}",
            "{\"lithology\": \"peridotite-katz2003\", \"columns\": {\"pressureGPa\": [1], \"temperatureC\": [1300]}}",
            "{\"lithology\": \"peridotite-katz2003\", \"columns\": {\"pressureGPa\": [1], \"temperatureC\": [9300]}}"};
        int accepted = 0;
        for (String b : bodies) {
            JsonNode body = JSON.readTree(b);
            List<String> expected = errors(library, base, doc, pointer, body);
            assertEquals(expected, errors(quick, base, doc, pointer, body), b);
            accepted += expected.isEmpty() ? 1 : 0;
        }
        assertEquals(3, accepted, "the one-point body and both batches are valid");
    }
}
