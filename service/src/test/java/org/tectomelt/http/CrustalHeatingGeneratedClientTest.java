package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.client.ApiClient;
import org.tectomelt.client.ApiException;
import org.tectomelt.client.api.CrustApi;
import org.tectomelt.client.model.BudgetCrust;
import org.tectomelt.client.model.BudgetIntrusion;
import org.tectomelt.client.model.CrustMeltingInterval;
import org.tectomelt.client.model.CrustalHeatingBudgetRequest;
import org.tectomelt.client.model.CrustalHeatingBudgetResponse;
import org.tectomelt.client.model.SillCrust;
import org.tectomelt.client.model.SillIntrusion;
import org.tectomelt.client.model.SillRepeat;
import org.tectomelt.client.model.SillRequest;
import org.tectomelt.client.model.SillResponse;

/** Both crustal-heating endpoints through the client generated from {@code api-spec/openapi.yaml}. */
class CrustalHeatingGeneratedClientTest {

    private static CrustApi api() {
        ApiClient c = new ApiClient();
        c.updateBaseUri(TestServer.baseUri());
        return new CrustApi(c);
    }

    @Test
    void theBudgetThroughTheGeneratedClient() throws ApiException {
        // the hand calculation of CrustalHeatingBudgetContractTest: hb/hc = 1.107e9 / 2.436e9
        CrustalHeatingBudgetResponse r = api().computeCrustalHeatingBudget(new CrustalHeatingBudgetRequest()
                .intrusion(new BudgetIntrusion().temperatureC(1250.0).densityKgPerM3(2900.0).heatCapacityJPerKgK(1100.0)
                        .latentHeatJPerKg(400000.0).crystallizedFraction(1.0))
                .crust(new BudgetCrust().initialTemperatureC(500.0).densityKgPerM3(2700.0).heatCapacityJPerKgK(1000.0)
                        .latentHeatJPerKg(300000.0).targetMeltFraction(0.2))
                .finalTemperatureC(850.0));
        assertEquals(1.107 / 2.436, r.getBasaltToCrustThicknessRatio(), 1e-9);
        assertEquals(2.436e9, r.getHeatReleasedJPerM3(), 1);
    }

    @Test
    void theSillModelThroughTheGeneratedClient() throws ApiException {
        SillResponse r = api().runSillModel(new SillRequest()
                .crust(new SillCrust().initialTemperatureC(450.0).conductivityWPerMK(2.5).densityKgPerM3(2750.0)
                        .heatCapacityJPerKgK(1050.0).latentHeatJPerKg(280000.0)
                        .meltingInterval(new CrustMeltingInterval().solidusC(750.0).liquidusC(1000.0)))
                .intrusion(new SillIntrusion().temperatureC(1230.0).thicknessM(100.0).topDepthKm(5.0)
                        .conductivityWPerMK(2.5).densityKgPerM3(2900.0).heatCapacityJPerKgK(1100.0)
                        .latentHeatJPerKg(400000.0)
                        .meltingInterval(new CrustMeltingInterval().solidusC(1000.0).liquidusC(1200.0))
                        .repeat(new SillRepeat().count(2).intervalKyr(2.0).stacking(SillRepeat.StackingEnum.OVER)))
                .columnDepthKm(10.0).durationKyr(5.0).profileTimesKyr(List.of(5.0)));
        assertEquals(2, r.getSummary().getSillsEmplaced());
        assertEquals(101, r.getSeries().size());
        assertEquals(1, r.getProfiles().size());
        assertTrue(r.getSummary().getEnergyErrorFraction() < 1e-3);
    }

    @Test
    void aRefusedSillRunReachesTheClientAsA400() {
        ApiException e = assertThrows(ApiException.class, () -> api().runSillModel(new SillRequest()
                .crust(new SillCrust().initialTemperatureC(450.0))
                .intrusion(new SillIntrusion().temperatureC(1230.0))
                .durationKyr(10.0)));
        assertEquals(400, e.getCode());
    }
}
