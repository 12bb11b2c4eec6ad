package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.tectomelt.http.Problem.assertInvalidField;

import io.restassured.path.json.JsonPath;
import org.junit.jupiter.api.Test;

/**
 * The source fields on the column, hotspot and rift operations; the experimental wet solidus of the
 * subduction operation; the thermal lithosphere and solidus depth of the geotherm.
 */
class SourcesAcrossOperationsContractTest {

    private static JsonPath ok(String path, String body) {
        return TestServer.json(body).post(path).then().statusCode(200).extract().jsonPath();
    }

    @Test
    void theColumnRunsEveryModeAndAMixedSource() {
        String base = "{\"potentialTemperatureC\": 1350, \"stepKm\": 2";
        JsonPath batch = ok("/v1/decompression-melting", base + "}");
        JsonPath frac = ok("/v1/decompression-melting", base + ", \"meltingMode\": \"fractional\"}");
        JsonPath mixed = ok("/v1/decompression-melting", base + ", \"pyroxeniteFraction\": 0.1}");
        assertEquals("batch", batch.getString("meltingMode"));
        assertTrue(frac.getDouble("meltThicknessKm") < batch.getDouble("meltThicknessKm"));
        assertTrue(frac.getDouble("meltThicknessKm") > 0.9 * batch.getDouble("meltThicknessKm"));
        assertTrue(mixed.getDouble("crustalThicknessKm") > batch.getDouble("crustalThicknessKm"));
        assertEquals(2, mixed.getList("lithologies").size());
        assertTrue(mixed.getDouble("pyroxeniteMeltShare") > 0.1);
        assertInvalidField(TestServer.json(base + ", \"pyroxeniteFraction\": 2}").post("/v1/decompression-melting"),
                "pyroxeniteFraction");
    }

    @Test
    void theHotspotAndTheRiftTakeTheSource() {
        String plume = "{\"potentialTemperatureC\": 1500, \"ambientPotentialTemperatureC\": 1350, "
                + "\"lithosphereThicknessKm\": 80, \"plumeRadiusKm\": 100, \"upwellingVelocityCmPerYr\": 10";
        double dry = ok("/v1/settings/hotspot", plume + "}").getDouble("meltFluxKm3PerYr");
        JsonPath mixed = ok("/v1/settings/hotspot", plume + ", \"pyroxeniteFraction\": 0.1}");
        assertTrue(mixed.getDouble("meltFluxKm3PerYr") > dry, "pyroxenite raises the plume's melt flux");
        assertEquals(2, mixed.getList("column.lithologies").size());
        String rift = "{\"potentialTemperatureC\": 1400, \"stretchingFactor\": 4, \"lithosphereThicknessKm\": 120, "
                + "\"crustThicknessKm\": 35";
        double batch = ok("/v1/settings/continental-rift", rift + "}").getDouble("meltThicknessKm");
        JsonPath frac = ok("/v1/settings/continental-rift", rift + ", \"meltingMode\": \"near-fractional\"}");
        assertTrue(frac.getDouble("meltThicknessKm") <= batch);
        assertEquals("near-fractional", frac.getString("column.meltingMode"));
        assertInvalidField(TestServer.json(rift + ", \"meltingMode\": \"fractional\", \"retainedMeltFraction\": 0.01}")
                .post("/v1/settings/continental-rift"), "retainedMeltFraction");
    }

    @Test
    void theWedgeComparesBothWetSolidiAndRunsTheExperimentalOne() {
        String wedge = "{\"pressureGPa\": 3, \"wedgeTemperatureC\": 900, \"bulkWaterWtPct\": 0.5";
        JsonPath katz = ok("/v1/settings/subduction", wedge + "}");
        assertEquals("katz2003", katz.getString("wetSolidus"));
        assertNull(katz.get("waterForOnsetWtPct"), "900 °C is below Katz's saturated solidus at 3 GPa");
        assertEquals(810.0, katz.getDouble("wetSolidusComparison.experimentalSaturatedSolidusC"), 1e-9);
        assertTrue(katz.getDouble("wetSolidusComparison.differenceK") > 120);
        assertTrue(katz.getDouble("wetSolidusComparison.experimentalWaterForOnsetWtPct") > 0);
        JsonPath exp = ok("/v1/settings/subduction", wedge + ", \"wetSolidus\": \"experimental\"}");
        assertEquals("experimental", exp.getString("wetSolidus"));
        assertEquals(810.0, exp.getDouble("saturatedSolidusC"), 1e-9);
        assertTrue(exp.getDouble("meltFraction") > 0);
        assertTrue(exp.getList("models.id").contains("water-saturated-solidus-grove2006-till2012"));
        assertInvalidField(TestServer.json(wedge + ", \"wetSolidus\": \"grove\"}").post("/v1/settings/subduction"),
                "wetSolidus");
    }

    @Test
    void theGeothermReportsItsThermalLithosphereAndWhereItMeetsASolidus() {
        JsonPath half = ok("/v1/geotherm", "{\"lithosphere\": {\"type\": \"oceanic-half-space\", \"ageMyr\": 100}}");
        // Turcotte & Schubert ch. 4 (REFERENCES §1.2 [calc]): 2.326·√(κt) = 130.7 km at 100 Myr
        assertEquals(130.7, half.getDouble("thermalLithosphereThicknessKm"), 0.1);
        JsonPath ridge = ok("/v1/geotherm", "{\"potentialTemperatureC\": 1350, \"solidus\": "
                + "{\"lithology\": \"peridotite-katz2003\"}}");
        assertEquals(0.0, ridge.getDouble("solidus.topDepthKm"), 0.0);
        assertEquals(ridge.getDouble("solidus.baseDepthKm"), ridge.getDouble("solidusDepthKm"), 0.0);
        assertTrue(ridge.getDouble("solidusDepthKm") > 60 && ridge.getDouble("solidusDepthKm") < 90);
        assertInvalidField(TestServer.json("{\"potentialTemperatureC\": 1350, \"solidus\": {\"lithology\": \"basalt\"}}")
                .post("/v1/geotherm"), "solidus.lithology");
        assertInvalidField(TestServer.json("{\"lithology\": \"peridotite-katz2003\", \"path\": {\"geotherm\": "
                + "{\"potentialTemperatureC\": 1350, \"solidus\": {}}}}").post("/v1/solidus-crossings"),
                "path.geotherm.solidus");
    }
}
