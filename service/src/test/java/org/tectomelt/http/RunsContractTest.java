package org.tectomelt.http;

import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.startsWith;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.javalin.Javalin;
import io.restassured.http.ContentType;
import io.restassured.path.json.JsonPath;
import io.restassured.response.Response;
import io.restassured.specification.RequestSpecification;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.stream.Stream;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.tectomelt.Config;
import org.tectomelt.RunsConfig;
import org.tectomelt.Tokens;
import org.tectomelt.runs.Backends;
import org.tectomelt.runs.RunService;

/**
 * {@code /v1/runs} over HTTP, on the embedded database and (when {@code .ci/run} provides one) on
 * PostgreSQL: a sweep accepted with 202 and computed in the background on the operations' own
 * path, its results as JSON, CSV and NDJSON, up-front validation naming the field and the
 * offending values, a failing point recorded while the run goes on, ownership through the tokens
 * file, the limits, 404 and the storage being unreachable.
 */
class RunsContractTest {

    static final String ANA = "ana-token-0123456789abcdef";
    static final String BEN = "ben-token-0123456789abcdef";

    @TempDir
    Path dir;

    private Javalin app;

    static Stream<String> backends() {
        return Backends.names().stream();
    }

    @AfterEach
    void stop() {
        if (app != null) {
            app.stop();
        }
    }

    private void start(String backend, int maxQueued) throws Exception {
        Path tokens = dir.resolve("tokens");
        Files.writeString(tokens, "# the group\nana:" + ANA + "\nben:" + BEN + "\n", StandardCharsets.UTF_8);
        Config config = TestApps.config(Map.of());
        RunsConfig base = Backends.fresh(backend, dir.resolve("data"), "contract-" + backend);
        RunsConfig runs = new RunsConfig(base.dataDir(), base.databaseUrl(), base.databaseUser(),
                base.databasePassword(), 3_000, maxQueued, 30, 2, 500, 100, base.instanceName());
        app = TestApps.start(config, Tokens.fromEnvironment(Map.of("TECTOMELT_TOKENS_FILE", tokens.toString()), ""),
                RunService.open(runs, App.evaluator(config)));
    }

    private RequestSpecification as(String token) {
        return TestApps.given(app).header("Authorization", "Bearer " + token);
    }

    private Response post(String token, String body) {
        return as(token).contentType(ContentType.JSON).body(body).post("/v1/runs");
    }

    private JsonPath await(String id, Duration max) throws InterruptedException {
        Instant end = Instant.now().plus(max);
        while (true) {
            JsonPath run = as(BEN).get("/v1/runs/" + id).then().statusCode(200).extract().jsonPath();
            String status = run.getString("status");
            if (!status.equals("queued") && !status.equals("running")) {
                return run;
            }
            if (Instant.now().isAfter(end)) {
                throw new AssertionError("run " + id + " still " + status + " after " + max);
            }
            Thread.sleep(50);
        }
    }

