package org.tectomelt.http;

import static org.hamcrest.Matchers.closeTo;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.hasSize;
import static org.tectomelt.http.Problem.assertInvalidField;

import org.junit.jupiter.api.Test;

/** {@code POST /v1/pressure}. */
class PressureContractTest {

    @Test
    void depthsBecomePressuresInRequestOrderWithTheModelCited() {
        TestServer.json("{\"depthsKm\": [0, 30.9, 61.8]}").post("/v1/pressure").then()
                .statusCode(200)
                .body("points", hasSize(3))
                .body("points[1].depthKm", closeTo(30.9, 1e-9))
                // REFERENCES §1.1 [calc]: mantle-only column, 1 GPa at 30.9 km
                .body("points[1].pressureGPa", closeTo(1.0, 0.002))
                .body("points[2].pressureGPa", closeTo(2.0, 0.002))
                .body("models[0].id", equalTo("lithostatic-two-layer"));
    }

    @Test
    void pressuresBecomeDepths() {
        TestServer.json("{\"pressuresGPa\": [1, 2, 3], \"crustThicknessKm\": 35}").post("/v1/pressure").then()
                .statusCode(200)
                // REFERENCES §1.1 [calc]: 35 km crust at 2800 kg/m³ over 3300 kg/m³ mantle
                .body("points[0].depthKm", closeTo(36.2, 0.05))
                .body("points[2].depthKm", closeTo(98.0, 0.05));
    }

    @Test
    void bothOrNeitherListIsRefused() {
        assertInvalidField(TestServer.json("{\"depthsKm\": [1], \"pressuresGPa\": [1]}").post("/v1/pressure"),
                "depthsKm");
        assertInvalidField(TestServer.json("{\"depthsKm\": []}").post("/v1/pressure"), "depthsKm");
    }
}
