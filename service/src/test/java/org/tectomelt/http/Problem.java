package org.tectomelt.http;

import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.hasItem;
import static org.hamcrest.Matchers.not;
import static org.hamcrest.Matchers.notNullValue;
import static org.hamcrest.Matchers.startsWith;

import io.restassured.response.Response;
import io.restassured.response.ValidatableResponse;

/** Assertions shared by the contract tests for RFC 9457 problem responses. */
public final class Problem {

    private Problem() {
    }

    /** Asserts a problem+json response with {@code status} and {@code type}, and no stack trace. */
    public static ValidatableResponse assertProblem(Response r, int status, String type) {
        return r.then()
                .statusCode(status)
                .contentType(startsWith("application/problem+json"))
                .body("type", equalTo("/problems/" + type))
                .body("status", equalTo(status))
                .body("title", notNullValue())
                .body("detail", notNullValue())
                .body("requestId", notNullValue())
                .body(not(containsString("Exception")))
                .body(not(containsString("\tat ")));
    }

    /** Asserts a 400 validation problem naming {@code field}. */
    public static ValidatableResponse assertInvalidField(Response r, String field) {
        return assertProblem(r, 400, "validation").body("errors.field", hasItem(field));
    }
}
