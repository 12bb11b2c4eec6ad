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
import org.junit.jupiter.api.Test;

/**
 * The quick accept of {@link QuickBounds} passes and refuses exactly what networknt's own
 * {@code minimum}/{@code maximum} do, with the same messages, at and around inclusive and exclusive
 * bounds that are and are not exact doubles.
 */
class QuickBoundsTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final String BASE = "https://example.org/bounds.json";
    private static final String SCHEMAS = """
            {"components": {"schemas": {
              "inclusive": {"type": "number", "minimum": 0.1, "maximum": 200},
              "exclusive": {"type": "number", "minimum": -2.5, "exclusiveMinimum": true,
                            "maximum": 0.3, "exclusiveMaximum": true},
              "integer": {"type": "integer", "minimum": 1, "maximum": 10000}
            }}}""";

    /** The service's dialect, with its quick accepts, on this test's schemas. */
    private static Dialect quick() throws Exception {
        return QuickBounds.openApi30(JSON.readTree(SCHEMAS));
    }

    private static List<String> errors(Dialect dialect, String name, String instance) throws Exception {
        SchemaRegistry registry = SchemaRegistry.withDefaultDialect(dialect, b -> b.schemas(Map.of(BASE, SCHEMAS)));
        Schema schema = registry.getSchema(SchemaLocation.of(BASE + "#/components/schemas/" + name));
        JsonNode node = JSON.readTree(instance);
        List<String> out = new ArrayList<>();
        for (Error e : schema.validate(node)) {
            out.add(e.getKeyword() + ": " + e.getMessage());
        }
        return out;
    }

    @Test
    void theQuickAcceptAgreesWithTheLibraryEverywhere() throws Exception {
        Dialect quick = quick();
        Dialect library = Dialects.getOpenApi30();
        List<String> values = new ArrayList<>(List.of("0.1", "0.10000000000000000555", "0.1000000000000000055511151231257827",
                "0.09999999999999999", "200", "200.0", "200.00000000000000001", "-2.5", "-2.4999999999999996",
                "0.3", "0.29999999999999993", "0.30000000000000004", "1", "0", "10000", "10001", "1e2", "-1e300",
                "1e300", "123456789012345678901234567890", "9223372036854775807", "\"text\"", "null", "true"));
        for (double d : new double[] {0.1, 200, -2.5, 0.3, 1, 10000}) {
            values.add(Double.toString(Math.nextUp(d)));
            values.add(Double.toString(Math.nextDown(d)));
        }
        int refused = 0;
        int accepted = 0;
        for (String name : List.of("inclusive", "exclusive", "integer")) {
            for (String v : values) {
                List<String> expected = errors(library, name, v);
                assertEquals(expected, errors(quick, name, v), name + " " + v);
                if (expected.isEmpty()) {
                    accepted++;
                } else {
                    refused++;
                }
            }
        }
        assertTrue(accepted > 20 && refused > 20, accepted + " accepted, " + refused + " refused");
    }

    @Test
    void aBoundBreachIsStillWordedByTheLibrary() throws Exception {
        List<String> e = errors(quick(), "inclusive", "200.5");
        assertEquals(1, e.size(), e.toString());
        assertTrue(e.get(0).startsWith("maximum: "), e.get(0));
        assertFalse(errors(quick(), "exclusive", "0.3").isEmpty(), "an exclusive bound itself fails");
    }
}
