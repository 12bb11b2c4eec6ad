package org.tectomelt.http;

import static org.hamcrest.Matchers.closeTo;
import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.greaterThan;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.hasSize;
import static org.hamcrest.Matchers.lessThan;
import static org.hamcrest.Matchers.nullValue;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.tectomelt.http.Problem.assertInvalidField;
import static org.tectomelt.http.Problem.assertProblem;

import io.restassured.http.ContentType;
import io.restassured.path.json.JsonPath;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/** {@code POST /v1/melt-composition}: results, the tables cited, CSV, and a 400 naming the field for bad input. */
class MeltCompositionContractTest {

    private static final String PATH = "/v1/melt-composition";
    private static final String RIDGE = "\"midOceanRidge\": {\"potentialTemperatureC\": 1350, \"fullSpreadingRateMmPerYr\": 40}";

    private static String body(String extra) {
        return "{" + RIDGE + (extra.isEmpty() ? "" : ", " + extra) + "}";
    }

    @Test
    void aRidgeGivesPooledAndProfileCompositionsThatHoldTheSource() {
        JsonPath j = TestServer.json(body("\"elements\": [\"La\", \"Sm\", \"Dy\", \"Yb\"]")).post(PATH).then()
                .statusCode(200)
                .body("regime", equalTo("midOceanRidge"))
                .body("meltingMode", equalTo("fractional"))
                .body("elements", equalTo(List.of("La", "Sm", "Dy", "Yb")))
                .body("pooled.regime", equalTo("passive"))
                .body("pooled.meanMeltFraction", greaterThan(0.05))
                // (La/Sm)N < 1 for melts of depleted mantle (common practice)
                .body("pooled.ratios.laSmN", lessThan(1.0))
                .body("pooled.ratios.smYbN", greaterThan(0.0))
                .body("profile[0].meltFraction", closeTo(0.0, 1e-12))
                .body("tables.kind", equalTo(List.of("source", "partition-coefficients", "normalisation")))
                .body("tables.id", hasItem("dmm-workman-hart2005"))
                .body("models.id", hasItem("trace-element-melting-shaw1970"))
                .body("models.id", hasItem("dmm-workman-hart2005"))
                .body("models.id", hasItem("cpx-partitioning-hart-dunn1993"))
                .body("models.id", hasItem("ci-chondrite-sun-mcdonough1989"))
                .body("models.id", hasItem("peridotite-katz2003"))
                .extract().jsonPath();
        // mass balance of the pooled regime: F̄·C̄_pool + (1 − F̄)·C̄_res = C0
        double f = j.getDouble("pooled.meanMeltFraction");
        for (String e : List.of("La", "Sm", "Dy", "Yb")) {
            double c0 = j.getDouble("sourcePpm." + e);
            double sum = f * j.getDouble("pooled.meltPpm." + e) + (1 - f) * j.getDouble("pooled.residuePpm." + e);
            assertEquals(c0, sum, 1e-9 * c0, e);
            // normalised = ppm / CI chondrite (Sun & McDonough 1989, from memory: La 0.237, Yb 0.170)
        }
        assertEquals(j.getDouble("pooled.meltPpm.La") / 0.237, j.getDouble("pooled.meltNormalised.La"), 1e-9);
        assertEquals(j.getDouble("pooled.meltPpm.Yb") / 0.170, j.getDouble("pooled.meltNormalised.Yb"), 1e-9);
        // the reference the page normalises a pasted analysis by is the one the service divided by
        assertEquals(0.237, j.getDouble("normalisationPpm.La"), 1e-12);
        assertEquals(List.of("La", "Sm", "Dy", "Yb"), List.copyOf(j.getMap("normalisationPpm").keySet()));
        for (String e : List.of("La", "Sm", "Dy", "Yb")) {
            assertEquals(j.getDouble("pooled.meltPpm." + e) / j.getDouble("normalisationPpm." + e),
                    j.getDouble("pooled.meltNormalised." + e), 1e-12 * j.getDouble("pooled.meltNormalised." + e), e);
        }
        assertEquals(j.getList("column.profile").size(), j.getList("profile").size());
    }

