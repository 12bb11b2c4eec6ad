package org.tectomelt.runs.study;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.Json;
import org.tectomelt.engine.Deadline;
import org.tectomelt.operations.Operation;
import org.tectomelt.operations.OperationException;
import org.tectomelt.operations.Violation;
import org.tectomelt.runs.sweep.Sweep;
import org.tectomelt.studies.MonteCarlo;
import org.tectomelt.studies.Workers;

/**
 * The study parts of a run on the mid-ocean-ridge operation, through the operations' invocation
 * path (no HTTP): checked against the spec's ranges, computed in blocks that assemble to the
 * study computed in one go. The invented scenario: the "Varden Rise", 60 mm/yr.
 */
class StudyRunTest {

    private static final Invoker INVOKER = Invoker.standard();
    private static final Operation<?, ?> RIDGE = INVOKER.operation("mid-ocean-ridge");

    private static ObjectNode json(String s) {
        try {
            return (ObjectNode) Json.mapper().readTree(s);
        } catch (Exception e) {
            throw new IllegalArgumentException(e);
        }
    }

    private static List<String> fields(OperationException e) {
        return e.violations().stream().map(Violation::field).toList();
    }

    private static StudyRequest parse(String body) {
        return StudyRequest.parse(json(body), RIDGE, INVOKER);
    }

    /** The study parts read as a run body is: the spec's rules first, then the study's own. */
    private static void parseRun(String parts) {
        ObjectNode body = json(parts);
        body.put("operation", RIDGE.name());
        Sweep.parse(body, INVOKER, 50_000);
    }

    private static ObjectNode assembleShuffled(StudyRun run, ObjectNode request) {
        List<String> blocks = new ArrayList<>();
        for (int b = 0; b < run.blocks(); b++) {
            blocks.add(run.evaluate(request, b, Deadline.none()));
        }
        Collections.reverse(blocks);
        return run.assemble(blocks);
    }

    @Test
    void aForwardStudyInBlocksEqualsTheStudyInOneGo() {
        // melt fraction is cheap: 600 samples in three blocks, against the same study in one go
        Operation<?, ?> melt = INVOKER.operation("melt-fraction");
        StudyRequest s = StudyRequest.parse(json("{\"uncertainty\": {\"samples\": 600, \"seed\": 42, \"inputs\": {"
                + "\"temperatureC\": {\"normal\": {\"mean\": 1300, \"sd\": 10}}}}}"), melt, INVOKER);
        StudyRun run = new StudyRun(INVOKER, melt, s, List.of("meltFraction", "solidusC"));
        assertEquals(StudyRun.Kind.FORWARD, run.kind());
        assertEquals(3, run.blocks(), "600 samples in blocks of 250");
        ObjectNode request = json("{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 1,"
                + " \"temperatureC\": 1300}");
        ObjectNode assembled = assembleShuffled(run, request);
        MonteCarlo.Result direct = MonteCarlo.run(new OperationModel(INVOKER, melt, request,
                        List.of("meltFraction", "solidusC")), s.inputs(),
                Map.of("meltFraction", "1", "solidusC", "°C"), 600, 42, Workers.serial(), Deadline.none());
        JsonNode summary = assembled.get("summaries").get("meltFraction");
        assertEquals(direct.summaries().get("meltFraction").mean(), summary.get("mean").doubleValue(), 0.0,
                "bit-identical mean");
        assertEquals(direct.summaries().get("meltFraction").p97_5(), summary.get("p97_5").doubleValue(), 0.0);
        assertEquals(600, summary.get("n").asInt());
        assertEquals(21, summary.get("histogram").get("edges").size());
        assertEquals("forward", assembled.get("study").asText());
        assertEquals(42, assembled.get("seed").asLong());
        // REFERENCES §2.1 [calc]: F(1 GPa, 1300 °C) = 0.1293, the median of F(T) for T's median 1300 °C
        assertEquals(0.1293, summary.get("p50").doubleValue(), 0.005);
        // the solidus at 1 GPa does not depend on T: 1213.5 °C (REFERENCES §2.1 [calc]) with zero spread
        assertEquals(1213.5, assembled.get("summaries").get("solidusC").get("mean").doubleValue(), 0.05);
        assertEquals(0.0, assembled.get("summaries").get("solidusC").get("sd").doubleValue(), 1e-9);
    }

    @Test
    void aRidgeStudyReportsTheCrustWithItsUnit() {
        StudyRequest s = parse("{\"uncertainty\": {\"samples\": 30, \"seed\": 42, \"inputs\": {"
                + "\"potentialTemperatureC\": {\"normal\": {\"mean\": 1350, \"sd\": 25}},"
                + "\"bulkWaterWtPct\": {\"uniform\": {\"min\": 0, \"max\": 0.02}}}}}");
        StudyRun run = new StudyRun(INVOKER, RIDGE, s, List.of("crustalThicknessKm"));
        ObjectNode r = assembleShuffled(run, json("{\"potentialTemperatureC\": 1350, \"fullSpreadingRateMmPerYr\": 60}"));
        JsonNode summary = r.get("summaries").get("crustalThicknessKm");
        assertEquals("km", summary.get("unit").asText());
        assertEquals(30, summary.get("n").asInt());
        // the crust of a 1350 ± 25 °C mantle: about 7 to 12 km (REFERENCES §2.5: ∫F dz = 8.85 km at 1350 °C)
        assertTrue(summary.get("p50").doubleValue() > 7 && summary.get("p50").doubleValue() < 12, summary.toString());
    }

