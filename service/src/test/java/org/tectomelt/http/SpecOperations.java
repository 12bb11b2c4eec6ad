package org.tectomelt.http;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;

/** The POST operations of {@code api-spec/openapi.yaml} with their request schemas, for spec-driven tests. */
final class SpecOperations {

    /** One POST operation: its path and the schema of its JSON request body. */
    record Operation(String path, JsonNode schema) {
        @Override
        public String toString() {
            return "POST " + path;
        }
    }

    private static final JsonNode SPEC = load();

    private SpecOperations() {
    }

    /** Every POST operation with a JSON request body, in spec order. */
    static List<Operation> posts() {
        List<Operation> ops = new ArrayList<>();
        for (Iterator<Map.Entry<String, JsonNode>> it = SPEC.get("paths").fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> path = it.next();
            JsonNode schema = path.getValue().path("post").path("requestBody").path("content")
                    .path("application/json").path("schema");
            if (!schema.isMissingNode()) {
                ops.add(new Operation(path.getKey(), schema));
            }
        }
        return ops;
    }

    /** Follows {@code $ref} chains within the spec. */
    static JsonNode resolve(JsonNode schema) {
        JsonNode s = schema;
        for (int guard = 0; s.has("$ref") && guard < 32; guard++) {
            String ref = s.get("$ref").asText();
            if (!ref.startsWith("#/")) {
                throw new IllegalArgumentException("only local references are supported: " + ref);
            }
            JsonNode target = SPEC;
            for (String part : ref.substring(2).split("/")) {
                target = target.path(part.replace("~1", "/").replace("~0", "~"));
            }
            if (target.isMissingNode()) {
                throw new IllegalArgumentException("dangling reference " + ref);
            }
            s = target;
        }
        return s;
    }

    private static JsonNode load() {
        try {
            return new ObjectMapper(new YAMLFactory()).readTree(Path.of("..", "api-spec", "openapi.yaml").toFile());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
