package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import org.junit.jupiter.api.ClassOrderer;
import org.junit.jupiter.api.Order;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/**
 * Keeps {@code api-spec/openapi.yaml} true to the code: the same routes in both, and every
 * documented status code produced by some contract test. Runs after the other test classes
 * ({@link ClassOrderer.OrderAnnotation} is the default orderer, see the surefire config), because
 * it reads the status codes they recorded in {@link TestServer#OBSERVED}.
 */
@Order(Integer.MAX_VALUE)
class SpecConsistencyTest {

    private static final Set<String> METHODS = Set.of("get", "post", "put", "patch", "delete", "head", "options");

    private static JsonNode spec() throws Exception {
        return new ObjectMapper(new YAMLFactory()).readTree(Path.of("..", "api-spec", "openapi.yaml").toFile());
    }

    private static Set<String> specOperations(JsonNode spec) {
        Set<String> ops = new TreeSet<>();
        for (Iterator<Map.Entry<String, JsonNode>> it = spec.get("paths").fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> path = it.next();
            path.getValue().fieldNames().forEachRemaining(m -> {
                if (METHODS.contains(m)) {
                    ops.add(m.toUpperCase(Locale.ROOT) + " " + path.getKey());
                }
            });
        }
        return ops;
    }

    @Test
    void everyRouteIsInTheSpecAndEverySpecPathHasARoute() throws Exception {
        Set<String> code = new TreeSet<>();
        for (Route r : App.routes(Config.defaults())) {
            code.add(r.method().name().toUpperCase(Locale.ROOT) + " " + r.path());
        }
        Set<String> documented = specOperations(spec());
        assertEquals(documented, code, "routes in the code (right) and operations in openapi.yaml (left) differ");
    }

    @Test
    void everyDocumentedStatusCodeIsProducedByAContractTest() throws Exception {
        JsonNode spec = spec();
        assertTrue(TestServer.OBSERVED.size() > 0, "run the whole suite: this test reads what the contract tests saw");
        List<String> missing = new ArrayList<>();
        for (Iterator<Map.Entry<String, JsonNode>> it = spec.get("paths").fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> path = it.next();
            for (Iterator<Map.Entry<String, JsonNode>> ops = path.getValue().fields(); ops.hasNext(); ) {
                Map.Entry<String, JsonNode> op = ops.next();
                if (!METHODS.contains(op.getKey())) {
                    continue;
                }
                op.getValue().get("responses").fieldNames().forEachRemaining(status -> {
                    String key = TestServer.key(op.getKey(), path.getKey(), Integer.parseInt(status));
                    if (!TestServer.OBSERVED.contains(key)) {
                        missing.add(key);
                    }
                });
            }
        }
        assertTrue(missing.isEmpty(), "documented but never produced by a contract test: " + missing);
    }

    @Test
    void everyRequestBodySchemaRejectsUnknownFields() throws Exception {
        JsonNode schemas = spec().get("components").get("schemas");
        List<String> open = new ArrayList<>();
        schemas.fields().forEachRemaining(e -> {
            if (e.getKey().endsWith("Request") && !e.getValue().path("additionalProperties").isBoolean()) {
                open.add(e.getKey());
            }
        });
        assertTrue(open.isEmpty(), "request schemas must say additionalProperties: false, as the server does: " + open);
    }
}
