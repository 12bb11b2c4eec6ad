package org.tectomelt.http;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.BigIntegerNode;
import com.fasterxml.jackson.databind.node.BooleanNode;
import com.fasterxml.jackson.databind.node.DecimalNode;
import com.fasterxml.jackson.databind.node.DoubleNode;
import com.fasterxml.jackson.databind.node.IntNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.LongNode;
import com.fasterxml.jackson.databind.node.NullNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.databind.node.TextNode;
import java.math.BigDecimal;
import java.math.BigInteger;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.Set;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;

/**
 * Request bodies generated from an OpenAPI schema, and mutations of them, for the property-based
 * fuzz tests. Everything is derived from the spec, so a new endpoint is covered as soon as its
 * schema is written.
 */
final class BodyArbitraries {

    private static final JsonNodeFactory F = JsonNodeFactory.instance;
    private static final int MAX_DEPTH = 6;

    /** Where a value sits in a body: field names and array indices from the root. */
    record Slot(List<Object> location, String type, JsonNode schema) {

        /** The path as the service names fields: {@code lithosphere.ageMyr}, {@code points[3].depthKm}. */
        String path() {
            StringBuilder sb = new StringBuilder();
            for (Object segment : location) {
                if (segment instanceof Integer i) {
                    sb.append('[').append(i).append(']');
                } else {
                    if (sb.length() > 0) {
                        sb.append('.');
                    }
                    sb.append(segment);
                }
            }
            return sb.toString();
        }
    }

    /** A body to send, with the field a targeted mutation broke (null when none is singled out). */
    record Mutation(byte[] body, String brokenField, String what) {
        static Mutation of(JsonNode body, String brokenField, String what) {
            return new Mutation(body.toString().getBytes(StandardCharsets.UTF_8), brokenField, what);
        }
    }

    private BodyArbitraries() {
    }

    // ---------------------------------------------------------------- bodies that follow the schema

    /** Bodies that follow {@code schema}: types, required fields, ranges, array lengths, enums. */
    static Arbitrary<JsonNode> conforming(JsonNode schema) {
        return conforming(schema, 0);
    }

    private static Arbitrary<JsonNode> conforming(JsonNode schema, int depth) {
        JsonNode s = SpecOperations.resolve(schema);
        if (s.has("enum")) {
            List<JsonNode> values = new ArrayList<>();
            s.get("enum").forEach(values::add);
            return Arbitraries.of(values);
        }
        for (String choice : List.of("oneOf", "anyOf")) {
            if (s.has(choice)) {
                List<Arbitrary<JsonNode>> branches = new ArrayList<>();
                s.get(choice).forEach(b -> branches.add(conforming(b, depth + 1)));
                return Arbitraries.oneOf(branches);
            }
        }
        if (s.has("allOf")) {
            return conforming(mergeAllOf(s), depth + 1);
        }
        String type = typeOf(s);
        if (type == null || depth > MAX_DEPTH) {
            return Arbitraries.just(F.objectNode());
        }
        return switch (type) {
            case "object" -> object(s, depth);
            case "array" -> {
                int min = s.path("minItems").asInt(0);
                int max = Math.min(s.path("maxItems").asInt(Integer.MAX_VALUE), min + 8);
                Arbitrary<JsonNode> items = s.has("items") ? conforming(s.get("items"), depth + 1)
                        : Arbitraries.just(IntNode.valueOf(1));
                yield items.list().ofMinSize(min).ofMaxSize(Math.max(min, max)).map(list -> {
                    ArrayNode a = F.arrayNode();
                    list.forEach(a::add);
                    return a;
                });
            }
            case "number" -> {
                double min = s.path("minimum").asDouble(-1e6);
                double max = s.path("maximum").asDouble(1e6);
                Arbitrary<JsonNode> inRange = Arbitraries.doubles().between(min, max).ofScale(10).map(DoubleNode::valueOf);
                yield s.has("default") ? Arbitraries.frequencyOf(
                        net.jqwik.api.Tuple.of(9, inRange), net.jqwik.api.Tuple.of(1, Arbitraries.just(s.get("default"))))
                        : inRange;
            }
            case "integer" -> {
                long min = Math.max(Integer.MIN_VALUE, s.path("minimum").asLong(-1_000_000));
                long max = Math.min(Integer.MAX_VALUE, s.path("maximum").asLong(1_000_000));
                yield Arbitraries.longs().between(min, max).map(v -> (JsonNode) IntNode.valueOf(v.intValue()));
            }
            case "string" -> Arbitraries.strings().alpha().numeric().withChars('-', '_', ' ')
                    .ofMinLength(s.path("minLength").asInt(0)).ofMaxLength(16).map(TextNode::valueOf);
            case "boolean" -> Arbitraries.of(BooleanNode.TRUE, BooleanNode.FALSE);
            default -> Arbitraries.just(F.objectNode());
        };
    }

