package org.tectomelt.http;

import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.startsWith;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * The page's files as served, and its declarative {@code tools.json} kept true to
 * {@code api-spec/openapi.yaml}: for every tool whose endpoint the spec has, each field the form
 * sends is a property of the request schema, and each summary row, table and plotted key is in
 * the response schema. (The browser itself is exercised by {@link PageBrowserTest}.)
 */
class PageContractTest {

    private static final Path PUBLIC = Path.of("src", "main", "resources", "public");
    private static final ObjectMapper JSON = new ObjectMapper();

    private static JsonNode spec() throws IOException {
        return new ObjectMapper(new YAMLFactory()).readTree(Path.of("..", "api-spec", "openapi.yaml").toFile());
    }

    private static JsonNode tools() throws IOException {
        return JSON.readTree(PUBLIC.resolve("tools.json").toFile());
    }

    @Test
    void theScriptsStylesAndToolDescriptionAreServedWithTheirMediaTypes() {
        TestServer.given().get("/app.js").then().statusCode(200)
                .contentType(containsString("javascript")).body(containsString("tools.json"));
        TestServer.given().get("/plot.js").then().statusCode(200)
                .contentType(containsString("javascript")).body(containsString("export function drawPlot"));
        TestServer.given().get("/style.css").then().statusCode(200).contentType(startsWith("text/css"));
        TestServer.given().get("/tools.json").then().statusCode(200)
                .contentType(startsWith("application/json")).body(containsString("\"tools\""));
        TestServer.given().get("/").then().statusCode(200)
                .body(containsString("<script type=\"module\" src=\"app.js\">"))
                .body(containsString("<script src=\"api.js\"></script>"))
                .body(containsString("id=\"token\""));
    }

    @Test
    void thePageFetchesNothingFromOutsideTheService() throws IOException {
        Pattern external = Pattern.compile("(https?:)?//[A-Za-z0-9.-]+\\.[A-Za-z]{2,}[^\\s\"')]*");
        List<String> found = new ArrayList<>();
        try (Stream<Path> files = Files.list(PUBLIC)) {
            for (Path f : files.toList()) {
                String text = Files.readString(f, StandardCharsets.UTF_8);
                Matcher m = external.matcher(text);
                while (m.find()) {
                    // the SVG namespace is an identifier, never fetched
                    if (!m.group().equals("http://www.w3.org/2000/svg")) {
                        found.add(f.getFileName() + ": " + m.group());
                    }
                }
            }
        }
        assertTrue(found.isEmpty(), "external references in the page: " + found);
    }

    @Test
    void everyToolHasUniqueIdsAndEveryNumericFieldAUnitLabelAndADefault() throws IOException {
        Set<String> ids = new HashSet<>();
        Set<String> groups = new HashSet<>();
        tools().get("groups").forEach(g -> groups.add(g.get("id").asText()));
        for (JsonNode t : tools().get("tools")) {
            String id = t.get("id").asText();
            assertTrue(ids.add(id), "duplicate tool id " + id);
            assertTrue(groups.contains(t.get("group").asText()), id + ": unknown group");
            assertTrue(t.get("endpoint").asText().startsWith("/v1/"), id);
            assertTrue(t.path("scenario").asText().startsWith("Invented scenario"), id + ": defaults come from an invented scenario");
            for (JsonNode f : t.get("fields")) {
                String type = f.get("type").asText();
                assertTrue(List.of("number", "integer", "list", "curve", "select", "lithology").contains(type), id + ": " + type);
                assertFalse(f.path("label").asText().isBlank(), id + "." + f.get("name").asText() + " has no label");
                if (List.of("number", "integer", "list", "curve").contains(type)) {
                    assertFalse(f.path("unit").asText().isBlank(), id + "." + f.get("name").asText() + " has no unit label");
                    assertTrue(f.has("default"), id + "." + f.get("name").asText() + " has no default");
                }
                if (!f.path("send").asBoolean(true)) {
                    assertTrue(f.get("name").asText().startsWith("_"), "page-only field names start with _: " + f);
                }
            }
        }
        assertTrue(ids.containsAll(List.of("ridge", "hotspot", "rift", "subduction", "budget", "sill",
                "geotherm", "melt-fraction", "pressure")), "a form for each setting and tool: " + ids);
    }

