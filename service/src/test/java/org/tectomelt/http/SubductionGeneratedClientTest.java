package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.client.ApiClient;
import org.tectomelt.client.ApiException;
import org.tectomelt.client.api.SettingsApi;
import org.tectomelt.client.model.SubductionRequest;
import org.tectomelt.client.model.SubductionResponse;

/** {@code POST /v1/settings/subduction} through the Java client generated from the spec. */
class SubductionGeneratedClientTest {

    private static SettingsApi api() {
        ApiClient c = new ApiClient();
        c.updateBaseUri(TestServer.baseUri());
        return new SettingsApi(c);
    }

    @Test
    void wedgeMeltingAndBudgetThroughTheGeneratedClient() throws ApiException {
        SubductionResponse r = api().computeSubductionWedge(new SubductionRequest()
                .pressureGPa(3.0).wedgeTemperatureC(1300.0).bulkWaterWtPct(0.5).slabWaterFluxKgPerMPerYr(5000.0));
        assertEquals("peridotite-katz2003", r.getLithology());
        assertTrue(r.getMeltFraction() > 0);
        // REFERENCES §2.1 [calc]: saturated solidus 941 °C at 3 GPa
        assertEquals(941, r.getSaturatedSolidusC(), 0.5);
        assertEquals(101, r.getWaterCurve().size());
        assertNull(r.getWaterForSaturationWtPct(), "saturation is beyond 5 wt% at 3 GPa and 1300 °C");
        double expected = 5000 / (r.getWaterInMeltWtPct() / 100 * r.getMeltDensityKgPerM3()) * 1e-6;
        assertEquals(expected, r.getMagmaProductionKm3PerYrPerKm(), 1e-12 * expected);
    }

    @Test
    void aBadFieldReachesTheGeneratedClientAs400() {
        ApiException e = assertThrows(ApiException.class, () -> api().computeSubductionWedge(new SubductionRequest()
                .pressureGPa(3.0).wedgeTemperatureC(1300.0).bulkWaterWtPct(0.5).lithology("granite")));
        assertEquals(400, e.getCode());
        assertTrue(e.getResponseBody().contains("peridotite-katz2003"));
    }
}