    private static Arbitrary<JsonNode> object(JsonNode s, int depth) {
        JsonNode props = s.path("properties");
        Set<String> required = new HashSet<>();
        s.path("required").forEach(r -> required.add(r.asText()));
        List<String> names = new ArrayList<>();
        List<Arbitrary<JsonNode>> values = new ArrayList<>();
        for (Iterator<Map.Entry<String, JsonNode>> it = props.fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> p = it.next();
            names.add(p.getKey());
            Arbitrary<JsonNode> v = conforming(p.getValue(), depth + 1);
            // an absent optional field is represented by null here and left out of the object
            values.add(required.contains(p.getKey()) ? v : v.injectNull(0.4));
        }
        if (names.isEmpty()) {
            return Arbitraries.just(F.objectNode());
        }
        return Combinators.combine(values).as(vs -> {
            ObjectNode o = F.objectNode();
            for (int i = 0; i < names.size(); i++) {
                if (vs.get(i) != null) {
                    o.set(names.get(i), vs.get(i));
                }
            }
            return o;
        });
    }

    private static JsonNode mergeAllOf(JsonNode s) {
        ObjectNode merged = F.objectNode();
        merged.put("type", "object");
        ObjectNode props = merged.putObject("properties");
        ArrayNode required = merged.putArray("required");
        for (JsonNode part : s.get("allOf")) {
            JsonNode p = SpecOperations.resolve(part);
            p.path("properties").fields().forEachRemaining(e -> props.set(e.getKey(), e.getValue()));
            p.path("required").forEach(required::add);
        }
        return merged;
    }

    /** The JSON type a schema asks for, or null when it does not say (oneOf without a type, free form). */
    static String typeOf(JsonNode schema) {
        JsonNode s = SpecOperations.resolve(schema);
        if (s.has("type")) {
            return s.get("type").asText();
        }
        if (s.has("properties")) {
            return "object";
        }
        if (s.has("items")) {
            return "array";
        }
        return null;
    }

    /** Every value in {@code body} whose schema names its type, the root object included. */
    static List<Slot> slots(JsonNode body, JsonNode schema) {
        List<Slot> out = new ArrayList<>();
        collect(body, schema, new ArrayList<>(), out);
        return out;
    }

    private static void collect(JsonNode node, JsonNode schema, List<Object> location, List<Slot> out) {
        JsonNode s = SpecOperations.resolve(schema);
        String type = typeOf(s);
        if (type == null) {
            return;
        }
        out.add(new Slot(List.copyOf(location), type, s));
        if (type.equals("object") && node.isObject()) {
            for (Iterator<Map.Entry<String, JsonNode>> it = node.fields(); it.hasNext(); ) {
                Map.Entry<String, JsonNode> e = it.next();
                JsonNode child = s.path("properties").path(e.getKey());
                if (!child.isMissingNode()) {
                    location.add(e.getKey());
                    collect(e.getValue(), child, location, out);
                    location.remove(location.size() - 1);
                }
            }
        } else if (type.equals("array") && node.isArray() && s.has("items")) {
            for (int i = 0; i < node.size(); i++) {
                location.add(i);
                collect(node.get(i), s.get("items"), location, out);
                location.remove(location.size() - 1);
            }
        }
    }

