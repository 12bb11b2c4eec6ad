package org.tectomelt.contract;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.operations.Cap;
import org.tectomelt.operations.Violation;

/** The packaged spec's request rules, as {@link SpecContract} enforces them (no HTTP). */
class SpecContractTest {

    private static final SpecContract SPEC = SpecContract.standard();
    private static final String RIDGE = "/v1/settings/mid-ocean-ridge";
    private static final String MELT = "/v1/melt-fraction";

    private static ObjectNode body(String json) {
        return (ObjectNode) Json.readTree(json.getBytes(java.nio.charset.StandardCharsets.UTF_8));
    }

    @Test
    void aConformingBodyGetsTheSpecsDefaults() {
        ObjectNode b = body("{\"potentialTemperatureC\": 1350, \"fullSpreadingRateMmPerYr\": 40}");
        assertEquals(List.of(), SPEC.check(RIDGE, b, List.of()));
        assertEquals("peridotite-katz2003", b.path("lithology").asText());
        assertEquals(0.0, b.path("bulkWaterWtPct").asDouble());
    }

    @Test
    void everyBrokenRuleIsReportedAtOnceInTheApiFieldForm() {
        List<Violation> v = SPEC.check(RIDGE, body("{\"potentialTemperatureC\": 1800, \"fullSpreadingRateMmPerYr\": \"x\","
                + " \"potentialTemperature\": 1}"), List.of());
        assertEquals(3, v.size(), v.toString());
        assertTrue(v.contains(new Violation("potentialTemperatureC", "must be between 1000 and 1700, got 1800")), v.toString());
        assertTrue(v.contains(new Violation("fullSpreadingRateMmPerYr", "has the wrong JSON type; expected a number")),
                v.toString());
        assertTrue(v.stream().anyMatch(x -> x.field().equals("potentialTemperature")
                && x.message().startsWith("is not a known field here; known fields: [bulkWaterWtPct,")), v.toString());
    }

    @Test
    void aMissingRequiredFieldIsNamedWithItsRange() {
        List<Violation> v = SPEC.check(RIDGE, body("{\"fullSpreadingRateMmPerYr\": 40}"), List.of());
        assertEquals(List.of(new Violation("potentialTemperatureC", "is required (allowed range 1000 and 1700)")), v);
    }

    @Test
    void nestedAndIndexedFieldsArePathsLikePoints3Temperature() {
        List<Violation> v = SPEC.check(MELT, body("{\"lithology\": \"peridotite-katz2003\", \"points\": ["
                + "{\"pressureGPa\": 1, \"temperatureC\": 1300}, {\"pressureGPa\": 1, \"temperatureC\": 4000},"
                + " {\"pressureGPa\": 1}]}"), List.of());
        assertTrue(v.contains(new Violation("points[1].temperatureC", "must be between -50 and 3000, got 4000")),
                v.toString());
        assertTrue(v.stream().anyMatch(x -> x.field().equals("points[2].temperatureC")
                && x.message().startsWith("is required")), v.toString());
    }

    @Test
    void aNullMemberCountsAsAbsent() {
        ObjectNode b = body("{\"potentialTemperatureC\": 1350, \"fullSpreadingRateMmPerYr\": 40, \"bulkWaterWtPct\": null}");
        assertEquals(List.of(), SPEC.check(RIDGE, b, List.of()));
        assertEquals(0.0, b.path("bulkWaterWtPct").asDouble(), "the default replaces the null");
    }

    @Test
    void aServerCapReplacesTheDocumentedMaxItemsAndNamesItsVariable() {
        StringBuilder points = new StringBuilder();
        for (int i = 0; i < 12; i++) {
            points.append(i == 0 ? "" : ",").append("{\"pressureGPa\": 1, \"temperatureC\": 1300}");
        }
        String json = "{\"lithology\": \"peridotite-katz2003\", \"points\": [" + points + "]}";
        List<Violation> v = SPEC.check(MELT, body(json), List.of(new Cap("points", 10, "TECTOMELT_MAX_BATCH_POINTS")));
        assertEquals(List.of(new Violation("points",
                "must have between 1 and 10 entries (server cap TECTOMELT_MAX_BATCH_POINTS), got 12")), v);
        assertEquals(List.of(), SPEC.check(MELT, body(json), List.of(new Cap("points", 20_000, "X"))));
    }

    @Test
    void rangesComeFromTheSpec() {
        SpecContract.Range r = SPEC.range(RIDGE, "potentialTemperatureC").orElseThrow();
        assertEquals(1000.0, r.minimum());
        assertEquals(1700.0, r.maximum());
        SpecContract.Range t = SPEC.range(MELT, "points.temperatureC").orElseThrow();
        assertEquals(-50.0, t.minimum());
        assertEquals(3000.0, t.maximum());
    }
}
