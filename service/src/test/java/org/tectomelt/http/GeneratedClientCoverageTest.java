package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * Every JSON operation of {@code api-spec/openapi.yaml} is called through the Java client that the
 * OpenAPI Generator builds from it, in some test under {@code http/}: the spec stays usable by
 * generated clients for every endpoint, not only for the ones someone remembered.
 */
class GeneratedClientCoverageTest {

    @Test
    void everyOperationIsCalledThroughTheGeneratedClient() throws IOException {
        JsonNode spec = new ObjectMapper(new YAMLFactory()).readTree(Path.of("..", "api-spec", "openapi.yaml").toFile());
        StringBuilder sources = new StringBuilder();
        try (Stream<Path> files = Files.walk(Path.of("src", "test", "java", "org", "tectomelt", "http"))) {
            for (Path f : files.filter(p -> p.toString().endsWith(".java")).toList()) {
                String text = Files.readString(f, StandardCharsets.UTF_8);
                if (text.contains("import org.tectomelt.client.")) {
                    sources.append(text);
                }
            }
        }
        List<String> missing = new ArrayList<>();
        int operations = 0;
        for (JsonNode path : spec.get("paths")) {
            for (JsonNode op : path) {
                if (!op.has("operationId")) {
                    continue;
                }
                // an operation answering only text (the YAML spec, Prometheus metrics) cannot be called
                // through the generated client, which reads every body as JSON; contract tests cover those
                JsonNode ok = op.at("/responses/200/content");
                if (!ok.has("application/json")) {
                    continue;
                }
                operations++;
                String id = op.get("operationId").asText();
                if (!sources.toString().contains("." + id + "(")) {
                    missing.add(id);
                }
            }
        }
        assertTrue(operations >= 3, "the spec lists its operations");
        assertTrue(missing.isEmpty(), "operations never called through the generated client "
                + "(add a call in your own *GeneratedClientTest): " + missing);
    }
}
