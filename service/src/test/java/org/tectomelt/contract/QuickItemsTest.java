package org.tectomelt.contract;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
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
 * The quick accept of {@link QuickItems} passes and refuses exactly what networknt's own {@code items}
 * does, with the same errors, for batches of points with every kind of defect, and it stands aside for
 * item schemas that are not plain points. Also checked on the spec's own melt-fraction batch.
 */
class QuickItemsTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final String BASE = "https://example.org/items.json";
    private static final String DOC = """
            {"components": {"schemas": {
              "point": {"type": "object", "additionalProperties": false, "required": ["p", "t"],
                        "properties": {"p": {"type": "number", "format": "double", "minimum": 0, "maximum": 10},
                                       "t": {"type": "number", "minimum": -50, "maximum": 3000,
                                             "exclusiveMaximum": true, "description": "°C"},
                                       "w": {"type": "number", "minimum": 0.1}}},
              "batch": {"type": "array", "items": {"$ref": "#/components/schemas/point"}},
              "inline": {"type": "array", "items": {"type": "object", "additionalProperties": false,
                         "required": ["p"], "properties": {"p": {"type": "number", "maximum": 1}}}},
              "notPlain": {"type": "array", "items": {"type": "object", "additionalProperties": false,
                           "properties": {"p": {"type": "number", "enum": [1, 2]}}}},
              "open": {"type": "array", "items": {"type": "object",
                       "properties": {"p": {"type": "number", "maximum": 1}}}},
              "numbers": {"type": "array", "items": {"$ref": "#/components/schemas/point/properties/t"}}
            }}}""";

    private static List<String> errors(Dialect dialect, String name, JsonNode instance) {
        SchemaRegistry registry = SchemaRegistry.withDefaultDialect(dialect, b -> b.schemas(Map.of(BASE, DOC)));
        Schema schema = registry.getSchema(SchemaLocation.of(BASE + "#/components/schemas/" + name));
        List<String> out = new ArrayList<>();
        for (Error e : schema.validate(instance)) {
            out.add(e.getInstanceLocation() + " " + e.getKeyword() + ": " + e.getMessage());
        }
        return out;
    }

    private static final String[] ITEMS = {
        "{\"p\": 1, \"t\": 1200}", "{\"p\": 0.5, \"t\": 1200.5, \"w\": 0.2}", "{\"p\": 0, \"t\": 1200}",
        "{\"p\": 10, \"t\": 1200}", "{\"p\": 10.000000000000002, \"t\": 1200}", "{\"p\": 1, \"t\": 3000}",
        "{\"p\": 1, \"t\": 2999.9999999999995}", "{\"p\": 1}", "{\"t\": 5}", "{\"p\": 1, \"t\": 5, \"x\": 1}",
        "{\"p\": \"1\", \"t\": 5}", "{\"p\": 1, \"t\": null}", "null", "[1, 2]", "7", "{\"p\": 1, \"t\": 5, \"w\": 0.1}",
        "{\"p\": 9223372036854775807, \"t\": 5}", "{\"p\": 1e-320, \"t\": 5}", "{\"p\": 1, \"t\": -50}",
        "{\"p\": 1, \"t\": 123456789012345678901234567890}", "{\"p\": {\"q\": 1}, \"t\": 5}", "{}"};

    @Test
    void theQuickAcceptAgreesWithTheLibraryOnEveryBatch() throws Exception {
        JsonNode doc = JSON.readTree(DOC);
        Dialect quick = QuickBounds.openApi30(doc);
        Dialect library = Dialects.getOpenApi30();
        Random random = new Random(20261202);
        int refused = 0;
        for (int trial = 0; trial < 400; trial++) {
            StringBuilder sb = new StringBuilder("[");
            int n = 1 + random.nextInt(6);
            for (int i = 0; i < n; i++) {
                // mostly good points, so that many batches pass and some fail at one item
                String item = random.nextInt(3) > 0 ? ITEMS[random.nextInt(2)] : ITEMS[random.nextInt(ITEMS.length)];
                sb.append(i == 0 ? "" : ",").append(item);
            }
            JsonNode batch = JSON.readTree(sb.append("]").toString());
            for (String schema : List.of("inline", "notPlain", "open")) {
                check(quick, library, schema, batch);
            }
            StringBuilder nums = new StringBuilder("[");
            for (int i = 0; i < n; i++) {
                String item = random.nextInt(3) > 0 ? "1200.5" : NUMBERS[random.nextInt(NUMBERS.length)];
                nums.append(i == 0 ? "" : ",").append(item);
            }
            JsonNode numbers = JSON.readTree(nums.append("]").toString());
            refused += check(quick, library, "numbers", numbers);
            refused += check(quick, library, "batch", batch);
        }
        assertTrue(refused > 100, "the trials include many refused batches: " + refused);
    }

    private static final String[] NUMBERS = {"-50", "-49.99999999999999", "3000", "2999.9999999999995", "0", "1e3",
        "\"7\"", "null", "true", "[1]", "{}", "9223372036854775807", "123456789012345678901234567890", "-1e300"};

    /** The same errors both ways; 1 when the batch was refused. */
    private static int check(Dialect quick, Dialect library, String schema, JsonNode batch) {
        List<String> expected = errors(library, schema, batch);
        assertEquals(expected, errors(quick, schema, batch), schema + " " + batch);
        return expected.isEmpty() ? 0 : 1;
    }

    @Test
    void onlyPlainPointSchemasGetTheQuickAccept() throws Exception {
        JsonNode doc = JSON.readTree(DOC);
        QuickItems items = new QuickItems(doc);
        assertTrue(items.quickFor(doc.at("/components/schemas/batch/items")));
        assertTrue(items.quickFor(doc.at("/components/schemas/inline/items")));
        assertFalse(items.quickFor(doc.at("/components/schemas/notPlain/items")), "an enum is not a bound");
        assertFalse(items.quickFor(doc.at("/components/schemas/open/items")), "unknown fields allowed");
        assertTrue(items.quickFor(doc.at("/components/schemas/numbers/items")), "bounded numbers");
        assertFalse(items.quickFor(JSON.readTree("{\"type\": \"number\", \"format\": \"float\", \"maximum\": 1}")),
                "a float's range is the library's to check");
    }

    @Test
    void theSpecsMeltFractionBatchIsAPlainPointBatch() {
        JsonNode spec = SpecContract.standard().document();
        assertTrue(new QuickItems(spec).quickFor(spec.at("/components/schemas/MeltFractionRequest/properties/points/items")));
        for (String column : List.of("pressureGPa", "temperatureC")) {
            assertTrue(new QuickItems(spec).quickFor(spec.at("/components/schemas/MeltFractionRequest/properties/columns"
                    + "/properties/" + column + "/items")), column);
        }
    }
}
