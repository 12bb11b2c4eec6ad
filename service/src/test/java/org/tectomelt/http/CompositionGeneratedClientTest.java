package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.client.ApiClient;
import org.tectomelt.client.ApiException;
import org.tectomelt.client.api.CompositionApi;
import org.tectomelt.client.model.MeltCompositionRequest;
import org.tectomelt.client.model.MeltCompositionResponse;
import org.tectomelt.client.model.MidOceanRidgeRequest;

/** {@code POST /v1/melt-composition} through the generated Java client. */
class CompositionGeneratedClientTest {

    @Test
    void aRidgeCompositionThroughTheGeneratedClient() throws ApiException {
        ApiClient c = new ApiClient();
        c.updateBaseUri(TestServer.baseUri());
        MeltCompositionResponse r = new CompositionApi(c).computeMeltComposition(new MeltCompositionRequest()
                .midOceanRidge(new MidOceanRidgeRequest().potentialTemperatureC(1350.0).fullSpreadingRateMmPerYr(40.0))
                .elements(List.of(MeltCompositionRequest.ElementsEnum.LA, MeltCompositionRequest.ElementsEnum.SM,
                        MeltCompositionRequest.ElementsEnum.YB)));
        assertNotNull(r.getPooled());
        double f = r.getPooled().getMeanMeltFraction();
        double c0 = r.getSourcePpm().get("La");
        // mass balance of the pooled regime (Shaw 1970 bookkeeping): F̄·C̄_pool + (1 − F̄)·C̄_res = C0
        assertEquals(c0, f * r.getPooled().getMeltPpm().get("La") + (1 - f) * r.getPooled().getResiduePpm().get("La"),
                1e-9 * c0);
        assertTrue(r.getPooled().getRatios().getLaSmN() < 1, "depleted-mantle melts have (La/Sm)N < 1");
        assertEquals(3, r.getElements().size());
        assertTrue(r.getProfile().size() > 50);
    }
}
