package org.tectomelt.runs.study;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.io.InputStream;
import java.util.List;
import java.util.Map;
import java.util.stream.Collectors;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.Json;
import org.tectomelt.contract.SpecContract;
import org.tectomelt.operations.OperationException;
import org.tectomelt.operations.Operations;
import org.tectomelt.operations.Violation;
import org.tectomelt.runs.sweep.Sweep;
import org.tectomelt.studies.PosteriorInversion;
import org.tectomelt.studies.SamplingInversion;

/**
 * The body of {@code POST /v1/runs} is held to the spec's {@code RunRequest} schema: its limits and
 * defaults are read from {@code api-spec/openapi.yaml}, not written in Java. A copy of the spec with
 * other limits and defaults changes what {@link Sweep#parse} accepts and fills in, with no Java edit.
 */
class RunBodyFollowsTheSpecTest {

    private static final String RUN = """
            {"operation": "mid-ocean-ridge", "request": {"fullSpreadingRateMmPerYr": 40},
             "label": "Quillon Rise, Tp", "sweep": {"potentialTemperatureC": {"from": 1300, "to": 1400, "steps": 3}},
             "uncertainty": {"samples": 400, "inputs": {"bulkWaterWtPct": {"uniform": {"min": 0, "max": 0.02}}}}}""";

    private static ObjectNode spec() throws Exception {
        try (InputStream in = SpecContract.class.getResourceAsStream(SpecContract.SPEC_RESOURCE)) {
            return (ObjectNode) new ObjectMapper(new YAMLFactory()).readTree(in);
        }
    }

    private static Invoker on(ObjectNode spec) throws Exception {
        return new Invoker(SpecContract.fromYaml(new ObjectMapper(new YAMLFactory()).writeValueAsBytes(spec)),
                Operations.of(Config.defaults()));
    }

    private static ObjectNode body(String json) throws Exception {
        return (ObjectNode) Json.mapper().readTree(json);
    }

    private static Map<String, String> problems(Invoker invoker, String json) throws Exception {
        ObjectNode b = body(json);
        OperationException e = assertThrows(OperationException.class, () -> Sweep.parse(b, invoker, 50_000));
        return e.violations().stream().collect(Collectors.toMap(Violation::field, Violation::message, (a, x) -> a));
    }

    @Test
    void theStandardSpecAcceptsTheRunAndFillsItsDefaults() throws Exception {
        Sweep s = Sweep.parse(body(RUN), Invoker.standard(), 50_000);
        assertEquals(3, s.size());
        assertTrue(s.blocks() >= 2, "400 samples are stored in blocks: " + s.blocks());
        assertEquals(400, s.study().path("uncertainty").path("samples").asInt());
        ObjectNode inversion = body("""
                {"operation": "mid-ocean-ridge", "request": {"fullSpreadingRateMmPerYr": 40},
                 "solve": {"field": "potentialTemperatureC", "min": 1250, "max": 1450},
                 "observed": {"crustalThicknessKm": {"value": 7, "sd": 0.8}}}""");
        JsonNode solve = Sweep.parse(inversion, Invoker.standard(), 50_000).study().path("solve");
        JsonNode spec = spec().at("/components/schemas/Solve/properties");
        assertEquals(spec.at("/method/default").asText(), solve.path("method").asText());
        assertEquals(spec.at("/gridPoints/default").asInt(), solve.path("gridPoints").asInt());
        assertEquals(spec.at("/scanPoints/default").asInt(), solve.path("scanPoints").asInt());
    }

    @Test
    void aCopyOfTheSpecWithOtherLimitsChangesWhatARunMayAsk() throws Exception {
        ObjectNode copy = spec();
        ((ObjectNode) copy.at("/components/schemas/RunRequest/properties/label")).put("maxLength", 8);
        ((ObjectNode) copy.at("/components/schemas/Uncertainty/properties/samples")).put("maximum", 300);
        ((ObjectNode) copy.at("/components/schemas/SweepAxis/properties/steps")).put("minimum", 4);
        Map<String, String> p = problems(on(copy), RUN);
        assertEquals(List.of("label", "sweep.potentialTemperatureC.steps", "uncertainty.samples"),
                p.keySet().stream().sorted().toList(), p.toString());
        assertTrue(p.get("uncertainty.samples").contains("between 1 and 300, got 400"), p.toString());
        assertTrue(p.get("sweep.potentialTemperatureC.steps").contains("between 4 and"), p.toString());
        // and the standard spec takes the same body
        Sweep.parse(body(RUN), Invoker.standard(), 50_000);
    }

    @Test
    void aCopyOfTheSpecWithOtherDefaultsChangesWhatARunUses() throws Exception {
        ObjectNode copy = spec();
        ((ObjectNode) copy.at("/components/schemas/Uncertainty/properties/samples")).put("default", 37);
        ((ObjectNode) copy.at("/components/schemas/Solve/properties/method")).put("default", "sampling");
        Sweep s = Sweep.parse(body(RUN.replace("\"samples\": 400, ", "")), on(copy), 50_000);
        assertEquals(37, s.study().path("uncertainty").path("samples").asInt());
        ObjectNode inversion = body("""
                {"operation": "mid-ocean-ridge", "request": {"fullSpreadingRateMmPerYr": 40},
                 "solve": {"field": "potentialTemperatureC", "min": 1250, "max": 1450},
                 "observed": {"crustalThicknessKm": {"value": 7, "sd": 0.8}}}""");
        Sweep inv = Sweep.parse(inversion, on(copy), 50_000);
        assertEquals("sampling", inv.study().path("solve").path("method").asText());
        assertEquals(37, inv.study().path("uncertainty").path("samples").asInt(),
                "an inversion without uncertain inputs draws the spec's default number of samples");
    }

    @Test
    void theSpecAsksAtLeastWhatTheInversionMethodsNeed() throws Exception {
        // the methods' own preconditions (a posterior's mean and spread need three grid points; a scan
        // for a sign change needs two points): the spec may be stricter, never looser
        JsonNode solve = spec().at("/components/schemas/Solve/properties");
        assertTrue(solve.at("/gridPoints/minimum").asInt() >= PosteriorInversion.MIN_GRID_POINTS);
        assertTrue(solve.at("/scanPoints/minimum").asInt() >= SamplingInversion.MIN_SCAN_POINTS);
    }
}
