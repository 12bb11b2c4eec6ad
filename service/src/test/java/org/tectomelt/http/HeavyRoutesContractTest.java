package org.tectomelt.http;

import static org.hamcrest.Matchers.closeTo;
import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.notNullValue;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.tectomelt.http.Problem.assertProblem;

import io.javalin.Javalin;
import io.restassured.http.ContentType;
import io.restassured.response.Response;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;
import org.tectomelt.engine.Deadline;

/**
 * Heavy routes: the concurrency limit with its 503 and {@code Retry-After}, cheap routes staying
 * responsive while heavy ones are saturated, the wall-clock budget, and the result cache. Uses
 * test-only heavy routes, since which production routes are heavy is up to each feature.
 */
class HeavyRoutesContractTest {

    private static final String SLOW = "/v1/test-only/slow";

    /** A heavy route that holds its slot until {@code release} opens. */
    private static Route slow(CountDownLatch entered, CountDownLatch release) {
        return Route.heavyPost(SLOW, ctx -> {
            entered.countDown();
            release.await(20, TimeUnit.SECONDS);
            Responses.json(ctx, Map.of("done", true));
        });
    }

    @Test
    void beyondTheLimitA503WithRetryAfterWhileCheapRoutesStayResponsive() throws Exception {
        Config config = TestApps.config(Map.of("TECTOMELT_HEAVY_CONCURRENCY", "2", "TECTOMELT_HEAVY_QUEUE_MS", "0"));
        CountDownLatch entered = new CountDownLatch(2);
        CountDownLatch release = new CountDownLatch(1);
        Javalin app = TestApps.start(config, TestApps.routesPlus(config, slow(entered, release)), new Heavy(config));
        ExecutorService pool = Executors.newFixedThreadPool(2);
        try {
            List<Future<Response>> running = new ArrayList<>();
            for (int i = 0; i < 2; i++) {
                String body = "{\"n\": " + i + "}";   // distinct, so neither is a cache hit
                running.add(pool.submit(() -> TestApps.given(app).contentType(ContentType.JSON).body(body).post(SLOW)));
            }
            assertTrue(entered.await(20, TimeUnit.SECONDS), "both slots taken");

            for (int i = 0; i < 3; i++) {
                assertProblem(TestApps.given(app).contentType(ContentType.JSON).body("{\"n\": 9}").post(SLOW),
                        503, "busy")
                        .header("Retry-After", equalTo(String.valueOf(Heavy.RETRY_AFTER_SECONDS)))
                        .body("detail", containsString("TECTOMELT_HEAVY_CONCURRENCY"));
            }
            // the cheap routes answer while every heavy slot is taken
            TestApps.given(app).get("/v1/health").then().statusCode(200);
            TestApps.given(app).contentType(ContentType.JSON).body("{\"depthsKm\": [30.9]}").post("/v1/pressure")
                    .then().statusCode(200)
                    // REFERENCES §1.1 [calc]: mantle-only column, 1 GPa at 30.9 km
                    .body("points[0].pressureGPa", closeTo(1.0, 0.002));
            TestApps.given(app).get("/metrics").then().statusCode(200)
                    .body(containsString("tectomelt_heavy_in_flight 2.0"));

            release.countDown();
            for (Future<Response> f : running) {
                assertEquals(200, f.get(20, TimeUnit.SECONDS).statusCode());
            }
            // slots are given back
            TestApps.given(app).contentType(ContentType.JSON).body("{\"n\": 3}").post(SLOW).then().statusCode(200);
        } finally {
            release.countDown();
            pool.shutdownNow();
            app.stop();
        }
    }

    @Test
    void aShortWaitInTheQueueIsServedInsteadOfRefused() throws Exception {
        Config config = TestApps.config(Map.of("TECTOMELT_HEAVY_CONCURRENCY", "1", "TECTOMELT_HEAVY_QUEUE_MS", "10000"));
        CountDownLatch entered = new CountDownLatch(1);
        CountDownLatch release = new CountDownLatch(1);
        Javalin app = TestApps.start(config, TestApps.routesPlus(config, slow(entered, release)), new Heavy(config));
        ExecutorService pool = Executors.newFixedThreadPool(2);
        try {
            Future<Response> first = pool.submit(() -> TestApps.given(app).contentType(ContentType.JSON)
                    .body("{\"n\": 1}").post(SLOW));
            assertTrue(entered.await(20, TimeUnit.SECONDS));
            Future<Response> queued = pool.submit(() -> TestApps.given(app).contentType(ContentType.JSON)
                    .body("{\"n\": 2}").post(SLOW));
            Thread.sleep(200);
            release.countDown();
            assertEquals(200, first.get(20, TimeUnit.SECONDS).statusCode());
            assertEquals(200, queued.get(20, TimeUnit.SECONDS).statusCode());
        } finally {
            release.countDown();
            pool.shutdownNow();
            app.stop();
        }
    }

