package org.tectomelt.http;

import static org.hamcrest.Matchers.closeTo;
import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.empty;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.greaterThan;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.hasItems;
import static org.hamcrest.Matchers.hasSize;
import static org.hamcrest.Matchers.lessThan;
import static org.hamcrest.Matchers.not;
import static org.hamcrest.Matchers.nullValue;
import static org.tectomelt.http.Problem.assertInvalidField;
import static org.tectomelt.http.Problem.assertProblem;

import io.restassured.http.ContentType;
import io.restassured.response.Response;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/** {@code POST /v1/geotherm}. */
class GeothermContractTest {

    private static final String PATH = "/v1/geotherm";

    private static Response post(String body) {
        return TestServer.json(body).post(PATH);
    }

    @Test
    void theIssueExampleGivesAPlateOnAnAdiabatWithEveryOceanicOutput() {
        post("""
                {"lithosphere": {"type": "oceanic-plate", "ageMyr": 60},
                 "potentialTemperatureC": 1350, "maxDepthKm": 300, "stepKm": 1}""").then()
                .statusCode(200)
                .body("points", hasSize(301))
                .body("points[0].depthKm", closeTo(0, 1e-12))
                .body("points[0].temperatureC", closeTo(0, 1e-9))
                // REFERENCES §1.3 [calc]: GDH1 at 60 Myr, q = 66.1 mW/m², d = 5184 m
                .body("surfaceHeatFlowMWPerM2", closeTo(66.1, 0.05))
                .body("seafloorDepthM", closeTo(5184, 1))
                // the plate meets the adiabat inside its 95 km
                .body("lithosphereBaseDepthKm", greaterThan(60.0))
                .body("lithosphereBaseDepthKm", lessThan(95.0))
                // below the base: Tp exp(αgz/cp) = 1623.15 K · exp(3e-5·9.81·2e5/1000) = 1448.4 °C (computed here)
                .body("points[200].temperatureC", closeTo(1448.4, 0.1))
                // REFERENCES §1.1 [calc]: mantle column, 1 GPa at 30.9 km (common practice 30–33 km/GPa)
                .body("points[31].pressureGPa", closeTo(1.0036, 0.0005))
                .body("mohoTemperatureC", nullValue())
                .body("models.id", hasItems("oceanic-plate-cooling", "plate-parameters-gdh1", "mantle-adiabat",
                        "lithostatic-two-layer"))
                .body("warnings", empty());
    }

    @Test
    void halfSpaceGivesTheTurcotteSchubertValues() {
        post("""
                {"lithosphere": {"type": "oceanic-half-space", "ageMyr": 100}, "maxDepthKm": 50, "stepKm": 50}""")
                .then()
                .statusCode(200)
                .body("points", hasSize(2))
                // REFERENCES §1.2 [calc]: 100 Myr, k = 3.3, κ = 1e-6, ΔT = 1300 K
                .body("points[1].temperatureC", closeTo(612, 0.5))
                .body("surfaceHeatFlowMWPerM2", closeTo(43.1, 0.05))
                .body("seafloorDepthM", greaterThan(5500.0))
                .body("lithosphereBaseDepthKm", nullValue())
                .body("models.id", hasItem("oceanic-half-space-cooling"))
                .body("warnings", hasItem(containsString("80 Myr")));
    }

    @Test
    void continentalGeothermGivesTheClosedFormAndTheMohoTemperature() {
        post("""
                {"lithosphere": {"type": "continental", "surfaceHeatFlowMWPerM2": 50},
                 "maxDepthKm": 35, "stepKm": 5}""").then()
                .statusCode(200)
                .body("points", hasSize(8))
                // REFERENCES §1.4 [calc]: exponential, 309 °C at 20 km, 498 °C at 35 km
                .body("points[4].temperatureC", closeTo(309, 0.5))
                .body("mohoTemperatureC", closeTo(498, 0.5))
                .body("surfaceHeatFlowMWPerM2", closeTo(50, 1e-9))
                .body("seafloorDepthM", nullValue())
                // 35 km of crust at 2800 kg/m³: ρ g h = 0.9614 GPa
                .body("points[7].pressureGPa", closeTo(0.9614, 0.0005))
                .body("models.id", hasItem("continental-steady-conductive"));
    }

    @Test
    void twoLayerHeatProductionIsSelectable() {
        post("""
                {"lithosphere": {"type": "continental", "surfaceHeatFlowMWPerM2": 50, "heatProduction": "two-layer"},
                 "maxDepthKm": 35, "stepKm": 5}""").then()
                .statusCode(200)
                // REFERENCES §1.4 [calc]: two-layer, 280 °C at 20 km, 460 °C at 35 km
                .body("points[4].temperatureC", closeTo(280, 0.5))
                .body("mohoTemperatureC", closeTo(460, 0.5));
    }

