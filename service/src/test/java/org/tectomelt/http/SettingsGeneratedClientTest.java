package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.client.ApiClient;
import org.tectomelt.client.ApiException;
import org.tectomelt.client.api.SettingsApi;
import org.tectomelt.client.model.ContinentalRiftRequest;
import org.tectomelt.client.model.ContinentalRiftResponse;
import org.tectomelt.client.model.DecompressionMeltingRequest;
import org.tectomelt.client.model.DecompressionMeltingResponse;
import org.tectomelt.client.model.HotspotRequest;
import org.tectomelt.client.model.HotspotResponse;
import org.tectomelt.client.model.MidOceanRidgeRequest;
import org.tectomelt.client.model.MidOceanRidgeResponse;

/** The decompression column and the ridge, hotspot and rift settings through the generated Java client. */
class SettingsGeneratedClientTest {

    private static SettingsApi api() {
        ApiClient c = new ApiClient();
        c.updateBaseUri(TestServer.baseUri());
        return new SettingsApi(c);
    }

    @Test
    void aColumnThroughTheGeneratedClient() throws ApiException {
        DecompressionMeltingResponse r = api().computeDecompressionMelting(new DecompressionMeltingRequest()
                .potentialTemperatureC(1350.0).upwelling(DecompressionMeltingRequest.UpwellingEnum.PASSIVE));
        // REFERENCES §2.5 [calc]: Katz et al. (2003), dry, Tp 1350 °C: ∫F dz = 8.85 km, F(0) = 0.236
        assertEquals(8.85, r.getMeltThicknessKm(), 0.005);
        assertEquals(0.236, r.getTop().getMeltFraction(), 0.0005);
        assertEquals(2.661, r.getOnset().getPressureGPa(), 0.0006);
        assertTrue(r.getProfile().size() > 80);
    }

    @Test
    void aColdColumnHasNullOnsetThroughTheGeneratedClient() throws ApiException {
        DecompressionMeltingResponse r = api().computeDecompressionMelting(new DecompressionMeltingRequest()
                .potentialTemperatureC(1050.0));
        assertNull(r.getOnset());
        assertNull(r.getTop());
        assertNull(r.getMeanMeltingPressureGPa());
        assertEquals(0.0, r.getMeltThicknessKm(), 0.0);
    }

    @Test
    void aRidgeThroughTheGeneratedClient() throws ApiException {
        MidOceanRidgeResponse r = api().computeMidOceanRidge(new MidOceanRidgeRequest()
                .potentialTemperatureC(1330.0).fullSpreadingRateMmPerYr(60.0));
        assertEquals(r.getCrustalThicknessKm() * 60e-6, r.getMeltProductionKm3PerYrPerKm(), 1e-12);
        assertTrue(r.getColumn().getMeltThicknessKm() > 5);
    }

    @Test
    void aHotspotThroughTheGeneratedClient() throws ApiException {
        HotspotResponse r = api().computeHotspot(new HotspotRequest().potentialTemperatureC(1550.0)
                .ambientPotentialTemperatureC(1350.0).lithosphereThicknessKm(70.0).plumeRadiusKm(60.0)
                .upwellingVelocityCmPerYr(8.0));
        assertEquals(200.0, r.getExcessTemperatureK(), 1e-9);
        assertTrue(r.getMeltFluxKm3PerYr() > 0);
        assertEquals(r.getMeltFractionAtLid(), r.getColumn().getTop().getMeltFraction(), 1e-12);
    }

    @Test
    void aRiftThroughTheGeneratedClient() throws ApiException {
        ContinentalRiftResponse r = api().computeContinentalRift(new ContinentalRiftRequest()
                .potentialTemperatureC(1380.0).stretchingFactor(4.0).lithosphereThicknessKm(120.0)
                .crustThicknessKm(35.0));
        assertEquals(30.0, r.getLidDepthKm(), 1e-9);
        assertTrue(r.getOnsetStretchingFactor() > 1 && r.getOnsetStretchingFactor() < 4);
        assertTrue(r.getMeltThicknessKm() > 0);
    }

    @Test
    void aBadFieldReachesTheGeneratedClientAs400() {
        ApiException e = assertThrows(ApiException.class, () -> api().computeContinentalRift(
                new ContinentalRiftRequest().potentialTemperatureC(1380.0).stretchingFactor(0.5)
                        .lithosphereThicknessKm(120.0).crustThicknessKm(35.0)));
        assertEquals(400, e.getCode());
        assertTrue(e.getResponseBody().contains("stretchingFactor"));
    }
}
