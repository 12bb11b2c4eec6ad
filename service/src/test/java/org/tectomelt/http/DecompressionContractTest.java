package org.tectomelt.http;

import static org.hamcrest.Matchers.closeTo;
import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.greaterThan;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.hasSize;
import static org.hamcrest.Matchers.lessThan;
import static org.hamcrest.Matchers.notNullValue;
import static org.hamcrest.Matchers.nullValue;
import static org.tectomelt.http.Problem.assertInvalidField;
import static org.tectomelt.http.Problem.assertProblem;

import io.restassured.http.ContentType;
import io.restassured.path.json.JsonPath;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/**
 * {@code POST /v1/decompression-melting}, {@code /v1/settings/mid-ocean-ridge},
 * {@code /v1/settings/hotspot} and {@code /v1/settings/continental-rift}: every documented status.
 */
class DecompressionContractTest {

    private static final String COLUMN = "/v1/decompression-melting";
    private static final String RIDGE = "/v1/settings/mid-ocean-ridge";
    private static final String HOTSPOT = "/v1/settings/hotspot";
    private static final String RIFT = "/v1/settings/continental-rift";

    private static final String HOTSPOT_BODY = "{\"potentialTemperatureC\": 1550, \"ambientPotentialTemperatureC\": "
            + "1350, \"lithosphereThicknessKm\": 70, \"plumeRadiusKm\": 60, \"upwellingVelocityCmPerYr\": 8}";
    private static final String RIFT_BODY = "{\"potentialTemperatureC\": 1380, \"stretchingFactor\": 4, "
            + "\"lithosphereThicknessKm\": 120, \"crustThicknessKm\": 35}";

    @Test
    void aDryKatzColumnReproducesTheWorkedValues() {
        TestServer.json("{\"potentialTemperatureC\": 1350, \"stepKm\": 0.5}").post(COLUMN).then()
                .statusCode(200)
                .body("lithology", equalTo("peridotite-katz2003"))
                .body("upwelling", equalTo("passive"))
                // REFERENCES §2.5 [calc]: onset 2.661 GPa ≈ 82 km, 1403 °C; F(0) = 0.236; ∫F dz = 8.85 km
                .body("onset.pressureGPa", closeTo(2.661, 0.0006))
                .body("onset.depthKm", closeTo(82.2, 0.1))
                .body("onset.temperatureC", closeTo(1403, 0.5))
                .body("top.depthKm", closeTo(0, 1e-12))
                .body("top.meltFraction", closeTo(0.236, 0.0005))
                .body("meltThicknessKm", closeTo(8.85, 0.005))
                .body("crustalThicknessKm", closeTo(8.854 * 3300 / 2900, 0.01))
                .body("meanMeltingPressureGPa", greaterThan(0.0))
                .body("profile[0].meltFraction", closeTo(0, 1e-12))
                .body("profile[0].productivityPercentPerGPa", closeTo(0, 1e-9))
                .body("profile[-1].productivityPercentPerGPa", closeTo(10.4, 0.2))
                .body("profile", hasSize(166))
                .body("warnings", hasSize(0))
                .body("models.id", hasItem("peridotite-katz2003"))
                .body("models.id", hasItem("isentropic-melting-katz2003"))
                .body("assumptions[1]", containsString("batch"));
    }

    @Test
    void aColdMantleIsAValidZeroMeltAnswerWithNullOnset() {
        TestServer.json("{\"potentialTemperatureC\": 1050}").post(COLUMN).then()
                .statusCode(200)
                .body("onset", nullValue())
                .body("top", nullValue())
                .body("meanMeltingPressureGPa", nullValue())
                .body("meltThicknessKm", closeTo(0, 0))
                .body("profile", hasSize(0))
                .body("warnings[0]", containsString("no melting"));
    }

    @Test
    void aLidDeeperThanTheOnsetMeltsNothingButReportsTheOnset() {
        TestServer.json("{\"potentialTemperatureC\": 1350, \"lidDepthKm\": 100, \"upwelling\": \"active\"}")
                .post(COLUMN).then()
                .statusCode(200)
                .body("onset.depthKm", closeTo(82.2, 0.1))
                .body("top", nullValue())
                .body("meltThicknessKm", closeTo(0, 0))
                .body("warnings[0]", containsString("deeper than the onset"));
    }

    @Test
    void waterDeepensTheOnsetAndIsReportedInTheMelt() {
        JsonPath wet = TestServer.json("{\"potentialTemperatureC\": 1350, \"bulkWaterWtPct\": 0.02, "
                + "\"lidDepthKm\": 6}").post(COLUMN).then().statusCode(200).extract().jsonPath();
        double onset = wet.getDouble("onset.depthKm");
        org.junit.jupiter.api.Assertions.assertTrue(onset > 100, "onset " + onset);
        org.junit.jupiter.api.Assertions.assertTrue(wet.getDouble("profile[3].waterInMeltWtPct") > 0.5);
    }

