package org.tectomelt.http;

import static org.hamcrest.Matchers.closeTo;
import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.everyItem;
import static org.hamcrest.Matchers.greaterThan;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.hasSize;
import static org.hamcrest.Matchers.lessThan;
import static org.hamcrest.Matchers.notNullValue;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.tectomelt.http.Problem.assertInvalidField;
import static org.tectomelt.http.Problem.assertProblem;

import io.restassured.http.ContentType;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;
import org.tectomelt.engine.crust.ConductivityLaw;
import org.tectomelt.engine.crust.InitialState;
import org.tectomelt.engine.crust.MeltingIntervals;
import org.tectomelt.engine.crust.Rock;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.units.Units;

/** {@code POST /v1/crustal-heating/sill}. */
class CrustalHeatingSillContractTest {

    private static final String PATH = "/v1/crustal-heating/sill";

    /** An invented pelitic crust at 450 °C (melt curve approximating REFERENCES §3.4, for the demo). */
    static final String CRUST = "\"crust\": {\"initialTemperatureC\": 450, \"conductivityWPerMK\": 2.5, "
            + "\"densityKgPerM3\": 2750, \"heatCapacityJPerKgK\": 1050, \"latentHeatJPerKg\": 280000, "
            + "\"meltCurve\": [{\"temperatureC\": 750, \"meltFraction\": 0}, {\"temperatureC\": 800, \"meltFraction\": 0.05}, "
            + "{\"temperatureC\": 850, \"meltFraction\": 0.25}, {\"temperatureC\": 900, \"meltFraction\": 0.45}, "
            + "{\"temperatureC\": 1000, \"meltFraction\": 0.6}]}";
    /** Basalt crystallising over 1200 → 1000 °C (REFERENCES §3.4, common practice). */
    static final String BASALT = "\"temperatureC\": 1230, \"conductivityWPerMK\": 2.5, \"densityKgPerM3\": 2900, "
            + "\"heatCapacityJPerKgK\": 1100, \"latentHeatJPerKg\": 400000, "
            + "\"meltingInterval\": {\"solidusC\": 1000, \"liquidusC\": 1200}";

    private static String body(String intrusionExtra, String rest) {
        return "{" + CRUST + ", \"intrusion\": {" + BASALT + intrusionExtra + "}" + rest + "}";
    }