    @Test
    void continentalLithosphereMeetsTheAdiabat() {
        post("""
                {"lithosphere": {"type": "continental", "surfaceHeatFlowMWPerM2": 45},
                 "potentialTemperatureC": 1330, "maxDepthKm": 250, "stepKm": 5}""").then()
                .statusCode(200)
                .body("lithosphereBaseDepthKm", greaterThan(100.0))
                .body("lithosphereBaseDepthKm", lessThan(200.0))
                .body("models.id", hasItems("continental-steady-conductive", "mantle-adiabat"));
    }

    @Test
    void theAdiabatAloneStartsAtThePotentialTemperature() {
        post("""
                {"potentialTemperatureC": 1350, "maxDepthKm": 100, "stepKm": 50}""").then()
                .statusCode(200)
                .body("points", hasSize(3))
                .body("points[0].temperatureC", closeTo(1350, 1e-9))
                // 1623.15 K · exp(3e-5 · 9.81 · 1e5 / 1000) = 1398.5 °C (computed here)
                .body("points[2].temperatureC", closeTo(1398.5, 0.1))
                .body("lithosphereBaseDepthKm", closeTo(0, 0))
                .body("surfaceHeatFlowMWPerM2", nullValue())
                .body("models.id", equalTo(java.util.List.of("mantle-adiabat", "lithostatic-two-layer")));
    }

    @Test
    void ps77ParameterSetIsSelectableAndChangedParametersAreFlagged() {
        post("""
                {"lithosphere": {"type": "oceanic-plate", "ageMyr": 4, "parameterSet": "PS77"}, "maxDepthKm": 10}""")
                .then()
                .statusCode(200)
                // Parsons & Sclater (1977) [pub]: d = 2500 + 350 √t m → 3200 m at 4 Myr (within 1 %)
                .body("seafloorDepthM", closeTo(3200, 7))
                .body("models.id", hasItem("plate-parameters-ps77"))
                .body("warnings", empty());
        post("""
                {"lithosphere": {"type": "oceanic-plate", "ageMyr": 60, "plateThicknessKm": 110}, "maxDepthKm": 10}""")
                .then()
                .statusCode(200)
                .body("warnings", hasItem(containsString("plateThicknessKm")));
    }

    @Test
    void aPurelyConductiveGeothermThatRunsHotIsFlagged() {
        post("""
                {"lithosphere": {"type": "continental", "surfaceHeatFlowMWPerM2": 70}, "maxDepthKm": 300, "stepKm": 10}""")
                .then()
                .statusCode(200)
                .body("lithosphereBaseDepthKm", nullValue())
                .body("warnings", hasItem(containsString("potentialTemperatureC")));
    }

    @Test
    void aNegativeAgeNamesTheFieldAndItsRange() {
        assertInvalidField(post("""
                {"lithosphere": {"type": "oceanic-plate", "ageMyr": -5}}"""), "lithosphere.ageMyr")
                .body("errors[0].message", containsString("between 0.01 and 200"));
        assertInvalidField(post("""
                {"lithosphere": {"type": "oceanic-half-space"}}"""), "lithosphere.ageMyr");
    }

    @Test
    void heatFlowTooLowToBePhysicalIsRefused() {
        assertInvalidField(post("""
                {"lithosphere": {"type": "continental", "surfaceHeatFlowMWPerM2": 5}}"""),
                "lithosphere.surfaceHeatFlowMWPerM2")
                .body("errors[0].message", containsString("between 15 and 200"));
        assertInvalidField(post("""
                {"lithosphere": {"type": "continental"}}"""), "lithosphere.surfaceHeatFlowMWPerM2");
    }

    @Test
    void aReducedFractionOutsideZeroToOneIsRefused() {
        for (String f : new String[] {"1.2", "-0.1"}) {
            assertInvalidField(post("""
                    {"lithosphere": {"type": "continental", "surfaceHeatFlowMWPerM2": 60,
                     "reducedHeatFlowFraction": %s}}""".formatted(f)), "lithosphere.reducedHeatFlowFraction")
                    .body("errors[0].message", containsString("between 0 and 1"));
        }
    }

    @Test
    void aStepLargerThanTheDepthRangeIsRefused() {
        assertInvalidField(post("""
                {"potentialTemperatureC": 1350, "maxDepthKm": 50, "stepKm": 60}"""), "stepKm")
                .body("errors[0].message", containsString("maxDepthKm"));
    }

    @Test
    void moreThan5000PointsAreRefused() {
        assertInvalidField(post("""
                {"potentialTemperatureC": 1350, "maxDepthKm": 300, "stepKm": 0.05}"""), "stepKm")
                .body("errors[0].message", containsString("6001"))
                .body("errors[0].message", containsString("5000"));
        // 0 to 400 km every 0.08 km is exactly 5001 depths: still too many
        assertInvalidField(post("""
                {"potentialTemperatureC": 1350, "maxDepthKm": 400, "stepKm": 0.08}"""), "stepKm");
        post("""
                {"potentialTemperatureC": 1350, "maxDepthKm": 400, "stepKm": 0.08002}""").then().statusCode(200)
                .body("points", hasSize(5000));
    }

