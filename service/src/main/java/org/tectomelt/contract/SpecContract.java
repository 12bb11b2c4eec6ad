package org.tectomelt.contract;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import com.networknt.schema.Error;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaLocation;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.path.NodePath;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;
import java.util.concurrent.ConcurrentHashMap;
import org.tectomelt.operations.Cap;
import org.tectomelt.operations.Rules;
import org.tectomelt.operations.Violation;

/**
 * The request rules of {@code api-spec/openapi.yaml}, enforced at run time: required fields, JSON
 * types, {@code minimum}/{@code maximum}, {@code enum}, {@code minItems}/{@code maxItems} and
 * unknown fields ({@code additionalProperties: false}) are checked by networknt's JSON Schema
 * validator in the OpenAPI 3.0 dialect ({@code nullable} included), and the spec's
 * {@code default}s are filled in. Nothing of this is written in Java: a range changed in the spec
 * changes what the service accepts.
 *
 * <p>Every error is reported at once, in the API's field form ({@code lithosphere.ageMyr},
 * {@code points[3].temperatureC}) with a message naming the allowed range. A JSON {@code null}
 * for an object member counts as absent, as it always has. A list with a server {@link Cap} is
 * held to the configured length instead of the spec's {@code maxItems} (which documents the
 * default), and the message names the variable.
 *
 * <p>Immutable and thread-safe once built; build one per spec document ({@link #standard()} is
 * the packaged spec).
 */
public final class SpecContract {

    /** Classpath location of the spec, copied byte for byte from {@code api-spec/} by the build. */
    public static final String SPEC_RESOURCE = "/api-spec/openapi.yaml";

    /**
     * The message of a number beyond the range of a double: {@link #check} reports those alone,
     * before the schema is applied, so a body with one has not been held to the schema.
     */
    public static final String BEYOND_DOUBLE = "is invalid: the number is beyond the range of a double (about ±1.8e308)";

    private static final String BASE = "https://tectomelt.invalid/openapi.json";
    private static final ObjectMapper YAML = new ObjectMapper(new YAMLFactory());
    private static volatile SpecContract standard;

    private final JsonNode spec;
    private final SchemaRegistry registry;
    private final Map<String, Schema> schemas = new ConcurrentHashMap<>();
    private final Map<String, JsonNode> requestSchemas = new ConcurrentHashMap<>();
    /** Local references, resolved once: the spec tree is not changed after loading. */
    private final Map<String, JsonNode> refs = new ConcurrentHashMap<>();

    private SpecContract(JsonNode spec) {
        this.spec = spec;
        String json = spec.toString();
        this.registry = SchemaRegistry.withDefaultDialect(QuickBounds.openApi30(spec),
                b -> b.schemas(Map.of(BASE, json)));
    }

    /** The packaged spec (read once). */
    public static SpecContract standard() {
        SpecContract s = standard;
        if (s == null) {
            synchronized (SpecContract.class) {
                s = standard;
                if (s == null) {
                    try (InputStream in = SpecContract.class.getResourceAsStream(SPEC_RESOURCE)) {
                        if (in == null) {
                            throw new IllegalStateException("the build did not package " + SPEC_RESOURCE);
                        }
                        s = fromYaml(in.readAllBytes());
                    } catch (IOException e) {
                        throw new UncheckedIOException(e);
                    }
                    standard = s;
                }
            }
        }
        return s;
    }

