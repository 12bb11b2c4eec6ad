package org.tectomelt.contract;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.DeferredList;
import org.tectomelt.operations.MidOceanRidgeOperation;
import org.tectomelt.operations.OperationException;

/** Running an operation by name from a JSON tree, as the runs and the studies do: no HTTP. */
class InvokerTest {

    private static final Invoker INVOKER = Invoker.standard();

    @Test
    void anOperationRunsByNameFromAJsonTree() {
        Record r = ridge(40);
        MidOceanRidgeOperation.Result ridge = (MidOceanRidgeOperation.Result) r;
        assertEquals("peridotite-katz2003", ridge.lithology(), "the spec's default lithology");
        Map<String, Double> out = INVOKER.outputs("mid-ocean-ridge", r, List.of("crustalThicknessKm",
                "column.onset.depthKm"));
        assertEquals(ridge.crustalThicknessKm(), out.get("crustalThicknessKm"));
        assertNotNull(out.get("column.onset.depthKm"));
        // common practice: a 1350 °C ambient mantle makes a normal, several-km oceanic crust
        assertTrue(ridge.crustalThicknessKm() > 3 && ridge.crustalThicknessKm() < 12, "crust " + ridge.crustalThicknessKm());
    }

    @Test
    void theSpecsRulesAndTheOperationsAreEnforcedOnTheSamePath() {
        OperationException spec = assertThrows(OperationException.class, () -> INVOKER.run("mid-ocean-ridge",
                Json.readTree("{\"potentialTemperatureC\": 900, \"fullSpreadingRateMmPerYr\": 40}"
                        .getBytes(StandardCharsets.UTF_8)), Deadline.none()));
        assertEquals("potentialTemperatureC", spec.violations().get(0).field());
        OperationException rule = assertThrows(OperationException.class, () -> INVOKER.run("melt-fraction",
                Json.readTree(("{\"lithology\": \"peridotite-mckenzie-bickle1988\", \"pressureGPa\": 1,"
                        + " \"temperatureC\": 1300, \"bulkWaterWtPct\": 0.1}").getBytes(StandardCharsets.UTF_8)),
                Deadline.none()));
        assertEquals("bulkWaterWtPct", rule.violations().get(0).field());
    }

    @Test
    void readingOutputsBuildsNeitherTheProfileRowsNorTheTextWhichAnAnswerStillCarriesInFull() {
        Record r = ridge(12);
        MidOceanRidgeOperation.Result ridge = (MidOceanRidgeOperation.Result) r;
        INVOKER.outputs("mid-ocean-ridge", r, List.of("crustalThicknessKm", "column.meanMeltFraction"));
        assertFalse(((DeferredList<?>) ridge.column().profile()).isBuilt(), "a run's point converts no profile row");
        assertFalse(((DeferredList<?>) ridge.assumptions()).isBuilt(), "nor writes the assumptions");
        com.fasterxml.jackson.databind.JsonNode answer = Json.mapper().valueToTree(r);
        // one row per km from the onset up to the lid (MidOceanRidge.PROFILE_STEP), the ridge's text last
        assertEquals(ridge.column().profile().size(), answer.at("/column/profile").size());
        assertTrue(answer.at("/column/profile").size() > 30, answer.at("/column/profile").toString());
        assertEquals(ridge.column().onset().depthKm(), answer.at("/column/profile/0/depthKm").asDouble());
        assertEquals(ridge.assumptions().size(), answer.at("/assumptions").size());
        assertTrue(answer.at("/assumptions/" + (ridge.assumptions().size() - 1)).asText()
                .startsWith("ridge: passive triangular melting region; slow spreading"), answer.at("/assumptions").toString());
    }

    @Test
    void anUnknownOutputNameListsTheKnownOnes() {
        Record r = ridge(40);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> INVOKER.outputs("mid-ocean-ridge", r, List.of("crustThickness")));
        assertTrue(e.getMessage().contains("crustalThicknessKm"), e.getMessage());
    }

    /** The ridge at Tp 1350 °C and the given full spreading rate, run by name from a JSON tree. */
    private static Record ridge(int fullSpreadingRateMmPerYr) {
        return INVOKER.run("mid-ocean-ridge", Json.readTree(("{\"potentialTemperatureC\": 1350, "
                + "\"fullSpreadingRateMmPerYr\": " + fullSpreadingRateMmPerYr + "}").getBytes(StandardCharsets.UTF_8)),
                Deadline.none());
    }
}
