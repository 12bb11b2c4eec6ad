package org.tectomelt.http;

import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.matchesPattern;
import static org.hamcrest.Matchers.startsWith;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.javalin.Javalin;
import io.restassured.http.ContentType;
import java.util.Map;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/** {@code GET /metrics}: the Prometheus text format with requests, refusals, engine time and the JVM. */
class MetricsContractTest {

    private static String metrics(Javalin app) {
        return TestApps.given(app).get("/metrics").then()
                .statusCode(200)
                .contentType(startsWith("text/plain; version=0.0.4"))
                .extract().asString();
    }

    private static double sample(String text, String series) {
        var m = Pattern.compile("(?m)^" + Pattern.quote(series) + " (\\S+)$").matcher(text);
        assertTrue(m.find(), "no sample " + series + " in\n" + text);
        return Double.parseDouble(m.group(1));
    }

    @Test
    void requestsRefusalsEngineTimeAndTheJvmAreExposed() {
        Config config = TestApps.config(Map.of());
        Route timed = Route.post("/v1/test-only/timed", ctx -> {
            double x = Metrics.engine(ctx, () -> Math.sqrt(2.0));
            Responses.json(ctx, Map.of("x", x));
        });
        Javalin app = TestApps.start(config, TestApps.routesPlus(config, timed), new Heavy(config));
        try {
            for (int i = 0; i < 3; i++) {
                TestApps.given(app).contentType(ContentType.JSON).body("{\"depthsKm\": [" + i + "]}")
                        .post("/v1/pressure").then().statusCode(200);
            }
            TestApps.given(app).contentType(ContentType.TEXT).body("x").post("/v1/pressure").then().statusCode(415);
            TestApps.given(app).contentType(ContentType.JSON).body("{\"depthsKm\": [-1]}").post("/v1/pressure")
                    .then().statusCode(400);
            TestApps.given(app).get("/v1/nowhere/" + System.nanoTime()).then().statusCode(404);
            TestApps.given(app).contentType(ContentType.JSON).body("{}").post("/v1/test-only/timed").then()
                    .statusCode(200);

            String text = metrics(app);
            assertTrue(sample(text,
                    "tectomelt_http_requests_seconds_count{method=\"POST\",route=\"/v1/pressure\",status=\"200\"}") == 3);
            assertTrue(sample(text, "tectomelt_http_requests_seconds_bucket{method=\"POST\",route=\"/v1/pressure\","
                    + "status=\"200\",le=\"+Inf\"}") == 3);
            assertTrue(sample(text,
                    "tectomelt_requests_rejected_total{reason=\"unsupported-media-type\",status=\"415\"}") == 1);
            // refused before the handler ran, still counted under its route
            assertTrue(sample(text,
                    "tectomelt_http_requests_seconds_count{method=\"POST\",route=\"/v1/pressure\",status=\"415\"}") == 1);
            assertTrue(sample(text, "tectomelt_requests_rejected_total{reason=\"validation\",status=\"400\"}") == 1);
            assertTrue(sample(text, "tectomelt_requests_rejected_total{reason=\"not-found\",status=\"404\"}") == 1);
            // a random path becomes one "unmatched" series, so callers cannot inflate the label set
            assertTrue(sample(text,
                    "tectomelt_http_requests_seconds_count{method=\"GET\",route=\"unmatched\",status=\"404\"}") == 1);
            assertTrue(sample(text, "tectomelt_engine_seconds_count{route=\"/v1/test-only/timed\"}") == 1);
            assertTrue(text.contains("jvm_memory_used_bytes{area=\"heap\""), "JVM memory");
            assertTrue(text.contains("jvm_gc_"), "JVM garbage collection");
            assertTrue(sample(text, "tectomelt_process_resident_memory_bytes") > 1e6, "resident set size");
            assertTrue(sample(text, "tectomelt_heavy_slots") == config.heavyConcurrency());
        } finally {
            app.stop();
        }
    }

    @Test
    void theSharedServerExposesMetricsToo() {
        TestServer.given().get("/v1/health").then().statusCode(200);
        TestServer.given().get("/metrics").then()
                .statusCode(200)
                .contentType(startsWith("text/plain"))
                .body(containsString("# TYPE tectomelt_http_requests_seconds histogram"))
                .body(matchesPattern("(?s).*\\njvm_threads_live_threads \\d+.*"));
    }
}
