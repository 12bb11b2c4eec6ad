package org.tectomelt.http;

import static org.hamcrest.Matchers.closeTo;
import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.greaterThan;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.lessThan;
import static org.hamcrest.Matchers.notNullValue;
import static org.hamcrest.Matchers.nullValue;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.tectomelt.http.Problem.assertInvalidField;

import org.junit.jupiter.api.Test;

/**
 * {@code POST /v1/crustal-heating/sill}: the graded grid and its convergence check, convecting
 * intrusions, and the crust's own melt table F(T, P).
 */
class SillGradedGridContractTest {

    private static final String PATH = "/v1/crustal-heating/sill";
    private static final String CRUST = CrustalHeatingSillContractTest.CRUST;
    private static final String BASALT = CrustalHeatingSillContractTest.BASALT;

    private static String single(String intrusionExtra, String rest) {
        return "{" + CRUST + ", \"intrusion\": {" + BASALT + ", \"thicknessM\": 50, \"topDepthKm\": 10" + intrusionExtra
                + "}, \"columnDepthKm\": 20, \"durationKyr\": 0.2" + rest + "}";
    }

    /** An invented two-row table: the pelite-like curve at 0 GPa and 60 K higher at 1 GPa. */
    private static String table(String secondRowFirstFraction, double highestGpa) {
        return "\"crust\": {\"initialTemperatureC\": 450, \"conductivityWPerMK\": 2.5, \"densityKgPerM3\": 2750, "
                + "\"heatCapacityJPerKgK\": 1050, \"latentHeatJPerKg\": 280000, \"meltTable\": ["
                + "{\"pressureGPa\": 0, \"meltCurve\": [{\"temperatureC\": 720, \"meltFraction\": 0}, "
                + "{\"temperatureC\": 850, \"meltFraction\": 0.25}, {\"temperatureC\": 1000, \"meltFraction\": 0.6}]}, "
                + "{\"pressureGPa\": " + highestGpa + ", \"meltCurve\": [{\"temperatureC\": 780, \"meltFraction\": 0}, "
                + "{\"temperatureC\": 910, \"meltFraction\": " + secondRowFirstFraction + "}, "
                + "{\"temperatureC\": 900, \"meltFraction\": 0.3}, {\"temperatureC\": 1060, \"meltFraction\": 0.6}]}]}";
    }

    @Test
    void theDefaultGridIsGradedAndReportsItsCellsAndItsConvergence() {
        TestServer.json(single("", "")).post(PATH).then()
                .statusCode(200)
                // the default finest cell: 1/400 of the 50 m sill
                .body("numerics.gridSpacingM", closeTo(0.125, 1e-12))
                .body("numerics.smallestCellM", lessThan(0.14))
                .body("numerics.largestCellM", greaterThan(100.0))
                .body("numerics.convergence.coarseGridSpacingM", closeTo(0.25, 1e-12))
                .body("numerics.convergence.converged", equalTo(true))
                .body("numerics.convergence.largestChange", lessThan(0.01))
                .body("summary.timeToFirstCrustMeltKyr", notNullValue())
                .body("summary.lockUpTimeKyr", nullValue())
                .body("summary.energyErrorFraction", lessThan(1e-10));
        // without the check, no convergence block
        TestServer.json(single("", ", \"convergenceCheck\": false")).post(PATH).then()
                .statusCode(200)
                .body("numerics.convergence", nullValue());
        // a coarse grid is flagged
        TestServer.json(single("", ", \"gridSpacingM\": 5")).post(PATH).then()
                .statusCode(200)
                .body("numerics.convergence.converged", equalTo(false))
                .body("warnings", hasItem(containsString("not converged")));
    }