    /** A copy of {@code body} with the value at {@code location} replaced (the root when empty). */
    static JsonNode replace(JsonNode body, List<Object> location, JsonNode value) {
        if (location.isEmpty()) {
            return value;
        }
        JsonNode copy = body.deepCopy();
        JsonNode parent = copy;
        for (int i = 0; i < location.size() - 1; i++) {
            Object seg = location.get(i);
            parent = seg instanceof Integer idx ? parent.get(idx) : parent.get((String) seg);
        }
        Object last = location.get(location.size() - 1);
        if (last instanceof Integer idx) {
            ((ArrayNode) parent).set(idx, value);
        } else {
            ((ObjectNode) parent).set((String) last, value);
        }
        return copy;
    }

    private static JsonNode at(JsonNode body, List<Object> location) {
        JsonNode n = body;
        for (Object seg : location) {
            n = seg instanceof Integer idx ? n.get(idx) : n.get((String) seg);
        }
        return n;
    }

    // ---------------------------------------------------------------- one wrong type, named back

    /**
     * One value replaced by one of another JSON type (a string where a number belongs, an object
     * where an array belongs…), or one unknown field added to a closed object. The service must
     * answer 400 naming exactly that field.
     */
    static Arbitrary<Mutation> oneWrongType(JsonNode body, JsonNode schema) {
        List<Arbitrary<Mutation>> choices = new ArrayList<>();
        for (Slot slot : slots(body, schema)) {
            if (slot.location().isEmpty()) {
                continue;
            }
            List<JsonNode> wrong = wrongValues(slot.type());
            choices.add(Arbitraries.of(wrong).map(w -> Mutation.of(replace(body, slot.location(), w), slot.path(),
                    slot.type() + " replaced by " + w)));
        }
        for (Slot slot : slots(body, schema)) {
            JsonNode extra = slot.schema().path("additionalProperties");
            if (slot.type().equals("object") && extra.isBoolean() && !extra.asBoolean()
                    && at(body, slot.location()).isObject()) {
                choices.add(Arbitraries.of("zzUnknownKm", "temperature", "depthkm").map(name -> {
                    ObjectNode target = (ObjectNode) at(body, slot.location()).deepCopy();
                    target.put(name, 1.0);
                    String prefix = slot.path();
                    return Mutation.of(replace(body, slot.location(), target),
                            prefix.isEmpty() ? name : prefix + "." + name, "unknown field " + name);
                }));
            }
        }
        return choices.isEmpty() ? Arbitraries.just(Mutation.of(body, null, "nothing to mutate"))
                : Arbitraries.oneOf(choices);
    }

    private static List<JsonNode> wrongValues(String type) {
        return switch (type) {
            case "number" -> List.of(TextNode.valueOf("12.5"), TextNode.valueOf("NaN"), BooleanNode.TRUE,
                    F.objectNode(), F.arrayNode().add(1));
            case "integer" -> List.of(TextNode.valueOf("3"), DoubleNode.valueOf(1.5), BooleanNode.FALSE,
                    F.arrayNode());
            case "string" -> List.of(IntNode.valueOf(7), BooleanNode.FALSE, F.arrayNode().add("x"), F.objectNode());
            case "boolean" -> List.of(TextNode.valueOf("true"), F.arrayNode(), F.objectNode());
            case "array" -> List.of(IntNode.valueOf(3), TextNode.valueOf("1,2"), F.objectNode().put("a", 1));
            case "object" -> List.of(F.arrayNode(), IntNode.valueOf(3), TextNode.valueOf("{}"));
            default -> List.of(F.objectNode());
        };
    }

    // ---------------------------------------------------------------- numeric edge cases, nulls, sizes

    private static final List<JsonNode> EDGE_NUMBERS = List.of(
            DoubleNode.valueOf(1e308), DoubleNode.valueOf(-1e308), DoubleNode.valueOf(Double.MAX_VALUE),
            DoubleNode.valueOf(Double.MIN_VALUE), DoubleNode.valueOf(-0.0), IntNode.valueOf(0), IntNode.valueOf(-1),
            DoubleNode.valueOf(1e-308), DoubleNode.valueOf(1e16), LongNode.valueOf(9_007_199_254_740_993L),
            LongNode.valueOf(Long.MIN_VALUE), DecimalNode.valueOf(new BigDecimal("1e400")),
            DecimalNode.valueOf(new BigDecimal("-1e400")), DecimalNode.valueOf(new BigDecimal("1e-400")),
            BigIntegerNode.valueOf(new BigInteger("123456789012345678901234567890")),
            IntNode.valueOf(Integer.MAX_VALUE), IntNode.valueOf(Integer.MIN_VALUE), NullNode.getInstance());

