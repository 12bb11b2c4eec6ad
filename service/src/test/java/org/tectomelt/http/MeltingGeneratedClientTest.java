package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.client.ApiClient;
import org.tectomelt.client.ApiException;
import org.tectomelt.client.api.MeltingApi;
import org.tectomelt.client.model.AdiabatPath;
import org.tectomelt.client.model.Crossing;
import org.tectomelt.client.model.GeothermRequest;
import org.tectomelt.client.model.LithologyInfo;
import org.tectomelt.client.model.MeltCurvePoint;
import org.tectomelt.client.model.MeltFractionRequest;
import org.tectomelt.client.model.MeltFractionResponse;
import org.tectomelt.client.model.Path;
import org.tectomelt.client.model.PathSample;
import org.tectomelt.client.model.PressureTemperature;
import org.tectomelt.client.model.SolidusCrossingsRequest;
import org.tectomelt.client.model.SolidusCrossingsResponse;

/** The melting endpoints through the Java client generated from {@code api-spec/openapi.yaml}. */
class MeltingGeneratedClientTest {

    private static MeltingApi api() {
        ApiClient c = new ApiClient();
        c.updateBaseUri(TestServer.baseUri());
        return new MeltingApi(c);
    }

    @Test
    void lithologiesThroughTheGeneratedClient() throws ApiException {
        List<LithologyInfo> all = api().listLithologies();
        assertEquals(7, all.size());
        assertEquals(LithologyInfo.IdEnum.PYROXENITE_PERTERMANN_HIRSCHMANN2003, all.get(6).getId());
        assertEquals(LithologyInfo.IdEnum.PERIDOTITE_MCKENZIE_BICKLE1988, all.get(1).getId());
        assertEquals(LithologyInfo.KindEnum.INTRUSION, all.get(5).getKind());
        assertEquals(2900.0, all.get(5).getThermalProperties().getDensityKgPerM3(), 0);
    }

    @Test
    void singleAndBatchMeltFractionThroughTheGeneratedClient() throws ApiException {
        // REFERENCES §2.1 [calc]: Katz et al. (2003), dry, F(3 GPa, 1500 °C) = 0.1237
        MeltFractionResponse one = api().computeMeltFraction(new MeltFractionRequest()
                .lithology("peridotite-katz2003").pressureGPa(3.0).temperatureC(1500.0));
        assertEquals(0.1237, one.getMeltFraction(), 5e-5);
        assertNull(one.getResults());
        MeltFractionResponse batch = api().computeMeltFraction(new MeltFractionRequest()
                .lithology("peridotite-katz2003")
                .points(List.of(new PressureTemperature().pressureGPa(3.0).temperatureC(1500.0),
                        new PressureTemperature().pressureGPa(1.0).temperatureC(1300.0))));
        assertEquals(2, batch.getResults().size());
        assertEquals(one.getMeltFraction(), batch.getResults().get(0).getMeltFraction(), 0);
        assertEquals(0.1293, batch.getResults().get(1).getMeltFraction(), 5e-5);
    }

    @Test
    void solidusCrossingsThroughTheGeneratedClient() throws ApiException {
        SolidusCrossingsResponse adiabat = api().computeSolidusCrossings(new SolidusCrossingsRequest()
                .lithology("peridotite-mckenzie-bickle1988")
                .path(new Path().adiabat(new AdiabatPath().potentialTemperatureC(1350.0))));
        assertEquals(1, adiabat.getCrossings().size());
        assertTrue(adiabat.getModels().stream().anyMatch(m -> m.getId().equals("peridotite-katz2003")),
                "the Katz Table 2 constants are cited when they drive the McKenzie & Bickle adiabat");
        SolidusCrossingsResponse own = api().computeSolidusCrossings(new SolidusCrossingsRequest()
                .lithology("amphibolite")
                .meltCurve(List.of(new MeltCurvePoint().temperatureC(800.0).meltFraction(0.0),
                        new MeltCurvePoint().temperatureC(900.0).meltFraction(0.5)))
                .path(new Path().points(List.of(new PathSample().depthKm(30.0).temperatureC(700.0),
                        new PathSample().depthKm(30.0).temperatureC(850.0)))));
        assertEquals(800.0, own.getCrossings().get(0).getTemperatureC(), 1e-6);
        assertEquals(0.25, own.getMaxMeltFraction(), 1e-12);
    }

    @Test
    void aGeothermPathThroughTheGeneratedClient() throws ApiException {
        SolidusCrossingsResponse r = api().computeSolidusCrossings(new SolidusCrossingsRequest()
                .lithology("peridotite-katz2003")
                .bulkWaterWtPct(0.1)
                .path(new Path().geotherm(new GeothermRequest().potentialTemperatureC(1350.0).maxDepthKm(250.0))));
        assertEquals(251, r.getProfile().size());
        assertTrue(r.getMeltPresent());
        assertEquals(Crossing.DirectionEnum.OUT_OF_MELT, r.getCrossings().get(0).getDirection(),
                "a geotherm runs from the surface down: the wet solidus is left behind with depth");
    }

    @Test
    void anUnknownLithologyReachesTheGeneratedClientAs400() {
        ApiException e = assertThrows(ApiException.class, () -> api().computeMeltFraction(
                new MeltFractionRequest().lithology("dunite").pressureGPa(1.0).temperatureC(1300.0)));
        assertEquals(400, e.getCode());
    }
}
