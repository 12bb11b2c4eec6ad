package org.tectomelt.contract;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import com.networknt.schema.Error;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaLocation;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.dialect.Dialects;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * How {@code api-spec/openapi.yaml} writes "this object or null". OpenAPI 3.0.3 (§4.7.24, Schema
 * Object, {@code nullable}) lets {@code nullable: true} add null only to the {@code type} given in
 * the same Schema Object, and a {@code $ref} takes no siblings; so a nullable reference is written
 * {@code type: object, nullable: true, allOf: [{$ref}]}. OpenAPI linters report a {@code nullable}
 * without a sibling {@code type} as an error (common practice; the rule is usually called
 * "nullable-type-sibling"). The second test checks that networknt's OpenAPI 3.0 dialect, which
 * {@link SpecContract} uses at run time, still accepts null for such a field and still checks the
 * referenced schema otherwise.
 */
class SpecNullableTest {

    private static final String BASE = "https://tectomelt.invalid/openapi.json";
    private static JsonNode spec;

    @BeforeAll
    static void read() throws Exception {
        spec = new ObjectMapper(new YAMLFactory()).readTree(Path.of("..", "api-spec", "openapi.yaml").toFile());
    }

    /** JSON pointers of every object in the document that has a member {@code key}. */
    private static void walk(JsonNode n, String pointer, String key, List<String> out) {
        if (n.isObject()) {
            if (n.has(key)) {
                out.add(pointer);
            }
            for (Iterator<Map.Entry<String, JsonNode>> it = n.fields(); it.hasNext(); ) {
                Map.Entry<String, JsonNode> e = it.next();
                walk(e.getValue(), pointer + "/" + e.getKey().replace("~", "~0").replace("/", "~1"), key, out);
            }
        } else if (n.isArray()) {
            for (int i = 0; i < n.size(); i++) {
                walk(n.get(i), pointer + "/" + i, key, out);
            }
        }
    }

    private static List<String> nullableSchemas() {
        List<String> all = new ArrayList<>();
        walk(spec, "", "nullable", all);
        return all;
    }

    @Test
    void everyNullableSchemaNamesItsTypeBesideIt() {
        List<String> all = nullableSchemas();
        assertTrue(all.size() > 10, "the spec has nullable fields: " + all);
        List<String> untyped = new ArrayList<>();
        for (String p : all) {
            if (!spec.at(p).has("type")) {
                untyped.add(p);
            }
        }
        assertEquals(List.of(), untyped, "nullable without a sibling type (OpenAPI 3.0.3 Schema Object, nullable)");
    }

    @Test
    void aNullableReferenceAcceptsNullAndIsStillCheckedAgainstItsSchema() {
        SchemaRegistry registry = SchemaRegistry.withDefaultDialect(Dialects.getOpenApi30(),
                b -> b.schemas(Map.of(BASE, spec.toString())));
        ObjectMapper json = new ObjectMapper();
        int composed = 0;
        for (String p : nullableSchemas()) {
            JsonNode s = spec.at(p);
            if (!s.path("nullable").asBoolean() || !s.has("allOf")) {
                continue;
            }
            composed++;
            assertEquals("object", s.path("type").asText(), p);
            Schema schema = registry.getSchema(SchemaLocation.of(BASE + "#" + p));
            List<Error> onNull = schema.validate(json.nullNode());
            assertEquals(List.of(), onNull, p + " must accept null");
            assertFalse(schema.validate(json.getNodeFactory().numberNode(42)).isEmpty(), p + " must reject a number");
            assertFalse(schema.validate(json.createObjectNode()).isEmpty(),
                    p + " must still require the referenced schema's fields");
        }
        assertTrue(composed >= 7, "onset/top of the columns, pooled, wetSolidusComparison…: " + composed);
    }
}
