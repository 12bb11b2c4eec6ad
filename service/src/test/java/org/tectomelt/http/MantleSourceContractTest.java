package org.tectomelt.http;

import static org.hamcrest.Matchers.closeTo;
import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.hasSize;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.tectomelt.http.Problem.assertInvalidField;

import io.restassured.path.json.JsonPath;
import java.util.List;
import java.util.Map;
import java.util.stream.Collectors;
import org.junit.jupiter.api.Test;
import org.tectomelt.operations.Input;
import org.tectomelt.operations.Operations;

/**
 * The mantle-source fields of the decompression operations (melting mode, cpx mass fraction, solidus
 * shifts, pyroxenite fraction) and the slow-spreading model, through {@code /v1/settings/mid-ocean-ridge}:
 * every rule that ties fields together gives a 400 naming the field and the allowed values.
 */
class MantleSourceContractTest {

    private static final String RIDGE = "/v1/settings/mid-ocean-ridge";

    private static JsonPath ridge(String extra) {
        return TestServer.json("{\"potentialTemperatureC\": 1350, \"fullSpreadingRateMmPerYr\": 40" + extra + "}")
                .post(RIDGE).then().statusCode(200).extract().jsonPath();
    }

    @Test
    void batchIsTheDefaultAndItsAnswerUnchanged() {
        JsonPath plain = ridge("");
        JsonPath batch = ridge(", \"meltingMode\": \"batch\", \"pyroxeniteFraction\": 0, \"solidusShiftK\": 0");
        assertEquals(plain.getDouble("crustalThicknessKm"), batch.getDouble("crustalThicknessKm"), 0.0);
        assertEquals("batch", plain.getString("column.meltingMode"));
        assertEquals("infinite-stretching", plain.getString("crustModel"));
        assertEquals(1, plain.getList("column.lithologies").size());
        assertTrue(plain.getMap("column").containsKey("pyroxeniteMeltShare"));
        assertTrue(plain.get("column.pyroxeniteMeltShare") == null, "null for a peridotite-only source");
        assertTrue(plain.get("column.profile[3].pyroxeniteMeltFraction") == null);
    }

    @Test
    void fractionalMeltingMakesALittleLessCrustAndDriesTheResidue() {
        double batch = ridge(", \"bulkWaterWtPct\": 0.01").getDouble("crustalThicknessKm");
        JsonPath frac = ridge(", \"bulkWaterWtPct\": 0.01, \"meltingMode\": \"fractional\"");
        assertTrue(frac.getDouble("crustalThicknessKm") < batch);
        assertEquals("fractional", frac.getString("column.meltingMode"));
        List<Float> residue = frac.getList("column.profile.residueWaterWtPct", Float.class);
        assertEquals(0.01, residue.get(0), 1e-6);
        for (int i = 1; i < residue.size(); i++) {
            assertTrue(residue.get(i) <= residue.get(i - 1));
        }
        assertTrue(frac.getList("models.id").contains("fractional-melting-asimow1997"));
        JsonPath near = ridge(", \"meltingMode\": \"near-fractional\", \"retainedMeltFraction\": 0.02");
        assertEquals("near-fractional", near.getString("column.meltingMode"));
    }

    @Test
    void aPyroxeniteFractionMakesMoreCrustAndReportsEachLithology() {
        double batch = ridge("").getDouble("crustalThicknessKm");
        JsonPath mixed = ridge(", \"pyroxeniteFraction\": 0.1");
        assertTrue(mixed.getDouble("crustalThicknessKm") > batch);
        assertTrue(mixed.getDouble("column.pyroxeniteMeltShare") > 0.2);
        assertTrue(mixed.getDouble("column.lithologies[1].onset.depthKm")
                > mixed.getDouble("column.lithologies[0].onset.depthKm"), "the pyroxenite starts deeper");
        assertTrue(mixed.getDouble("column.profile[5].pyroxeniteMeltFraction") > 0);
        TestServer.json("{\"potentialTemperatureC\": 1350, \"fullSpreadingRateMmPerYr\": 40, \"pyroxeniteFraction\": 0.1}")
                .post(RIDGE).then().statusCode(200)
                .body("column.lithologies", hasSize(2))
                .body("column.lithologies[1].lithology", equalTo("pyroxenite-pertermann-hirschmann2003"))
                .body("column.lithologies[1].massFraction", closeTo(0.1, 1e-12))
                .body("models.id", hasItem("two-lithology-melting-phipps-morgan2001"));
    }

