package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.tectomelt.http.Problem.assertInvalidField;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import io.restassured.response.Response;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.tectomelt.contract.Json;
import org.tectomelt.operations.Operation;
import org.tectomelt.operations.Operations;

/**
 * Every computing answer says what made it: {@code provenance} with the build's version and commit
 * and the models (citation and DOI) it used; {@code ?cite=bibtex} or
 * {@code Accept: application/x-bibtex} gives the same as BibTeX. Walks every operation of the
 * catalogue with the request example its spec entry documents.
 */
class ProvenanceContractTest {

    private static JsonNode example(JsonNode spec, String path) {
        JsonNode media = spec.path("paths").path(path).path("post").path("requestBody").path("content")
                .path("application/json");
        if (!media.path("example").isMissingNode()) {
            return media.get("example");
        }
        return media.path("examples").elements().next().path("value");
    }

    @Test
    void everyOperationAnswersWithItsProvenanceAndItsBibtexOnRequest() throws Exception {
        JsonNode spec = new ObjectMapper(new YAMLFactory()).readTree(Path.of("..", "api-spec", "openapi.yaml").toFile());
        int checked = 0;
        for (Operation<?, ?> op : Operations.all()) {
            String body = example(spec, op.path()).toString();
            Response r = TestServer.json(body).post(op.path());
            r.then().statusCode(200)
                    .header(Provenance.VERSION_HEADER, BuildInfo.CURRENT.version())
                    .header(Provenance.COMMIT_HEADER, BuildInfo.CURRENT.commitLabel());
            JsonNode answer = Json.mapper().readTree(r.asByteArray());
            JsonNode p = answer.path("provenance");
            assertEquals(BuildInfo.CURRENT.version(), p.path("version").asText(), op.name());
            assertEquals(BuildInfo.CURRENT.commitLabel(), p.path("commit").asText(), op.name());
            assertTrue(p.path("models").isArray() && p.path("models").size() > 0, op.name() + ": " + p);
            assertEquals(answer.path("models"), p.path("models"), op.name() + ": the models that made it");
            for (JsonNode m : p.path("models")) {
                assertTrue(m.hasNonNull("citation") && m.has("doi"), op.name() + ": " + m);
            }

            String byQuery = TestServer.json(body).queryParam("cite", "bibtex").post(op.path()).then()
                    .statusCode(200).contentType("application/x-bibtex; charset=utf-8").extract().asString();
            String byAccept = TestServer.json(body).header("Accept", "application/x-bibtex").post(op.path()).then()
                    .statusCode(200).extract().asString();
            assertEquals(byQuery, byAccept, op.name());
            assertTrue(byQuery.startsWith("@misc{tectomelt-" + BuildInfo.CURRENT.version() + ","), byQuery);
            for (JsonNode m : p.path("models")) {
                assertTrue(byQuery.contains("{" + m.path("id").asText() + ",\n"), op.name() + " cites "
                        + m.path("id").asText() + ":\n" + byQuery);
            }
            checked++;
        }
        assertTrue(checked >= 3, "the catalogue's operations were walked");
    }

    @Test
    void anUnknownCiteFormatOnAComputationIsNamed() {
        assertInvalidField(TestServer.json("{\"depthsKm\": [30]}").queryParam("cite", "endnote").post("/v1/pressure"),
                "cite");
    }
}