    @Test
    void forEveryEndpointInTheSpecTheFormUsesTheSpecsFieldNames() throws IOException {
        JsonNode spec = spec();
        List<String> problems = new ArrayList<>();
        int checked = 0;
        for (JsonNode t : tools().get("tools")) {
            JsonNode op = spec.path("paths").path(t.get("endpoint").asText()).path("post");
            if (op.isMissingNode()) {
                continue; // that endpoint has not landed; the page marks it unavailable
            }
            checked++;
            String id = t.get("id").asText();
            SchemaWalker w = new SchemaWalker(spec);
            JsonNode request = w.resolve(op.at("/requestBody/content/application~1json/schema"));
            JsonNode response = w.resolve(op.at("/responses/200/content/application~1json/schema"));
            for (JsonNode f : t.get("fields")) {
                if (f.path("send").asBoolean(true) && w.at(request, f.get("name").asText()) == null) {
                    problems.add(id + ": request field " + f.get("name").asText() + " is not in the spec");
                }
            }
            for (JsonNode row : t.path("summary")) {
                requireOne(w, response, row.get("path"), id + ": summary row '" + row.get("label").asText() + "'", problems);
            }
            if (t.has("table")) {
                requireArray(w, response, t.get("table"), id + ": table", problems);
            }
            if (t.has("listing")) {
                JsonNode items = requireArray(w, response, t.get("listing").get("data"), id + ": listing", problems);
                for (JsonNode c : t.get("listing").get("columns")) {
                    requireKey(w, items, c.get("key").asText(), id + ": listing column", problems);
                }
            }
            for (JsonNode p : t.path("plots")) {
                String what = id + ": plot '" + p.get("title").asText() + "'";
                if (p.has("seriesFrom")) {
                    JsonNode sf = p.get("seriesFrom");
                    JsonNode each = requireArray(w, response, sf.get("data"), what, problems);
                    JsonNode points = each == null ? null : w.at(each, sf.get("points").asText());
                    if (points == null || !"array".equals(points.path("type").asText())) {
                        problems.add(what + ": " + sf.get("points").asText() + " is not an array in each element");
                    } else {
                        requireKey(w, w.resolve(points.get("items")), sf.get("x").asText(), what, problems);
                        requireKey(w, w.resolve(points.get("items")), p.at("/y/key").asText(), what, problems);
                    }
                }
                if (p.get("data").isEmpty()) {
                    continue;
                }
                JsonNode items = requireArray(w, response, p.get("data"), what, problems);
                String axisKey = p.get("type").asText().equals("depth") ? p.at("/y/key").asText() : p.at("/x/key").asText();
                requireKey(w, items, axisKey, what, problems);
                if (p.has("y2")) {
                    requireKey(w, items, p.at("/y2/key").asText(), what + " second axis", problems);
                }
                for (JsonNode s : p.get("series")) {
                    requireKey(w, items, s.path(p.get("type").asText().equals("depth") ? "x" : "y").asText(), what, problems);
                    if (s.has("where")) {
                        requireKey(w, items, s.get("where").asText(), what, problems);
                    }
                }
                if (p.has("adiabat")) {
                    requireOne(w, response, p.at("/adiabat/below"), what + " adiabat depth", problems);
                }
                for (JsonNode l : p.path("levels")) {
                    if (l.has("response")) {
                        requireOne(w, response, l.get("response"), what + " level", problems);
                    }
                }
            }
        }
        assertTrue(checked >= 1, "the pressure tool at least has its endpoint in the spec");
        assertTrue(problems.isEmpty(), "tools.json (service/src/main/resources/public) disagrees with openapi.yaml:\n  "
                + String.join("\n  ", problems));
    }

    /**
     * A spec boolean is chosen from a select that sends a JSON boolean ({@code valueType: boolean}, options
     * "true" and "false"); a tool's counterpart run (the same request with one case switched, e.g. conduction
     * beside convection) names a field of its form and request fields of the spec.
     */
    @Test
    void booleanFieldsSendBooleansAndCounterpartRunsNameSpecFields() throws IOException {
        JsonNode spec = spec();
        List<String> problems = new ArrayList<>();
        int booleans = 0;
        SchemaWalker w = new SchemaWalker(spec);
        for (JsonNode t : tools().get("tools")) {
            JsonNode request = w.resolve(spec.path("paths").path(t.get("endpoint").asText())
                    .at("/post/requestBody/content/application~1json/schema"));
            if (request == null) {
                continue; // not on this server
            }
            String id = t.get("id").asText();
            Set<String> names = new HashSet<>();
            for (JsonNode f : t.get("fields")) {
                String name = f.get("name").asText();
                names.add(name);
                JsonNode schema = f.path("send").asBoolean(true) ? w.at(request, name) : null;
                boolean specBoolean = schema != null && "boolean".equals(schema.path("type").asText());
                boolean sendsBoolean = "boolean".equals(f.path("valueType").asText());
                if (specBoolean != sendsBoolean) {
                    problems.add(id + "." + name + ": the spec's type is " + (schema == null ? "-" : schema.path("type").asText())
                            + " but the field's valueType is " + f.path("valueType").asText("-"));
                }
                if (sendsBoolean) {
                    booleans++;
                    Set<String> values = new HashSet<>();
                    f.path("options").forEach(o -> values.add(o.get("value").asText()));
                    if (!"select".equals(f.get("type").asText()) || !values.equals(Set.of("true", "false"))) {
                        problems.add(id + "." + name + ": a boolean is a select of \"true\" and \"false\"");
                    }
                }
            }
            JsonNode cp = t.path("counterpart");
            if (cp.isMissingNode()) {
                continue;
            }
            if (!names.contains(cp.at("/when/field").asText())) {
                problems.add(id + ": counterpart condition on an unknown field " + cp.at("/when/field").asText());
            }
            cp.path("set").fieldNames().forEachRemaining(n -> {
                if (w.at(request, n) == null) {
                    problems.add(id + ": counterpart sets " + n + ", not in the spec");
                }
            });
            cp.path("drop").forEach(n -> {
                if (w.at(request, n.asText()) == null) {
                    problems.add(id + ": counterpart drops " + n.asText() + ", not in the spec");
                }
            });
            if (cp.path("label").asText().isBlank()) {
                problems.add(id + ": counterpart without a label");
            }
        }
        assertTrue(booleans >= 2, "the sill form's convection and grid-check choices at least: " + booleans);
        assertTrue(problems.isEmpty(), String.join("\n  ", problems));
    }

