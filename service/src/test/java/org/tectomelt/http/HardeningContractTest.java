package org.tectomelt.http;

import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.not;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.tectomelt.http.Problem.assertProblem;

import com.fasterxml.jackson.databind.JsonNode;
import io.javalin.Javalin;
import org.tectomelt.contract.Json;
import io.restassured.http.ContentType;
import java.io.ByteArrayOutputStream;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.PrintStream;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.util.Map;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/**
 * Regression tests for faults found by attacking the service (issue 13): each of these once got
 * a 500, an HTML page, a bypass of the token, or a silently accepted body.
 */
class HardeningContractTest {

    private static final String PRESSURE = "{\"depthsKm\": [30]}";
    private static Javalin guarded;

    @BeforeAll
    static void start() {
        Config config = TestApps.config(Map.of("TECTOMELT_TOKEN", TestApps.TOKEN));
        guarded = TestApps.start(config);
    }

    @AfterAll
    static void stop() {
        guarded.stop();
    }

    /** Sends raw bytes over one connection and returns everything the server wrote until it closed. */
    static String raw(int port, String request) throws Exception {
        try (Socket s = new Socket("127.0.0.1", port)) {
            s.setSoTimeout(10_000);
            OutputStream out = s.getOutputStream();
            out.write(request.getBytes(StandardCharsets.ISO_8859_1));
            out.flush();
            s.shutdownOutput();
            return new String(s.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        }
    }

    private static void assertRawProblem(String response, int status) throws Exception {
        assertTrue(response.startsWith("HTTP/1.1 " + status), response);
        String lower = response.toLowerCase(java.util.Locale.ROOT);
        assertTrue(lower.contains("content-type: application/problem+json"), response);
        assertFalse(lower.contains("<html"), "no HTML error page: " + response);
        String body = response.substring(response.indexOf("\r\n\r\n") + 4);
        JsonNode problem = Json.mapper().readTree(body);
        assertEquals(status, problem.get("status").asInt(), body);
        assertTrue(problem.get("type").asText().startsWith("/problems/"), body);
        assertTrue(problem.hasNonNull("detail") && problem.hasNonNull("requestId"), body);
    }

    // ---- fault 2: access decided on the matched route; no method override --------------------

    @Test
    void theMetricsWithATrailingSlashNeedTheTokenToo() {
        assertProblem(TestApps.given(guarded).get("/metrics/"), 401, "unauthorized");
        assertProblem(TestApps.given(guarded).get("/metrics"), 401, "unauthorized");
        TestApps.given(guarded).header("Authorization", "Bearer " + TestApps.TOKEN).get("/metrics/").then()
                .statusCode(200);
    }

    @Test
    void healthWithATrailingSlashStaysOpen() {
        TestApps.given(guarded).get("/v1/health/").then().statusCode(200).body("status", equalTo("up"));
    }

    @Test
    void aMethodOverrideHeaderIsIgnored() {
        // a POST tunnelled as GET must not reach the GET route
        assertProblem(TestServer.json("{}").header("X-HTTP-Method-Override", "GET").post("/v1/health"),
                405, "method-not-allowed");
        // and a GET cannot be turned into a POST
        assertProblem(TestServer.given().header("X-HTTP-Method-Override", "POST").get("/v1/pressure"),
                405, "method-not-allowed");
    }

    // ---- faults 5 and 7: exact media type, charset, content encoding ----------------------------

    @Test
    void anUnknownCharsetIsA415NamingUtf8() {
        assertProblem(TestServer.given().contentType("application/json; charset=utf-7").body(PRESSURE.getBytes(StandardCharsets.UTF_8))
                .post("/v1/pressure"), 415, "unsupported-media-type").body("detail", containsString("utf-8"));
        assertProblem(TestServer.given().contentType("application/json; charset=no-such-charset").body(PRESSURE.getBytes(StandardCharsets.UTF_8))
                .post("/v1/pressure"), 415, "unsupported-media-type");
        TestServer.given().contentType("application/json; charset=UTF-8").body(PRESSURE.getBytes(StandardCharsets.UTF_8)).post("/v1/pressure")
                .then().statusCode(200);
        TestServer.given().contentType("Application/JSON").body(PRESSURE.getBytes(StandardCharsets.UTF_8)).post("/v1/pressure").then().statusCode(200);
    }

    @Test
    void mediaTypesMatchExactlyNotByPrefix() {
        for (String ct : new String[] {"application/jsonp", "application/json-patch+json", "application/jsonx",
                "text/json", "application/vnd.api+json"}) {
            assertProblem(TestServer.given().contentType(ct).body(PRESSURE.getBytes(StandardCharsets.UTF_8)).post("/v1/pressure"),
                    415, "unsupported-media-type");
        }
    }

    @Test
    void anEncodedBodyIsA415NotAMisleading400() {
        assertProblem(TestServer.json(PRESSURE).header("Content-Encoding", "gzip").post("/v1/pressure"),
                415, "unsupported-media-type").body("detail", containsString("Content-Encoding"));
        TestServer.json(PRESSURE).header("Content-Encoding", "identity").post("/v1/pressure").then().log().ifValidationFails().statusCode(200);
    }

    // ---- fault 6: an under-sent body ---------------------------------------------------------------

    @Test
    void anUnderSentBodyIsA400CountedAsAClientErrorWithOneWarnLine() throws Exception {
        int port = TestServer.port();
        PrintStream original = System.err;
        ByteArrayOutputStream captured = new ByteArrayOutputStream();
        String response;
        System.setErr(new PrintStream(captured, true, StandardCharsets.UTF_8));
        try {
            response = raw(port, "POST /v1/pressure HTTP/1.1\r\nHost: localhost\r\nContent-Type: application/json\r\n"
                    + "Content-Length: 100\r\n\r\n{\"depthKm\":");
            Thread.sleep(300);   // the log line of the finished request
        } finally {
            System.setErr(original);
        }
        assertRawProblem(response, 400);
        assertTrue(response.contains("/problems/incomplete-body"), response);
        String log = captured.toString(StandardCharsets.UTF_8);
        assertTrue(log.contains("WARN") && log.contains("request body incomplete"), log);
        assertFalse(log.contains("\tat ") || log.contains("Exception"), "no stack trace in the log: " + log);
        assertFalse(log.contains("ERROR"), log);
        TestServer.given().get("/metrics").then().statusCode(200)
                .body(containsString("tectomelt_requests_rejected_total{reason=\"incomplete-body\",status=\"400\"}"))
                .body(not(containsString("route=\"/v1/pressure\",status=\"500\"")));
    }

    // ---- fault 8: errors Jetty answers itself are problem+json too -------------------------------

    @Test
    void aRequestWithoutHostIsAProblemNotAnHtmlPage() throws Exception {
        assertRawProblem(raw(TestServer.port(), "GET /v1/health HTTP/1.1\r\nConnection: close\r\n\r\n"), 400);
    }

    @Test
    void twoContentLengthsAreAProblemNotAnHtmlPage() throws Exception {
        assertRawProblem(raw(TestServer.port(), "POST /v1/pressure HTTP/1.1\r\nHost: localhost\r\n"
                + "Content-Type: application/json\r\nContent-Length: 15\r\nContent-Length: 16\r\nConnection: close\r\n"
                + "\r\n{\"depthKm\": 30}"), 400);
    }

    @Test
    void aDotDotPathIsAProblemNotAnHtmlPage() throws Exception {
        assertRawProblem(raw(TestServer.port(), "GET /../x HTTP/1.1\r\nHost: localhost\r\nConnection: close\r\n\r\n"),
                400);
    }

    @Test
    void aNulInThePathIsAProblemNotAnHtmlPage() throws Exception {
        assertRawProblem(raw(TestServer.port(), "GET /v1/%00 HTTP/1.1\r\nHost: localhost\r\nConnection: close\r\n\r\n"),
                400);
    }

    // ---- fault 9: -0 -------------------------------------------------------------------------------

    @Test
    void minusZeroIsEchoedAsZero() {
        String body = TestServer.json("{\"depthsKm\": [-0.0], \"crustThicknessKm\": -0.0}").post("/v1/pressure").then().log().ifValidationFails().statusCode(200)
                .extract().asString();
        assertFalse(body.contains("-0.0") || body.contains("-0,") || body.contains("-0}"), body);
        assertTrue(body.contains("\"depthKm\":0.0"), body);
    }

    // ---- fault 4: subduction at a vanishing water content ------------------------------------------

    @Test
    void subductionAtAVanishingWaterContentIsNeverA500() {
        String body = "{\"depthKm\": 1e-9, \"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 1e-310,"
                + " \"slabWaterFluxKgPerMPerYr\": 1000000}";
        TestServer.given().contentType(ContentType.JSON).body(body).post("/v1/settings/subduction").then()
                .statusCode(200)
                .body("waterForOnsetWtPct", equalTo(0.0))
                .body("magmaProductionKm3PerYrPerKm", equalTo(null))
                .body("warnings", hasItem(containsString("melts without added water")));
    }
}
