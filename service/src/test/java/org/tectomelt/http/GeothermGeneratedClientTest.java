package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.client.ApiClient;
import org.tectomelt.client.ApiException;
import org.tectomelt.client.api.ThermalApi;
import org.tectomelt.client.model.GeothermLithosphere;
import org.tectomelt.client.model.GeothermRequest;
import org.tectomelt.client.model.GeothermResponse;

/** {@code POST /v1/geotherm} through the Java client generated from {@code api-spec/openapi.yaml}. */
class GeothermGeneratedClientTest {

    private static ThermalApi api() {
        ApiClient c = new ApiClient();
        c.updateBaseUri(TestServer.baseUri());
        return new ThermalApi(c);
    }

    @Test
    void plateOnAnAdiabatThroughTheGeneratedClient() throws ApiException {
        GeothermResponse r = api().computeGeotherm(new GeothermRequest()
                .lithosphere(new GeothermLithosphere().type(GeothermLithosphere.TypeEnum.OCEANIC_PLATE).ageMyr(60.0))
                .potentialTemperatureC(1350.0));
        // defaults: 0–300 km every 1 km
        assertEquals(301, r.getPoints().size());
        // REFERENCES §1.3 [calc]: GDH1 at 60 Myr, q = 66.1 mW/m²
        assertEquals(66.1, r.getSurfaceHeatFlowMWPerM2(), 0.05);
        assertTrue(r.getLithosphereBaseDepthKm() > 60 && r.getLithosphereBaseDepthKm() < 95);
        assertNull(r.getMohoTemperatureC());
    }

    @Test
    void continentalTwoLayerThroughTheGeneratedClient() throws ApiException {
        GeothermResponse r = api().computeGeotherm(new GeothermRequest()
                .lithosphere(new GeothermLithosphere().type(GeothermLithosphere.TypeEnum.CONTINENTAL)
                        .surfaceHeatFlowMWPerM2(50.0)
                        .heatProduction(GeothermLithosphere.HeatProductionEnum.TWO_LAYER))
                .maxDepthKm(35.0).stepKm(5.0));
        // REFERENCES §1.4 [calc]: two-layer Moho (35 km) temperature 460 °C
        assertEquals(460, r.getMohoTemperatureC(), 0.5);
        assertEquals(8, r.getPoints().size());
    }

    @Test
    void aFieldOfAnotherTypeReachesTheClientAs400() {
        ApiException e = assertThrows(ApiException.class, () -> api().computeGeotherm(new GeothermRequest()
                .lithosphere(new GeothermLithosphere().type(GeothermLithosphere.TypeEnum.CONTINENTAL)
                        .surfaceHeatFlowMWPerM2(50.0).ageMyr(10.0))));
        assertEquals(400, e.getCode());
        assertTrue(e.getResponseBody().contains("lithosphere.ageMyr"));
    }
}