    private static final String RIDGE = """
            {"operation": "mid-ocean-ridge", "request": {"fullSpreadingRateMmPerYr": 40},
             "sweep": {"potentialTemperatureC": {"from": 1250, "to": 1550, "steps": 7},
                       "bulkWaterWtPct": {"values": [0, 0.01]}},
             "outputs": ["crustalThicknessKm"], "label": "Sarrow Ridge, Tp and water"}""";

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void aSweepIsAcceptedComputedAndReadableAsJsonCsvAndNdjson(String backend) throws Exception {
        start(backend, 5);
        Response created = post(ANA, RIDGE);
        created.then().statusCode(202)
                .header("Location", startsWith("/v1/runs/"))
                .contentType(startsWith("application/json"))
                .body("status", equalTo("queued"))
                .body("owner", equalTo("ana"))
                .body("label", equalTo("Sarrow Ridge, Tp and water"))
                .body("progress.total", equalTo(14))
                .body("sweep.potentialTemperatureC.steps", equalTo(7));
        String id = created.jsonPath().getString("id");
        assertEquals("/v1/runs/" + id, created.header("Location"));

        JsonPath done = await(id, Duration.ofSeconds(60));
        assertEquals("succeeded", done.getString("status"));
        assertEquals(14, done.getInt("progress.done"));
        assertEquals(0, done.getInt("progress.failed"));
        assertEquals(App.VERSION, done.getString("provenance.version"));
        assertEquals("/v1/settings/mid-ocean-ridge", done.getString("provenance.path"));
        assertEquals("mid-ocean-ridge", done.getString("provenance.operation"));
        // the build as /v1/health names it, on the POST answer (no models yet: nothing computed) too
        String commit = TestApps.given(app).get("/v1/health").then().statusCode(200).extract().path("commit");
        assertEquals(commit, done.getString("provenance.commit"));
        assertEquals(commit, created.jsonPath().getString("provenance.commit"));
        assertEquals(List.of(), created.jsonPath().getList("provenance.models"));
        Set<Map<String, String>> runModels = Set.copyOf(done.<Map<String, String>>getList("provenance.models"));
        assertEquals(done.getList("provenance.models").size(), runModels.size(), "each model once");
        Set<Map<String, String>> pointModels = new HashSet<>();

        // JSON: one row per point in index order, the last axis fastest; the same numbers the
        // operation's own route answers for that point (one engine path)
        JsonPath rows = as(BEN).get("/v1/runs/" + id + "/results").then().statusCode(200)
                .contentType(startsWith("application/json")).header("X-Run-Status", "succeeded")
                .header("X-Run-Progress", "14/14").extract().jsonPath();
        assertEquals(14, rows.getList("$").size());
        for (int i = 0; i < 14; i++) {
            double tp = 1250 + 50 * (i / 2);
            double water = i % 2 == 0 ? 0 : 0.01;
            assertEquals(i, rows.getInt("[" + i + "].index"));
            assertEquals(tp, rows.getDouble("[" + i + "].inputs.potentialTemperatureC"), 1e-9);
            assertEquals(water, rows.getDouble("[" + i + "].inputs.bulkWaterWtPct"), 1e-12);
            double direct = as(ANA).contentType(ContentType.JSON)
                    .body("{\"potentialTemperatureC\": " + tp + ", \"bulkWaterWtPct\": " + water
                            + ", \"fullSpreadingRateMmPerYr\": 40}")
                    .post("/v1/settings/mid-ocean-ridge").then().statusCode(200).extract().jsonPath()
                    .getDouble("crustalThicknessKm");
            assertEquals(direct, rows.getDouble("[" + i + "].outputs.crustalThicknessKm"), 0.0);
        }
        // the run's models: those single requests of the same operation list for its points
        for (double water : new double[] {0, 0.01}) {
            JsonPath single = as(ANA).contentType(ContentType.JSON).body("{\"potentialTemperatureC\": 1350, "
                    + "\"bulkWaterWtPct\": " + water + ", \"fullSpreadingRateMmPerYr\": 40}")
                    .post("/v1/settings/mid-ocean-ridge").then().statusCode(200).extract().jsonPath();
            pointModels.addAll(single.<Map<String, String>>getList("provenance.models"));
            assertEquals(single.getList("models"), single.getList("provenance.models"));
        }
        assertTrue(!pointModels.isEmpty());
        assertEquals(pointModels, runModels);
        // the listing shows the same provenance
        as(BEN).get("/v1/runs?owner=ana").then().statusCode(200)
                .body("runs[0].provenance.commit", equalTo(commit))
                .body("runs[0].provenance.models.size()", equalTo(runModels.size()));
        // hotter mantle, thicker crust (common practice; e.g. White et al. 1992)
        assertTrue(rows.getDouble("[12].outputs.crustalThicknessKm") > rows.getDouble("[0].outputs.crustalThicknessKm"));

        String csv = as(BEN).header("Accept", "text/csv").get("/v1/runs/" + id + "/results").then().statusCode(200)
                .contentType(startsWith("text/csv")).extract().asString();
        List<String> lines = csv.lines().toList();
        assertEquals("index,potentialTemperatureC,bulkWaterWtPct,crustalThicknessKm,problem", lines.get(0));
        assertEquals(15, lines.size());
        assertTrue(lines.get(3).startsWith("2,1300.0,0.0,"), lines.get(3));

        String nd = as(BEN).get("/v1/runs/" + id + "/results?format=ndjson").then().statusCode(200)
                .contentType(startsWith("application/x-ndjson")).extract().asString();
        List<String> ndl = nd.lines().toList();
        assertEquals(14, ndl.size());
        assertEquals(13, JsonPath.from(ndl.get(13)).getInt("index"));

        as(BEN).get("/v1/runs/" + id + "/results?format=xml").then().statusCode(400)
                .body("errors.field", hasItem("format"));

        // the listing: newest first, filters, paging
        as(BEN).get("/v1/runs?owner=ana&operation=mid-ocean-ridge").then().statusCode(200)
                .body("total", equalTo(1)).body("runs[0].id", equalTo(id));
        as(BEN).get("/v1/runs?status=running").then().statusCode(200).body("total", equalTo(0));
        as(BEN).get("/v1/runs?status=sleeping").then().statusCode(400).body("errors.field", hasItem("status"));
        as(BEN).get("/v1/runs?limit=0").then().statusCode(400).body("errors.field", hasItem("limit"));

        // only the owner deletes; a finished run is removed
        as(BEN).delete("/v1/runs/" + id).then().statusCode(403).body("type", equalTo("/problems/not-owner"));
        TestApps.given(app).delete("/v1/runs/" + id).then().statusCode(401);
        as(ANA).delete("/v1/runs/" + id).then().statusCode(204);
        as(ANA).get("/v1/runs/" + id).then().statusCode(404).body("type", equalTo("/problems/run-not-found"));
        as(ANA).get("/v1/runs/" + id + "/results").then().statusCode(404);
        as(ANA).delete("/v1/runs/" + id).then().statusCode(404);
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void aPointTheModelCannotComputeRecordsItsProblemAndTheRunGoesOn(String backend) throws Exception {
        start(backend, 5);
        // the peridotites are taken to 10 GPa: the 12 GPa point is refused by the operation, after the
        // spec (which has no upper bound on pressureGPa) let it through
        String id = post(ANA, """
                {"operation": "melt-fraction", "request": {"lithology": "peridotite-katz2003", "temperatureC": 1300},
                 "sweep": {"pressureGPa": {"values": [0, 1, 2, 3, 12]}}, "outputs": ["solidusC", "meltFraction"]}""")
                .then().statusCode(202).extract().jsonPath().getString("id");
        JsonPath done = await(id, Duration.ofSeconds(60));
        assertEquals("succeeded", done.getString("status"));
        assertEquals(5, done.getInt("progress.done"));
        assertEquals(1, done.getInt("progress.failed"));
        JsonPath rows = as(ANA).get("/v1/runs/" + id + "/results").then().statusCode(200).extract().jsonPath();
        // Katz et al. (2003) eq. 4 with Table 2: dry solidus 1085.7 + 132.9 P - 5.1 P² (°C, P in GPa)
        double[] p = {0, 1, 2, 3};
        for (int i = 0; i < 4; i++) {
            assertEquals(1085.7 + 132.9 * p[i] - 5.1 * p[i] * p[i], rows.getDouble("[" + i + "].outputs.solidusC"), 1e-6);
            assertNull(rows.get("[" + i + "].problem"));
        }
        assertEquals("/problems/validation", rows.getString("[4].problem.type"));
        assertEquals("pressureGPa", rows.getString("[4].problem.errors[0].field"));
        assertEquals(400, rows.getInt("[4].problem.status"));
        assertNull(rows.get("[4].outputs"));
        String csv = as(ANA).get("/v1/runs/" + id + "/results?format=csv").then().statusCode(200).extract().asString();
        String last = csv.lines().toList().get(5);
        assertTrue(last.startsWith("4,12.0,,,\""), last);
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void everySweepIsCheckedUpFrontNamingTheFieldAndTheOffendingValues(String backend) throws Exception {
        start(backend, 5);
        post(ANA, """
                {"operation": "mid-ocean-ridge", "request": {"fullSpreadingRateMmPerYr": 40},
                 "sweep": {"potentialTemperatureC": {"values": [1300, 1750, 1800, 900]}}}""")
                .then().statusCode(400).contentType(startsWith("application/problem+json"))
                .body("errors[0].field", equalTo("sweep.potentialTemperatureC"))
                .body("errors[0].message", equalTo("must be between 1000 and 1700; offending values: 900, 1750, 1800"));
        post(ANA, "{\"operation\": \"volcano\", \"sweep\": {\"x\": {\"values\": [1]}}}").then().statusCode(400)
                .body("errors[0].field", equalTo("operation")).body("errors[0].message", containsString("mid-ocean-ridge"));
        post(ANA, "{\"operation\": \"mid-ocean-ridge\", \"sweep\": {\"mantleColour\": {\"values\": [1]}}}")
                .then().statusCode(400).body("errors[0].field", equalTo("sweep.mantleColour"))
                .body("errors[0].message", containsString("is not a field of mid-ocean-ridge"));
        post(ANA, "{\"operation\": \"mid-ocean-ridge\", \"sweep\": {\"lithology\": {\"values\": [1]}}}")
                .then().statusCode(400).body("errors[0].field", equalTo("sweep.lithology"))
                .body("errors[0].message", containsString("cannot address"));
        post(ANA, "{\"operation\": \"mid-ocean-ridge\", \"request\": {\"fullSpreadingRateMmPerYr\": 40},"
                + " \"sweep\": {\"potentialTemperatureC\": {\"from\": 1300, \"to\": 1400, \"steps\": 0}}}")
                .then().statusCode(400).body("errors[0].field", equalTo("sweep.potentialTemperatureC.steps"));
        post(ANA, "{\"operation\": \"mid-ocean-ridge\", \"request\": {\"fullSpreadingRateMmPerYr\": 40},"
                + " \"sweep\": {\"potentialTemperatureC\": {\"from\": 1400, \"to\": 1300, \"steps\": 5}}}")
                .then().statusCode(400).body("errors[0].field", equalTo("sweep.potentialTemperatureC"))
                .body("errors[0].message", containsString("from must be below to"));
        post(ANA, "{\"operation\": \"mid-ocean-ridge\", \"request\": {\"fullSpreadingRateMmPerYr\": 40},"
                + " \"sweep\": {\"potentialTemperatureC\": {\"from\": 1300, \"to\": 1400, \"steps\": 100},"
                + " \"bulkWaterWtPct\": {\"from\": 0, \"to\": 0.02, \"steps\": 40}}}")
                .then().statusCode(400).body("errors[0].field", equalTo("sweep"))
                .body("errors[0].message", containsString("TECTOMELT_MAX_RUN_POINTS"));
        post(ANA, "{\"operation\": \"mid-ocean-ridge\", \"request\": {\"fullSpreadingRateMmPerYr\": 40},"
                + " \"sweep\": {\"potentialTemperatureC\": {\"values\": [1300]}}, \"outputs\": [\"crustalThicknessKm\", \"magmaColour\"]}")
                .then().statusCode(400).body("errors[0].field", equalTo("outputs[1]"));
        post(ANA, "{\"operation\": \"mid-ocean-ridge\", \"sweep\": {\"potentialTemperatureC\": {\"values\": [1300]}},"
                + " \"colour\": 1}").then().statusCode(400).body("errors.field", hasItem("colour"));
        // a field missing from the base request is named under request.
        post(ANA, "{\"operation\": \"mid-ocean-ridge\", \"sweep\": {\"potentialTemperatureC\": {\"values\": [1300]}}}")
                .then().statusCode(400).body("errors[0].field", equalTo("request.fullSpreadingRateMmPerYr"));
        as(ANA).contentType(ContentType.TEXT).body("operation=mid-ocean-ridge").post("/v1/runs").then().statusCode(415);
        post(ANA, "{\"operation\": \"pressure\", \"sweep\": {\"crustThicknessKm\": {\"values\": [30]}}}")
                .then().statusCode(400).body("errors[0].field", equalTo("operation"))
                .body("errors[0].message", containsString("no scalar output"));
        post(ANA, "{\"label\": \"" + "x".repeat(1_100_000) + "\"}").then().statusCode(413);
        as(ANA).get("/v1/runs").then().statusCode(200).body("total", equalTo(0));
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void queuedRunsPerOwnerAreLimitedAndARunningRunIsCancelledWithItsPartialResultsKept(String backend)
            throws Exception {
        start(backend, 2);
        // hydrous fractional columns (the slowest ridge points, tens of ms each), so the run is
        // still computing when it is cancelled however fast the machine
        String big = """
                {"operation": "mid-ocean-ridge", "request": {"fullSpreadingRateMmPerYr": 40, "meltingMode": "fractional"},
                 "sweep": {"potentialTemperatureC": {"from": 1250, "to": 1550, "steps": 1000},
                           "bulkWaterWtPct": {"values": [0.01, 0.015, 0.02]}}}""";
        String first = post(ANA, big).then().statusCode(202).extract().jsonPath().getString("id");
        String second = post(ANA, big).then().statusCode(202).extract().jsonPath().getString("id");
        post(ANA, big).then().statusCode(429).header("Retry-After", "30")
                .body("type", equalTo("/problems/too-many-runs"))
                .body("detail", containsString("TECTOMELT_MAX_QUEUED_RUNS_PER_OWNER"));
        post(BEN, RIDGE).then().statusCode(202);

        // partial results while it runs: the rows computed so far, never more than the progress said after
        Response partial = as(BEN).get("/v1/runs/" + first + "/results");
        partial.then().statusCode(200);
        int rows = partial.jsonPath().getList("$").size();
        assertTrue(rows < 3000, "read while running: " + rows + " rows");
        Response cancelled = as(ANA).delete("/v1/runs/" + first);
        cancelled.then().statusCode(200).body("status", equalTo("cancelled"))
                .body("statusReason", equalTo("cancelled by ana"));
        int kept = cancelled.jsonPath().getInt("progress.done");
        assertTrue(kept >= rows && kept < 3000, kept + " points kept of " + rows + " seen");
        Thread.sleep(700);
        int after = as(ANA).get("/v1/runs/" + first + "/results").jsonPath().getList("$").size();
        assertTrue(after >= kept && after < 3000, after + " rows after the cancel");
        as(ANA).delete("/v1/runs/" + second).then().statusCode(200);
        // now ana may start another
        post(ANA, RIDGE).then().statusCode(202);
    }

    @Test
    void metricsCountRunsByStatusPointsAndTheQueue() throws Exception {
        start("h2", 5);
        String id = post(ANA, RIDGE).then().statusCode(202).extract().jsonPath().getString("id");
        await(id, Duration.ofSeconds(60));
        String m = as(ANA).get("/metrics").then().statusCode(200).extract().asString();
        assertTrue(m.contains("tectomelt_runs{status=\"succeeded\"} 1.0"), m);
        assertTrue(m.contains("tectomelt_run_points_total 14.0"), m);
        assertTrue(m.contains("tectomelt_run_queue_chunks 0.0"), m);
        assertTrue(m.contains("tectomelt_run_points_per_second"), m);
    }

    @Test
    void anUnreachableDatabaseIsA503NamingItAndTheServiceLivesOn() throws Exception {
        Config config = TestApps.config(Map.of());
        RunService runs = RunService.open(RunsConfig.inMemory(), App.evaluator(config));
        app = TestApps.start(config, Tokens.none(), runs);
        runs.close();
        TestApps.given(app).get("/v1/runs").then().statusCode(503)
                .body("type", equalTo("/problems/storage-unavailable")).header("Retry-After", "10");
        TestApps.given(app).get("/v1/runs/abc").then().statusCode(503);
        TestApps.given(app).contentType(ContentType.JSON).body(RIDGE).post("/v1/runs").then().statusCode(503)
                .body("detail", containsString("runs resume when it answers again"));
        TestApps.given(app).contentType(ContentType.JSON).body("{\"depthsKm\": [10]}").post("/v1/pressure")
                .then().statusCode(200);
    }
}