    @Test
    void fieldsOfAnotherTypeAreRefusedByName() {
        assertInvalidField(post("""
                {"lithosphere": {"type": "continental", "surfaceHeatFlowMWPerM2": 60, "ageMyr": 30}}"""),
                "lithosphere.ageMyr")
                .body("errors[0].message", containsString("continental"));
        assertInvalidField(post("""
                {"lithosphere": {"type": "oceanic-half-space", "ageMyr": 30, "plateThicknessKm": 100,
                 "parameterSet": "GDH1"}}"""), "lithosphere.plateThicknessKm")
                .body("errors.field", hasItem("lithosphere.parameterSet"));
        assertInvalidField(post("""
                {"lithosphere": {"type": "oceanic-plate", "ageMyr": 30, "crustThicknessKm": 7}}"""),
                "lithosphere.crustThicknessKm");
    }

    @Test
    void typeAndChoicesAreChecked() {
        assertInvalidField(post("""
                {"lithosphere": {"ageMyr": 30}}"""), "lithosphere.type");
        assertInvalidField(post("""
                {"lithosphere": {"type": "oceanic"}}"""), "lithosphere.type")
                .body("errors[0].message", containsString("oceanic-plate"));
        assertInvalidField(post("""
                {"lithosphere": {"type": "oceanic-plate", "ageMyr": 30, "parameterSet": "XYZ"}}"""),
                "lithosphere.parameterSet");
        assertInvalidField(post("""
                {"lithosphere": {"type": "continental", "surfaceHeatFlowMWPerM2": 60, "heatProduction": "linear"}}"""),
                "lithosphere.heatProduction");
    }

    @Test
    void neitherLithosphereNorPotentialTemperatureIsRefused() {
        assertInvalidField(post("{\"maxDepthKm\": 100}"), "lithosphere");
    }

    @Test
    void aFieldWithoutItsUnitIsUnknown() {
        assertInvalidField(post("""
                {"lithosphere": {"type": "oceanic-plate", "age": 30}}"""), "lithosphere.age")
                .body("errors[0].message", containsString("ageMyr"));
        assertInvalidField(post("{\"potentialTemperature\": 1350}"), "potentialTemperature");
    }

    @Test
    void twoLayerHeatProductionMustFitInTheCrust() {
        assertInvalidField(post("""
                {"lithosphere": {"type": "continental", "surfaceHeatFlowMWPerM2": 60, "heatProduction": "two-layer",
                 "heatProductionScaleKm": 40, "crustThicknessKm": 30}}"""), "lithosphere.heatProductionScaleKm");
    }

    @Test
    void aLithosphereThatNeverMeetsTheAdiabatSaysHowHotItWouldNeedToBe() {
        // the half-space's default 1300 °C interior is colder than a 1350 °C adiabat at every depth
        assertInvalidField(post("""
                {"lithosphere": {"type": "oceanic-half-space", "ageMyr": 60}, "potentialTemperatureC": 1350}"""),
                "potentialTemperatureC")
                .body("errors.field", hasItem("lithosphere.mantleTemperatureC"))
                .body("errors[1].message", containsString("at least"));
        // with the interior hot enough, it meets
        post("""
                {"lithosphere": {"type": "oceanic-half-space", "ageMyr": 60, "mantleTemperatureC": 1500},
                 "potentialTemperatureC": 1350}""").then().statusCode(200)
                .body("lithosphereBaseDepthKm", greaterThan(60.0));
        // a continent whose heat is all crustal levels off below the crust and never meets it
        assertInvalidField(post("""
                {"lithosphere": {"type": "continental", "surfaceHeatFlowMWPerM2": 40, "reducedHeatFlowFraction": 0},
                 "potentialTemperatureC": 1350}"""), "potentialTemperatureC")
                .body("errors.field", hasItem("lithosphere.reducedHeatFlowFraction"));
    }

    @Test
    void everyInvalidFieldIsListedAndNothingLeaks() {
        assertProblem(post("""
                {"lithosphere": {"type": "oceanic-plate", "ageMyr": 500, "mantleTemperatureC": 5000,
                 "diffusivityM2PerS": 1}, "potentialTemperatureC": 100, "maxDepthKm": 1000}"""), 400, "validation")
                .body("errors.field", hasItems("lithosphere.ageMyr", "lithosphere.mantleTemperatureC",
                        "lithosphere.diffusivityM2PerS", "potentialTemperatureC", "maxDepthKm"))
                .body(not(containsString("NaN")));
    }

    @Test
    void aWrongContentTypeIs415() {
        assertProblem(TestServer.given().contentType(ContentType.TEXT).body("{\"potentialTemperatureC\": 1350}")
                .post(PATH), 415, "unsupported-media-type");
    }

    @Test
    void aBodyOverTheLimitIs413() {
        StringBuilder big = new StringBuilder("{\"potentialTemperatureC\": 1350, \"pad\": \"");
        big.append("x".repeat((int) Config.defaults().maxBodyBytes() + 10)).append("\"}");
        assertProblem(post(big.toString()), 413, "body-too-large");
    }
}
