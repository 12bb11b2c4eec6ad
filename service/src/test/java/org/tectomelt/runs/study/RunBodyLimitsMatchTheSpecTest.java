package org.tectomelt.runs.study;

import static org.junit.jupiter.api.Assertions.assertEquals;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.runs.sweep.Sweep;
import org.tectomelt.studies.PosteriorInversion;
import org.tectomelt.studies.SamplingInversion;

/**
 * The body of {@code POST /v1/runs} is read by hand ({@link Sweep#parse}, {@link StudyRequest#parse}), not
 * by the spec validator, so its limits and defaults are written in Java and in {@code api-spec/openapi.yaml}
 * alike. This test makes the two fail together when one of them changes alone.
 */
class RunBodyLimitsMatchTheSpecTest {

    private static JsonNode schema(String name) throws Exception {
        JsonNode spec = new ObjectMapper(new YAMLFactory()).readTree(Path.of("..", "api-spec", "openapi.yaml").toFile());
        return spec.path("components").path("schemas").path(name).path("properties");
    }

    private static void bounds(JsonNode field, long min, long max, long dflt, String name) {
        assertEquals(min, field.path("minimum").asLong(), name + ".minimum");
        assertEquals(max, field.path("maximum").asLong(), name + ".maximum");
        assertEquals(dflt, field.path("default").asLong(), name + ".default");
    }

    @Test
    void theStudyLimitsAndDefaultsAreTheSpecs() throws Exception {
        bounds(schema("Uncertainty").path("samples"), 1, StudyRequest.MAX_SAMPLES, StudyRequest.DEFAULT_SAMPLES,
                "Uncertainty.samples");
        JsonNode solve = schema("Solve");
        bounds(solve.path("gridPoints"), PosteriorInversion.MIN_GRID_POINTS, StudyRequest.MAX_GRID_POINTS,
                StudyRequest.DEFAULT_GRID_POINTS, "Solve.gridPoints");
        bounds(solve.path("scanPoints"), SamplingInversion.MIN_SCAN_POINTS, StudyRequest.MAX_SCAN_POINTS,
                SamplingInversion.DEFAULT_SCAN_POINTS, "Solve.scanPoints");
        List<String> methods = new ArrayList<>();
        solve.path("method").path("enum").forEach(m -> methods.add(m.asText()));
        assertEquals(StudyRequest.METHODS, methods, "Solve.method.enum");
        assertEquals(StudyRequest.METHODS.get(0), solve.path("method").path("default").asText(), "Solve.method.default");
    }

    @Test
    void theRunLabelLimitIsTheSpecs() throws Exception {
        assertEquals(Sweep.MAX_LABEL, schema("RunRequest").path("label").path("maxLength").asInt(), "RunRequest.label");
    }
}
