package org.tectomelt.http;

import static org.hamcrest.Matchers.closeTo;
import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.greaterThan;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.hasKey;
import static org.hamcrest.Matchers.hasSize;
import static org.hamcrest.Matchers.not;
import static org.hamcrest.Matchers.nullValue;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.tectomelt.http.Problem.assertInvalidField;
import static org.tectomelt.http.Problem.assertProblem;

import io.restassured.http.ContentType;
import io.restassured.path.json.JsonPath;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/** {@code POST /v1/settings/subduction}. */
class SubductionContractTest {

    private static final String PATH = "/v1/settings/subduction";

    @Test
    void wedgeMeltingAtADepthWithAllTheIssueFields() {
        JsonPath r = TestServer.json("{\"depthKm\": 100, \"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 0.5}")
                .post(PATH).then()
                .statusCode(200)
                .body("lithology", equalTo("peridotite-katz2003"))
                // REFERENCES §1.1: mantle-only column, 3300 kg/m³ × 9.81 m/s² × 100 km = 3.2373 GPa
                .body("pressureGPa", closeTo(3.2373, 1e-4))
                .body("meltFraction", greaterThan(0.0))
                .body("waterSaturated", equalTo(false))
                .body("freeFluidWtPct", equalTo(0.0))
                // Katz et al. (2003) Ts = 1085.7 + 132.9 P − 5.1 P² at 3.2373 GPa
                .body("drySolidusC", closeTo(1085.7 + 132.9 * 3.2373 - 5.1 * 3.2373 * 3.2373, 1e-2))
                .body("waterForOnsetWtPct", greaterThan(0.0))
                .body("meltPerWaterPercentPerWtPct", greaterThan(0.0))
                .body("$", hasKey("waterForSaturationWtPct"))
                .body("waterForSaturationWtPct", nullValue())
                .body("$", not(hasKey("magmaProductionKm3PerYrPerKm")))
                .body("maxWaterWtPct", equalTo(1.0))
                .body("waterCurve", hasSize(101))
                .body("waterCurve[0].bulkWaterWtPct", equalTo(0.0))
                .body("waterCurve[0].meltFraction", equalTo(0.0))
                .body("waterCurve[100].bulkWaterWtPct", equalTo(1.0))
                .body("models.id", hasItem("peridotite-katz2003"))
                .body("models.id", hasItem("lithostatic-two-layer"))
                .body("assumptions[0]", containsString("mantle-only"))
                .extract().jsonPath();
        // the melt water obeys the Katz (2003) mass balance X = Xbulk / (D + F(1 − D)), D = 0.01
        double f = r.getDouble("meltFraction");
        assertEquals(0.5 / (0.01 + 0.99 * f), r.getDouble("waterInMeltWtPct"), 1e-9);
        assertEquals(r.getDouble("drySolidusC") - r.getDouble("wetSolidusC"), r.getDouble("solidusDepressionK"), 1e-9);
        assertTrue(r.getDouble("saturatedSolidusC") <= r.getDouble("wetSolidusC"));
    }

    @Test
    void theMagmaBudgetFollowsTheStatedFormula() {
        JsonPath r = TestServer.json("{\"pressureGPa\": 3, \"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 0.5,"
                        + " \"slabWaterFluxKgPerMPerYr\": 5000}")
                .post(PATH).then()
                .statusCode(200)
                .body("slabWaterFluxKgPerMPerYr", equalTo(5000.0))
                .body("meltDensityKgPerM3", equalTo(2900.0))
                .body("assumptions", hasItem(containsString("upper bound")))
                .extract().jsonPath();
        // the spec's formula: Q = flux / (waterInMeltWtPct / 100 × meltDensity) × 1e-6 km³/yr per km
        double expected = 5000 / (r.getDouble("waterInMeltWtPct") / 100 * 2900) * 1e-6;
        assertEquals(expected, r.getDouble("magmaProductionKm3PerYrPerKm"), 1e-12 * expected);
        assertEquals(3 * 1e9 / (3300 * 9.81) / 1e3, r.getDouble("depthKm"), 1e-9);
    }

    @Test
    void belowTheSaturatedSolidusOnsetIsNullAndTheWaterIsFreeFluid() {
        TestServer.json("{\"pressureGPa\": 3, \"wedgeTemperatureC\": 700, \"bulkWaterWtPct\": 1,"
                        + " \"slabWaterFluxKgPerMPerYr\": 5000}")
                .post(PATH).then()
                .statusCode(200)
                .body("meltFraction", equalTo(0.0))
                .body("$", hasKey("waterForOnsetWtPct"))
                .body("waterForOnsetWtPct", nullValue())
                .body("waterSaturated", equalTo(true))
                .body("freeFluidWtPct", greaterThan(0.5))
                .body("meltPerWaterPercentPerWtPct", equalTo(0.0))
                // REFERENCES §2.1 [calc]: saturated solidus 941 °C at 3 GPa
                .body("saturatedSolidusC", closeTo(941, 0.5))
                .body("$", not(hasKey("magmaProductionKm3PerYrPerKm")))
                .body("warnings", hasItem(containsString("no amount of water melts this rock")))
                .body("warnings", hasItem(containsString("free fluid")))
                .body("warnings", hasItem(containsString("no magma budget")));
    }

