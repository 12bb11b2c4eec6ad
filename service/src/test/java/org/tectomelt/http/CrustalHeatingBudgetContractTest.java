package org.tectomelt.http;

import static org.hamcrest.Matchers.closeTo;
import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.empty;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.not;
import static org.hamcrest.Matchers.nullValue;
import static org.tectomelt.http.Problem.assertInvalidField;
import static org.tectomelt.http.Problem.assertProblem;

import io.restassured.http.ContentType;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/** {@code POST /v1/crustal-heating/budget}. */
class CrustalHeatingBudgetContractTest {

    private static final String PATH = "/v1/crustal-heating/budget";

    private static final String INTRUSION = "\"intrusion\": {\"temperatureC\": 1250, \"densityKgPerM3\": 2900, "
            + "\"heatCapacityJPerKgK\": 1100, \"latentHeatJPerKg\": 400000";
    private static final String CRUST = "\"crust\": {\"initialTemperatureC\": 500, \"densityKgPerM3\": 2700, "
            + "\"heatCapacityJPerKgK\": 1000, \"latentHeatJPerKg\": 300000";

    /**
     * Hand calculation of REFERENCES §3.3 with stated (invented) parameters:
     * <pre>
     *   intrusion  Tb0 = 1250 °C, ρb = 2900 kg/m³, cb = 1100 J/kg/K, Lb = 400 kJ/kg, Xb = 1
     *   crust      Tc0 = 500 °C,  ρc = 2700 kg/m³, cc = 1000 J/kg/K, Lc = 300 kJ/kg, F = 0.2
     *   target     Tf = 850 °C
     *   qb = 2900 × (1100 × (1250 − 850) + 1 × 400000)  = 2900 × 840000 = 2.436e9 J/m³
     *   qc = 2700 × (1000 × (850 − 500)  + 0.2 × 300000) = 2700 × 410000 = 1.107e9 J/m³
     *   hb/hc = 1.107e9 / 2.436e9 = 0.454433...
     *   a 100 m intrusion: 2.436e11 J/m², brings 100 / 0.454433 = 220.05 m of crust to the target
     *   500 m of crust: 5.535e11 J/m², needs 500 × 0.454433 = 227.22 m of intrusion
     * </pre>
     */
    @Test
    void theBalanceMatchesAHandCalculation() {
        TestServer.json("{" + INTRUSION + ", \"crystallizedFraction\": 1, \"thicknessM\": 100}, "
                        + CRUST + ", \"targetMeltFraction\": 0.2, \"thicknessM\": 500}, \"finalTemperatureC\": 850}")
                .post(PATH).then()
                .statusCode(200)
                .body("finalTemperatureC", closeTo(850, 1e-9))
                .body("crustMeltFraction", closeTo(0.2, 1e-12))
                .body("intrusionCrystallizedFraction", closeTo(1, 1e-12))
                .body("heatReleasedJPerM3", closeTo(2.436e9, 1))
                .body("heatRequiredJPerM3", closeTo(1.107e9, 1))
                .body("basaltToCrustThicknessRatio", closeTo(1.107 / 2.436, 1e-9))
                .body("heatReleasedJPerM2", closeTo(2.436e11, 100))
                .body("crustThicknessBroughtToTargetM", closeTo(220.05, 0.005))
                .body("heatRequiredJPerM2", closeTo(5.535e11, 100))
                .body("intrusionThicknessNeededM", closeTo(227.22, 0.005))
                .body("note", containsString("lower bound"))
                // the intrusion's default lithology (basalt) supplies the curve checked against Xb
                .body("warnings", hasItem(containsString("intrusion (basalt): default melt curve is approximate")))
                .body("models[0].id", equalTo("heat-budget-no-loss"));
    }

