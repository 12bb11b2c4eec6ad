package org.tectomelt.contract;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import io.javalin.Javalin;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;
import org.tectomelt.http.App;
import org.tectomelt.operations.Operation;
import org.tectomelt.operations.OperationException;

/**
 * Generated from the spec itself: for every numeric request field it bounds ({@code minimum},
 * {@code maximum}) in every operation, the bound is accepted and the nearest double beyond it
 * (an integer field: one beyond) is a 400 naming that field; for an exclusive bound the nearest
 * value inside is accepted and the bound itself refused. Each field is set in the operation's
 * documented example body (objects and lists it lives in are added when the example has none).
 * "Accepted" is judged by the contract itself (no violation naming the field), so no computation
 * runs at the extremes; "refused" over HTTP.
 */
class SpecBoundsContractTest {

    private static final Invoker INVOKER = Invoker.standard();
    private static Javalin app;
    private static HttpClient client;

    @BeforeAll
    static void start() {
        app = App.create(Config.defaults().withPort(0)).start("127.0.0.1", 0);
        client = HttpClient.newHttpClient();
    }

    @AfterAll
    static void stop() {
        app.stop();
    }

    /** One bound of one field. */
    private record Bound(Operation<?, ?> op, List<Object> path, String field, double value, double beyond) {
    }

    @Test
    void everyBoundIsAcceptedAndJustBeyondIsRefusedNamingTheField() throws Exception {
        List<Bound> bounds = new ArrayList<>();
        for (Operation<?, ?> op : INVOKER.operations().list()) {
            JsonNode schema = INVOKER.spec().document().at("/paths/" + op.path().replace("/", "~1")
                    + "/post/requestBody/content/application~1json/schema");
            collect(op, schema, new ArrayList<>(), "", bounds, 0);
        }
        assertTrue(bounds.size() > 100, "the spec bounds many fields: " + bounds.size());
        List<String> failures = new ArrayList<>();
        for (Bound b : bounds) {
            ObjectNode atBound = bodyWith(b, b.value());
            List<String> named = violations(b.op(), atBound);
            if (named.contains(b.field())) {
                failures.add(b.op().name() + " " + b.field() + " = " + b.value() + " refused: " + named);
            }
            String beyond = bodyWith(b, b.beyond()).toString();
            HttpResponse<String> r = client.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + app.port()
                    + b.op().path())).header("Content-Type", "application/json")
                    .POST(HttpRequest.BodyPublishers.ofString(beyond)).build(), HttpResponse.BodyHandlers.ofString());
            JsonNode p = Json.mapper().readTree(r.body());
            List<String> fields = new ArrayList<>();
            p.path("errors").forEach(e -> fields.add(e.path("field").asText()));
            if (r.statusCode() != 400 || !fields.contains(b.field())) {
                failures.add(b.op().name() + " " + b.field() + " = " + b.beyond() + " gave " + r.statusCode() + " "
                        + fields);
            }
        }
        assertEquals(List.of(), failures, bounds.size() + " bounds checked");
    }

    /** The field names of the contract's violations for {@code body} (empty when it passes). */
    private static List<String> violations(Operation<?, ?> op, ObjectNode body) {
        try {
            INVOKER.prepare(op, body);
            return List.of();
        } catch (OperationException e) {
            return e.violations().stream().map(v -> v.field()).toList();
        }
    }

    private static ObjectNode bodyWith(Bound b, double value) {
        ObjectNode body = example(b.op()).deepCopy();
        JsonNode node = body;
        List<Object> path = b.path();
        for (int i = 0; i < path.size() - 1; i++) {
            Object step = path.get(i);
            Object next = path.get(i + 1);
            JsonNode child = step instanceof Integer idx ? node.get(idx) : node.get((String) step);
            if (child == null || child.isNull()) {
                child = next instanceof Integer ? Json.mapper().createArrayNode() : Json.mapper().createObjectNode();
                if (node instanceof ObjectNode o) {
                    o.set((String) step, child);
                } else {
                    ((ArrayNode) node).add(child);
                }
            }
            node = child;
        }
        Object last = path.get(path.size() - 1);
        JsonNode v = Math.rint(value) == value && Math.abs(value) < 1e15 && b.op() != null
                && isInteger(b) ? Json.mapper().getNodeFactory().numberNode((long) value)
                : Json.mapper().getNodeFactory().numberNode(value);
        if (node instanceof ObjectNode o) {
            o.set((String) last, v);
        } else {
            ArrayNode a = (ArrayNode) node;
            if (a.size() == 0) {
                a.add(v);
            } else {
                a.set(0, v);
            }
        }
        return body;
    }

    private static boolean isInteger(Bound b) {
        return b.beyond() - b.value() == 1 || b.value() - b.beyond() == 1;
    }

    private static ObjectNode example(Operation<?, ?> op) {
        JsonNode content = INVOKER.spec().document().at("/paths/" + op.path().replace("/", "~1")
                + "/post/requestBody/content/application~1json");
        JsonNode ex = content.has("example") ? content.get("example")
                : content.path("examples").elements().hasNext() ? content.path("examples").elements().next().get("value")
                : Json.mapper().createObjectNode();
        return (ObjectNode) ex;
    }

    private static JsonNode resolve(JsonNode s) {
        for (int i = 0; s != null && i < 16; i++) {
            if (s.has("$ref")) {
                s = INVOKER.spec().document().at(s.get("$ref").asText().substring(1));
            } else if (s.has("allOf") && s.get("allOf").size() == 1) {
                s = s.get("allOf").get(0);
            } else {
                return s;
            }
        }
        return s;
    }

    private static void collect(Operation<?, ?> op, JsonNode schema, List<Object> path, String field,
                                List<Bound> out, int depth) {
        JsonNode s = resolve(schema);
        if (s == null || depth > 8) {
            return;
        }
        String type = s.path("type").asText();
        if (type.equals("object")) {
            for (Iterator<Map.Entry<String, JsonNode>> it = s.path("properties").fields(); it.hasNext(); ) {
                Map.Entry<String, JsonNode> p = it.next();
                List<Object> next = new ArrayList<>(path);
                next.add(p.getKey());
                collect(op, p.getValue(), next, field.isEmpty() ? p.getKey() : field + "." + p.getKey(), out, depth + 1);
            }
        } else if (type.equals("array")) {
            List<Object> next = new ArrayList<>(path);
            next.add(0);
            collect(op, s.get("items"), next, field + "[0]", out, depth + 1);
        } else if (type.equals("number") || type.equals("integer")) {
            boolean integer = type.equals("integer");
            // an exclusive bound (OpenAPI 3.0's boolean form): the nearest value inside is accepted
            // and the bound itself is refused
            if (s.has("minimum")) {
                double m = s.get("minimum").asDouble();
                if (s.path("exclusiveMinimum").asBoolean(false)) {
                    out.add(new Bound(op, path, field, integer ? m + 1 : Math.nextUp(m), m));
                } else {
                    out.add(new Bound(op, path, field, m, integer ? m - 1 : Math.nextDown(m)));
                }
            }
            if (s.has("maximum")) {
                double m = s.get("maximum").asDouble();
                if (s.path("exclusiveMaximum").asBoolean(false)) {
                    out.add(new Bound(op, path, field, integer ? m - 1 : Math.nextDown(m), m));
                } else {
                    out.add(new Bound(op, path, field, m, integer ? m + 1 : Math.nextUp(m)));
                }
            }
        }
        assertFalse(field.contains("null"), field);
    }
}