    /**
     * A 250 m sill in metapelite at 650 °C first melts its roof within a year, while the heated layer is a few
     * metres thick: the default grid is refined (finest cell halved, tolerance quartered; adaptive refinement,
     * common practice) until the run and the one before it agree within 1 %, and the response says how.
     */
    @Test
    void theDefaultIsRefinedUntilConvergedAndReportsThePair() {
        String body = "{\"crust\": {\"lithology\": \"metapelite\", \"initialTemperatureC\": 650}, \"intrusion\": "
                + "{\"temperatureC\": 1230, \"thicknessM\": 250, \"topDepthKm\": 20}, \"columnDepthKm\": 40, "
                + "\"durationKyr\": 20, \"outputEveryKyr\": 1";
        var json = TestServer.json(body + "}").post(PATH).then()
                .statusCode(200)
                .body("numerics.convergence.converged", equalTo(true))
                .body("numerics.convergence.largestChange", lessThan(0.01))
                .body("numerics.convergence.refinements", greaterThan(0))
                .body("numerics.convergence.coarse.timeToFirstCrustMeltKyr", notNullValue())
                .body("numerics.convergence.coarse.peakCrustMeltThicknessM", greaterThan(0.0))
                .extract().jsonPath();
        int k = json.getInt("numerics.convergence.refinements");
        double h = json.getDouble("numerics.gridSpacingM");
        double tol = json.getDouble("numerics.toleranceK");
        // the default 1/400 of the sill and 0.125 K, halved and quartered k times
        assertEquals(250.0 / 400 / (1 << k), h, 1e-12);
        assertEquals(0.125 / (1 << (2 * k)), tol, 1e-15);
        assertEquals(2 * h, json.getDouble("numerics.convergence.coarseGridSpacingM"),
                1e-12);
        assertEquals(4 * tol, json.getDouble("numerics.convergence.coarseToleranceK"),
                1e-15);
        double fine = json.getDouble("summary.timeToFirstCrustMeltKyr");
        double coarse = json.getDouble("numerics.convergence.coarse.timeToFirstCrustMeltKyr");
        assertEquals(Math.abs(fine - coarse) / Math.max(fine, coarse),
                json.getDouble("numerics.convergence.timeToFirstCrustMeltChange"), 1e-12);
        // a given spacing is used as it is and checked, not refined; its tolerance goes with it
        TestServer.json(body + ", \"gridSpacingM\": 1.25}").post(PATH).then()
                .statusCode(200)
                .body("numerics.gridSpacingM", closeTo(1.25, 1e-12))
                .body("numerics.toleranceK", closeTo(0.5, 1e-12))
                .body("numerics.convergence.refinements", equalTo(0))
                .body("numerics.convergence.coarseGridSpacingM", closeTo(2.5, 1e-12))
                .body("numerics.convergence.coarseToleranceK", closeTo(0.5, 1e-12))
                .body("numerics.convergence.converged", equalTo(false))
                .body("warnings", hasItem(containsString("not converged")));
    }

    @Test
    void aConvectingSillLocksUpAndReportsWhen() {
        TestServer.json(single(", \"convection\": true, \"lockMeltFraction\": 0.5", ""))
                .post(PATH).then()
                .statusCode(200)
                .body("summary.lockUpTimeKyr", greaterThan(0.0))
                .body("summary.lockUpTimeKyr", lessThan(0.01))
                .body("series[1].roofHeatFluxMWPerM2", greaterThan(0.0))
                .body("models.id", hasItem("convecting-sill-huppert-sparks1988"));
    }

    @Test
    void badConvectionFieldsAreRefusedNamingThem() {
        assertInvalidField(TestServer.json(single(", \"convection\": true, \"lockMeltFraction\": 0", "")).post(PATH),
                "intrusion.lockMeltFraction");
        assertInvalidField(TestServer.json(single(", \"convection\": true, \"lockMeltFraction\": 1", "")).post(PATH),
                "intrusion.lockMeltFraction");
        assertInvalidField(TestServer.json(single(", \"lockMeltFraction\": 0.5", "")).post(PATH),
                "intrusion.lockMeltFraction")
                .body("errors[0].message", containsString("convection"));
        assertInvalidField(TestServer.json(single("", ", \"gridSpacingM\": 10, \"largestCellM\": 5")).post(PATH),
                "largestCellM");
    }

    @Test
    void theCrustsOwnMeltTableIsUsedAndBadTablesAreRefusedNamingThePoint() {
        String good = "{" + table("0.1", 1.0) .replace("{\"temperatureC\": 910, \"meltFraction\": 0.1}, ", "")
                + ", \"intrusion\": {" + BASALT + ", \"thicknessM\": 50, \"topDepthKm\": 10}, \"columnDepthKm\": 20, "
                + "\"durationKyr\": 0.2, \"convergenceCheck\": false}";
        TestServer.json(good).post(PATH).then()
                .statusCode(200)
                .body("summary.peakCrustMeltThicknessM", greaterThan(0.0));
        // not monotonic in temperature in the second row: 910 °C then 900 °C
        String bad = "{" + table("0.1", 1.0) + ", \"intrusion\": {" + BASALT + ", \"thicknessM\": 50, "
                + "\"topDepthKm\": 10}, \"columnDepthKm\": 20, \"durationKyr\": 0.2}";
        assertInvalidField(TestServer.json(bad).post(PATH), "crust.meltTable[1].meltCurve[2].temperatureC");
        // a table up to 0.3 GPa does not cover a 20 km crust (0.54 GPa at its base)
        String shallow = "{" + table("0.1", 0.3).replace("{\"temperatureC\": 910, \"meltFraction\": 0.1}, ", "")
                + ", \"intrusion\": {" + BASALT + ", \"thicknessM\": 50, \"topDepthKm\": 10}, \"columnDepthKm\": 20, "
                + "\"durationKyr\": 0.2}";
        assertInvalidField(TestServer.json(shallow).post(PATH), "crust.meltTable")
                .body("errors[0].message", containsString("not covered"));
    }
}