    /** A contract from a spec document (YAML or JSON), e.g. a modified copy in a test. */
    public static SpecContract fromYaml(byte[] yaml) {
        try {
            return new SpecContract(YAML.readTree(yaml));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The spec as a tree (read-only by convention). */
    public JsonNode document() {
        return spec;
    }

    /** True when the spec documents a JSON request body for {@code POST path}. */
    public boolean hasRequestBody(String path) {
        return requestSchemaNode(path) != null;
    }

    /**
     * Checks {@code body} against the request schema of {@code POST path}, with the given caps,
     * and fills in the spec's defaults (in place, also into a body that breaks a rule, so an
     * operation can check its own rules on it). A null object member is removed first (absent).
     *
     * @return every violation, in the order found (empty when the body conforms)
     */
    public List<Violation> check(String path, ObjectNode body, List<Cap> caps) {
        List<Violation> out = new ArrayList<>();
        clean(body, new StringBuilder(), out);
        if (!out.isEmpty()) {
            return out;
        }
        applyDefaults(requestSchemaNode(path), body);   // a default is valid, so it is filled in first
        List<Error> errors = schema(path).validate(body);
        for (Error e : errors) {
            String field = field(e);
            if (("maxItems".equals(e.getKeyword()) || "maximum".equals(e.getKeyword())) && capped(field, caps)) {
                continue;   // the server's cap holds instead of the documented default
            }
            out.add(new Violation(field, message(e, field)));
        }
        for (Cap cap : caps) {
            JsonNode value = at(body, cap.field());
            Range r = value == null ? null : range(path, cap.field()).orElse(null);
            if (value != null && value.isArray() && value.size() > cap.limit()) {
                long min = r == null || r.minItems() == null ? 0 : r.minItems();
                out.add(new Violation(cap.field(), "must have between " + min + " and " + Rules.format(cap.limit())
                        + " entries (server cap " + cap.variable() + "), got " + value.size()));
            } else if (value != null && value.isNumber() && value.doubleValue() > cap.limit()) {
                String min = r == null || r.minimum() == null ? "" : "between " + Rules.format(r.minimum()) + " and ";
                out.add(new Violation(cap.field(), "must be " + (min.isEmpty() ? "at most " : min)
                        + Rules.format(cap.limit()) + " (server cap " + cap.variable() + "), got "
                        + Rules.format(value.doubleValue())));
            }
        }
        return out;
    }

    /**
     * Fills the spec's defaults of the request schema of {@code POST path} into {@code body}, in
     * place, without checking it: for a body already checked when it was accepted and stored by an
     * earlier build, whose defaults may not have been filled in.
     */
    public void fillDefaults(String path, ObjectNode body) {
        applyDefaults(requestSchemaNode(path), body);
    }

    /**
     * Reads the query parameters of {@code method path} as the spec documents them (the
     * operation's and the path's {@code parameters}, {@code $ref}s followed): each given value is
     * read as its schema's type ({@code integer}, {@code number}, {@code boolean}, {@code string})
     * and held to the schema ({@code minimum}, {@code maximum}, {@code enum}…); an absent or blank
     * one takes the spec's {@code default}. Parameters the spec does not document are not read.
     *
     * @param method lower-case HTTP method, e.g. {@code get}
     * @param given  the request's query parameters (the first value of each counts)
     */
    public Query query(String method, String path, Map<String, List<String>> given) {
        Map<String, JsonNode> values = new java.util.LinkedHashMap<>();
        List<Violation> out = new ArrayList<>();
        String base = "/paths/" + escape(path);
        for (String at : List.of(base + "/" + method + "/parameters", base + "/parameters")) {
            JsonNode params = spec.at(at);
            for (int i = 0; i < params.size(); i++) {
                String pointer = at + "/" + i;
                JsonNode p = params.get(i);
                if (p.has("$ref") && p.get("$ref").asText().startsWith("#")) {
                    pointer = p.get("$ref").asText().substring(1);
                    p = resolve(p);
                }
                if (p == null || !"query".equals(p.path("in").asText()) || values.containsKey(p.path("name").asText())) {
                    continue;
                }
                String name = p.path("name").asText();
                JsonNode schema = resolve(p.get("schema"));
                List<String> raw = given.get(name);
                String text = raw == null || raw.isEmpty() || raw.get(0).isBlank() ? null : raw.get(0).trim();
                if (text == null) {
                    if (schema != null && schema.has("default")) {
                        values.put(name, schema.get("default"));
                    }
                    continue;
                }
                JsonNode value = typed(text, schema == null ? "string" : schema.path("type").asText("string"));
                if (value == null) {
                    out.add(new Violation(name, "has the wrong type; expected " + describe(schema.path("type").asText())
                            + ", got '" + abbreviate(text) + "'"));
                    continue;
                }
                String schemaPointer = pointer + "/schema";
                for (Error e : schemas.computeIfAbsent("#query " + schemaPointer,
                        k -> registry.getSchema(SchemaLocation.of(BASE + "#" + schemaPointer))).validate(value)) {
                    out.add(new Violation(name, message(e, name)));
                }
                values.put(name, value);
            }
        }
        return new Query(values, out);
    }

    /**
     * Query parameters read by {@link #query}.
     *
     * @param values     parameter → its value as the schema's type (given, or the spec's default)
     * @param violations every parameter that broke its schema, named
     */
    public record Query(Map<String, JsonNode> values, List<Violation> violations) {

        /** The integer value of {@code name}: given, or the spec's default. */
        public long integer(String name) {
            JsonNode v = values.get(name);
            if (v == null) {
                throw new IllegalStateException("the spec gives the query parameter '" + name + "' no default");
            }
            return v.asLong();
        }

        /** The text of {@code name}, or null when it was not given and has no default. */
        public String text(String name) {
            JsonNode v = values.get(name);
            return v == null ? null : v.asText();
        }
    }

    private static JsonNode typed(String text, String type) {
        var f = com.fasterxml.jackson.databind.node.JsonNodeFactory.instance;
        try {
            return switch (type) {
                case "integer" -> f.numberNode(Long.parseLong(text));
                case "number" -> {
                    double d = Double.parseDouble(text);
                    yield Double.isFinite(d) ? f.numberNode(d) : null;
                }
                case "boolean" -> "true".equals(text) ? f.booleanNode(true) : "false".equals(text) ? f.booleanNode(false) : null;
                default -> f.textNode(text);
            };
        } catch (NumberFormatException e) {
            return null;
        }
    }

    /**
     * What the spec says of a request field of {@code POST path} (a dotted path; array items are
     * reached through the list's name, {@code points.temperatureC}).
     */
    public Optional<Range> range(String path, String field) {
        JsonNode s = requestSchemaNode(path);
        for (String part : field.split("\\.")) {
            s = resolve(s);
            while (s != null && "array".equals(s.path("type").asText())) {
                s = resolve(s.get("items"));
            }
            s = s == null ? null : resolve(s.path("properties").get(part));
            if (s == null) {
                return Optional.empty();
            }
        }
        return Optional.of(new Range(number(s, "minimum"), number(s, "maximum"), s.get("default"),
                s.path("type").asText(null), s.path("description").asText(null),
                s.has("minItems") ? s.get("minItems").asLong() : null,
                s.has("maxItems") ? s.get("maxItems").asLong() : null));
    }

    /**
     * What the spec states of one request field.
     *
     * @param minimum     inclusive lower bound, null when none
     * @param maximum     inclusive upper bound, null when none
     * @param defaultValue the spec's default (a JSON value), null when none
     * @param type        the JSON Schema type ({@code number}, {@code integer}, {@code array}…)
     * @param description the spec's description, null when none
     * @param minItems    for a list, the least length; null otherwise
     * @param maxItems    for a list, the documented longest length; null otherwise
     */
    public record Range(Double minimum, Double maximum, JsonNode defaultValue, String type, String description,
                        Long minItems, Long maxItems) {
    }

    // ---------------------------------------------------------------- schema lookup

    private Schema schema(String path) {
        return schemas.computeIfAbsent(path, p -> {
            if (requestSchemaNode(p) == null) {
                throw new IllegalArgumentException("the spec documents no JSON request body for POST " + p);
            }
            return registry.getSchema(SchemaLocation.of(BASE + "#" + requestPointer(p)));
        });
    }

    private static String requestPointer(String path) {
        return "/paths/" + escape(path) + "/post/requestBody/content/application~1json/schema";
    }

    private JsonNode requestSchemaNode(String path) {
        // looked up once per path (every request asks): the spec tree is not changed after loading
        JsonNode n = requestSchemas.computeIfAbsent(path, p -> spec.at(requestPointer(p)));
        return n.isMissingNode() ? null : n;
    }

    /** Follows local {@code $ref}s and a lone {@code allOf}. */
    private JsonNode resolve(JsonNode s) {
        for (int i = 0; s != null && i < 32; i++) {
            JsonNode ref = s.get("$ref");
            if (ref != null && ref.asText().startsWith("#")) {
                s = refs.computeIfAbsent(ref.asText(), r -> spec.at(r.substring(1)));
            } else if (s.has("allOf") && s.get("allOf").size() == 1) {
                s = s.get("allOf").get(0);
            } else {
                return s.isMissingNode() ? null : s;
            }
        }
        return s;
    }

    private static String escape(String s) {
        return s.replace("~", "~0").replace("/", "~1");
    }

    // ---------------------------------------------------------------- defaults and nulls

    private void applyDefaults(JsonNode schema, JsonNode value) {
        JsonNode s = resolve(schema);
        if (s == null || !value.isContainerNode() || !defaultsBelow(s)) {
            return;   // nothing to fill in under this schema (a batch's points, usually): not walked
        }
        if (value instanceof ObjectNode obj) {
            Iterator<Map.Entry<String, JsonNode>> props = s.path("properties").fields();
            while (props.hasNext()) {
                Map.Entry<String, JsonNode> p = props.next();
                JsonNode child = obj.get(p.getKey());
                if (child == null) {
                    JsonNode ps = resolve(p.getValue());
                    if (ps != null && ps.has("default")) {
                        obj.set(p.getKey(), ps.get("default").deepCopy());
                    }
                } else {
                    applyDefaults(p.getValue(), child);
                }
            }
        } else if (value instanceof ArrayNode arr && s.has("items")) {
            for (JsonNode item : arr) {
                applyDefaults(s.get("items"), item);
            }
        }
    }

    /** A schema node by identity (the spec tree is not changed after loading). */
    private record Identity(JsonNode node) {
        @Override
        public boolean equals(Object o) {
            return o instanceof Identity i && i.node == node;
        }

        @Override
        public int hashCode() {
            return System.identityHashCode(node);
        }
    }

    /** Whether a (resolved) schema has a {@code default} in its properties or items, at any depth. */
    private final Map<Identity, Boolean> defaultsBelow = new ConcurrentHashMap<>();

    private boolean defaultsBelow(JsonNode resolved) {
        Boolean known = defaultsBelow.get(new Identity(resolved));
        if (known == null) {
            known = findDefaults(resolved, java.util.Collections.newSetFromMap(new java.util.IdentityHashMap<>()));
            defaultsBelow.put(new Identity(resolved), known);
        }
        return known;
    }

    private boolean findDefaults(JsonNode s, Set<JsonNode> seen) {
        if (s == null || !seen.add(s)) {
            return false;
        }
        for (Iterator<JsonNode> it = s.path("properties").elements(); it.hasNext(); ) {
            JsonNode p = resolve(it.next());
            if (p != null && (p.has("default") || findDefaults(p, seen))) {
                return true;
            }
        }
        return s.has("items") && findDefaults(resolve(s.get("items")), seen);
    }

    /**
     * Removes null members (absent) and reports numbers beyond the range of a double (the parser
     * makes them infinite), naming the field.
     */
    private static void clean(JsonNode node, StringBuilder path, List<Violation> out) {
        int mark = path.length();
        if (node instanceof ObjectNode obj) {
            Iterator<Map.Entry<String, JsonNode>> it = obj.fields();
            while (it.hasNext()) {
                Map.Entry<String, JsonNode> e = it.next();
                JsonNode v = e.getValue();
                if (v.isNull()) {
                    it.remove();
                } else if (v.isContainerNode() || v.isNumber()) {
                    path.append(mark == 0 ? "" : ".").append(e.getKey());
                    clean(v, path, out);
                    path.setLength(mark);
                }
            }
        } else if (node instanceof ArrayNode arr) {
            for (int i = 0; i < arr.size(); i++) {
                JsonNode item = arr.get(i);
                if (item.isContainerNode() || item.isNumber()) {
                    path.append('[').append(i).append(']');
                    clean(item, path, out);
                    path.setLength(mark);
                }
            }
        } else if (node.isFloatingPointNumber() && !Double.isFinite(node.doubleValue())) {
            out.add(new Violation(path.toString(), BEYOND_DOUBLE));
        }
    }

    // ---------------------------------------------------------------- errors → violations

    private static boolean capped(String field, List<Cap> caps) {
        for (Cap c : caps) {
            if (c.field().equals(field)) {
                return true;
            }
        }
        return false;
    }

    private static JsonNode at(JsonNode body, String dotted) {
        JsonNode n = body;
        for (String part : dotted.split("\\.")) {
            n = n == null ? null : n.get(part);
        }
        return n;
    }

    /** The API form of the error's instance path, with the missing or unknown member appended. */
    private static String field(Error e) {
        StringBuilder sb = new StringBuilder();
        NodePath p = e.getInstanceLocation();
        for (int i = 0; i < p.getNameCount(); i++) {
            Object el = p.getElement(i);
            if (el instanceof Integer index) {
                sb.append('[').append(index).append(']');
            } else {
                if (sb.length() > 0) {
                    sb.append('.');
                }
                sb.append(el);
            }
        }
        String k = e.getKeyword();
        if (("required".equals(k) || "additionalProperties".equals(k)) && e.getProperty() != null) {
            if (sb.length() > 0) {
                sb.append('.');
            }
            sb.append(e.getProperty());
        }
        return sb.toString();
    }

    /** The schema object holding the failed keyword. */
    private JsonNode owner(Error e) {
        NodePath f = e.getSchemaLocation().getFragment();
        StringBuilder pointer = new StringBuilder();
        for (int i = 0; i < f.getNameCount() - 1; i++) {
            pointer.append('/').append(escape(String.valueOf(f.getElement(i))));
        }
        JsonNode n = spec.at(pointer.toString());
        return n.isMissingNode() ? null : n;
    }

    private String message(Error e, String field) {
        JsonNode owner = owner(e);
        JsonNode got = e.getInstanceNode();
        switch (e.getKeyword()) {
            case "minimum", "maximum" -> {
                return bounds(owner) + ", got " + (got == null ? "?" : format(got));
            }
            case "required" -> {
                JsonNode ps = owner == null ? null : resolve(owner.path("properties").get(e.getProperty()));
                String range = ps != null && (ps.has("minimum") || ps.has("maximum"))
                        ? " (allowed range " + number(ps, "minimum", "…") + " and " + number(ps, "maximum", "…") + ")"
                        : "";
                return "is required" + range;
            }
            case "additionalProperties" -> {
                TreeSet<String> known = new TreeSet<>();
                if (owner != null) {
                    owner.path("properties").fieldNames().forEachRemaining(known::add);
                }
                return "is not a known field here; known fields: " + known;
            }
            case "type" -> {
                return "has the wrong JSON type; expected " + describe(owner == null ? null : owner.path("type").asText());
            }
            case "enum" -> {
                List<String> allowed = new ArrayList<>();
                if (owner != null) {
                    owner.path("enum").forEach(v -> allowed.add(v.asText()));
                }
                return "must be one of " + allowed + ", got " + (got == null ? "?" : got.isTextual()
                        ? "'" + abbreviate(got.asText()) + "'" : abbreviate(got.toString()));
            }
            case "minProperties", "maxProperties" -> {
                List<String> names = new ArrayList<>();
                if (owner != null) {
                    owner.path("properties").fieldNames().forEachRemaining(n -> names.add(field.isEmpty() ? n
                            : field + "." + n));
                }
                String choices = names.size() < 2 ? String.join("", names)
                        : String.join(", ", names.subList(0, names.size() - 1)) + " or " + names.get(names.size() - 1);
                long min = owner == null ? 0 : owner.path("minProperties").asLong(0);
                long max = owner == null ? Long.MAX_VALUE : owner.path("maxProperties").asLong(Long.MAX_VALUE);
                if (names.isEmpty()) {
                    return max == Long.MAX_VALUE ? "must have at least " + min + " members"
                            : "must have between " + min + " and " + max + " members";
                }
                return min == 1 && max == 1 ? "give exactly one of " + choices
                        : "must have between " + min + " and " + max + " of " + choices;
            }
            case "minItems", "maxItems" -> {
                long min = owner != null && owner.has("minItems") ? owner.get("minItems").asLong() : 0;
                String max = owner != null && owner.has("maxItems") ? owner.get("maxItems").asText() : null;
                int n = got == null ? 0 : got.size();
                return max == null ? "must have at least " + min + " entries, got " + n
                        : "must have between " + min + " and " + max + " entries, got " + n;
            }
            default -> {
                String m = e.getMessage();
                int colon = m == null ? -1 : m.indexOf(": ");
                return colon >= 0 && colon < m.length() - 2 ? m.substring(colon + 2) : String.valueOf(m);
            }
        }
    }

    private static String bounds(JsonNode s) {
        boolean lo = s != null && s.has("minimum");
        boolean hi = s != null && s.has("maximum");
        if (lo && hi) {
            return "must be between " + number(s, "minimum", "") + " and " + number(s, "maximum", "");
        }
        return lo ? "must be at least " + number(s, "minimum", "") : "must be at most " + number(s, "maximum", "");
    }

    private static Double number(JsonNode s, String key) {
        return s.has(key) && s.get(key).isNumber() ? s.get(key).asDouble() : null;
    }

    private static String number(JsonNode s, String key, String absent) {
        Double d = number(s, key);
        return d == null ? absent : Rules.format(d);
    }

    private static String format(JsonNode n) {
        return n.isNumber() ? Rules.format(n.asDouble()) : abbreviate(n.toString());
    }

    private static String describe(String type) {
        if (type == null) {
            return "another type";
        }
        return switch (type) {
            case "number" -> "a number";
            case "integer" -> "an integer";
            case "boolean" -> "true or false";
            case "string" -> "a string";
            case "array" -> "an array";
            case "object" -> "an object";
            default -> type;
        };
    }

    private static String abbreviate(String s) {
        return s.length() <= 40 ? s : s.substring(0, 40) + "…";
    }
}