    @Test
    void theSchemaWalkerFollowsReferencesAndRejectsUnknownNames() throws IOException {
        SchemaWalker w = new SchemaWalker(spec());
        JsonNode req = w.resolve(JSON.readTree("{\"$ref\": \"#/components/schemas/PressureRequest\"}"));
        assertTrue(w.at(req, "crustThicknessKm") != null);
        assertEquals(null, w.at(req, "crustThickness"));
        JsonNode res = w.resolve(JSON.readTree("{\"$ref\": \"#/components/schemas/PressureResponse\"}"));
        assertEquals("array", w.at(res, "points").path("type").asText());
        assertTrue(w.at(w.at(res, "points").get("items"), "pressureGPa") != null);
        assertEquals(null, w.at(res, "points.nothing"));
        assertTrue(w.at(res, "points.last.pressureGPa") != null, "last steps into an array's items");
        assertEquals(null, w.at(res, "points.last.nothing"));
        assertEquals(null, w.at(req, "crustThicknessKm.last"), "and only into an array");
    }

    private static void requireOne(SchemaWalker w, JsonNode schema, JsonNode paths, String what, List<String> problems) {
        for (JsonNode p : paths) {
            if (w.at(schema, p.asText()) != null) {
                return;
            }
        }
        problems.add(what + ": none of " + paths + " is in the response schema");
    }

    private static JsonNode requireArray(SchemaWalker w, JsonNode schema, JsonNode paths, String what, List<String> problems) {
        for (JsonNode p : paths) {
            JsonNode s = w.at(schema, p.asText());
            if (s != null && "array".equals(s.path("type").asText())) {
                return w.resolve(s.get("items"));
            }
        }
        problems.add(what + ": none of " + paths + " is an array in the response schema");
        return null;
    }

    private static void requireKey(SchemaWalker w, JsonNode items, String key, String what, List<String> problems) {
        if (items != null && w.at(items, key) == null) {
            problems.add(what + ": key " + key + " is not in the array's item schema");
        }
    }

    /** Finds properties by dotted path in an OpenAPI schema, through $ref, allOf, oneOf and anyOf. */
    static final class SchemaWalker {
        private final JsonNode spec;

        SchemaWalker(JsonNode spec) {
            this.spec = spec;
        }

        JsonNode resolve(JsonNode s) {
            int guard = 0;
            while (s != null && s.has("$ref") && guard++ < 20) {
                s = spec.at(s.get("$ref").asText().substring(1));
            }
            return s == null || s.isMissingNode() ? null : s;
        }

        /**
         * The schema of the property at {@code dotted}, or null when the spec has no such property. The page's
         * segment {@code last} (the last element, e.g. {@code column.profile.last.residueWaterWtPct}) steps into
         * the items of an array and nothing else.
         */
        JsonNode at(JsonNode schema, String dotted) {
            JsonNode cur = resolve(schema);
            for (String part : dotted.split("\\.")) {
                if (part.equals("last") && cur != null && "array".equals(cur.path("type").asText())) {
                    cur = resolve(cur.get("items"));
                    continue;
                }
                cur = property(cur, part, 0);
                if (cur == null) {
                    return null;
                }
            }
            return cur;
        }

        private JsonNode property(JsonNode s, String name, int depth) {
            s = resolve(s);
            if (s == null || depth > 10) {
                return null;
            }
            JsonNode p = s.path("properties").get(name);
            if (p != null) {
                return resolve(p);
            }
            for (String combo : List.of("allOf", "oneOf", "anyOf")) {
                for (JsonNode sub : s.path(combo)) {
                    JsonNode found = property(sub, name, depth + 1);
                    if (found != null) {
                        return found;
                    }
                }
            }
            return null;
        }
    }
}
