package org.tectomelt.http;

import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.not;
import static org.tectomelt.http.Problem.assertInvalidField;
import static org.tectomelt.http.Problem.assertProblem;

import io.javalin.Javalin;
import io.restassured.RestAssured;
import io.restassured.http.ContentType;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/** Every bad-input case of the foundation returns a documented RFC 9457 problem, never a 500. */
class ProblemContractTest {

    private static final String PRESSURE = "/v1/pressure";

    @Test
    void malformedJsonIs400MalformedJson() {
        assertProblem(TestServer.json("{\"depthsKm\": [31, 100").post(PRESSURE), 400, "malformed-json");
        assertProblem(TestServer.json("{depthsKm: 3}").post(PRESSURE), 400, "malformed-json");
        assertProblem(TestServer.json("").post(PRESSURE), 400, "malformed-json");
        assertProblem(TestServer.json("[1, 2]").post(PRESSURE), 400, "malformed-json");
        assertProblem(TestServer.json("{\"depthsKm\": [1]} trailing").post(PRESSURE), 400, "malformed-json");
    }

    @Test
    void aWrongJsonTypeNamesTheField() {
        assertInvalidField(TestServer.json("{\"depthsKm\": [31], \"crustThicknessKm\": \"35\"}").post(PRESSURE),
                "crustThicknessKm");
        assertInvalidField(TestServer.json("{\"depthsKm\": 31}").post(PRESSURE), "depthsKm");
        assertInvalidField(TestServer.json("{\"depthsKm\": [31, \"deep\"]}").post(PRESSURE), "depthsKm[1]");
    }

    @Test
    void notANumberAndInfinityAreNotNumbersInJson() {
        for (String word : new String[] {"\"NaN\"", "\"Infinity\"", "\"-Infinity\""}) {
            assertInvalidField(TestServer.json("{\"depthsKm\": [31, " + word + "]}").post(PRESSURE), "depthsKm[1]")
                    .body("errors[0].message", containsString("expected a number"));
            assertInvalidField(TestServer.json("{\"depthsKm\": [31], \"crustThicknessKm\": " + word + "}")
                    .post(PRESSURE), "crustThicknessKm");
        }
        // beyond the range of a double: named, not turned into Infinity
        assertInvalidField(TestServer.json("{\"depthsKm\": [1e400]}").post(PRESSURE), "depthsKm[0]")
                .body("errors[0].message", containsString("beyond the range of a double"));
        assertProblem(TestServer.json("\"\"").post(PRESSURE), 400, "malformed-json");
    }

    @Test
    void anUnknownFieldIsNamedSoAMissingUnitSuffixIsCaught() {
        assertInvalidField(TestServer.json("{\"depthsKm\": [31], \"crustThickness\": 35}").post(PRESSURE),
                "crustThickness")
                .body("errors[0].message", containsString("crustThicknessKm"));
    }

    @Test
    void aMissingRequiredFieldIsNamed() {
        assertInvalidField(TestServer.json("{\"crustThicknessKm\": 35}").post(PRESSURE), "depthsKm");
    }

    @Test
    void anOutOfRangeValueNamesTheFieldAndTheAllowedRange() {
        assertInvalidField(TestServer.json("{\"depthsKm\": [31], \"crustThicknessKm\": -5}").post(PRESSURE),
                "crustThicknessKm")
                .body("errors[0].message", containsString("between 0 and 100"));
        assertInvalidField(TestServer.json("{\"depthsKm\": [1e308]}").post(PRESSURE), "depthsKm[0]");
        assertInvalidField(TestServer.json("{\"depthsKm\": [null]}").post(PRESSURE), "depthsKm[0]");
    }

    @Test
    void everyInvalidFieldIsListedAtOnce() {
        assertProblem(TestServer.json("{\"depthsKm\": [-1, 800], \"mantleDensityKgPerM3\": 1}").post(PRESSURE),
                400, "validation")
                .body("errors.field", hasItem("depthsKm[0]"))
                .body("errors.field", hasItem("depthsKm[1]"))
                .body("errors.field", hasItem("mantleDensityKgPerM3"));
    }

    @Test
    void anUnknownRouteIs404() {
        assertProblem(TestServer.given().get("/v1/no-such-thing"), 404, "not-found");
    }

    @Test
    void aWrongMethodIs405() {
        assertProblem(TestServer.given().delete("/v1/health"), 405, "method-not-allowed");
        assertProblem(TestServer.given().get(PRESSURE), 405, "method-not-allowed");
    }

    @Test
    void aWrongContentTypeIs415() {
        assertProblem(TestServer.given().contentType(ContentType.TEXT).body("{\"depthsKm\": [31]}").post(PRESSURE),
                415, "unsupported-media-type");
        assertProblem(TestServer.given().body("{\"depthsKm\": [31]}").post(PRESSURE), 415,
                "unsupported-media-type");
    }

    @Test
    void aBodyOverTheLimitIs413() {
        StringBuilder big = new StringBuilder("{\"depthsKm\": [");
        while (big.length() < Config.defaults().maxBodyBytes() + 10) {
            big.append("1.0,");
        }
        big.append("1.0]}");
        assertProblem(TestServer.json(big.toString()).post(PRESSURE), 413, "body-too-large");
    }

    @Test
    void deepNestingIsRefusedWithA400() {
        String deepArray = "{\"depthsKm\": " + "[".repeat(5000) + "]".repeat(5000) + "}";
        assertInvalidField(TestServer.json(deepArray).post(PRESSURE), "depthsKm[0]");
        String deepObject = "{\"crustThicknessKm\": " + "{\"x\":".repeat(5000) + "1" + "}".repeat(5000) + "}";
        assertInvalidField(TestServer.json(deepObject).post(PRESSURE), "crustThicknessKm");
        String deepGarbage = "[".repeat(5000);
        assertProblem(TestServer.json(deepGarbage).post(PRESSURE), 400, "malformed-json");
    }

    @Test
    void anUnexpectedFailureIsAGeneric500WithTheRequestIdAndNoDetailsLeaked() {
        List<Route> routes = new ArrayList<>(App.routes(Config.defaults()));
        routes.add(Route.get("/v1/boom", ctx -> {
            throw new IllegalStateException("secret internal state 0xDEADBEEF");
        }));
        Javalin app = App.create(TestApps.config(java.util.Map.of()), RequestObserver.NONE, routes).start("127.0.0.1", 0);
        try {
            var r = RestAssured.given().baseUri("http://127.0.0.1").port(app.port())
                    .header("X-Request-Id", "trace-500").get("/v1/boom");
            assertProblem(r, 500, "internal")
                    .body("requestId", equalTo("trace-500"))
                    .body("detail", containsString("trace-500"))
                    .body(not(containsString("DEADBEEF")));
        } finally {
            app.stop();
        }
    }

    @Test
    void aNonFiniteNumberCanNeverReachAResponse() {
        List<Route> routes = new ArrayList<>(App.routes(Config.defaults()));
        routes.add(Route.get("/v1/nan", ctx -> Responses.json(ctx, java.util.Map.of("x", Double.NaN))));
        Javalin app = App.create(TestApps.config(java.util.Map.of()), RequestObserver.NONE, routes).start("127.0.0.1", 0);
        try {
            var r = RestAssured.given().baseUri("http://127.0.0.1").port(app.port()).get("/v1/nan");
            assertProblem(r, 500, "internal").body(not(containsString("NaN")));
        } finally {
            app.stop();
        }
    }
}
