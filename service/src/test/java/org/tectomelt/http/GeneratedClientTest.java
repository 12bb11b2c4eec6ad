package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.client.ApiClient;
import org.tectomelt.client.ApiException;
import org.tectomelt.client.api.MetaApi;
import org.tectomelt.client.api.ThermalApi;
import org.tectomelt.client.model.Health;
import org.tectomelt.client.model.PressureRequest;
import org.tectomelt.client.model.PressureResponse;

/**
 * Calls the service through the Java client that the OpenAPI Generator plugin builds from
 * {@code api-spec/openapi.yaml} at build time: the spec must be usable by generated clients.
 * Each endpoint adds itself here.
 */
class GeneratedClientTest {

    private static ApiClient client() {
        ApiClient c = new ApiClient();
        c.updateBaseUri(TestServer.baseUri());
        return c;
    }

    @Test
    void healthThroughTheGeneratedClient() throws ApiException {
        Health h = new MetaApi(client()).getHealth();
        assertEquals(Health.StatusEnum.UP, h.getStatus());
        assertEquals(App.VERSION, h.getVersion());
        assertEquals(BuildInfo.CURRENT.commitLabel(), h.getCommit());
    }

    @Test
    void citationsThroughTheGeneratedClient() throws ApiException {
        org.tectomelt.client.model.Citations c = new MetaApi(client()).getCitations(null);
        assertEquals("tectomelt", c.getSoftware().getId());
        assertEquals(org.tectomelt.engine.ModelCatalogue.all().size(), c.getModels().size());
    }

    @Test
    void pressureThroughTheGeneratedClient() throws ApiException {
        PressureResponse r = new ThermalApi(client()).computePressure(
                new PressureRequest().depthsKm(List.of(30.9)));
        assertEquals(1.0, r.getPoints().get(0).getPressureGPa(), 0.002);
    }

    @Test
    void aProblemReachesTheGeneratedClientAsItsStatus() {
        ApiException e = assertThrows(ApiException.class, () -> new ThermalApi(client())
                .computePressure(new PressureRequest().depthsKm(List.of(-1.0))));
        assertEquals(400, e.getCode());
    }
}