    @Test
    void modesSourcesScalesAndSuppliedValuesChangeTheAnswer() {
        double fractional = TestServer.json(body("\"elements\": [\"La\"]")).post(PATH).then().statusCode(200)
                .extract().jsonPath().getDouble("pooled.meltPpm.La");
        double doubled = TestServer.json(body("\"elements\": [\"La\"], \"sourceConcentrationsPpm\": {\"La\": 0.384}"))
                .post(PATH).then().statusCode(200)
                .body("tables[0].suppliedElements", equalTo(List.of("La")))
                .body("sourcePpm.La", closeTo(0.384, 1e-12))
                .extract().jsonPath().getDouble("pooled.meltPpm.La");
        // concentrations are linear in C0
        assertEquals(2 * fractional, doubled, 1e-9 * doubled);
        TestServer.json(body("\"elements\": [\"La\", \"Sm\"], \"meltingMode\": \"batch\"")).post(PATH).then()
                .statusCode(200).body("retainedMeltFraction", closeTo(1.0, 0)).body("meltingMode", equalTo("batch"));
        TestServer.json(body("\"elements\": [\"La\"], \"meltingMode\": \"near-fractional\", \"retainedMeltFraction\": 0.01"))
                .post(PATH).then().statusCode(200).body("retainedMeltFraction", closeTo(0.01, 0))
                .body("models.id", hasItem("dynamic-melting-zou1998"));
        TestServer.json(body("\"elements\": [\"Yb\"], \"userPartitionCoefficients\": {\"Yb\": {\"olivine\": 0.002, "
                + "\"orthopyroxene\": 0.05, \"clinopyroxene\": 0.4, \"garnet\": 5, \"spinel\": 0.01}}, "
                + "\"partitionCoefficientScale\": 1.5, \"source\": \"primitive-mantle-mcdonough-sun1995\", "
                + "\"normalisation\": \"primitive-mantle-sun-mcdonough1989\"")).post(PATH).then().statusCode(200)
                .body("tables[1].suppliedElements", equalTo(List.of("Yb")))
                .body("tables[0].id", equalTo("primitive-mantle-mcdonough-sun1995"))
                .body("pooled.ratios.laSmN", nullValue())
                .body("assumptions", hasItem(containsString("multiplied by 1.5")));
    }

    @Test
    void aPlumeUnderALidPoolsTheTopOfAnActiveColumn() {
        TestServer.json("{\"hotspot\": {\"potentialTemperatureC\": 1500, \"ambientPotentialTemperatureC\": 1350, "
                + "\"lithosphereThicknessKm\": 80, \"plumeRadiusKm\": 60, \"upwellingVelocityCmPerYr\": 8}, "
                + "\"elements\": [\"La\", \"Sm\", \"Yb\"]}").post(PATH).then().statusCode(200)
                .body("regime", equalTo("hotspot"))
                .body("pooled.regime", equalTo("active"))
                .body("column.upwelling", equalTo("active"))
                .body("profile[0].garnetFraction", closeTo(1.0, 0))
                .body("models.id", hasItem("lid-effect-ellam1992"));
        TestServer.json("{\"continentalRift\": {\"potentialTemperatureC\": 1400, \"stretchingFactor\": 5, "
                + "\"lithosphereThicknessKm\": 100, \"crustThicknessKm\": 30}, \"elements\": [\"La\"]}").post(PATH)
                .then().statusCode(200).body("regime", equalTo("continentalRift"))
                .body("assumptions", hasItem(containsString("unstretched lithosphere")));
        TestServer.json("{\"column\": {\"potentialTemperatureC\": 1050}, \"elements\": [\"La\"]}").post(PATH).then()
                .statusCode(200).body("pooled", nullValue()).body("profile", hasSize(0))
                .body("warnings", hasItem(containsString("no melt")));
    }

    @Test
    void theProfileComesAsCsvWithAColumnPerElement() {
        String csv = TestServer.given().contentType("application/json").accept("text/csv")
                .body(body("\"elements\": [\"La\", \"Yb\"]")).post(PATH).then().statusCode(200)
                .contentType(containsString("text/csv")).extract().asString();
        String header = csv.lines().findFirst().orElseThrow();
        assertTrue(header.contains("instantaneousPpm.La") && header.contains("accumulatedPpm.Yb"), header);
        assertTrue(csv.lines().count() > 50);
    }

