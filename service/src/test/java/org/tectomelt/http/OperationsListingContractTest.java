package org.tectomelt.http;

import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.startsWith;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.restassured.response.Response;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;
import org.tectomelt.client.ApiClient;
import org.tectomelt.client.ApiException;
import org.tectomelt.client.api.MetaApi;
import org.tectomelt.client.model.OperationInfo;
import org.tectomelt.operations.Operations;

/**
 * {@code GET /v1/operations} lists the catalogue with the spec's ranges, and the table answers
 * ({@code Accept: text/csv}, {@code fields}) of batch and profile operations.
 */
class OperationsListingContractTest {

    @Test
    void theListingIsTheCatalogueWithTheSpecsRanges() {
        Response r = TestServer.given().get("/v1/operations");
        r.then().statusCode(200).contentType(startsWith("application/json"))
                .body("name", equalTo(Operations.of(Config.defaults()).list().stream().map(o -> o.name()).toList()))
                .body("find { it.name == 'mid-ocean-ridge' }.path", equalTo("/v1/settings/mid-ocean-ridge"))
                .body("find { it.name == 'mid-ocean-ridge' }.cost", equalTo("cheap"))
                .body("find { it.name == 'sill-model' }.cost", equalTo("heavy"))
                // the range of potentialTemperatureC is the spec's (MidOceanRidgeRequest: 1000–1700 °C)
                .body("find { it.name == 'mid-ocean-ridge' }.inputs.find { it.name == 'potentialTemperatureC' }.minimum",
                        equalTo(1000.0))
                .body("find { it.name == 'mid-ocean-ridge' }.inputs.find { it.name == 'potentialTemperatureC' }.maximum",
                        equalTo(1700.0))
                .body("find { it.name == 'mid-ocean-ridge' }.inputs.find { it.name == 'bulkWaterWtPct' }.default",
                        equalTo(0.0))
                .body("find { it.name == 'mid-ocean-ridge' }.outputs.name", hasItem("column.onset.depthKm"))
                .body("find { it.name == 'melt-fraction' }.rows", equalTo("results"));
    }

    @Test
    void theListingCarriesAnETagAndAnswers304ToIt() {
        String etag = TestServer.given().get("/v1/operations").then().statusCode(200).extract().header("ETag");
        assertTrue(etag != null && etag.startsWith("\""), "ETag " + etag);
        TestServer.given().header("If-None-Match", etag).get("/v1/operations").then().statusCode(304);
    }

    @Test
    void theListingThroughTheGeneratedClient() throws ApiException {
        ApiClient c = new ApiClient();
        c.updateBaseUri(TestServer.baseUri());
        List<OperationInfo> all = new MetaApi(c).listOperations();
        assertEquals(Operations.all().size(), all.size());
        OperationInfo geotherm = all.stream().filter(o -> o.getName().equals("geotherm")).findFirst().orElseThrow();
        assertEquals("/v1/geotherm", geotherm.getPath());
        assertTrue(geotherm.getInputs().stream().anyMatch(i -> i.getName().equals("lithosphere.ageMyr")
                && i.getMinimum() == 0.01 && i.getMaximum() == 200));
    }

    @Test
    void aBatchAnswersAsCsvWithTheChosenFields() {
        String body = "{\"lithology\": \"peridotite-katz2003\", \"bulkWaterWtPct\": 0.1, \"points\": ["
                + "{\"pressureGPa\": 1, \"temperatureC\": 1200}, {\"pressureGPa\": 2, \"temperatureC\": 1400}]}";
        Response csv = TestServer.json(body).accept("text/csv").queryParam("fields",
                "meltFraction,solidusC,waterInMeltWtPct").post("/v1/melt-fraction");
        csv.then().statusCode(200).contentType(startsWith("text/csv"));
        String[] lines = csv.asString().split("\r\n");
        assertEquals("meltFraction,solidusC,waterInMeltWtPct", lines[0]);
        assertEquals(3, lines.length);
        // the CSV holds the same numbers as the JSON answer
        Response json = TestServer.json(body).post("/v1/melt-fraction");
        List<Map<String, Object>> results = json.jsonPath().getList("results");
        for (int i = 0; i < 2; i++) {
            String[] cells = lines[i + 1].split(",");
            assertEquals(((Number) results.get(i).get("meltFraction")).doubleValue(), Double.parseDouble(cells[0]), 0);
            assertEquals(((Number) results.get(i).get("solidusC")).doubleValue(), Double.parseDouble(cells[1]), 0);
        }
        // fields alone keep JSON and trim the rows
        TestServer.json(body).queryParam("fields", "meltFraction").post("/v1/melt-fraction").then().statusCode(200)
                .body("results[0].size()", equalTo(1)).body("lithology", equalTo("peridotite-katz2003"));
        // an unknown column names the field and the columns there are
        TestServer.json(body).queryParam("fields", "meltFractionPct").post("/v1/melt-fraction").then().statusCode(400)
                .body("errors[0].field", equalTo("fields")).body("errors[0].message", containsString("meltFraction"));
    }

    @Test
    void aProfileAnswersAsCsvWithNestedColumnsDotted() {
        Response csv = TestServer.json("{\"potentialTemperatureC\": 1350, \"fullSpreadingRateMmPerYr\": 40}")
                .accept("text/csv").post("/v1/settings/mid-ocean-ridge");
        csv.then().statusCode(200).contentType(startsWith("text/csv"));
        String header = csv.asString().split("\r\n")[0];
        assertEquals("depthKm,pressureGPa,temperatureC,meltFraction,productivityPercentPerGPa,waterInMeltWtPct,"
                + "residueWaterWtPct,pyroxeniteMeltFraction", header, "the profile point's components, in order");
    }
}