    @Test
    void aPosteriorAndASamplingInversionAssembleFromTheirBlocks() {
        StudyRequest p = parse("{\"solve\": {\"field\": \"potentialTemperatureC\", \"min\": 1250, \"max\": 1450,"
                + " \"gridPoints\": 11}, \"observed\": {\"crustalThicknessKm\": {\"value\": 9, \"sd\": 0.8}}}");
        StudyRun post = new StudyRun(INVOKER, RIDGE, p, List.of());
        assertEquals(StudyRun.Kind.POSTERIOR, post.kind());
        assertEquals(11, post.blocks());
        ObjectNode request = json("{\"fullSpreadingRateMmPerYr\": 60}");
        ObjectNode r = assembleShuffled(post, request);
        assertEquals(11, r.get("density").size());
        double mean = r.get("estimate").get("mean").doubleValue();
        assertTrue(mean > 1250 && mean < 1450, r.toString());

        StudyRequest s = parse("{\"uncertainty\": {\"samples\": 12, \"seed\": 3}, \"solve\": {\"field\": "
                + "\"potentialTemperatureC\", \"min\": 1250, \"max\": 1450, \"method\": \"sampling\"},"
                + " \"observed\": {\"crustalThicknessKm\": {\"value\": 9, \"sd\": 0.8}}}");
        StudyRun sampling = new StudyRun(INVOKER, RIDGE, s, List.of());
        ObjectNode sr = assembleShuffled(sampling, request);
        assertEquals("sampling", sr.get("study").asText());
        assertEquals(12, sr.get("samples").asInt());
        assertEquals(sr.get("solved").asInt(), sr.get("summary").get("n").asInt());
        assertEquals("°C", sr.get("summary").get("unit").asText());
        assertTrue(Math.abs(sr.get("summary").get("mean").doubleValue() - mean) < 15,
                "both methods agree on the Tp of 9 ± 0.8 km: " + sr.get("summary") + " vs " + mean);
    }

    @Test
    void aSeedIsDrawnAndStoredWhenTheRequestGivesNone() {
        StudyRequest s = parse("{\"uncertainty\": {\"inputs\": {\"potentialTemperatureC\": {\"normal\":"
                + " {\"mean\": 1350, \"sd\": 25}}}}}");
        assertEquals(INVOKER.spec().range(Sweep.SPEC_PATH, "uncertainty.samples").orElseThrow().defaultValue().asInt(),
                s.samples(), "the spec's default number of samples");
        assertEquals(s.seed(), s.definition().get("uncertainty").get("seed").asLong());
        StudyRequest again = StudyRequest.parse(s.definition(), RIDGE, INVOKER);
        assertEquals(s.seed(), again.seed(), "the stored definition reads back with its seed");
        assertNotEquals(s.seed(), parse("{\"uncertainty\": {\"inputs\": {\"potentialTemperatureC\": {\"normal\":"
                + " {\"mean\": 1350, \"sd\": 25}}}}}").seed());
    }

    @Test
    void everyProblemIsReportedNamingItsField() {
        OperationException e = assertThrows(OperationException.class, () -> parseRun("{\"uncertainty\": {"
                + "\"samples\": 0, \"inputs\": {"
                + "\"potentialTemperatureC\": {\"normal\": {\"mean\": 1650, \"sd\": 25}},"
                + "\"bulkWaterWtPct\": {\"gamma\": {\"k\": 2}},"
                + "\"lithology\": {\"uniform\": {\"min\": 0, \"max\": 1}},"
                + "\"fullSpreadingRateMmPerYr\": {\"triangular\": {\"min\": 10, \"mode\": 5, \"max\": 60}}}}}"));
        List<String> f = fields(e);
        assertTrue(f.containsAll(List.of("uncertainty.samples", "uncertainty.inputs.potentialTemperatureC",
                "uncertainty.inputs.bulkWaterWtPct.gamma", "uncertainty.inputs.lithology",
                "uncertainty.inputs.fullSpreadingRateMmPerYr.triangular.mode")), f.toString());
        String tp = e.violations().stream().filter(v -> v.field().equals("uncertainty.inputs.potentialTemperatureC"))
                .findFirst().orElseThrow().message();
        assertTrue(tp.contains("[1000, 1700]") && tp.contains("truncatedNormal"),
                "names the spec's range and the truncated form: " + tp);

        OperationException inv = assertThrows(OperationException.class, () -> parseRun("{\"solve\": {\"field\":"
                + " \"potentialTemperatureC\", \"min\": 900, \"max\": 1600, \"method\": \"guess\"},"
                + " \"uncertainty\": {\"inputs\": {\"potentialTemperatureC\": {\"normal\": {\"mean\": 1350, \"sd\": 25}}}}}"));
        assertTrue(fields(inv).containsAll(List.of("solve.min", "solve.method", "observed")), fields(inv).toString());
        OperationException obs = assertThrows(OperationException.class, () -> parseRun("{\"observed\": "
                + "{\"crustThicknessKm\": {\"value\": 7, \"sd\": 0}}}"));
        assertTrue(fields(obs).containsAll(List.of("observed.crustThicknessKm", "observed")), fields(obs).toString());
    }
}
