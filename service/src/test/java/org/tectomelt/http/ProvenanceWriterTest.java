package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.charset.StandardCharsets;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.Json;
import org.tectomelt.engine.Deadline;
import org.tectomelt.operations.Operation;

/**
 * The one-pass answer writer ({@link Provenance#json}) writes exactly the bytes of the tree way
 * ({@code valueToTree}, {@link Provenance#attach}, write), for the documented example request of
 * every operation in the spec: a cheap answer skips the tree, and no answer changes by it.
 */
class ProvenanceWriterTest {

    private static final Invoker INVOKER = Invoker.standard();

    @Test
    void oneWriteEqualsTheTreeWayForEveryDocumentedExample() {
        int compared = 0;
        for (Operation<?, ?> op : INVOKER.operations().list()) {
            for (JsonNode example : SpecExamples.of(INVOKER, op)) {
                Record result = INVOKER.run(op, example.deepCopy(), Deadline.none());
                String tree = new String(Json.write(Provenance.attach(Json.mapper().valueToTree(result))),
                        StandardCharsets.UTF_8);
                String direct = new String(Provenance.json(result), StandardCharsets.UTF_8);
                assertEquals(tree, direct, op.name() + ": " + example);
                assertTrue(direct.contains("\"provenance\":{\"version\":"), op.name());
                compared++;
            }
        }
        assertTrue(compared >= INVOKER.operations().list().size(), "every operation has an example: " + compared);
    }

    @Test
    void aResultWithoutModelsGetsAnEmptyList() {
        record Bare(double valueC) {
        }
        JsonNode out = Json.readTree(Provenance.json(new Bare(1.5)));
        assertEquals(1.5, out.get("valueC").asDouble());
        assertTrue(out.at("/provenance/models").isArray());
        assertEquals(0, out.at("/provenance/models").size());
        assertFalse(out.at("/provenance/version").asText().isEmpty());
    }
}