    /**
     * One to three values replaced by numeric edge cases (±1e308, -0, subnormals, 1e400, huge
     * integers, the range limits nudged outward) or null, or one array resized: emptied, or grown
     * past its {@code maxItems}.
     */
    static Arbitrary<Mutation> edgeCases(JsonNode body, JsonNode schema) {
        List<Slot> numbers = new ArrayList<>();
        List<Slot> arrays = new ArrayList<>();
        List<Slot> any = new ArrayList<>();
        for (Slot slot : slots(body, schema)) {
            if (slot.location().isEmpty()) {
                continue;
            }
            any.add(slot);
            switch (slot.type()) {
                case "number", "integer" -> numbers.add(slot);
                case "array" -> arrays.add(slot);
                default -> { }
            }
        }
        List<Arbitrary<Mutation>> choices = new ArrayList<>();
        if (!numbers.isEmpty()) {
            choices.add(Arbitraries.of(numbers).list().ofMinSize(1).ofMaxSize(3)
                    .flatMap(picked -> Arbitraries.of(edgesFor(picked.get(0))).list().ofSize(picked.size())
                            .map(values -> {
                                JsonNode b = body;
                                StringBuilder what = new StringBuilder("edge numbers:");
                                for (int i = 0; i < picked.size(); i++) {
                                    b = replace(b, picked.get(i).location(), values.get(i));
                                    what.append(' ').append(picked.get(i).path()).append('=').append(values.get(i));
                                }
                                return Mutation.of(b, null, what.toString());
                            })));
        }
        if (!arrays.isEmpty()) {
            choices.add(Arbitraries.of(arrays).flatMap(slot -> {
                JsonNode current = at(body, slot.location());
                JsonNode element = current.size() > 0 ? current.get(0) : IntNode.valueOf(1);
                int max = slot.schema().path("maxItems").asInt(1000);
                return Arbitraries.of(0, max + 1, Math.min(2 * max + 7, 60_000)).map(size -> {
                    ArrayNode a = F.arrayNode();
                    for (int i = 0; i < size; i++) {
                        a.add(element.deepCopy());
                    }
                    return Mutation.of(replace(body, slot.location(), a), null,
                            "array " + slot.path() + " resized to " + size);
                });
            }));
        }
        if (!any.isEmpty()) {
            choices.add(Arbitraries.of(any).map(slot -> Mutation.of(replace(body, slot.location(),
                    NullNode.getInstance()), null, "null at " + slot.path())));
        }
        return choices.isEmpty() ? Arbitraries.just(Mutation.of(body, null, "no numbers")) : Arbitraries.oneOf(choices);
    }

    private static List<JsonNode> edgesFor(Slot slot) {
        List<JsonNode> edges = new ArrayList<>(EDGE_NUMBERS);
        JsonNode s = slot.schema();
        if (s.has("minimum")) {
            double min = s.get("minimum").asDouble();
            edges.add(DoubleNode.valueOf(min));
            edges.add(DoubleNode.valueOf(Math.nextDown(min)));
            edges.add(DoubleNode.valueOf(min - 1));
        }
        if (s.has("maximum")) {
            double max = s.get("maximum").asDouble();
            edges.add(DoubleNode.valueOf(max));
            edges.add(DoubleNode.valueOf(Math.nextUp(max)));
            edges.add(DoubleNode.valueOf(max + 1));
        }
        return edges;
    }

    // ---------------------------------------------------------------- bodies that are not the schema at all

