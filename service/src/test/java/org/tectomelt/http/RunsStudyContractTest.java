package org.tectomelt.http;

import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.hasItem;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.javalin.Javalin;
import io.restassured.http.ContentType;
import io.restassured.path.json.JsonPath;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.tectomelt.Config;
import org.tectomelt.RunsConfig;
import org.tectomelt.Tokens;
import org.tectomelt.runs.Backends;
import org.tectomelt.runs.RunService;

/**
 * Runs with a study over HTTP (embedded database): a forward Monte Carlo at every sweep point
 * (one summary per point, the band of a curve), a posterior inversion and a sampling inversion of
 * an invented ridge's crust, and the 400s naming the field. The scenario is invented: the
 * "Varden Rise", 60 mm/yr, 7.1 ± 0.8 km of crust.
 */
class RunsStudyContractTest {

    @TempDir
    Path dir;

    private Javalin app;

    @BeforeEach
    void start() throws Exception {
        Config config = TestApps.config(Map.of());
        RunsConfig base = Backends.fresh(Backends.names().get(0), dir.resolve("data"), "study-contract");
        RunsConfig runs = new RunsConfig(base.dataDir(), base.databaseUrl(), base.databaseUser(),
                base.databasePassword(), 3_000, 5, 30, 2, 500, 100, base.instanceName());
        app = TestApps.start(config, Tokens.fromEnvironment(Map.of(), ""), RunService.open(runs, App.evaluator(config)));
    }

    @AfterEach
    void stop() {
        app.stop();
    }

    private String submit(String body) {
        return TestApps.given(app).contentType(ContentType.JSON).body(body).post("/v1/runs").then().statusCode(202)
                .extract().jsonPath().getString("id");
    }

    private JsonPath await(String id) throws InterruptedException {
        Instant end = Instant.now().plus(Duration.ofSeconds(120));
        while (true) {
            JsonPath run = TestApps.given(app).get("/v1/runs/" + id).then().statusCode(200).extract().jsonPath();
            String status = run.getString("status");
            if (!status.equals("queued") && !status.equals("running")) {
                return run;
            }
            if (Instant.now().isAfter(end)) {
                throw new AssertionError("run " + id + " still " + status);
            }
            Thread.sleep(50);
        }
    }

    @Test
    void aForwardStudyAtEverySweepPointGivesOneSummaryPerPoint() throws Exception {
        String id = submit("""
                {"operation": "mid-ocean-ridge", "request": {"fullSpreadingRateMmPerYr": 60},
                 "sweep": {"potentialTemperatureC": {"values": [1300, 1400]}},
                 "uncertainty": {"samples": 20, "seed": 42,
                                 "inputs": {"bulkWaterWtPct": {"uniform": {"min": 0, "max": 0.02}}}},
                 "outputs": ["crustalThicknessKm"], "label": "Varden Rise band"}""");
        JsonPath run = await(id);
        assertEquals("succeeded", run.getString("status"));
        assertEquals(2, run.getInt("progress.total"), "two sweep points of one 20-sample block each");
        assertEquals(42L, run.getLong("study.uncertainty.seed"));
        // provenance as on every answer: the build /v1/health names and the models the samples'
        // results listed, here those a single wet request of the operation lists
        assertEquals(TestApps.given(app).get("/v1/health").then().extract().path("commit"),
                run.getString("provenance.commit"));
        List<Map<String, String>> single = TestApps.given(app).contentType(ContentType.JSON)
                .body("{\"potentialTemperatureC\": 1300, \"bulkWaterWtPct\": 0.01, \"fullSpreadingRateMmPerYr\": 60}")
                .post("/v1/settings/mid-ocean-ridge").then().statusCode(200).extract().jsonPath()
                .getList("provenance.models");
        List<Map<String, String>> models = run.getList("provenance.models");
        assertEquals(models.size(), Set.copyOf(models).size(), "each model once: " + models);
        assertEquals(Set.copyOf(single), Set.copyOf(models));
        JsonPath rows = TestApps.given(app).get("/v1/runs/" + id + "/results").then().statusCode(200)
                .extract().jsonPath();
        assertEquals(2, rows.getList("$").size());
        assertEquals("forward", rows.getString("[0].study.study"));
        assertEquals(20, rows.getInt("[0].study.summaries.crustalThicknessKm.n"));
        assertEquals("km", rows.getString("[0].study.summaries.crustalThicknessKm.unit"));
        double low = rows.getDouble("[0].study.summaries.crustalThicknessKm.p50");
        double high = rows.getDouble("[1].study.summaries.crustalThicknessKm.p50");
        assertTrue(high > low + 2, "a 100 K hotter mantle makes several km more crust: " + low + " → " + high);
        assertTrue(rows.getDouble("[0].study.summaries.crustalThicknessKm.p16")
                <= rows.getDouble("[0].study.summaries.crustalThicknessKm.p84"));
        String csv = TestApps.given(app).get("/v1/runs/" + id + "/results?format=csv").then().statusCode(200)
                .extract().asString();
        String[] lines = csv.split("\r\n");
        assertEquals(3, lines.length, csv);
        assertTrue(lines[0].startsWith("index,potentialTemperatureC,crustalThicknessKm.mean,crustalThicknessKm.sd,"
                + "crustalThicknessKm.p2_5,crustalThicknessKm.p16"), lines[0]);
    }