    @Test
    void cpxMassFractionAndSolidusShiftMoveTheAnswer() {
        double fertile = TestServer.json("{\"potentialTemperatureC\": 1450, \"fullSpreadingRateMmPerYr\": 40}")
                .post(RIDGE).then().statusCode(200).extract().jsonPath().getDouble("crustalThicknessKm");
        JsonPath depleted = TestServer.json("{\"potentialTemperatureC\": 1450, \"fullSpreadingRateMmPerYr\": 40, "
                + "\"cpxMassFraction\": 0.10}").post(RIDGE).then().statusCode(200).extract().jsonPath();
        assertTrue(depleted.getDouble("crustalThicknessKm") < fertile);
        double colder = TestServer.json("{\"potentialTemperatureC\": 1350, \"fullSpreadingRateMmPerYr\": 40, "
                + "\"solidusShiftK\": 30}").post(RIDGE).then().statusCode(200).extract().jsonPath()
                .getDouble("crustalThicknessKm");
        assertTrue(colder < ridge("").getDouble("crustalThicknessKm"));
    }

    @Test
    void aSlowRidgeNamesTheConductiveLid() {
        TestServer.json("{\"potentialTemperatureC\": 1330, \"fullSpreadingRateMmPerYr\": 10}").post(RIDGE).then()
                .statusCode(200)
                .body("crustModel", equalTo("slow-spreading-conductive-lid"))
                .body("conductiveLidKm", closeTo(12.54, 0.05))
                .body("column.lidDepthKm", closeTo(12.54, 0.05))
                .body("models.id", hasItem("slow-spreading-conductive-lid"));
        double slow = TestServer.json("{\"potentialTemperatureC\": 1330, \"fullSpreadingRateMmPerYr\": 10}").post(RIDGE)
                .then().extract().jsonPath().getDouble("crustalThicknessKm");
        double fast = TestServer.json("{\"potentialTemperatureC\": 1330, \"fullSpreadingRateMmPerYr\": 40}").post(RIDGE)
                .then().extract().jsonPath().getDouble("crustalThicknessKm");
        assertTrue(slow < 0.8 * fast, slow + " vs " + fast);
    }

    @Test
    void badSourceFieldsAreRefusedNamingTheFieldAndTheAllowedValues() {
        String base = "{\"potentialTemperatureC\": 1350, \"fullSpreadingRateMmPerYr\": 40, ";
        assertInvalidField(TestServer.json(base + "\"pyroxeniteFraction\": 1.5}").post(RIDGE), "pyroxeniteFraction")
                .body("errors[0].message", containsString("between 0 and 1"));
        assertInvalidField(TestServer.json(base + "\"pyroxeniteFraction\": -0.1}").post(RIDGE), "pyroxeniteFraction");
        assertInvalidField(TestServer.json(base + "\"meltingMode\": \"dynamic\"}").post(RIDGE), "meltingMode")
                .body("errors[0].message", containsString("near-fractional"));
        assertInvalidField(TestServer.json(base + "\"meltingMode\": \"near-fractional\", \"retainedMeltFraction\": 0.3}")
                .post(RIDGE), "retainedMeltFraction").body("errors[0].message", containsString("0.1"));
        assertInvalidField(TestServer.json(base + "\"retainedMeltFraction\": 0.01}").post(RIDGE), "retainedMeltFraction")
                .body("errors[0].message", containsString("near-fractional"));
        // hydrous fractional melting on a dry-only law
        assertInvalidField(TestServer.json(base + "\"lithology\": \"peridotite-mckenzie-bickle1988\", "
                + "\"bulkWaterWtPct\": 0.01, \"meltingMode\": \"fractional\"}").post(RIDGE), "meltingMode")
                .body("errors.message", hasItem(containsString("[batch]")));
        assertInvalidField(TestServer.json(base + "\"lithology\": \"peridotite-mckenzie-bickle1988\", "
                + "\"cpxMassFraction\": 0.12}").post(RIDGE), "cpxMassFraction");
        assertInvalidField(TestServer.json(base + "\"cpxMassFraction\": 0.3}").post(RIDGE), "cpxMassFraction");
        assertInvalidField(TestServer.json(base + "\"solidusShiftK\": 500}").post(RIDGE), "solidusShiftK");
        assertInvalidField(TestServer.json(base + "\"pyroxenite\": \"pyroxenite-pertermann-hirschmann2003\"}")
                .post(RIDGE), "pyroxenite").body("errors[0].message", containsString("pyroxeniteFraction"));
        assertInvalidField(TestServer.json(base + "\"pyroxeniteFraction\": 0.1, \"pyroxenite\": \"basalt\"}")
                .post(RIDGE), "pyroxenite").body("errors[0].message", containsString("pyroxenite-pertermann-hirschmann2003"));
    }

    @Test
    void theSourceVariationsAreListedAsSampleableInputs() {
        Map<String, Input> in = Operations.byName("mid-ocean-ridge").orElseThrow().inputs().stream()
                .collect(Collectors.toMap(Input::name, i -> i));
        for (String name : List.of("cpxMassFraction", "solidusShiftK", "pyroxeniteFraction")) {
            assertTrue(in.containsKey(name) && in.get(name).sampleable(), name);
        }
        assertEquals("K", in.get("solidusShiftK").unit());
    }
}
