package org.tectomelt.http;

import static org.hamcrest.Matchers.emptyString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.matchesPattern;
import static org.hamcrest.Matchers.nullValue;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import io.javalin.Javalin;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/** ETags computed from the canonical request, and {@code If-None-Match}. */
class ConditionalRequestContractTest {

    private static final String BODY = "{\"depthsKm\": [10, 30.9], \"crustThicknessKm\": 35}";

    private static String etagOf(String body) {
        return TestServer.json(body).post("/v1/pressure").then().statusCode(200)
                .header("ETag", matchesPattern("\"[A-Za-z0-9_-]{24}\"")).extract().header("ETag");
    }

    @Test
    void theSameRequestSpelledDifferentlyHasTheSameTag() {
        String tag = etagOf(BODY);
        assertEquals(tag, etagOf("{\"crustThicknessKm\":35,\"depthsKm\":[10,30.90]}"));
        assertEquals(tag, etagOf("{\n  \"depthsKm\" : [ 10 , 3.09e1 ],\n  \"crustThicknessKm\" : 35 }"));
        // an integer and a decimal stay distinct spellings (an integer field refuses 35.0)
        assertNotEquals(tag, etagOf("{\"crustThicknessKm\":35.0,\"depthsKm\":[10,30.9]}"));
    }

    @Test
    void anotherRequestHasAnotherTag() {
        String tag = etagOf(BODY);
        assertNotEquals(tag, etagOf("{\"depthsKm\": [10, 30.9], \"crustThicknessKm\": 36}"));
        assertNotEquals(tag, etagOf("{\"depthsKm\": [30.9, 10], \"crustThicknessKm\": 35}"));
    }

    @Test
    void ifNoneMatchWithTheTagIsA304WithoutABody() {
        String tag = etagOf(BODY);
        TestServer.json(BODY).header("If-None-Match", tag).post("/v1/pressure").then()
                .statusCode(304)
                .header("ETag", equalTo(tag))
                .body(emptyString());
        TestServer.json(BODY).header("If-None-Match", "\"other\", W/" + tag).post("/v1/pressure").then()
                .statusCode(304);
        TestServer.json(BODY).header("If-None-Match", "\"other\"").post("/v1/pressure").then()
                .statusCode(200)
                .header("ETag", equalTo(tag));
    }

    @Test
    void refusalsAndLiveAnswersCarryNoTag() {
        TestServer.json("{\"depthsKm\": [-1]}").post("/v1/pressure").then().statusCode(400)
                .header("ETag", nullValue());
        TestServer.json("{\"depthsKm\": [1]").post("/v1/pressure").then().statusCode(400)
                .header("ETag", nullValue());
        TestServer.given().get("/v1/health").then().statusCode(200).header("ETag", nullValue());
        TestServer.given().get("/metrics").then().statusCode(200).header("ETag", nullValue());
    }

    @Test
    void aTagFromAnotherBuildOrOtherCapsNeverMatches() {
        Javalin other = TestApps.start(TestApps.config(Map.of("TECTOMELT_MAX_PROFILE_POINTS", "4000")));
        try {
            String here = etagOf(BODY);
            String there = TestApps.given(other).contentType("application/json").body(BODY).post("/v1/pressure")
                    .then().statusCode(200).extract().header("ETag");
            assertNotEquals(here, there);
        } finally {
            other.stop();
        }
    }

    @Test
    void ifNoneMatchParsing() {
        assertTrue(RequestKey.matches("\"a\"", "\"a\""));
        assertTrue(RequestKey.matches(" \"b\" ,W/\"a\"", "\"a\""));
        assertFalse(RequestKey.matches("\"a\"", "\"ab\""));
        assertFalse(RequestKey.matches("*", "\"a\""));
        assertFalse(RequestKey.matches(null, "\"a\""));
    }

    /**
     * Every POST operation whose request body has an {@code example} (or {@code examples}) in the spec answers it with a
     * tag, and with 304 when the tag comes back: endpoints get this check by documenting an example.
     */
    @Test
    void everyDocumentedExampleIsTaggedAndRevalidated() throws Exception {
        JsonNode spec = new ObjectMapper(new YAMLFactory()).readTree(Path.of("..", "api-spec", "openapi.yaml").toFile());
        int checked = 0;
        for (Iterator<Map.Entry<String, JsonNode>> it = spec.get("paths").fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> path = it.next();
            JsonNode media = path.getValue().path("post").path("requestBody").path("content")
                    .path("application/json");
            List<JsonNode> examples = new ArrayList<>();
            if (!media.path("example").isMissingNode()) {
                examples.add(media.get("example"));
            }
            media.path("examples").forEach(named -> examples.add(named.path("value")));
            for (JsonNode example : examples) {
                String body = example.toString();
                String url = AccessControlContractTest.concrete(path.getKey());
                String tag = TestServer.json(body).post(url).then().statusCode(200)
                        .extract().header("ETag");
                TestServer.json(body).header("If-None-Match", tag).post(url).then().statusCode(304);
                checked++;
            }
        }
        assertTrue(checked >= 1, "the spec documents at least the pressure example");
    }
}
