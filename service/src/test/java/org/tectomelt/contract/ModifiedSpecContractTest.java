package org.tectomelt.contract;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import io.javalin.Javalin;
import java.io.InputStream;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;
import org.tectomelt.http.App;

/**
 * A range changed in a copy of the spec changes what an app built on that copy accepts, with no Java edit:
 * an operation's request and the body of a run alike.
 */
class ModifiedSpecContractTest {

    private static final String BODY = "{\"potentialTemperatureC\": 1650, \"fullSpreadingRateMmPerYr\": 40}";

    @Test
    void anAppOnACopyWithANarrowerRangeEnforcesIt() throws Exception {
        ObjectMapper yaml = new ObjectMapper(new YAMLFactory());
        ObjectNode copy;
        try (InputStream in = SpecContract.class.getResourceAsStream(SpecContract.SPEC_RESOURCE)) {
            copy = (ObjectNode) yaml.readTree(in);
        }
        ((ObjectNode) copy.at("/components/schemas/MidOceanRidgeRequest/properties/potentialTemperatureC"))
                .put("maximum", 1600);
        Javalin standard = App.create(Config.defaults().withPort(0)).start("127.0.0.1", 0);
        Javalin narrowed = App.create(Config.defaults().withPort(0), SpecContract.fromYaml(yaml.writeValueAsBytes(copy)))
                .start("127.0.0.1", 0);
        try {
            HttpResponse<String> ok = post(standard);
            assertEquals(200, ok.statusCode(), ok.body());
            HttpResponse<String> refused = post(narrowed);
            assertEquals(400, refused.statusCode(), refused.body());
            var problem = Json.mapper().readTree(refused.body());
            assertEquals("potentialTemperatureC", problem.at("/errors/0/field").asText());
            assertTrue(problem.at("/errors/0/message").asText().contains("between 1000 and 1600, got 1650"),
                    refused.body());
        } finally {
            standard.stop();
            narrowed.stop();
        }
    }

    @Test
    void anAppOnACopyHoldsARunToTheCopysLimits() throws Exception {
        ObjectMapper yaml = new ObjectMapper(new YAMLFactory());
        ObjectNode copy;
        try (InputStream in = SpecContract.class.getResourceAsStream(SpecContract.SPEC_RESOURCE)) {
            copy = (ObjectNode) yaml.readTree(in);
        }
        ((ObjectNode) copy.at("/components/schemas/Uncertainty/properties/samples")).put("maximum", 300);
        Javalin narrowed = App.create(Config.defaults().withPort(0), SpecContract.fromYaml(yaml.writeValueAsBytes(copy)))
                .start("127.0.0.1", 0);
        try {
            HttpResponse<String> refused = HttpClient.newHttpClient().send(HttpRequest.newBuilder(URI.create(
                    "http://127.0.0.1:" + narrowed.port() + "/v1/runs")).header("Content-Type", "application/json")
                    .POST(HttpRequest.BodyPublishers.ofString("""
                            {"operation": "mid-ocean-ridge", "request": {"fullSpreadingRateMmPerYr": 40},
                             "uncertainty": {"samples": 400, "inputs": {"potentialTemperatureC":
                               {"normal": {"mean": 1350, "sd": 20}}}}}""")).build(),
                    HttpResponse.BodyHandlers.ofString());
            assertEquals(400, refused.statusCode(), refused.body());
            var problem = Json.mapper().readTree(refused.body());
            assertEquals("uncertainty.samples", problem.at("/errors/0/field").asText(), refused.body());
            assertTrue(problem.at("/errors/0/message").asText().contains("between 1 and 300, got 400"), refused.body());
        } finally {
            narrowed.stop();
        }
    }

    private static HttpResponse<String> post(Javalin app) throws Exception {
        return HttpClient.newHttpClient().send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + app.port()
                + "/v1/settings/mid-ocean-ridge")).header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofString(BODY)).build(), HttpResponse.BodyHandlers.ofString());
    }
}