    @Test
    void aSingleSillReturnsTheSeriesTheSummaryAndTheBoundaryConditions() {
        TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10",
                        ", \"columnDepthKm\": 20, \"durationKyr\": 20, \"gridSpacingM\": 10, \"outputEveryKyr\": 1"))
                .post(PATH).then()
                .statusCode(200)
                .body("series", hasSize(21))
                .body("series[0].timeKyr", closeTo(0, 0))
                .body("series[0].intrusionMeltFraction", closeTo(1, 1e-12))
                .body("series[0].maxTemperatureC", closeTo(1230, 1e-9))
                .body("series[20].timeKyr", closeTo(20, 1e-9))
                .body("series.maxTemperatureC", everyItem(lessThan(1230.000001)))
                .body("summary.solidificationTimeKyr", greaterThan(0.5))
                .body("summary.solidificationTimeKyr", lessThan(20.0))
                .body("summary.energyErrorFraction", lessThan(1e-3))
                .body("summary.sillsEmplaced", equalTo(1))
                .body("summary.emplacedThicknessM", closeTo(250, 1e-9))
                .body("summary.intrusionTopDepthKm", closeTo(10, 1e-12))
                .body("boundaryConditions.surfaceTemperatureC", closeTo(450, 1e-9))
                .body("boundaryConditions.basalHeatFlowMWPerM2", closeTo(0, 0))
                .body("numerics.cells", equalTo(2025))
                .body("models.id", hasItem("enthalpy-method-voller1990"));
    }

    @Test
    void theIssuesExampleWithRepeatedSillsStacksThemAndMeltsTheCrust() {
        // the field layout of the issue's example, with explicit thermal properties (10 m cells instead
        // of 5 m to keep the suite quick)
        TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 28, \"repeat\": {\"count\": 10, "
                        + "\"intervalKyr\": 20}", ", \"columnDepthKm\": 40, \"durationKyr\": 500, \"gridSpacingM\": 10, "
                        + "\"outputEveryKyr\": 5"))
                .post(PATH).then()
                .statusCode(200)
                .body("series", hasSize(101))
                .body("summary.sillsEmplaced", equalTo(10))
                .body("summary.emplacedThicknessM", closeTo(2500, 1e-9))
                .body("summary.timeToFirstCrustMeltKyr", notNullValue())
                .body("summary.peakCrustMeltThicknessM", greaterThan(1.0))
                .body("summary.peakTimeKyr", greaterThan(0.0))
                .body("summary.energyErrorFraction", lessThan(1e-3))
                .body("numerics.cells", equalTo(4250))
                .body("models.id", hasItem("sill-stacking-annen-sparks2002"));
    }

    @Test
    void aRateInMillimetresPerYearSetsTheIntervalAndProfilesComeAtTheirTimes() {
        // 100 m sills at 2 mm/yr: one every 50 kyr, so 0, 50 and 100 kyr within 120 kyr
        TestServer.json(body(", \"thicknessM\": 100, \"topDepthKm\": 8, \"repeat\": {\"rateMmPerYr\": 2, "
                        + "\"stacking\": \"over\"}", ", \"columnDepthKm\": 16, \"durationKyr\": 120, "
                        + "\"gridSpacingM\": 10, \"profileTimesKyr\": [100, 0], \"profileSpacingM\": 100"))
                .post(PATH).then()
                .statusCode(200)
                .body("summary.sillsEmplaced", equalTo(3))
                .body("series", hasSize(101))
                .body("profiles", hasSize(2))
                .body("profiles[0].timeKyr", closeTo(0, 0))
                .body("profiles[1].timeKyr", closeTo(100, 1e-9))
                .body("profiles[0].points", hasSize(161))
                .body("profiles[1].points", hasSize(163))
                .body("profiles[1].points.rock", hasItem("intrusion"))
                .body("profiles[1].points[80].depthKm", closeTo(8.005, 1e-9))
                .body("profiles[1].points[80].temperatureC", closeTo(1230, 1e-9));
    }

    @Test
    void aContinentalGeothermIsTheInitialStateWithItsHeatFlowHeldAtTheBase() {
        // q0 = 60 mW/m², qm = 0.6 q0, hr = 10 km, k = 2.5: the flow at 40 km is
        // 36 + 24·exp(−4) = 36.44 mW/m² (Turcotte & Schubert 2014 ch. 4, closed form)
        String crust = CRUST.replace("\"initialTemperatureC\": 450, ", "");
        TestServer.json("{" + crust + ", \"intrusion\": {" + BASALT + ", \"thicknessM\": 200, \"topDepthKm\": 30}, "
                        + "\"geotherm\": {\"surfaceHeatFlowMWPerM2\": 60}, \"columnDepthKm\": 40, \"durationKyr\": 10, "
                        + "\"gridSpacingM\": 10, \"profileTimesKyr\": [0], \"profileSpacingM\": 1000}")
                .post(PATH).then()
                .statusCode(200)
                .body("boundaryConditions.surfaceTemperatureC", closeTo(0, 1e-9))
                .body("boundaryConditions.basalHeatFlowMWPerM2", closeTo(36 + 24 * Math.exp(-4), 1e-9))
                // T(10 km) = 0.036·10⁴/2.5 + 2.4e-6·10⁸/2.5·(1 − e⁻¹) = 144 + 60.68 °C
                .body("profiles[0].points[10].depthKm", closeTo(10.005, 1e-9))
                .body("profiles[0].points[10].temperatureC", closeTo(144 * 10.005 / 10 + 96 * (1 - Math.exp(-1.0005)), 0.05))
                .body("models.id", hasItem("continental-steady-conductive"))
                .body("summary.energyErrorFraction", lessThan(1e-3));
    }

    @Test
    void underplatedSillsAtTheMohoHeatAMantleThatDoesNotMeltButIsFlagged() {
        // a thin (invented) 10 km crust on a 60 mW/m² geotherm, six 500 m sills at 1350 °C at the Moho:
        // the mantle right under the newest sill passes the dry solidus at the Moho (1121 °C at
        // 0.27 GPa, Katz et al. 2003)
        String crust = CRUST.replace("\"initialTemperatureC\": 450, ", "\"thicknessKm\": 10, ");
        TestServer.json("{" + crust + ", \"intrusion\": {" + BASALT.replace("1230", "1350") + ", \"thicknessM\": 500, "
                        + "\"topDepthKm\": 10, \"repeat\": {\"count\": 6, \"intervalKyr\": 5}}, "
                        + "\"geotherm\": {\"surfaceHeatFlowMWPerM2\": 60}, \"mantle\": {\"densityKgPerM3\": 3300}, "
                        + "\"columnDepthKm\": 25, \"durationKyr\": 30, \"gridSpacingM\": 20, \"profileTimesKyr\": [30], "
                        + "\"profileSpacingM\": 1000}")
                .post(PATH).then()
                .statusCode(200)
                .body("summary.maxMantleTemperatureC", greaterThan(1121.0))
                .body("profiles[0].points[9].rock", equalTo("crust"))
                .body("profiles[0].points[10].rock", equalTo("intrusion"))
                .body("profiles[0].points[12].rock", equalTo("intrusion"))
                .body("profiles[0].points[13].rock", equalTo("mantle"))
                .body("profiles[0].points[13].meltFraction", closeTo(0, 0))
                .body("warnings", hasItem(containsString("dry peridotite solidus")))
                .body("models.id", hasItem("peridotite-katz2003"))
                .body("summary.energyErrorFraction", lessThan(1e-3));
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10",
                ", \"durationKyr\": 10, \"mantle\": {}")).post(PATH), "mantle");
        String deep = CRUST.replace("\"initialTemperatureC\": 450, ", "\"initialTemperatureC\": 450, \"thicknessKm\": 70, ");
        assertInvalidField(TestServer.json("{" + deep + ", \"intrusion\": {" + BASALT + ", \"thicknessM\": 250, "
                + "\"topDepthKm\": 10}, \"durationKyr\": 10}").post(PATH), "crust.thicknessKm");
    }

    @Test
    void namedLithologiesNeedNoPropertiesAndAreCited() {
        // the issue's example in spirit: a metapelite crust and a basalt intrusion with the catalogue's
        // default properties and curves
        TestServer.json("{\"crust\": {\"lithology\": \"metapelite\", \"initialTemperatureC\": 450}, "
                        + "\"intrusion\": {\"lithology\": \"basalt\", \"temperatureC\": 1230, \"thicknessM\": 250, "
                        + "\"topDepthKm\": 28, \"meltingInterval\": {\"solidusC\": 1000, \"liquidusC\": 1200}, "
                        + "\"repeat\": {\"count\": 3, \"intervalKyr\": 20}}, \"columnDepthKm\": 35, "
                        + "\"durationKyr\": 60, \"gridSpacingM\": 10, \"outputEveryKyr\": 5}")
                .post(PATH).then()
                .statusCode(200)
                .body("summary.sillsEmplaced", equalTo(3))
                .body("summary.peakCrustMeltThicknessM", greaterThan(0.0))
                .body("models.id", hasItem("metapelite"))
                .body("models.id", hasItem("basalt"))
                .body("warnings", hasItem(containsString("crust (metapelite): default melt curve is approximate")));
    }

    @Test
    void aUniformTemperatureAndAGeothermTogetherAreRefused() {
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10",
                ", \"durationKyr\": 10, \"geotherm\": {\"surfaceHeatFlowMWPerM2\": 60}")).post(PATH),
                "crust.initialTemperatureC");
        String crust = CRUST.replace("\"initialTemperatureC\": 450, ", "");
        assertInvalidField(TestServer.json("{" + crust + ", \"intrusion\": {" + BASALT + ", \"thicknessM\": 200, "
                + "\"topDepthKm\": 30}, \"geotherm\": {\"surfaceHeatFlowMWPerM2\": 5}, \"durationKyr\": 10}").post(PATH),
                "geotherm.surfaceHeatFlowMWPerM2");
        assertInvalidField(TestServer.json("{" + crust + ", \"intrusion\": {" + BASALT + ", \"thicknessM\": 200, "
                + "\"topDepthKm\": 30}, \"durationKyr\": 10}").post(PATH), "crust.initialTemperatureC");
    }

    @Test
    void temperatureDependentConductivityIsCitedAndItsExtrapolationFlagged() {
        String crust = CRUST.replace("\"conductivityWPerMK\": 2.5", "\"conductivityLaw\": \"miao2014-granite\"");
        TestServer.json("{" + crust + ", \"intrusion\": {" + BASALT.replace("\"conductivityWPerMK\": 2.5",
                        "\"conductivityLaw\": \"miao2014-gabbro\"") + ", \"thicknessM\": 100, \"topDepthKm\": 5}, "
                        + "\"columnDepthKm\": 10, \"durationKyr\": 5}")
                .post(PATH).then()
                .statusCode(200)
                .body("models.id", hasItem("conductivity-miao2014"))
                .body("warnings", hasItem(containsString("extrapolated")))
                .body("summary.energyErrorFraction", lessThan(1e-3));
    }

    @Test
    void missingAndOutOfRangeFieldsAreNamed() {
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10", "")).post(PATH),
                "durationKyr");
        assertInvalidField(TestServer.json("{\"intrusion\": {}, \"durationKyr\": 10}").post(PATH), "crust");
        assertInvalidField(TestServer.json(body(", \"topDepthKm\": 10", ", \"durationKyr\": 10")).post(PATH),
                "intrusion.thicknessM");
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10, \"conductivityLaw\": "
                + "\"copper\"", ", \"durationKyr\": 10")).post(PATH), "intrusion.conductivityLaw");
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10, \"conductivityLaw\": "
                + "\"miao2014-gabbro\"", ", \"durationKyr\": 10")).post(PATH), "intrusion.conductivityWPerMK");
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 59.9", ", \"durationKyr\": 10"))
                .post(PATH), "columnDepthKm");
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10, \"repeat\": {\"count\": 3, "
                + "\"intervalKyr\": 5, \"rateMmPerYr\": 2}", ", \"durationKyr\": 10")).post(PATH),
                "intrusion.repeat.intervalKyr");
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10", ", \"durationKyr\": 10, "
                + "\"profileTimesKyr\": [11]")).post(PATH), "profileTimesKyr[0]");
        String noCurve = CRUST.substring(0, CRUST.indexOf(", \"meltCurve\"")) + "}";
        assertInvalidField(TestServer.json("{" + noCurve + ", \"intrusion\": {" + BASALT + ", \"thicknessM\": 250, "
                + "\"topDepthKm\": 10}, \"durationKyr\": 10}").post(PATH), "crust.meltCurve");
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10, \"lithology\": \"komatiite\"",
                ", \"durationKyr\": 10")).post(PATH), "intrusion.lithology");
    }

    @Test
    void theIssuesPerformanceCaseFitsTheDefaultCaps() {
        // 2 Myr, 20 stacked 500 m sills, a 60 km column at 10 m cells, output every 10 kyr (run in
        // SillModelBenchmark: about 2.7e7 cell-steps); here only what is checked before running
        double kyr = Units.SECONDS_PER_KYR;
        double c0 = Units.ZERO_CELSIUS_K;
        Rock rock = new Rock(2900, 1100, 3e5, ConductivityLaw.constant(2.3), MeltingIntervals.linear(c0 + 850, c0 + 1050));
        SillModel.Setup s = new SillModel.Setup(rock, rock, new InitialState.Uniform(c0 + 500),
                new SillModel.Intrusions(500, 30e3, c0 + 1230, 20, 100 * kyr, SillModel.Stacking.UNDER), 60e3, 10,
                2000 * kyr, 10 * kyr, List.of(), 10, SillModel.Numerics.DEFAULT);
        assertEquals(7000, s.finalCells());
        assertTrue(s.finalCells() <= org.tectomelt.operations.SillModelOperation.MAX_CELLS);
        assertTrue(s.minimumCellSteps() < Config.DEFAULT_MAX_SILL_CELL_STEPS / 3.0, "bound " + s.minimumCellSteps());
        assertTrue(2000 / 10 + 1 <= Config.DEFAULT_MAX_PROFILE_POINTS);
        assertTrue(2.0 <= Config.DEFAULT_MAX_SILL_DURATION_MYR);
    }

    @Test
    void runawayRequestsAreRefusedNamingTheFieldToChange() {
        // grid cells: 60 km at 1 m would be 60,000 cells
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10",
                ", \"durationKyr\": 10, \"gridSpacingM\": 1")).post(PATH), "gridSpacingM")
                .body("errors[0].message", containsString("20000"));
        // a sill must span at least two cells
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 15, \"topDepthKm\": 10",
                ", \"durationKyr\": 10, \"gridSpacingM\": 10")).post(PATH), "gridSpacingM");
        // duration, beyond the server cap of 20 Myr
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10",
                ", \"durationKyr\": 30000")).post(PATH), "durationKyr")
                .body("errors[0].message", containsString("TECTOMELT_MAX_SILL_DURATION_MYR"));
        // series length, beyond the profile-points cap
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10",
                ", \"durationKyr\": 1000, \"outputEveryKyr\": 0.1")).post(PATH), "outputEveryKyr")
                .body("errors[0].message", containsString("TECTOMELT_MAX_PROFILE_POINTS"));
        // profile length
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 250, \"topDepthKm\": 10",
                ", \"durationKyr\": 10, \"profileTimesKyr\": [5], \"profileSpacingM\": 10")).post(PATH),
                "profileSpacingM");
        // time steps × cells: 1000 sills into a 150 km column need at least ~2.6e8 cell-steps
        assertInvalidField(TestServer.json(body(", \"thicknessM\": 20, \"topDepthKm\": 10, \"repeat\": "
                + "{\"count\": 1000, \"intervalKyr\": 10}", ", \"columnDepthKm\": 150, \"durationKyr\": 10000"))
                .post(PATH), "durationKyr")
                .body("errors[0].message", containsString("TECTOMELT_MAX_SILL_CELL_STEPS"));
    }

    @Test
    void wrongMediaTypeAndOversizedBodiesAreRefused() {
        assertProblem(TestServer.given().contentType(ContentType.TEXT).body("{}").post(PATH), 415,
                "unsupported-media-type");
        StringBuilder big = new StringBuilder("{\"profileTimesKyr\": [");
        while (big.length() < Config.defaults().maxBodyBytes() + 10) {
            big.append("1.0,");
        }
        big.append("1.0]}");
        assertProblem(TestServer.json(big.toString()).post(PATH), 413, "body-too-large");
    }
}