    /**
     * Lithology defaults (the catalogue's amphibolite and basalt) in a hand calculation:
     * <pre>
     *   amphibolite  ρ = 3000 kg/m³, c = 1100 J/kg/K, L = 270 kJ/kg; its curve reaches F = 0.2 at 950 °C
     *   basalt       ρ = 2900 kg/m³, c = 1200 J/kg/K, L = 350 kJ/kg; solid below 1000 °C, so Xb = 1
     *   crust at 600 °C, basalt at 1250 °C
     *   qc = 3000 × (1100 × 350 + 0.2 × 270000) = 3000 × 439000 = 1.317e9 J/m³
     *   qb = 2900 × (1200 × 300 + 350000)       = 2900 × 710000 = 2.059e9 J/m³
     * </pre>
     */
    @Test
    void lithologiesSupplyTheirDefaultPropertiesAndCurves() {
        TestServer.json("{\"crust\": {\"lithology\": \"amphibolite\", \"initialTemperatureC\": 600, "
                        + "\"targetMeltFraction\": 0.2}, \"intrusion\": {\"temperatureC\": 1250}}")
                .post(PATH).then()
                .statusCode(200)
                .body("finalTemperatureC", closeTo(950, 1e-9))
                .body("intrusionCrystallizedFraction", closeTo(1, 1e-12))
                .body("heatRequiredJPerM3", closeTo(1.317e9, 1))
                .body("heatReleasedJPerM3", closeTo(2.059e9, 1))
                .body("models.id", hasItem("amphibolite"))
                .body("models.id", hasItem("basalt"))
                .body("warnings", hasItem(containsString("crust (amphibolite): default melt curve is approximate")));
        // an explicit field overrides the lithology's value
        TestServer.json("{\"crust\": {\"lithology\": \"amphibolite\", \"initialTemperatureC\": 600, "
                        + "\"targetMeltFraction\": 0.2, \"densityKgPerM3\": 2900}, \"intrusion\": {\"temperatureC\": 1250}}")
                .post(PATH).then()
                .statusCode(200)
                .body("heatRequiredJPerM3", closeTo(2900 * 439000.0, 1));
        assertInvalidField(TestServer.json("{\"crust\": {\"lithology\": \"gneiss\", \"initialTemperatureC\": 600, "
                + "\"targetMeltFraction\": 0.2}, \"intrusion\": {\"temperatureC\": 1250}}").post(PATH), "crust.lithology")
                .body("errors[0].message", containsString("metapelite"));
    }

    @Test
    void theWaterSaturatedGraniteCurveIsReadAtTheGivenDepth() {
        // Huang & Wyllie (1973): water-saturated granite solidus 680 °C at 0.2 GPa and 620 °C at 1 GPa;
        // 1 GPa lies at 1e9 / (2650 × 9.81) = 38.466 km in granite of 2650 kg/m³
        String body = "{\"crust\": {\"lithology\": \"granite-water-saturated\", \"initialTemperatureC\": 400, "
                + "\"targetMeltFraction\": 0}, \"intrusion\": {\"temperatureC\": 1250}, \"depthKm\": ";
        TestServer.json(body + "38.466}").post(PATH).then().statusCode(200)
                .body("finalTemperatureC", closeTo(620, 0.05));
        TestServer.json(body + "7.693}").post(PATH).then().statusCode(200)
                .body("finalTemperatureC", closeTo(680, 0.05));
    }

    @Test
    void aTargetMeltFractionAloneFindsTheFinalTemperatureOnTheCrustsCurve() {
        // crust curve: 0 at 700 °C, 0.1 at 800 °C, 0.3 at 900 °C → F = 0.2 at 850 °C; the intrusion's
        // interval 1000–1200 °C is fully crystallised at 850 °C, so Xb = 1: the same balance as above
        TestServer.json("{" + INTRUSION + ", \"meltingInterval\": {\"solidusC\": 1000, \"liquidusC\": 1200}}, "
                        + CRUST + ", \"targetMeltFraction\": 0.2, \"meltCurve\": [{\"temperatureC\": 700, "
                        + "\"meltFraction\": 0}, {\"temperatureC\": 800, \"meltFraction\": 0.1}, {\"temperatureC\": 900, "
                        + "\"meltFraction\": 0.3}]}}")
                .post(PATH).then()
                .statusCode(200)
                .body("finalTemperatureC", closeTo(850, 1e-9))
                .body("intrusionCrystallizedFraction", closeTo(1, 1e-12))
                .body("basaltToCrustThicknessRatio", closeTo(1.107 / 2.436, 1e-9))
                .body("heatReleasedJPerM2", nullValue())
                .body("intrusionThicknessNeededM", nullValue());
    }

    @Test
    void aFinalTemperatureReadsTheCrustsMeltFractionFromItsCurve() {
        TestServer.json("{" + INTRUSION + "}, " + CRUST + ", \"meltingInterval\": {\"solidusC\": 750, "
                        + "\"liquidusC\": 1050}}, \"finalTemperatureC\": 900}")
                .post(PATH).then()
                .statusCode(200)
                .body("crustMeltFraction", closeTo(0.5, 1e-12))
                .body("intrusionCrystallizedFraction", closeTo(1, 1e-12));
    }

    @Test
    void anExplicitFractionOffTheCurveIsKeptButFlagged() {
        TestServer.json("{" + INTRUSION + ", \"meltingInterval\": {\"solidusC\": 1000, \"liquidusC\": 1200}, "
                        + "\"crystallizedFraction\": 1}, " + CRUST + ", \"meltingInterval\": {\"solidusC\": 750, "
                        + "\"liquidusC\": 1050}, \"targetMeltFraction\": 0.1}, \"finalTemperatureC\": 1100}")
                .post(PATH).then()
                .statusCode(200)
                .body("crustMeltFraction", closeTo(0.1, 1e-12))
                .body("warnings", hasItem(containsString("melt curve gives melt fraction")))
                .body("warnings", hasItem(containsString("overstates")));
    }