    @Test
    void badColumnInputNamesTheFieldAndRange() {
        assertInvalidField(TestServer.json("{}").post(COLUMN), "potentialTemperatureC");
        assertInvalidField(TestServer.json("{\"potentialTemperatureC\": 2500}").post(COLUMN), "potentialTemperatureC")
                .body("errors[0].message", containsString("between 1000 and 1700"));
        assertInvalidField(TestServer.json("{\"potentialTemperatureC\": 1350, \"upwelling\": \"sideways\"}")
                .post(COLUMN), "upwelling");
        assertInvalidField(TestServer.json("{\"potentialTemperatureC\": 1350, \"stepKm\": 0}").post(COLUMN), "stepKm");
        assertInvalidField(TestServer.json("{\"potentialTemperatureC\": 1350, \"lidDepthKm\": -1}").post(COLUMN),
                "lidDepthKm");
        assertInvalidField(TestServer.json("{\"potentialTemperatureC\": 1350, \"bulkWaterWtPct\": 9}").post(COLUMN),
                "bulkWaterWtPct");
        assertInvalidField(TestServer.json("{\"potentialTemperatureC\": 1350, \"lithology\": \"granite\"}")
                .post(COLUMN), "lithology");
        assertInvalidField(TestServer.json("{\"potentialTemperature\": 1350}").post(COLUMN), "potentialTemperature");
    }

    @Test
    void theMcKenzieBickleLawRunsDryAndRefusesWater() {
        TestServer.json("{\"potentialTemperatureC\": 1280, \"lithology\": \"peridotite-mckenzie-bickle1988\"}")
                .post(COLUMN).then()
                .statusCode(200)
                .body("lithology", equalTo("peridotite-mckenzie-bickle1988"))
                .body("models.id", hasItem("peridotite-mckenzie-bickle1988"))
                // White et al. (1992), Chen (1992): normal oceanic crust 6–7 km, within a few km
                .body("crustalThicknessKm", closeTo(6.5, 3.5));
        assertInvalidField(TestServer.json("{\"potentialTemperatureC\": 1280, \"bulkWaterWtPct\": 0.01, "
                + "\"lithology\": \"peridotite-mckenzie-bickle1988\"}").post(COLUMN),
                "bulkWaterWtPct")
                .body("errors[0].message", containsString("dry-only"));
    }

    @Test
    void aColumnMeltingDeeperThanTheModelReachesIsOutsideTheModelRange() {
        assertProblem(TestServer.json("{\"potentialTemperatureC\": 1700}").post(COLUMN), 400, "outside-model-range")
                .body("detail", containsString("deeper than the model reaches"));
    }

    @Test
    void aRidgeGivesCrustAndProductionPerKmOfRidge() {
        JsonPath r = TestServer.json("{\"potentialTemperatureC\": 1330, \"fullSpreadingRateMmPerYr\": 60}")
                .post(RIDGE).then().statusCode(200)
                .body("column.upwelling", equalTo("passive"))
                .body("column.lidDepthKm", closeTo(0, 0))
                .body("column.profile[0].meltFraction", closeTo(0, 1e-12))
                .body("models.id", hasItem("melt-thickness-mckenzie-bickle1988"))
                .extract().jsonPath();
        double crust = r.getDouble("crustalThicknessKm");
        // production = crust × full rate: km × km/yr per km of ridge
        org.junit.jupiter.api.Assertions.assertEquals(crust * 60e-6, r.getDouble("meltProductionKm3PerYrPerKm"),
                1e-12);
        org.junit.jupiter.api.Assertions.assertEquals(crust, r.getDouble("column.crustalThicknessKm"), 1e-12);
    }

    @Test
    void aSlowRidgeWarnsAboutConductiveCooling() {
        TestServer.json("{\"potentialTemperatureC\": 1330, \"fullSpreadingRateMmPerYr\": 12}").post(RIDGE).then()
                .statusCode(200)
                .body("warnings[0]", containsString("conductive cooling"));
    }

    @Test
    void badRidgeInputNamesTheField() {
        assertInvalidField(TestServer.json("{\"potentialTemperatureC\": 1330}").post(RIDGE),
                "fullSpreadingRateMmPerYr");
        assertInvalidField(TestServer.json("{\"potentialTemperatureC\": 1330, \"fullSpreadingRateMmPerYr\": 900}")
                .post(RIDGE), "fullSpreadingRateMmPerYr")
                .body("errors[0].message", containsString("between 1 and 250"));
    }