    @Test
    void badInputIsA400NamingTheField() {
        assertInvalidField(TestServer.json(body("\"elements\": [\"La\", \"Xx\"]")).post(PATH), "elements[1]");
        assertInvalidField(TestServer.json(body("\"elements\": [\"La\", \"La\"]")).post(PATH), "elements[1]");
        assertInvalidField(TestServer.json(body("\"source\": \"moon\"")).post(PATH), "source");
        assertInvalidField(TestServer.json(body("\"partitionCoefficients\": \"granite\"")).post(PATH),
                "partitionCoefficients");
        assertInvalidField(TestServer.json(body("\"normalisation\": \"mars\"")).post(PATH), "normalisation");
        assertInvalidField(TestServer.json(body("\"sourceConcentrationsPpm\": {\"La\": -1}")).post(PATH),
                "sourceConcentrationsPpm.La");
        assertInvalidField(TestServer.json(body("\"sourceConcentrationsPpm\": {\"Xx\": 1}")).post(PATH),
                "sourceConcentrationsPpm.Xx");
        assertInvalidField(TestServer.json(body("\"sourceConcentrationsPpm\": {\"La\": 1e400}")).post(PATH),
                "sourceConcentrationsPpm.La");
        assertInvalidField(TestServer.json(body("\"userPartitionCoefficients\": {\"La\": {\"olivine\": 0.001, "
                + "\"orthopyroxene\": 0.002, \"clinopyroxene\": -0.05, \"garnet\": 0.01, \"spinel\": 0.01}}"))
                .post(PATH), "userPartitionCoefficients.La.clinopyroxene");
        // a partial user table: an element without a coefficient for every mineral
        assertInvalidField(TestServer.json(body("\"userPartitionCoefficients\": {\"La\": {\"olivine\": 0.001, "
                + "\"clinopyroxene\": 0.05}}")).post(PATH), "userPartitionCoefficients.La.orthopyroxene");
        assertInvalidField(TestServer.json(body("\"partitionCoefficientScale\": 0")).post(PATH),
                "partitionCoefficientScale");
        assertInvalidField(TestServer.json(body("\"meltingMode\": \"equilibrium\"")).post(PATH), "meltingMode");
        assertInvalidField(TestServer.json(body("\"retainedMeltFraction\": 0.5")).post(PATH), "retainedMeltFraction");
        assertInvalidField(TestServer.json("{\"elements\": [\"La\"]}").post(PATH), "column");
        assertInvalidField(TestServer.json("{" + RIDGE + ", \"column\": {\"potentialTemperatureC\": 1350}}").post(PATH),
                "midOceanRidge");
        assertInvalidField(TestServer.json("{\"midOceanRidge\": {\"potentialTemperatureC\": 1350}}").post(PATH),
                "midOceanRidge.fullSpreadingRateMmPerYr");
        assertInvalidField(TestServer.json("{\"continentalRift\": {\"potentialTemperatureC\": 1400, "
                + "\"stretchingFactor\": 3, \"lithosphereThicknessKm\": 40, \"crustThicknessKm\": 45}}").post(PATH),
                "continentalRift.crustThicknessKm");
        assertInvalidField(TestServer.json(body("\"element\": [\"La\"]")).post(PATH), "element");
    }

    @Test
    void everyElementComesBackInDiagramOrderByDefault() {
        JsonPath j = TestServer.json(body("")).post(PATH).then().statusCode(200).body("elements", hasSize(25))
                .extract().jsonPath();
        assertEquals("Rb", j.getList("elements").get(0));
        assertEquals("Lu", j.getList("elements").get(24));
        Map<String, Object> melt = j.getMap("pooled.meltPpm");
        assertEquals(j.getList("elements"), List.copyOf(melt.keySet()));
    }

    @Test
    void wrongMediaTypeAndOversizedBodiesAreRefused() {
        assertProblem(TestServer.given().contentType(ContentType.TEXT).body("{}").post(PATH), 415,
                "unsupported-media-type");
        StringBuilder big = new StringBuilder("{" + RIDGE + ", \"elements\": [");
        while (big.length() < Config.defaults().maxBodyBytes() + 10) {
            big.append("\"La\",");
        }
        big.append("\"Sm\"]}");
        assertProblem(TestServer.json(big.toString()).post(PATH), 413, "body-too-large");
    }
}