    @Test
    void bothInversionsReturnThePotentialTemperatureOfAnObservedCrust() throws Exception {
        String posterior = submit("""
                {"operation": "mid-ocean-ridge", "request": {"fullSpreadingRateMmPerYr": 60},
                 "solve": {"field": "potentialTemperatureC", "min": 1200, "max": 1500, "gridPoints": 31},
                 "observed": {"crustalThicknessKm": {"value": 7.1, "sd": 0.8}}}""");
        String sampling = submit("""
                {"operation": "mid-ocean-ridge", "request": {"fullSpreadingRateMmPerYr": 60},
                 "uncertainty": {"samples": 30, "seed": 7},
                 "solve": {"field": "potentialTemperatureC", "min": 1200, "max": 1500, "method": "sampling",
                           "scanPoints": 8},
                 "observed": {"crustalThicknessKm": {"value": 7.1, "sd": 0.8}}}""");
        JsonPath posteriorRun = await(posterior);
        assertEquals("succeeded", posteriorRun.getString("status"));
        assertEquals("succeeded", await(sampling).getString("status"));
        // the models of the inversion's forward evaluations, as a single dry request lists them
        List<Map<String, String>> single = TestApps.given(app).contentType(ContentType.JSON)
                .body("{\"potentialTemperatureC\": 1300, \"fullSpreadingRateMmPerYr\": 60}")
                .post("/v1/settings/mid-ocean-ridge").then().statusCode(200).extract().jsonPath()
                .getList("provenance.models");
        assertEquals(Set.copyOf(single), Set.copyOf(posteriorRun.<Map<String, String>>getList("provenance.models")));
        JsonPath p = TestApps.given(app).get("/v1/runs/" + posterior + "/results").then().statusCode(200)
                .extract().jsonPath();
        assertEquals("posterior", p.getString("[0].study.study"));
        assertEquals(31, p.getList("[0].study.density").size());
        double mean = p.getDouble("[0].study.estimate.mean");
        JsonPath s = TestApps.given(app).get("/v1/runs/" + sampling + "/results").then().statusCode(200)
                .extract().jsonPath();
        assertEquals("sampling", s.getString("[0].study.study"));
        assertEquals(30, s.getInt("[0].study.samples"));
        double sampled = s.getDouble("[0].study.summary.mean");
        // the crust rises by roughly 0.1 km per K near here: 0.8 km of sd is several tens of K
        assertTrue(Math.abs(sampled - mean) < 20, "the methods agree: " + mean + " vs " + sampled);
        assertTrue(mean > 1250 && mean < 1400, "about 1300 °C for 7 km of crust: " + mean);
    }

    @Test
    void aStudyThatCannotStartIsA400NamingEveryField() {
        TestApps.given(app).contentType(ContentType.JSON).body("""
                {"operation": "mid-ocean-ridge", "request": {"fullSpreadingRateMmPerYr": 60},
                 "sweep": {"potentialTemperatureC": {"values": [1300, 1400]}},
                 "uncertainty": {"samples": 100,
                   "inputs": {"potentialTemperatureC": {"normal": {"mean": 1350, "sd": 25}},
                              "bulkWaterWtPct": {"normal": {"mean": 0.01, "sd": 0.01}}}}}""")
                .post("/v1/runs").then().statusCode(400)
                .body("type", equalTo("/problems/validation"))
                .body("errors.field", hasItem("uncertainty.inputs.bulkWaterWtPct"))
                .body("errors.field", hasItem("sweep.potentialTemperatureC"));
        List<String> fields = TestApps.given(app).contentType(ContentType.JSON).body("""
                {"operation": "mid-ocean-ridge", "request": {"fullSpreadingRateMmPerYr": 60},
                 "solve": {"field": "potentialTemperatureC", "min": 900, "max": 1500}}""")
                .post("/v1/runs").then().statusCode(400).extract().jsonPath().getList("errors.field");
        assertTrue(fields.containsAll(List.of("solve.min", "observed")), fields.toString());
    }
}