    @Test
    void aHotspotGivesExcessTemperatureMeltFractionAtTheLidAndTheFlux() {
        JsonPath r = TestServer.json(HOTSPOT_BODY).post(HOTSPOT).then().statusCode(200)
                .body("excessTemperatureK", closeTo(200, 1e-9))
                .body("column.upwelling", equalTo("active"))
                .body("column.top.depthKm", closeTo(70, 1e-9))
                .body("onsetDepthKm", greaterThan(70.0))
                .body("models.id", hasItem("lid-effect-ellam1992"))
                .extract().jsonPath();
        double f = r.getDouble("meltFractionAtLid");
        double flux = Math.PI * 60e3 * 60e3 * 0.08 / 3.15576e7 * f * 3300 / 2900;
        org.junit.jupiter.api.Assertions.assertEquals(flux, r.getDouble("meltFluxM3PerS"), 1e-9 * flux);
        org.junit.jupiter.api.Assertions.assertEquals(flux * 3.15576e7 * 1e-9, r.getDouble("meltFluxKm3PerYr"),
                1e-9 * flux);
    }

    @Test
    void aHotspotUnderAThickLidHasNoMeltButAnOnset() {
        TestServer.json(HOTSPOT_BODY.replace("\"lithosphereThicknessKm\": 70", "\"lithosphereThicknessKm\": 250"))
                .post(HOTSPOT).then().statusCode(200)
                .body("onsetDepthKm", notNullValue())
                .body("meltFractionAtLid", closeTo(0, 0))
                .body("meltFluxM3PerS", closeTo(0, 0))
                .body("column.top", nullValue());
    }

    @Test
    void badHotspotInputNamesEveryField() {
        assertProblem(TestServer.json("{\"potentialTemperatureC\": 1550}").post(HOTSPOT), 400, "validation")
                .body("errors.field", hasItem("ambientPotentialTemperatureC"))
                .body("errors.field", hasItem("lithosphereThicknessKm"))
                .body("errors.field", hasItem("plumeRadiusKm"))
                .body("errors.field", hasItem("upwellingVelocityCmPerYr"));
        assertInvalidField(TestServer.json(HOTSPOT_BODY.replace("\"plumeRadiusKm\": 60", "\"plumeRadiusKm\": 0"))
                .post(HOTSPOT), "plumeRadiusKm");
    }

    @Test
    void aRiftReportsTheStretchedLidTheOnsetFactorAndTheMelt() {
        TestServer.json(RIFT_BODY).post(RIFT).then().statusCode(200)
                .body("lidDepthKm", closeTo(30, 1e-9))
                .body("stretchedCrustThicknessKm", closeTo(8.75, 1e-9))
                .body("onsetStretchingFactor", greaterThan(1.0))
                .body("onsetStretchingFactor", lessThan(4.0))
                .body("meltThicknessKm", greaterThan(0.0))
                .body("column.top.depthKm", closeTo(30, 1e-9))
                .body("models.id", hasItem("uniform-stretching-mckenzie1978"));
        TestServer.json(RIFT_BODY.replace("\"stretchingFactor\": 4", "\"stretchingFactor\": 1.2")).post(RIFT).then()
                .statusCode(200)
                .body("meltThicknessKm", closeTo(0, 0))
                .body("onsetStretchingFactor", greaterThan(1.2));
        TestServer.json(RIFT_BODY.replace("1380", "1050")).post(RIFT).then()
                .statusCode(200)
                .body("onsetStretchingFactor", nullValue())
                .body("meltThicknessKm", closeTo(0, 0));
    }

    @Test
    void badRiftInputNamesTheField() {
        assertInvalidField(TestServer.json(RIFT_BODY.replace("\"stretchingFactor\": 4", "\"stretchingFactor\": 0.5"))
                .post(RIFT), "stretchingFactor");
        assertInvalidField(TestServer.json(RIFT_BODY.replace("\"crustThicknessKm\": 35", "\"crustThicknessKm\": 40")
                .replace("\"lithosphereThicknessKm\": 120", "\"lithosphereThicknessKm\": 40")).post(RIFT),
                "crustThicknessKm")
                .body("errors[0].message", containsString("less than lithosphereThicknessKm"));
    }

    @Test
    void wrongMediaTypeAndOversizedBodiesAreRefusedOnEveryRoute() {
        StringBuilder big = new StringBuilder("{\"potentialTemperatureC\": 1350, \"lithology\": \"");
        while (big.length() < Config.defaults().maxBodyBytes() + 10) {
            big.append("xxxxxxxxxx");
        }
        big.append("\"}");
        for (String path : List.of(COLUMN, RIDGE, HOTSPOT, RIFT)) {
            assertProblem(TestServer.given().contentType(ContentType.TEXT).body("{}").post(path), 415,
                    "unsupported-media-type");
            assertProblem(TestServer.json(big.toString()).post(path), 413, "body-too-large");
            assertProblem(TestServer.json("{\"potentialTemperatureC\": ").post(path), 400, "malformed-json");
        }
    }
}
