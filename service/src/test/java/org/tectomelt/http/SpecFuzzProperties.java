package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import com.fasterxml.jackson.core.StreamReadConstraints;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.json.JsonMapper;
import io.javalin.Javalin;
import java.math.BigDecimal;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.function.Function;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.statistics.Statistics;
import net.jqwik.api.lifecycle.AfterContainer;
import net.jqwik.api.lifecycle.BeforeContainer;
import org.tectomelt.http.BodyArbitraries.Mutation;
import org.tectomelt.http.SpecOperations.Operation;

/**
 * Property-based fuzzing of every POST operation in {@code api-spec/openapi.yaml}: bodies are
 * generated from each request schema and then broken in the ways real callers break them. Each
 * try sends one body to every operation, so each endpoint gets the same number of tries however
 * many endpoints there are, and a new endpoint is covered as soon as its schema is in the spec.
 *
 * <p>For every answer: never a 5xx; a 200 is JSON whose numbers are all finite (no NaN, no
 * Infinity, nothing beyond ±1.8e308); every 4xx is RFC 9457 problem+json whose {@code status}
 * matches, without a stack trace, and a {@code validation} problem names the fields at fault. A
 * body with exactly one value of the wrong JSON type (or one unknown field) must be a 400 naming
 * that field.
 */
class SpecFuzzProperties {