    @Test
    void aboveTheDrySolidusOnsetIsZeroAndAtZeroWaterTheSlopeIsNull() {
        TestServer.json("{\"pressureGPa\": 1, \"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 0}")
                .post(PATH).then()
                .statusCode(200)
                // REFERENCES §2.1 [calc]: dry F(1 GPa, 1300 °C) = 0.1293
                .body("meltFraction", closeTo(0.1293, 5e-5))
                .body("waterForOnsetWtPct", equalTo(0.0))
                .body("$", hasKey("meltPerWaterPercentPerWtPct"))
                .body("meltPerWaterPercentPerWtPct", nullValue())
                .body("solidusDepressionK", equalTo(0.0))
                .body("warnings", hasItem(containsString("slope of melt with water is null")));
    }

    @Test
    void pastSaturationTheCurveFlattensAndSaysSo() {
        JsonPath r = TestServer.json("{\"pressureGPa\": 1, \"wedgeTemperatureC\": 1000, \"bulkWaterWtPct\": 2,"
                        + " \"maxWaterWtPct\": 4}")
                .post(PATH).then()
                .statusCode(200)
                .body("waterSaturated", equalTo(true))
                .body("waterForSaturationWtPct", greaterThan(1.0))
                .body("waterCurve[100].waterSaturated", equalTo(true))
                .body("waterCurve[0].waterSaturated", equalTo(false))
                .extract().jsonPath();
        assertEquals(2 - r.getDouble("waterForSaturationWtPct"), r.getDouble("freeFluidWtPct"), 1e-9);
        assertEquals(r.getDouble("meltFraction"), r.getDouble("waterCurve[100].meltFraction"), 1e-9);
    }

    @Test
    void exactlyOneOfDepthOrPressure() {
        assertInvalidField(TestServer.json("{\"depthKm\": 100, \"pressureGPa\": 3, \"wedgeTemperatureC\": 1300,"
                + " \"bulkWaterWtPct\": 0.5}").post(PATH), "depthKm")
                .body("errors[0].message", containsString("exactly one"));
        assertInvalidField(TestServer.json("{\"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 0.5}").post(PATH),
                "depthKm");
    }

    @Test
    void outOfRangeFieldsAreNamedWithTheirRanges() {
        assertInvalidField(TestServer.json("{\"depthKm\": 400, \"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 0.5}")
                .post(PATH), "depthKm").body("errors[0].message", containsString("between 0 and 300"));
        assertInvalidField(TestServer.json(
                "{\"pressureGPa\": 12, \"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 0.5}")
                .post(PATH), "pressureGPa").body("errors[0].message", containsString("between 0 and 10"));
        assertInvalidField(TestServer.json("{\"pressureGPa\": 3, \"wedgeTemperatureC\": -300, \"bulkWaterWtPct\": 0.5}")
                .post(PATH), "wedgeTemperatureC").body("errors[0].message", containsString("between 0 and 2200"));
        assertInvalidField(TestServer.json("{\"pressureGPa\": 3, \"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 6}")
                .post(PATH), "bulkWaterWtPct").body("errors[0].message", containsString("between 0 and 5"));
        assertInvalidField(TestServer.json("{\"pressureGPa\": 3, \"wedgeTemperatureC\": 1300}").post(PATH),
                "bulkWaterWtPct");
        assertInvalidField(TestServer.json("{\"pressureGPa\": 3, \"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 0.5,"
                + " \"slabWaterFluxKgPerMPerYr\": -1}").post(PATH), "slabWaterFluxKgPerMPerYr");
        assertInvalidField(TestServer.json("{\"pressureGPa\": 3, \"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 0.5,"
                + " \"maxWaterWtPct\": 0}").post(PATH), "maxWaterWtPct")
                .body("errors[0].message", containsString("between 0.01 and 5"));
    }

    @Test
    void anUnknownFieldSuchAsAMissingUnitIsNamed() {
        assertInvalidField(TestServer.json("{\"pressureGPa\": 3, \"wedgeTemperature\": 1300, \"bulkWaterWtPct\": 0.5}")
                .post(PATH), "wedgeTemperature")
                .body("errors[0].message", containsString("wedgeTemperatureC"));
    }

    @Test
    void anUnknownLithologyIsRefusedListingTheHydrousOnes() {
        assertInvalidField(TestServer.json("{\"pressureGPa\": 3, \"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 0.5,"
                + " \"lithology\": \"granite\"}").post(PATH), "lithology")
                .body("errors[0].message", containsString("hydrous-capable"))
                .body("errors[0].message", containsString("peridotite-katz2003"));
    }

    @Test
    void aDryOnlyLithologyIsRefusedWithTheHydrousOnesListed() {
        // McKenzie & Bickle (1988) is dry-only in the catalogue: flux melting must refuse it by name
        assertInvalidField(TestServer.json("{\"pressureGPa\": 3, \"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 0.5,"
                + " \"lithology\": \"peridotite-mckenzie-bickle1988\"}").post(PATH), "lithology")
                .body("errors[0].message", containsString("ignores water"))
                .body("errors[0].message", containsString("peridotite-katz2003"));
    }

    @Test
    void aWrongContentTypeIs415() {
        assertProblem(TestServer.given().contentType(ContentType.TEXT)
                .body("{\"pressureGPa\": 3, \"wedgeTemperatureC\": 1300, \"bulkWaterWtPct\": 0.5}").post(PATH),
                415, "unsupported-media-type");
    }

    @Test
    void aBodyOverTheLimitIs413() {
        StringBuilder big = new StringBuilder("{\"lithology\": \"");
        big.append("x".repeat((int) Config.defaults().maxBodyBytes() + 10));
        big.append("\"}");
        assertProblem(TestServer.json(big.toString()).post(PATH), 413, "body-too-large");
    }
}
