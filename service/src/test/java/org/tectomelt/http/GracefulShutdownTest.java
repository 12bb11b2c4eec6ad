package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.javalin.Javalin;
import java.io.IOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.time.Duration;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/** Stopping the server lets in-flight requests finish and refuses new ones. */
class GracefulShutdownTest {

    @Test
    void inFlightRequestsFinishAndNewOnesAreRefused() throws Exception {
        Config config = TestApps.config(Map.of("TECTOMELT_SHUTDOWN_GRACE_MS", "30000"));
        CountDownLatch entered = new CountDownLatch(1);
        CountDownLatch release = new CountDownLatch(1);
        Route slow = Route.heavyPost("/v1/test-only/slow", ctx -> {
            entered.countDown();
            release.await(60, TimeUnit.SECONDS);
            Responses.json(ctx, Map.of("finished", true));
        });
        Javalin app = TestApps.start(config, TestApps.routesPlus(config, slow), new Heavy(config));
        URI base = URI.create("http://127.0.0.1:" + app.port());
        HttpClient inFlightClient = HttpClient.newHttpClient();
        CompletableFuture<HttpResponse<String>> inFlight = inFlightClient.sendAsync(
                HttpRequest.newBuilder(base.resolve("/v1/test-only/slow"))
                        .header("Content-Type", "application/json")
                        .POST(HttpRequest.BodyPublishers.ofString("{}")).build(),
                HttpResponse.BodyHandlers.ofString());
        assertTrue(entered.await(20, TimeUnit.SECONDS), "the slow request is being served");

        CompletableFuture<Void> stopping = CompletableFuture.runAsync(app::stop);
        // wait until the connector has stopped accepting
        HttpClient fresh = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(2)).build();
        HttpRequest health = HttpRequest.newBuilder(base.resolve("/v1/health")).timeout(Duration.ofSeconds(2)).build();
        boolean refused = false;
        for (int i = 0; i < 100 && !refused; i++) {
            try {
                HttpResponse<String> r = fresh.send(health, HttpResponse.BodyHandlers.ofString());
                refused = r.statusCode() == 503;
            } catch (IOException e) {
                refused = true;   // connection refused: the port is closed
            }
            if (!refused) {
                Thread.sleep(50);
            }
        }
        assertTrue(refused, "new requests are refused while stopping");
        assertTrue(!stopping.isDone(), "the server waits for the request in flight");

        release.countDown();
        HttpResponse<String> finished = inFlight.get(20, TimeUnit.SECONDS);
        assertEquals(200, finished.statusCode());
        assertEquals("{\"finished\":true}", finished.body());
        stopping.get(20, TimeUnit.SECONDS);
        assertThrows(IOException.class, () -> HttpClient.newHttpClient().send(health,
                HttpResponse.BodyHandlers.ofString()));
    }

    @Test
    void heavyWorkStillRunningAfterTheGracePeriodIsCancelled() throws Exception {
        Config config = TestApps.config(Map.of("TECTOMELT_SHUTDOWN_GRACE_MS", "200",
                "TECTOMELT_HEAVY_BUDGET_MS", "600000"));
        CountDownLatch entered = new CountDownLatch(1);
        CountDownLatch left = new CountDownLatch(1);
        Route endless = Route.heavyPost("/v1/test-only/endless", ctx -> {
            org.tectomelt.engine.Deadline d = Heavy.deadline(ctx);
            entered.countDown();
            try {
                while (true) {
                    d.check();
                    Thread.sleep(5);
                }
            } finally {
                left.countDown();
            }
        });
        Javalin app = TestApps.start(config, TestApps.routesPlus(config, endless), new Heavy(config));
        HttpClient.newHttpClient().sendAsync(HttpRequest.newBuilder(
                        URI.create("http://127.0.0.1:" + app.port() + "/v1/test-only/endless"))
                .header("Content-Type", "application/json").POST(HttpRequest.BodyPublishers.ofString("{}")).build(),
                HttpResponse.BodyHandlers.discarding());
        assertTrue(entered.await(20, TimeUnit.SECONDS), "the endless computation runs");
        try {
            app.stop();
        } catch (RuntimeException e) {
            // the grace period ended with the request still in flight: that is the case under test
        }
        // its budget is ten minutes; the stop must end it long before
        assertTrue(left.await(10, TimeUnit.SECONDS), "the abandoned computation was cancelled through its deadline");
    }
}