    @Test
    void missingOutOfRangeAndInconsistentFieldsAreNamed() {
        assertInvalidField(TestServer.json("{" + INTRUSION + "}, \"finalTemperatureC\": 850}").post(PATH), "crust");
        assertInvalidField(TestServer.json("{" + INTRUSION + "}, \"crust\": {\"initialTemperatureC\": 500, "
                + "\"densityKgPerM3\": 99999, \"heatCapacityJPerKgK\": 1000, \"latentHeatJPerKg\": 300000, "
                + "\"targetMeltFraction\": 0.2}, \"finalTemperatureC\": 850}").post(PATH), "crust.densityKgPerM3")
                .body("errors[0].message", containsString("between 1500 and 4000"));
        assertInvalidField(TestServer.json("{" + INTRUSION + "}, " + CRUST + ", \"targetMeltFraction\": 0.2}, "
                + "\"finalTemperatureC\": 1300}").post(PATH), "finalTemperatureC");
        assertInvalidField(TestServer.json("{" + INTRUSION + "}, " + CRUST + "}}").post(PATH), "finalTemperatureC");
        assertInvalidField(TestServer.json("{" + INTRUSION + "}, " + CRUST + "}, \"finalTemperatureC\": 850}")
                .post(PATH), "crust.targetMeltFraction");
        assertInvalidField(TestServer.json("{" + INTRUSION + "}, " + CRUST + ", \"targetMeltFraction\": 0.2}}")
                .post(PATH), "crust.meltCurve");
        assertInvalidField(TestServer.json("{" + INTRUSION + "}, " + CRUST + ", \"targetMeltFraction\": 0.8, "
                + "\"meltCurve\": [{\"temperatureC\": 700, \"meltFraction\": 0}, {\"temperatureC\": 900, "
                + "\"meltFraction\": 0.3}]}}").post(PATH), "crust.targetMeltFraction");
    }

    @Test
    void badMeltCurvesAreRefusedNamingThePoint() {
        assertInvalidField(TestServer.json("{" + INTRUSION + "}, " + CRUST + ", \"meltCurve\": [{\"temperatureC\": 700, "
                        + "\"meltFraction\": 0}, {\"temperatureC\": 690, \"meltFraction\": 0.3}]}, \"finalTemperatureC\": 850}")
                .post(PATH), "crust.meltCurve[1].temperatureC");
        assertInvalidField(TestServer.json("{" + INTRUSION + "}, " + CRUST + ", \"meltCurve\": [{\"temperatureC\": 700, "
                        + "\"meltFraction\": 0.3}, {\"temperatureC\": 790, \"meltFraction\": 0.1}]}, \"finalTemperatureC\": 850}")
                .post(PATH), "crust.meltCurve[1].meltFraction");
        assertInvalidField(TestServer.json("{" + INTRUSION + "}, " + CRUST + ", \"meltCurve\": [{\"temperatureC\": 700, "
                        + "\"meltFraction\": 0}], \"meltingInterval\": {\"solidusC\": 700, \"liquidusC\": 900}}, "
                        + "\"finalTemperatureC\": 850}").post(PATH), "crust.meltingInterval");
        assertInvalidField(TestServer.json("{" + INTRUSION + ", \"meltingInterval\": {\"solidusC\": 1200, "
                        + "\"liquidusC\": 1000}}, " + CRUST + ", \"targetMeltFraction\": 0.2}, \"finalTemperatureC\": 850}")
                .post(PATH), "intrusion.meltingInterval.liquidusC");
        assertInvalidField(TestServer.json("{" + INTRUSION + "}, " + CRUST + ", \"meltCurve\": [{\"temperatureC\": 700}, "
                        + "{\"temperatureC\": 800, \"meltFraction\": 0.3}]}, \"finalTemperatureC\": 850}").post(PATH),
                "crust.meltCurve[0].meltFraction");
    }

    @Test
    void fieldsOfTheSillModelAreNotFieldsOfTheBudget() {
        assertInvalidField(TestServer.json("{" + INTRUSION + "}, " + CRUST + ", \"targetMeltFraction\": 0.2, "
                + "\"conductivityWPerMK\": 2.5}, \"finalTemperatureC\": 850}").post(PATH), "crust.conductivityWPerMK")
                .body("detail", not(containsString("Exception")));
        assertProblem(TestServer.json("{\"crust\": ").post(PATH), 400, "malformed-json");
    }

    @Test
    void wrongMediaTypeAndOversizedBodiesAreRefused() {
        assertProblem(TestServer.given().contentType(ContentType.TEXT).body("{}").post(PATH), 415,
                "unsupported-media-type");
        StringBuilder big = new StringBuilder("{\"crust\": {\"meltCurve\": [");
        while (big.length() < Config.defaults().maxBodyBytes() + 10) {
            big.append("{\"temperatureC\": 700, \"meltFraction\": 0},");
        }
        big.append("{\"temperatureC\": 800, \"meltFraction\": 0}]}}");
        assertProblem(TestServer.json(big.toString()).post(PATH), 413, "body-too-large");
    }
}
