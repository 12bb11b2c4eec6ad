package org.tectomelt.contract;

import static org.junit.jupiter.api.Assertions.assertEquals;

import com.fasterxml.jackson.annotation.JsonInclude;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.charset.StandardCharsets;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.ModelCatalogue;
import org.tectomelt.engine.ModelInfo;

/**
 * A model written as pre-encoded bytes is what Jackson's own record serializer writes, in bytes, in
 * text and in a tree alike, for every model of the catalogue and for odd ones (a null member, quotes,
 * non-ASCII, control characters).
 */
class ModelInfoJsonTest {

    private static final ObjectMapper PLAIN = new ObjectMapper().setSerializationInclusion(JsonInclude.Include.NON_NULL);

    record Listing(List<ModelInfo> models, ModelInfo first) {
    }

    @Test
    void everyModelIsWrittenAsJacksonWritesIt() throws Exception {
        List<ModelInfo> models = new java.util.ArrayList<>(ModelCatalogue.all());
        models.add(new ModelInfo("odd", "Ærø, \"Quoted\" & back\\slash\ttab (2026)", null));
        models.add(new ModelInfo(null, "", ""));
        for (ModelInfo m : models) {
            Listing l = new Listing(List.of(m, m), m);
            String expected = PLAIN.writeValueAsString(l);
            assertEquals(expected, new String(Json.write(l), StandardCharsets.UTF_8), "bytes, twice: " + m);
            assertEquals(expected, Json.mapper().writeValueAsString(l), "text: " + m);
            JsonNode tree = Json.mapper().valueToTree(l);
            assertEquals(PLAIN.valueToTree(l), tree, "tree: " + m);
            assertEquals(expected, Json.mapper().writeValueAsString(tree), "tree written: " + m);
        }
    }
}