    private static final int TRIES = 150;
    private static final List<Operation> OPERATIONS = SpecOperations.posts();
    private static final JsonMapper STRICT = JsonMapper.builder()
            .enable(DeserializationFeature.USE_BIG_DECIMAL_FOR_FLOATS)
            .enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS)
            .build();
    private static final BigDecimal LARGEST = new BigDecimal(Double.MAX_VALUE);

    private static Javalin app;
    private static HttpClient client;

    static {
        STRICT.getFactory().setStreamReadConstraints(StreamReadConstraints.builder()
                .maxNumberLength(10_000).build());
    }

    /** One body for one operation. */
    record Case(Operation op, Mutation mutation) {
        @Override
        public String toString() {
            String body = new String(mutation.body(), StandardCharsets.UTF_8);
            return op + " [" + mutation.what() + "] " + (body.length() > 400 ? body.substring(0, 400) + "…" : body);
        }
    }

    @BeforeContainer
    static void start() {
        app = App.create(TestApps.config(java.util.Map.of())).start("127.0.0.1", 0);
        client = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1)
                .connectTimeout(Duration.ofSeconds(10)).build();
    }

    @AfterContainer
    static void stop() {
        app.stop();
    }

    // ---------------------------------------------------------------- properties

    @Property(tries = TRIES)
    void bodiesThatFollowTheSchemaAreAnsweredOrRefusedCleanly(@ForAll("conforming") List<Case> cases) {
        for (Case c : cases) {
            check(c);
        }
    }

    @Property(tries = TRIES)
    void oneValueOfTheWrongTypeIsA400NamingThatField(@ForAll("wrongType") List<Case> cases) {
        for (Case c : cases) {
            JsonNode problem = check(c);
            if (c.mutation().brokenField() == null) {
                continue;
            }
            assertTrue(problem != null && problem.path("status").asInt() == 400, "not a 400: " + c);
            assertEquals("/problems/validation", problem.path("type").asText(), c.toString());
            List<String> fields = new ArrayList<>();
            problem.path("errors").forEach(e -> fields.add(e.path("field").asText()));
            assertTrue(fields.contains(c.mutation().brokenField()),
                    "expected " + c.mutation().brokenField() + " among " + fields + " for " + c);
        }
    }

    @Property(tries = TRIES)
    void numericEdgeCasesNullsAndOversizedArraysNeverBreakTheService(@ForAll("edgeCases") List<Case> cases) {
        for (Case c : cases) {
            check(c);
        }
    }

    @Property(tries = TRIES)
    void bodiesThatAreNotTheSchemaAtAllAreRefusedCleanly(@ForAll("garbage") List<Case> cases) {
        for (Case c : cases) {
            JsonNode problem = check(c);
            Statistics.label("status").collect(problem == null ? 200 : problem.path("status").asInt());
        }
    }

    // ---------------------------------------------------------------- generators: one case per operation

    @Provide
    Arbitrary<List<Case>> conforming() {
        return perOperation(op -> BodyArbitraries.conforming(op.schema())
                .map(b -> Mutation.of(b, null, "follows the schema")));
    }

    @Provide
    Arbitrary<List<Case>> wrongType() {
        return perOperation(op -> BodyArbitraries.conforming(op.schema())
                .flatMap(b -> BodyArbitraries.oneWrongType(b, op.schema())));
    }

    @Provide
    Arbitrary<List<Case>> edgeCases() {
        return perOperation(op -> BodyArbitraries.conforming(op.schema())
                .flatMap(b -> BodyArbitraries.edgeCases(b, op.schema())));
    }

    @Provide
    Arbitrary<List<Case>> garbage() {
        return perOperation(op -> BodyArbitraries.garbage(op.schema()));
    }

    private static Arbitrary<List<Case>> perOperation(Function<Operation, Arbitrary<Mutation>> bodies) {
        assertFalse(OPERATIONS.isEmpty(), "the spec has POST operations");
        List<Arbitrary<Case>> each = new ArrayList<>();
        for (Operation op : OPERATIONS) {
            each.add(bodies.apply(op).map(m -> new Case(op, m)));
        }
        return Combinators.combine(each).as(list -> list);
    }

    // ---------------------------------------------------------------- the invariants

    /** The body-size cap of the app under test (its configuration has no override). */
    private static final long MAX_BODY_BYTES = TestApps.config(java.util.Map.of()).maxBodyBytes();

    private static void assertServerAlive(Case c) {
        try {
            HttpResponse<String> h = client.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + app.port()
                    + "/v1/health")).timeout(Duration.ofSeconds(30)).GET().build(), HttpResponse.BodyHandlers.ofString());
            assertEquals(200, h.statusCode(), "health after an oversized body");
        } catch (Exception e) {
            throw new AssertionError("the server did not answer after an oversized body: " + e + " for " + c, e);
        }
    }

    /** Sends {@code c} and checks the invariants; returns the problem body for a 4xx, null for a 200. */
    private static JsonNode check(Case c) {
        HttpResponse<byte[]> r;
        try {
            r = client.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + app.port()
                            + AccessControlContractTest.concrete(c.op().path())))
                            .timeout(Duration.ofSeconds(60))
                            .header("Content-Type", "application/json")
                            .POST(HttpRequest.BodyPublishers.ofByteArray(c.mutation().body())).build(),
                    HttpResponse.BodyHandlers.ofByteArray());
        } catch (Exception e) {
            if (c.mutation().body().length > MAX_BODY_BYTES) {
                // Over the body cap the server answers 413 as soon as it sees Content-Length and
                // closes the connection without reading the rest, so a client still writing may
                // see a broken pipe instead of the 413. What matters is that the server lives on.
                assertServerAlive(c);
                return null;
            }
            throw new AssertionError("request failed: " + e + " for " + c, e);
        }
        int status = r.statusCode();
        String contentType = r.headers().firstValue("Content-Type").orElse("");
        String text = new String(r.body(), StandardCharsets.UTF_8);
        if (status >= 500) {
            fail("5xx (" + status + ") " + text + " for " + c);
        }
        if (status == 200) {
            assertTrue(contentType.startsWith("application/json"), "200 without JSON for " + c);
            assertAllNumbersFinite(text, c);
            return null;
        }
        assertTrue(status >= 400 && status < 500, "unexpected status " + status + " for " + c);
        assertTrue(contentType.startsWith("application/problem+json"), "a " + status + " without problem+json for " + c);
        JsonNode p;
        try {
            p = STRICT.readTree(text);
        } catch (Exception e) {
            throw new AssertionError("problem body is not JSON: " + text + " for " + c, e);
        }
        assertTrue(p.path("type").asText().startsWith("/problems/"), "type " + text);
        assertEquals(status, p.path("status").asInt(), "status field " + text);
        assertFalse(p.path("title").asText().isBlank(), "title " + text);
        assertFalse(p.path("detail").asText().isBlank(), "detail " + text);
        assertFalse(p.path("requestId").asText().isBlank(), "requestId " + text);
        assertFalse(text.contains("Exception") || text.contains("\tat "), "leaks internals: " + text);
        if (p.path("type").asText().equals("/problems/validation")) {
            assertTrue(p.path("errors").isArray() && p.path("errors").size() > 0, "no fields named: " + text);
            for (JsonNode e : p.path("errors")) {
                assertFalse(e.path("field").asText().isBlank(), "blank field in " + text + " for " + c);
                assertFalse(e.path("message").asText().isBlank(), "blank message in " + text);
            }
        }
        return p;
    }

    private static void assertAllNumbersFinite(String json, Case c) {
        JsonNode tree;
        try {
            tree = STRICT.readTree(json);   // NaN and Infinity tokens are not JSON: refused here
        } catch (Exception e) {
            throw new AssertionError("200 body is not strict JSON: " + e.getMessage() + " for " + c, e);
        }
        List<JsonNode> stack = new ArrayList<>(List.of(tree));
        while (!stack.isEmpty()) {
            JsonNode n = stack.remove(stack.size() - 1);
            if (n.isNumber()) {
                assertTrue(n.decimalValue().abs().compareTo(LARGEST) <= 0, "non-finite number " + n + " for " + c);
            }
            n.forEach(stack::add);
        }
    }
}
