package org.tectomelt.http;

import static org.hamcrest.Matchers.closeTo;
import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.empty;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.everyItem;
import static org.hamcrest.Matchers.greaterThan;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.hasKey;
import static org.hamcrest.Matchers.hasSize;
import static org.hamcrest.Matchers.not;
import static org.hamcrest.Matchers.nullValue;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.tectomelt.http.Problem.assertInvalidField;
import static org.tectomelt.http.Problem.assertProblem;

import io.restassured.http.ContentType;
import io.restassured.path.json.JsonPath;
import java.util.List;
import java.util.Locale;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/** {@code GET /v1/lithologies}, {@code POST /v1/melt-fraction}, {@code POST /v1/solidus-crossings}. */
class MeltingContractTest {

    private static final String MELT = "/v1/melt-fraction";
    private static final String CROSSINGS = "/v1/solidus-crossings";

    @Test
    void lithologiesAreListedInCatalogueOrderWithKindRangeAndCitations() {
        TestServer.given().get("/v1/lithologies").then()
                .statusCode(200)
                .body("id", equalTo(List.of("peridotite-katz2003", "peridotite-mckenzie-bickle1988",
                        "granite-water-saturated", "metapelite", "amphibolite", "basalt",
                        "pyroxenite-pertermann-hirschmann2003")))
                .body("kind", equalTo(List.of("mantle", "mantle", "crust", "crust", "crust", "intrusion", "mantle")))
                .body("hydrous", equalTo(List.of(true, false, false, false, false, false, false)))
                .body("[0].pressureRangeGPa", equalTo(List.of(0.0, 8.0)))
                .body("[0].maxPressureGPa", closeTo(10.0, 1e-12))
                .body("[0].maxBulkWaterWtPct", closeTo(5.0, 1e-12))
                .body("[0].citations[0].doi", equalTo("10.1029/2002GC000433"))
                .body("[0]", not(hasKey("thermalProperties")))
                .body("[2].pressureRangeGPa", equalTo(List.of(0.2, 1.0)))
                .body("[2].acceptsMeltCurve", equalTo(true))
                .body("[5].thermalProperties.latentHeatJPerKg", closeTo(350e3, 1e-9))
                .body("citations.flatten().citation", everyItem(not(equalTo(""))));
    }

    @Test
    void theCatalogueIsTaggedAndRevalidated() {
        String tag = TestServer.given().get("/v1/lithologies").then().statusCode(200).extract().header("ETag");
        assertEquals(true, tag != null && !tag.isBlank(), "an ETag on the catalogue");
        TestServer.given().header("If-None-Match", tag).get("/v1/lithologies").then().statusCode(304);
    }

    @Test
    void pathsLongerThanTheServerCapAreRefusedNamingTheCap() {
        StringBuilder body = new StringBuilder("{\"lithology\": \"basalt\", \"path\": {\"points\": [");
        for (int i = 0; i <= Config.defaults().maxProfilePoints(); i++) {
            body.append(i == 0 ? "" : ",").append("{\"depthKm\": 10, \"temperatureC\": 900}");
        }
        body.append("]}}");
        assertInvalidField(TestServer.json(body.toString()).post(CROSSINGS), "path.points")
                .body("errors[0].message", containsString("TECTOMELT_MAX_PROFILE_POINTS"));
    }

