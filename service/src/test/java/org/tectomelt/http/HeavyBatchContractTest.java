package org.tectomelt.http;

import static org.tectomelt.http.Problem.assertProblem;

import io.javalin.Javalin;
import io.restassured.http.ContentType;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/**
 * Fault 3 of issue 13: a large melt-fraction batch is heavy work. Above
 * {@code TECTOMELT_HEAVY_BATCH_POINTS} points it goes through the heavy limiter (503 busy when
 * every slot is taken); at or below it, it is served at once.
 */
class HeavyBatchContractTest {

    /** A hydrous melt-fraction batch of {@code n} points at 2 GPa, 1200 °C upwards. */
    static String batch(int n) {
        StringBuilder sb = new StringBuilder("{\"lithology\":\"peridotite-katz2003\",\"bulkWaterWtPct\":0.1,\"points\":[");
        for (int i = 0; i < n; i++) {
            sb.append(i == 0 ? "" : ",").append("{\"pressureGPa\":2,\"temperatureC\":").append(1200 + i).append('}');
        }
        return sb.append("]}").toString();
    }

    @Test
    void aBatchAboveTheConfiguredSizeWaitsForAHeavySlot() {
        Config config = TestApps.config(Map.of("TECTOMELT_HEAVY_BATCH_POINTS", "5", "TECTOMELT_HEAVY_QUEUE_MS", "0"));
        Heavy heavy = new Heavy(config);
        Javalin app = TestApps.start(config, App.routes(config), heavy);
        int taken = heavy.drain();
        try {
            assertProblem(TestApps.given(app).contentType(ContentType.JSON).body(batch(6)).post("/v1/melt-fraction"),
                    503, "busy");
            TestApps.given(app).contentType(ContentType.JSON).body(batch(5)).post("/v1/melt-fraction").then()
                    .statusCode(200);
        } finally {
            heavy.refill(taken);
            app.stop();
        }
    }
}