    @Test
    void everyHeavyRouteOfTheServiceAnswers503WhenAllSlotsAreTaken() {
        Config config = TestApps.config(Map.of("TECTOMELT_HEAVY_QUEUE_MS", "0"));
        Heavy heavy = new Heavy(config);
        Javalin app = TestApps.start(config, App.routes(config), heavy);
        int taken = heavy.drain();
        try {
            for (Route r : App.routes(config)) {
                if (r.heavy()) {
                    assertProblem(TestApps.given(app).contentType(ContentType.JSON).body("{}")
                                    .post(AccessControlContractTest.concrete(r.path())),
                            503, "busy").header("Retry-After", notNullValue());
                }
            }
        } finally {
            heavy.refill(taken);
            app.stop();
        }
    }

    @Test
    void workBeyondTheBudgetIsAbandonedWithA503() {
        Config config = TestApps.config(Map.of("TECTOMELT_HEAVY_BUDGET_MS", "100"));
        AtomicInteger abandoned = new AtomicInteger();
        Route endless = Route.heavyPost("/v1/test-only/endless", ctx -> {
            Deadline d = Heavy.deadline(ctx);
            assertEquals(100, d.budget().toMillis());
            try {
                while (true) {
                    d.check();
                    Thread.onSpinWait();
                }
            } finally {
                abandoned.incrementAndGet();
            }
        });
        Javalin app = TestApps.start(config, TestApps.routesPlus(config, endless), new Heavy(config));
        try {
            assertProblem(TestApps.given(app).contentType(ContentType.JSON).body("{}").post("/v1/test-only/endless"),
                    503, "over-budget")
                    .header("Retry-After", equalTo(String.valueOf(Heavy.RETRY_AFTER_SECONDS)))
                    .body("detail", containsString("100 ms"))
                    .body("detail", containsString("TECTOMELT_HEAVY_BUDGET_MS"));
            assertEquals(1, abandoned.get(), "the loop was left, not kept running");
            // the slot was given back
            assertProblem(TestApps.given(app).contentType(ContentType.JSON).body("{}").post("/v1/test-only/endless"),
                    503, "over-budget");
        } finally {
            app.stop();
        }
    }

    @Test
    void cheapRoutesHaveNoDeadline() {
        Config config = TestApps.config(Map.of());
        Route probe = Route.post("/v1/test-only/cheap", ctx ->
                Responses.json(ctx, Map.of("unlimited", Heavy.deadline(ctx).isUnlimited())));
        Javalin app = TestApps.start(config, TestApps.routesPlus(config, probe), new Heavy(config));
        try {
            TestApps.given(app).contentType(ContentType.JSON).body("{}").post("/v1/test-only/cheap").then()
                    .statusCode(200).body("unlimited", equalTo(true));
        } finally {
            app.stop();
        }
    }

    @Test
    void identicalHeavyRequestsAreComputedOnceWhileTheCacheHoldsThem() {
        AtomicInteger computed = new AtomicInteger();
        Route counting = Route.heavyPost("/v1/test-only/counted", ctx -> {
            computed.incrementAndGet();
            Responses.json(ctx, Map.of("x", 1.5));
        });
        Config cached = TestApps.config(Map.of());
        Javalin app = TestApps.start(cached, TestApps.routesPlus(cached, counting), new Heavy(cached));
        try {
            String etag = TestApps.given(app).contentType(ContentType.JSON).body("{\"a\": 1, \"b\": [2.50, 3]}")
                    .post("/v1/test-only/counted").then().statusCode(200).extract().header("ETag");
            // same request, other key order and number spelling: a cache hit with the same tag and bytes
            TestApps.given(app).contentType(ContentType.JSON).body("{ \"b\": [2.5e0, 3], \"a\": 1 }")
                    .post("/v1/test-only/counted").then().statusCode(200)
                    .header("ETag", equalTo(etag)).body("x", equalTo(1.5));
            assertEquals(1, computed.get());
            TestApps.given(app).contentType(ContentType.JSON).body("{\"a\": 2}").post("/v1/test-only/counted")
                    .then().statusCode(200);
            assertEquals(2, computed.get());
            TestApps.given(app).get("/metrics").then()
                    .body(containsString("cache_gets_total{cache=\"results\",result=\"hit\"} 1.0"));
        } finally {
            app.stop();
        }

        computed.set(0);
        Config off = TestApps.config(Map.of("TECTOMELT_CACHE_MB", "0"));
        Javalin uncached = TestApps.start(off, TestApps.routesPlus(off, counting), new Heavy(off));
        try {
            for (int i = 0; i < 2; i++) {
                TestApps.given(uncached).contentType(ContentType.JSON).body("{\"a\": 1}")
                        .post("/v1/test-only/counted").then().statusCode(200);
            }
            assertEquals(2, computed.get());
        } finally {
            uncached.stop();
        }
    }
}
