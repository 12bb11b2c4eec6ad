package org.tectomelt.http;

import static org.hamcrest.Matchers.containsString;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.tectomelt.http.Problem.assertInvalidField;
import static org.tectomelt.http.Problem.assertProblem;

import io.javalin.Javalin;
import io.restassured.http.ContentType;
import java.util.Collections;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/** The caps set by environment variables give clear 4xx problems that name the variable. */
class CapsContractTest {

    private static String depths(int n) {
        return "{\"depthsKm\": [" + String.join(",", Collections.nCopies(n, "10")) + "]}";
    }

    @Test
    void theDefaultProfileCapNamesItsVariable() {
        TestServer.json(depths(Config.DEFAULT_MAX_PROFILE_POINTS)).post("/v1/pressure").then().statusCode(200);
        assertInvalidField(TestServer.json(depths(Config.DEFAULT_MAX_PROFILE_POINTS + 1)).post("/v1/pressure"),
                "depthsKm")
                .body("errors[0].message", containsString("TECTOMELT_MAX_PROFILE_POINTS"))
                .body("errors[0].message", containsString("got 5001"));
    }

    @Test
    void theCapsFollowTheEnvironment() {
        Javalin app = TestApps.start(TestApps.config(Map.of("TECTOMELT_MAX_PROFILE_POINTS", "3",
                "TECTOMELT_MAX_BODY_BYTES", "2048")));
        try {
            TestApps.given(app).contentType(ContentType.JSON).body(depths(3)).post("/v1/pressure").then()
                    .statusCode(200);
            assertInvalidField(TestApps.given(app).contentType(ContentType.JSON).body(depths(4)).post("/v1/pressure"),
                    "depthsKm")
                    .body("errors[0].message", containsString("between 1 and 3 entries"));
            assertProblem(TestApps.given(app).contentType(ContentType.JSON).body(depths(700)).post("/v1/pressure"),
                    413, "body-too-large")
                    .body("detail", containsString("TECTOMELT_MAX_BODY_BYTES"));
        } finally {
            app.stop();
        }
    }

    @Test
    void aSizeCapNamesTheFieldTheSizeAndTheVariable() {
        org.tectomelt.operations.Rules v = new org.tectomelt.operations.Rules();
        assertTrue(v.cap("grid.cells", 1_000 * 20_000, Config.DEFAULT_MAX_SILL_CELL_STEPS, "cells × steps",
                "TECTOMELT_MAX_SILL_CELL_STEPS"));
        assertFalse(v.cap("grid.cells", 10_000 * 20_000, Config.DEFAULT_MAX_SILL_CELL_STEPS, "cells × steps",
                "TECTOMELT_MAX_SILL_CELL_STEPS"));
        assertFalse(v.cap("durationMyr", Double.NaN, 20, "duration", "TECTOMELT_MAX_SILL_DURATION_MYR"));
        org.tectomelt.operations.OperationException p = assertThrows(org.tectomelt.operations.OperationException.class,
                v::throwIfBroken);
        assertEquals(List.of("grid.cells", "durationMyr"),
                p.violations().stream().map(org.tectomelt.operations.Violation::field).toList());
        assertEquals("cells × steps 200000000 exceeds the server cap of 100000000 (TECTOMELT_MAX_SILL_CELL_STEPS)",
                p.violations().get(0).message());
    }
}