    /**
     * Bytes that are not a body of this schema: random JSON trees using the schema's field names,
     * deep nesting inside a real field, truncated bodies, duplicate keys, JSON scalars and arrays
     * at the top, invalid UTF-8, nothing at all.
     */
    static Arbitrary<Mutation> garbage(JsonNode schema) {
        List<String> names = new ArrayList<>();
        SpecOperations.resolve(schema).path("properties").fieldNames().forEachRemaining(names::add);
        if (names.isEmpty()) {
            names.add("x");
        }
        Arbitrary<String> keys = Arbitraries.oneOf(Arbitraries.of(names),
                Arbitraries.strings().alpha().ofMinLength(1).ofMaxLength(8));
        Arbitrary<Mutation> randomTrees = randomJson(keys, 4).map(t -> Mutation.of(t, null, "random JSON"));
        Arbitrary<Mutation> deep = Combinators.combine(Arbitraries.of(names), Arbitraries.integers().between(20, 3000),
                Arbitraries.of("[", "{\"a\":")).as((name, depth, open) -> {
                    String close = open.equals("[") ? "]" : "}";
                    String inner = open.equals("[") ? "1" : "1";
                    String body = "{\"" + name + "\": " + open.repeat(depth) + inner + close.repeat(depth) + "}";
                    return new Mutation(body.getBytes(StandardCharsets.UTF_8), null, "nested " + depth + " deep");
                });
        Arbitrary<Mutation> truncated = conforming(schema).flatMap(b -> {
            String text = b.toString();
            return Arbitraries.integers().between(0, Math.max(0, text.length() - 1))
                    .map(cut -> new Mutation(text.substring(0, cut).getBytes(StandardCharsets.UTF_8), null,
                            "truncated at " + cut));
        });
        Arbitrary<Mutation> duplicate = Arbitraries.of(names).map(n -> new Mutation(
                ("{\"" + n + "\": 1, \"" + n + "\": 2}").getBytes(StandardCharsets.UTF_8), null, "duplicate key"));
        Arbitrary<Mutation> scalars = Arbitraries.of("null", "true", "0", "-0", "1e400", "\"text\"", "[]", "[{}]",
                "", " ", "{", "}", "{}{}", "{\"a\":1}x", "\uFEFF{}", "{'a': 1}", "{\"a\":NaN}", "{\"a\":Infinity}",
                "{\"a\":-Infinity}", "{\"a\":01}", "{\"a\":.5}", "{\"a\":1.}", "{\"a\":+1}", "{\"a\":0x10}")
                .map(t -> new Mutation(t.getBytes(StandardCharsets.UTF_8), null, "literal " + t));
        Arbitrary<Mutation> bytes = Arbitraries.bytes().array(byte[].class).ofMaxSize(64)
                .map(b -> new Mutation(b, null, "random bytes"));
        return Arbitraries.oneOf(randomTrees, deep, truncated, duplicate, scalars, bytes);
    }

    private static Arbitrary<JsonNode> randomJson(Arbitrary<String> keys, int depth) {
        Arbitrary<JsonNode> leaf = Arbitraries.oneOf(
                Arbitraries.doubles().map(d -> (JsonNode) DoubleNode.valueOf(d)),
                Arbitraries.integers().map(i -> (JsonNode) IntNode.valueOf(i)),
                Arbitraries.strings().ofMaxLength(10).map(TextNode::valueOf),
                Arbitraries.of(BooleanNode.TRUE, BooleanNode.FALSE, NullNode.getInstance()),
                Arbitraries.of(EDGE_NUMBERS));
        if (depth == 0) {
            return leaf;
        }
        Arbitrary<JsonNode> inner = Arbitraries.lazy(() -> randomJson(keys, depth - 1));
        Arbitrary<JsonNode> array = inner.list().ofMaxSize(4).map(l -> {
            ArrayNode a = F.arrayNode();
            l.forEach(a::add);
            return a;
        });
        Arbitrary<JsonNode> object = Combinators.combine(keys.list().ofMaxSize(4), inner.list().ofSize(4))
                .as((ks, vs) -> {
                    ObjectNode o = F.objectNode();
                    for (int i = 0; i < ks.size(); i++) {
                        o.set(ks.get(i), vs.get(i));
                    }
                    return o;
                });
        return Arbitraries.frequencyOf(
                net.jqwik.api.Tuple.of(2, leaf), net.jqwik.api.Tuple.of(2, array), net.jqwik.api.Tuple.of(4, object));
    }
}