    @Test
    void aSinglePointGivesTheMeltStateWithTheModelCited() {
        // REFERENCES §2.1 [calc]: Katz et al. (2003), dry, F(1 GPa, 1300 °C) = 0.1293
        TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 1, \"temperatureC\": 1300}")
                .post(MELT).then()
                .statusCode(200)
                .body("lithology", equalTo("peridotite-katz2003"))
                .body("meltFraction", closeTo(0.1293, 5e-5))
                .body("solidusC", closeTo(1085.7 + 132.9 - 5.1, 1e-9))
                .body("drySolidusC", closeTo(1085.7 + 132.9 - 5.1, 1e-9))
                .body("liquidusC", closeTo(1780 + 45 - 2, 1e-9))
                .body("waterInMeltWtPct", closeTo(0, 0))
                .body("waterSaturated", equalTo(false))
                .body("cpxExhausted", equalTo(false))
                .body("warnings", empty())
                .body("models[0].id", equalTo("peridotite-katz2003"))
                .body("$", not(hasKey("results")));
    }

    @Test
    void waterLowersTheSolidusAndPartitionsIntoTheMelt() {
        JsonPath r = TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 3.24,"
                + " \"temperatureC\": 1300, \"bulkWaterWtPct\": 0.3}").post(MELT).then().statusCode(200)
                .extract().jsonPath();
        double f = r.getDouble("meltFraction");
        assertEquals(true, f > 0 && f < 1);
        assertEquals(true, r.getDouble("solidusC") < r.getDouble("drySolidusC"));
        // mass balance with D = 0.01 (Katz et al. 2003 Table 2): Xbulk = X (D + F (1 − D))
        assertEquals(0.3, r.getDouble("waterInMeltWtPct") * (0.01 + 0.99 * f), 1e-9);
    }

    @Test
    void aBatchReturnsResultsInRequestOrder() {
        StringBuilder body = new StringBuilder("{\"lithology\": \"peridotite-mckenzie-bickle1988\", \"points\": [");
        for (int i = 0; i < 50; i++) {
            body.append(i == 0 ? "" : ",").append(String.format(Locale.ROOT,
                    "{\"pressureGPa\": %.2f, \"temperatureC\": %d}", 0.1 * i, 1100 + 10 * i));
        }
        body.append("]}");
        JsonPath r = TestServer.json(body.toString()).post(MELT).then().statusCode(200)
                .body("results", hasSize(50))
                .body("$", not(hasKey("meltFraction")))
                .extract().jsonPath();
        for (int i = 0; i < 50; i++) {
            JsonPath one = TestServer.json(String.format(Locale.ROOT,
                    "{\"lithology\": \"peridotite-mckenzie-bickle1988\", \"pressureGPa\": %.2f, \"temperatureC\": %d}",
                    0.1 * i, 1100 + 10 * i)).post(MELT).then().statusCode(200).extract().jsonPath();
            if (i % 10 == 0) {
                assertEquals(one.getDouble("meltFraction"), r.getDouble("results[" + i + "].meltFraction"), 0);
                assertEquals(one.getDouble("solidusC"), r.getDouble("results[" + i + "].solidusC"), 0);
            }
        }
    }

    @Test
    void aBatchAsColumnsIsAnsweredExactlyAsTheSamePoints() {
        StringBuilder points = new StringBuilder("[");
        StringBuilder p = new StringBuilder("[");
        StringBuilder t = new StringBuilder("[");
        for (int i = 0; i < 40; i++) {
            String sep = i == 0 ? "" : ",";
            double gpa = 0.15 * i;
            double c = 1000 + 12.5 * i;
            points.append(sep).append(String.format(Locale.ROOT, "{\"pressureGPa\": %s, \"temperatureC\": %s}", gpa, c));
            p.append(sep).append(gpa);
            t.append(sep).append(c);
        }
        String head = "{\"lithology\": \"peridotite-katz2003\", \"bulkWaterWtPct\": 0.1, ";
        String asPoints = TestServer.json(head + "\"points\": " + points + "]}").post(MELT).then().statusCode(200)
                .extract().asString();
        String asColumns = TestServer.json(head + "\"columns\": {\"pressureGPa\": " + p + "], \"temperatureC\": " + t
                + "]}}").post(MELT).then().statusCode(200).body("results", hasSize(40)).extract().asString();
        assertEquals(asPoints, asColumns, "the same answer, byte for byte");
        String csvPoints = TestServer.json(head + "\"points\": " + points + "]}").accept("text/csv")
                .queryParam("fields", "meltFraction,solidusC,waterInMeltWtPct").post(MELT).then().statusCode(200)
                .extract().asString();
        String csvColumns = TestServer.json(head + "\"columns\": {\"pressureGPa\": " + p + "], \"temperatureC\": "
                + t + "]}}").accept("text/csv").queryParam("fields", "meltFraction,solidusC,waterInMeltWtPct")
                .post(MELT).then().statusCode(200).extract().asString();
        assertEquals(csvPoints, csvColumns);
        assertEquals(41, csvColumns.split("\r\n").length, "a header and a line per point");
    }

    @Test
    void badColumnsAreRefusedNamingTheField() {
        String head = "{\"lithology\": \"peridotite-katz2003\", ";
        assertInvalidField(TestServer.json(head + "\"columns\": {\"pressureGPa\": [1, 2], \"temperatureC\": [1300]}}")
                .post(MELT), "columns.temperatureC");
        assertInvalidField(TestServer.json(head + "\"columns\": {\"pressureGPa\": [1, 12], \"temperatureC\": [1300, 1400]}}")
                .post(MELT), "columns.pressureGPa[1]");
        assertInvalidField(TestServer.json(head + "\"columns\": {\"pressureGPa\": [1], \"temperatureC\": [3100]}}")
                .post(MELT), "columns.temperatureC[0]");
        assertInvalidField(TestServer.json(head + "\"columns\": {\"pressureGPa\": [1]}}").post(MELT),
                "columns.temperatureC");
        assertInvalidField(TestServer.json(head + "\"columns\": {\"pressureGPa\": [1], \"temperatureC\": [1300]},"
                + " \"points\": [{\"pressureGPa\": 1, \"temperatureC\": 1300}]}").post(MELT), "columns");
        assertInvalidField(TestServer.json(head + "\"columns\": {\"pressureGPa\": [1], \"temperatureC\": [1300]},"
                + " \"pressureGPa\": 1}").post(MELT), "columns");
        StringBuilder many = new StringBuilder();
        for (int i = 0; i <= 10_000; i++) {
            many.append(i == 0 ? "" : ",").append("2");
        }
        assertInvalidField(TestServer.json(head + "\"columns\": {\"pressureGPa\": [" + many + "], \"temperatureC\": ["
                + many.toString().replace("2", "1400") + "]}}").post(MELT), "columns.pressureGPa");
    }

    @Test
    void aBatchOfTenThousandPointsIsAcceptedAndOneMoreIsRefused() {
        StringBuilder ok = new StringBuilder("{\"lithology\": \"peridotite-katz2003\", \"points\": [");
        for (int i = 0; i < 10_000; i++) {
            ok.append(i == 0 ? "" : ",").append("{\"pressureGPa\":2,\"temperatureC\":1400}");
        }
        String tooMany = ok + ",{\"pressureGPa\":2,\"temperatureC\":1400}]}";
        ok.append("]}");
        TestServer.json(ok.toString()).post(MELT).then().statusCode(200).body("results", hasSize(10_000));
        assertInvalidField(TestServer.json(tooMany).post(MELT), "points");
    }

    @Test
    void crustalLithologiesUseTheirDefaultCurveOrTheCallersCurve() {
        TestServer.json("{\"lithology\": \"metapelite\", \"pressureGPa\": 1, \"temperatureC\": 850}").post(MELT).then()
                .statusCode(200)
                .body("meltFraction", closeTo(0.25, 1e-12))
                .body("solidusC", closeTo(750, 1e-9))
                .body("$", not(hasKey("liquidusC")))
                .body("warnings[0]", containsString("approximate"));
        TestServer.json("{\"lithology\": \"granite-water-saturated\", \"pressureGPa\": 1, \"temperatureC\": 700}")
                .post(MELT).then()
                .statusCode(200)
                .body("solidusC", closeTo(620, 1e-9))
                .body("liquidusC", closeTo(725, 1e-9))
                .body("waterSaturated", equalTo(true))
                .body("$", not(hasKey("drySolidusC")));
        TestServer.json("{\"lithology\": \"amphibolite\", \"pressureGPa\": 0.8, \"temperatureC\": 950,"
                + " \"meltCurve\": [{\"temperatureC\": 900, \"meltFraction\": 0}, {\"temperatureC\": 1000, \"meltFraction\": 1}]}")
                .post(MELT).then()
                .statusCode(200)
                .body("meltFraction", closeTo(0.5, 1e-12))
                .body("liquidusC", closeTo(1000, 1e-9))
                .body("warnings", empty())
                .body("models[0].citation", containsString("supplied by the caller"));
    }

    @Test
    void anUnknownLithologyListsTheValidIds() {
        assertInvalidField(TestServer.json("{\"lithology\": \"lherzolite\", \"pressureGPa\": 1, \"temperatureC\": 1300}")
                .post(MELT), "lithology")
                .body("errors[0].message", containsString("peridotite-katz2003"))
                .body("errors[0].message", containsString("basalt"));
        assertInvalidField(TestServer.json("{\"pressureGPa\": 1, \"temperatureC\": 1300}").post(MELT), "lithology");
    }

    @Test
    void waterOutsideWhatTheModelAllowsIsRefused() {
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 1,"
                + " \"temperatureC\": 1300, \"bulkWaterWtPct\": -0.1}").post(MELT), "bulkWaterWtPct");
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 1,"
                + " \"temperatureC\": 1300, \"bulkWaterWtPct\": 6}").post(MELT), "bulkWaterWtPct")
                .body("errors[0].message", containsString("between 0 and 5"));
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-mckenzie-bickle1988\", \"pressureGPa\": 1,"
                + " \"temperatureC\": 1300, \"bulkWaterWtPct\": 0.1}").post(MELT), "bulkWaterWtPct")
                .body("errors[0].message", containsString("dry model"));
    }

    @Test
    void aNonMonotonicMeltCurveNamesThePoint() {
        String curve = "[{\"temperatureC\": 800, \"meltFraction\": 0}, {\"temperatureC\": 900, \"meltFraction\": 0.3},"
                + " {\"temperatureC\": 880, \"meltFraction\": 0.2}]";
        assertProblem(TestServer.json("{\"lithology\": \"metapelite\", \"pressureGPa\": 1, \"temperatureC\": 850,"
                + " \"meltCurve\": " + curve + "}").post(MELT), 400, "validation")
                .body("errors.field", hasItem("meltCurve[2].temperatureC"))
                .body("errors.field", hasItem("meltCurve[2].meltFraction"));
        assertInvalidField(TestServer.json("{\"lithology\": \"basalt\", \"pressureGPa\": 1, \"temperatureC\": 850,"
                + " \"meltCurve\": [{\"temperatureC\": 800, \"meltFraction\": 1.5}, {\"temperatureC\": 900}]}").post(MELT),
                "meltCurve[0].meltFraction")
                .body("errors.field", hasItem("meltCurve[1].meltFraction"));
        assertInvalidField(TestServer.json("{\"lithology\": \"basalt\", \"pressureGPa\": 1, \"temperatureC\": 850,"
                + " \"meltCurve\": [{\"temperatureC\": 800, \"meltFraction\": 0}]}").post(MELT), "meltCurve");
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 1, \"temperatureC\": 850,"
                + " \"meltCurve\": [{\"temperatureC\": 800, \"meltFraction\": 0}, {\"temperatureC\": 900, \"meltFraction\": 1}]}")
                .post(MELT), "meltCurve").body("errors[0].message", containsString("only crustal"));
    }

    @Test
    void pointsOutOfRangeOrMixedFormsAreRefused() {
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 11,"
                + " \"temperatureC\": 1300}").post(MELT), "pressureGPa")
                .body("errors[0].message", containsString("between 0 and 10"));
        assertInvalidField(TestServer.json("{\"lithology\": \"metapelite\", \"pressureGPa\": 3.5,"
                + " \"temperatureC\": 800}").post(MELT), "pressureGPa");
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 1}").post(MELT),
                "temperatureC");
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 1,"
                + " \"temperatureC\": 1300, \"points\": []}").post(MELT), "points");
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"points\": [{\"pressureGPa\": 1,"
                + " \"temperatureC\": 1300}, {\"pressureGPa\": -1, \"temperatureC\": 1300}, null]}").post(MELT),
                "points[1].pressureGPa")
                .body("errors.field", hasItem("points[2]"));
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 1,"
                + " \"temperature\": 1300}").post(MELT), "temperature");
    }

    @Test
    void aPressureAboveTheCalibrationIsComputedWithAWarning() {
        TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 9, \"temperatureC\": 1900}")
                .post(MELT).then().statusCode(200)
                .body("warnings", hasSize(1))
                .body("warnings[0]", containsString("calibration"));
    }

    @Test
    void meltFractionRefusesOtherMediaTypesAndOversizedBodies() {
        assertProblem(TestServer.given().contentType(ContentType.TEXT).body("{}").post(MELT), 415, "unsupported-media-type");
        assertProblem(TestServer.json(oversized()).post(MELT), 413, "body-too-large");
        assertProblem(TestServer.given().contentType(ContentType.TEXT).body("{}").post(CROSSINGS), 415,
                "unsupported-media-type");
        assertProblem(TestServer.json(oversized()).post(CROSSINGS), 413, "body-too-large");
    }

    private static String oversized() {
        StringBuilder big = new StringBuilder("{\"lithology\": \"basalt\", \"points\": [");
        while (big.length() < Config.defaults().maxBodyBytes() + 10) {
            big.append("{\"pressureGPa\":1,\"temperatureC\":1},");
        }
        return big.append("{\"pressureGPa\":1,\"temperatureC\":1}]}").toString();
    }

    // ---- solidus crossings -----------------------------------------------------------------

    @Test
    void anAdiabatCrossesTheKatzSolidusWhereReferencesSection25Says() {
        // REFERENCES §2.5 [calc]: Tp = 1350 °C meets the dry Katz solidus at 2.661 GPa, ≈ 82 km, 1403 °C
        TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {\"adiabat\": {\"potentialTemperatureC\": 1350,"
                + " \"depthStepKm\": 5}}}").post(CROSSINGS).then()
                .statusCode(200)
                .body("crossings", hasSize(1))
                .body("crossings[0].curve", equalTo("solidus"))
                .body("crossings[0].direction", equalTo("into-melt"))
                .body("crossings[0].pressureGPa", closeTo(2.661, 0.001))
                .body("crossings[0].temperatureC", closeTo(1403, 0.5))
                .body("crossings[0].depthKm", closeTo(82.2, 0.1))
                .body("meltPresent", equalTo(true))
                .body("maxMeltFraction", greaterThan(0.2))
                .body("profile", hasSize(41))
                .body("profile[0].depthKm", closeTo(200, 1e-9))
                .body("profile[40].depthKm", closeTo(0, 1e-9))
                .body("profile[40].temperatureC", closeTo(1350, 1e-9))
                .body("warnings", hasItem(containsString("solid adiabat")))
                .body("models.id", hasItem("lithostatic-two-layer"));
    }

    @Test
    void waterDeepensTheSolidusCrossingOfAnAdiabat() {
        double dry = TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {\"adiabat\":"
                + " {\"potentialTemperatureC\": 1350}}}").post(CROSSINGS).then().statusCode(200)
                .extract().jsonPath().getDouble("crossings[0].depthKm");
        double wet = TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"bulkWaterWtPct\": 0.02, \"path\": {\"adiabat\":"
                + " {\"potentialTemperatureC\": 1350, \"maxDepthKm\": 300}}}").post(CROSSINGS).then().statusCode(200)
                .extract().jsonPath().getDouble("crossings[0].depthKm");
        assertEquals(true, wet > dry + 10, "dry " + dry + " km, wet " + wet + " km");
    }

    @Test
    void aUserPathIsFollowedInItsOwnOrderWithLiquidusCrossings() {
        TestServer.json("{\"lithology\": \"basalt\", \"crustThicknessKm\": 35, \"path\": {\"points\": ["
                + "{\"depthKm\": 10, \"temperatureC\": 1250}, {\"depthKm\": 10, \"temperatureC\": 900}]}}")
                .post(CROSSINGS).then()
                .statusCode(200)
                .body("crossings.curve", equalTo(List.of("liquidus", "solidus")))
                .body("crossings.direction", equalTo(List.of("out-of-melt", "out-of-melt")))
                .body("crossings[0].temperatureC", closeTo(1200, 1e-6))
                .body("crossings[1].temperatureC", closeTo(1000, 1e-6))
                .body("profile[0].pressureGPa", closeTo(2800 * 9.81 * 10e3 / 1e9, 1e-12))
                .body("maxMeltFraction", closeTo(1.0, 0));
        TestServer.json("{\"lithology\": \"metapelite\", \"path\": {\"points\": ["
                + "{\"depthKm\": 35, \"temperatureC\": 600}, {\"depthKm\": 35, \"temperatureC\": 650}]}}")
                .post(CROSSINGS).then()
                .statusCode(200)
                .body("crossings", empty())
                .body("meltPresent", equalTo(false))
                .body("profile[0].liquidusC", nullValue());
    }

    @Test
    void aGeothermPathIsSampledFromTheSurfaceDownWithItsOwnColumn() {
        // an invented 25 Myr plate over a 1380 °C adiabat, sampled every 20 km on purpose
        JsonPath r = TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {\"geotherm\": {\"lithosphere\":"
                + " {\"type\": \"oceanic-plate\", \"ageMyr\": 25}, \"potentialTemperatureC\": 1380, \"maxDepthKm\": 160,"
                + " \"stepKm\": 20}}}").post(CROSSINGS).then()
                .statusCode(200)
                .body("profile", hasSize(9))
                .body("profile[0].depthKm", closeTo(0, 0))
                .body("crossings.curve", equalTo(List.of("solidus", "solidus")))
                .body("crossings.direction", equalTo(List.of("into-melt", "out-of-melt")))
                .body("models.id", hasItem("oceanic-plate-cooling"))
                .body("models.id", hasItem("peridotite-katz2003"))
                .extract().jsonPath();
        for (int i = 0; i < 2; i++) {
            double p = r.getDouble("crossings[" + i + "].pressureGPa");
            // on the Katz et al. (2003) dry solidus, Table 2 polynomial (REFERENCES §2.1)
            assertEquals(1085.7 + 132.9 * p - 5.1 * p * p, r.getDouble("crossings[" + i + "].temperatureC"), 1e-6);
            double z = r.getDouble("crossings[" + i + "].depthKm");
            assertEquals(true, z % 20 > 0.1 && z % 20 < 19.9, "between samples: " + z);
        }
        // the same samples as the geotherm endpoint returns for the same body
        JsonPath g = TestServer.json("{\"lithosphere\": {\"type\": \"oceanic-plate\", \"ageMyr\": 25},"
                + " \"potentialTemperatureC\": 1380, \"maxDepthKm\": 160, \"stepKm\": 20}").post("/v1/geotherm").then()
                .statusCode(200).extract().jsonPath();
        for (int i = 0; i < 9; i++) {
            assertEquals(g.getDouble("points[" + i + "].temperatureC"), r.getDouble("profile[" + i + "].temperatureC"), 1e-9);
            assertEquals(g.getDouble("points[" + i + "].pressureGPa"), r.getDouble("profile[" + i + "].pressureGPa"), 1e-12);
        }
    }

    @Test
    void aContinentalGeothermCarriesItsCrustIntoTheCrustalMeltingCheck() {
        JsonPath r = TestServer.json("{\"lithology\": \"granite-water-saturated\", \"path\": {\"geotherm\": {\"lithosphere\":"
                + " {\"type\": \"continental\", \"surfaceHeatFlowMWPerM2\": 90, \"crustThicknessKm\": 40},"
                + " \"maxDepthKm\": 40, \"stepKm\": 5}}}").post(CROSSINGS).then()
                .statusCode(200)
                .body("crossings[0].curve", equalTo("solidus"))
                .body("crossings[0].direction", equalTo("into-melt"))
                .body("warnings", hasItem(containsString("approximate")))
                .extract().jsonPath();
        double z = r.getDouble("crossings[0].depthKm");
        // within the crust the column is ρc g z with the default 2800 kg/m³ (REFERENCES §1.1)
        assertEquals(2800 * 9.81 * z * 1e3 / 1e9, r.getDouble("crossings[0].pressureGPa"), 1e-9);
        double t = r.getDouble("crossings[0].temperatureC");
        assertEquals(true, t >= 620 && t <= 680, "on the Huang & Wyllie (1973) solidus: " + t);
    }

    @Test
    void geothermPathsAreValidatedUnderTheirOwnPrefix() {
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {\"geotherm\":"
                + " {\"lithosphere\": {\"type\": \"oceanic-plate\"}}}}").post(CROSSINGS), "path.geotherm.lithosphere.ageMyr");
        assertInvalidField(TestServer.json("{\"lithology\": \"granite-water-saturated\", \"path\": {\"geotherm\":"
                + " {\"lithosphere\": {\"type\": \"continental\", \"surfaceHeatFlowMWPerM2\": 60}}}}").post(CROSSINGS),
                "path.geotherm.maxDepthKm")
                .body("errors[0].message", containsString("at most"));
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"crustThicknessKm\": 30,"
                + " \"path\": {\"geotherm\": {\"potentialTemperatureC\": 1350}}}").post(CROSSINGS), "crustThicknessKm");
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {\"geotherm\":"
                + " {\"potentialTemperatureC\": 1350, \"stepKm\": 0.01}}}").post(CROSSINGS), "path.geotherm.stepKm");
    }

    @Test
    void badPathsAreRefusedNamingTheField() {
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\"}").post(CROSSINGS), "path");
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {}}").post(CROSSINGS), "path");
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {\"adiabat\":"
                + " {\"potentialTemperatureC\": 1350}, \"points\": []}}").post(CROSSINGS), "path");
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {\"adiabat\":"
                + " {\"potentialTemperatureC\": 3000}}}").post(CROSSINGS), "path.adiabat.potentialTemperatureC");
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {\"adiabat\":"
                + " {\"potentialTemperatureC\": 1350, \"maxDepthKm\": 400}}}").post(CROSSINGS), "path.adiabat.maxDepthKm");
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {\"adiabat\":"
                + " {\"potentialTemperatureC\": 1350, \"depthStepKm\": 0.01}}}").post(CROSSINGS), "path.adiabat.depthStepKm");
        assertInvalidField(TestServer.json("{\"lithology\": \"granite-water-saturated\", \"path\": {\"adiabat\":"
                + " {\"potentialTemperatureC\": 1350}}}").post(CROSSINGS), "path.adiabat")
                .body("errors[0].message", containsString("mantle lithology"));
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {\"points\": ["
                + "{\"depthKm\": 10, \"temperatureC\": 1000}]}}").post(CROSSINGS), "path.points");
        assertInvalidField(TestServer.json("{\"lithology\": \"metapelite\", \"path\": {\"points\": ["
                + "{\"depthKm\": 10, \"temperatureC\": 700}, {\"depthKm\": 150, \"temperatureC\": 900}, null]}}")
                .post(CROSSINGS), "path.points[1].depthKm")
                .body("errors.field", hasItem("path.points[2]"));
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {\"geotherms\": {}}}")
                .post(CROSSINGS), "path.geotherms");
        assertInvalidField(TestServer.json("{\"lithology\": \"dunite\", \"path\": {\"points\": ["
                + "{\"depthKm\": 10, \"temperatureC\": 700}, {\"depthKm\": 15, \"temperatureC\": 900}]}}")
                .post(CROSSINGS), "lithology");
        assertInvalidField(TestServer.json("{\"lithology\": \"metapelite\", \"meltCurve\": [{\"temperatureC\": 700,"
                + " \"meltFraction\": 0.2}, {\"temperatureC\": 700, \"meltFraction\": 0.3}], \"path\": {\"points\": ["
                + "{\"depthKm\": 10, \"temperatureC\": 700}, {\"depthKm\": 15, \"temperatureC\": 900}]}}")
                .post(CROSSINGS), "meltCurve[1].temperatureC");
    }
}
