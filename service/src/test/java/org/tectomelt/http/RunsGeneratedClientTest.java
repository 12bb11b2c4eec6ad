package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Instant;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.client.ApiClient;
import org.tectomelt.client.ApiException;
import org.tectomelt.client.api.RunsApi;
import org.tectomelt.client.model.Run;
import org.tectomelt.client.model.RunList;
import org.tectomelt.client.model.RunRequest;
import org.tectomelt.client.model.RunResultRow;
import org.tectomelt.client.model.SweepAxis;

/** A sweep started, followed, read and removed through the Java client generated from the spec. */
class RunsGeneratedClientTest {

    private static RunsApi api() {
        ApiClient c = new ApiClient();
        c.updateBaseUri(TestServer.baseUri());
        return new RunsApi(c);
    }

    @Test
    void aPressureSweepThroughTheGeneratedClient() throws Exception {
        RunsApi api = api();
        Run started = api.startRun(new RunRequest().operation("melt-fraction")
                .request(Map.of("lithology", "peridotite-katz2003", "pressureGPa", 1.0))
                .sweep(Map.of("temperatureC", new SweepAxis().from(1100.0).to(1500.0).steps(5)))
                .outputs(List.of("meltFraction", "solidusC"))
                .label("Vellmar plume head, 1 GPa"));
        assertEquals(5, started.getProgress().getTotal());
        Run run = started;
        Instant end = Instant.now().plusSeconds(60);
        while (run.getStatus() == Run.StatusEnum.QUEUED || run.getStatus() == Run.StatusEnum.RUNNING) {
            assertTrue(Instant.now().isBefore(end), "the run finishes");
            Thread.sleep(50);
            run = api.getRun(started.getId());
        }
        assertEquals(Run.StatusEnum.SUCCEEDED, run.getStatus());
        List<RunResultRow> rows = api.getRunResults(run.getId(), "json");
        assertEquals(5, rows.size());
        assertEquals(1300.0, rows.get(2).getInputs().get("temperatureC"), 1e-12);
        // Katz et al. (2003) eq. 4, Table 2: dry solidus at 1 GPa = 1085.7 + 132.9 - 5.1 = 1213.5 °C
        assertEquals(1213.5, rows.get(2).getOutputs().get("solidusC"), 1e-9);
        assertEquals(0.0, rows.get(0).getOutputs().get("meltFraction"), 0.0, "1100 °C is below the solidus");
        assertTrue(rows.get(4).getOutputs().get("meltFraction") > rows.get(3).getOutputs().get("meltFraction"));
        RunList list = api.listRuns(null, null, "melt-fraction", 100, 0);
        assertTrue(list.getRuns().stream().anyMatch(r -> r.getId().equals(started.getId())));
        api.deleteRun(run.getId());
        ApiException gone = assertThrows(ApiException.class, () -> api.getRun(started.getId()));
        assertEquals(404, gone.getCode());
    }
}
