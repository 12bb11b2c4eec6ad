package org.tectomelt.contract;

import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.StreamReadConstraints;
import com.fasterxml.jackson.core.StreamReadFeature;
import com.fasterxml.jackson.core.StreamWriteFeature;
import com.fasterxml.jackson.core.exc.StreamReadException;
import com.fasterxml.jackson.core.exc.StreamConstraintsException;
import com.fasterxml.jackson.core.io.JsonStringEncoder;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonMappingException;
import com.fasterxml.jackson.databind.MapperFeature;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.SerializerProvider;
import com.fasterxml.jackson.databind.cfg.CoercionAction;
import com.fasterxml.jackson.databind.cfg.CoercionInputShape;
import com.fasterxml.jackson.databind.exc.InvalidFormatException;
import com.fasterxml.jackson.databind.exc.MismatchedInputException;
import com.fasterxml.jackson.databind.exc.UnrecognizedPropertyException;
import com.fasterxml.jackson.databind.json.JsonMapper;
import com.fasterxml.jackson.module.blackbird.BlackbirdModule;
import com.fasterxml.jackson.databind.module.SimpleModule;
import com.fasterxml.jackson.databind.ser.std.StdSerializer;
import com.fasterxml.jackson.databind.type.LogicalType;
import com.fasterxml.jackson.annotation.JsonInclude;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.introspect.Annotated;
import com.fasterxml.jackson.databind.introspect.JacksonAnnotationIntrospector;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.operations.ExplicitNull;
import org.tectomelt.operations.OperationException;
import java.io.IOException;
import java.util.List;
import java.util.Map;

/**
 * The one JSON configuration of the service: strict on the way in (unknown fields, wrong types,
 * strings where numbers belong, trailing garbage and deep nesting are all rejected with the
 * offending field named), and on the way out it refuses NaN and Infinity, so no response can
 * carry them. A result component marked {@link ExplicitNull} is written as {@code null} when absent;
 * other absent components are left out.
 *
 * <p>Failures: {@link MalformedBodyException} for a body that is not usable JSON,
 * {@link OperationException} naming the field for one that does not fit the request record.
 */
public final class Json {

    /** Deepest nesting accepted in a request body. */
    public static final int MAX_NESTING_DEPTH = 32;

    private static final JsonStringEncoder QUOTER = JsonStringEncoder.getInstance();

    private static final ObjectMapper MAPPER = build();

    private Json() {
    }

    /** The shared mapper (thread-safe once configured). */
    public static ObjectMapper mapper() {
        return MAPPER;
    }

    private static ObjectMapper build() {
        SimpleModule finiteOnly = new SimpleModule("finite-numbers");
        finiteOnly.addSerializer(Double.class, new FiniteDoubleSerializer());
        finiteOnly.addSerializer(double.class, new FiniteDoubleSerializer());
        finiteOnly.addSerializer(ModelInfo.class, new ModelInfoSerializer());
        finiteOnly.addDeserializer(Double.class, new StrictDoubleDeserializer(Double.class));
        finiteOnly.addDeserializer(double.class, new StrictDoubleDeserializer(double.class));
        JsonMapper mapper = JsonMapper.builder()
                .enable(DeserializationFeature.FAIL_ON_UNKNOWN_PROPERTIES)
                .enable(DeserializationFeature.FAIL_ON_NULL_FOR_PRIMITIVES)
                .enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS)
                .enable(DeserializationFeature.FAIL_ON_READING_DUP_TREE_KEY)
                .disable(DeserializationFeature.ACCEPT_FLOAT_AS_INT)
                .disable(MapperFeature.ALLOW_COERCION_OF_SCALARS)
                .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
                // shortest-repr number conversions (Jackson's own; the JDK 17 ones dominated a
                // 10,000-point batch): the same doubles, read and written faster
                .enable(StreamReadFeature.USE_FAST_DOUBLE_PARSER)
                .enable(StreamWriteFeature.USE_FAST_DOUBLE_WRITER)
                .disable(SerializationFeature.FAIL_ON_EMPTY_BEANS)
                .serializationInclusion(JsonInclude.Include.NON_NULL)
                .annotationIntrospector(new ExplicitNullIntrospector())
                .addModule(finiteOnly)
                .addModule(new BlackbirdModule())
                .build();
        mapper.getFactory().setStreamReadConstraints(StreamReadConstraints.builder()
                .maxNestingDepth(MAX_NESTING_DEPTH)
                .maxNumberLength(64)
                .maxStringLength(100_000)
                .build());
        for (LogicalType t : List.of(LogicalType.Float, LogicalType.Integer, LogicalType.Boolean)) {
            mapper.coercionConfigFor(t).setCoercion(CoercionInputShape.String, CoercionAction.Fail);
            mapper.coercionConfigFor(t).setCoercion(CoercionInputShape.EmptyString, CoercionAction.Fail);
        }
        mapper.coercionConfigFor(LogicalType.Textual).setCoercion(CoercionInputShape.Integer, CoercionAction.Fail);
        mapper.coercionConfigFor(LogicalType.Textual).setCoercion(CoercionInputShape.Float, CoercionAction.Fail);
        mapper.coercionConfigFor(LogicalType.Textual).setCoercion(CoercionInputShape.Boolean, CoercionAction.Fail);
        return mapper;
    }

    /**
     * Reads a request body into {@code type}, turning every Jackson failure into a 400 problem
     * that names the field at fault.
     */
    public static <T> T read(byte[] body, Class<T> type) {
        if (body == null || body.length == 0) {
            throw new MalformedBodyException("The request body is empty; a JSON object is expected");
        }
        T value;
        try {
            value = MAPPER.readValue(body, type);
        } catch (IOException e) {
            throw translate(e);
        }
        if (value == null) {
            throw new MalformedBodyException("The request body is JSON null; a JSON object is expected");
        }
        return value;
    }

    /**
     * Parses a request body into a tree with the same strictness (duplicate keys, trailing tokens,
     * nesting depth, number length).
     */
    public static JsonNode readTree(byte[] body) {
        if (body == null || body.length == 0) {
            throw new MalformedBodyException("The request body is empty; a JSON object is expected");
        }
        JsonNode tree;
        try {
            tree = MAPPER.readTree(body);
        } catch (IOException e) {
            throw translate(e);
        }
        if (tree == null || tree.isNull()) {
            throw new MalformedBodyException("The request body is JSON null; a JSON object is expected");
        }
        return tree;
    }

    /** Binds a request tree (already checked against the spec) to its record. */
    public static <T> T bind(JsonNode tree, Class<T> type) {
        try {
            return MAPPER.treeToValue(tree, type);
        } catch (IOException e) {
            throw translate(e);
        } catch (IllegalArgumentException e) {
            if (e.getCause() instanceof IOException io) {
                throw translate(io);
            }
            throw e;
        }
    }

    /** Turns a Jackson failure into the problem the caller should see. */
    private static RuntimeException translate(IOException e) {
        if (e instanceof StreamConstraintsException c) {
            return new MalformedBodyException("The request body exceeds a parser limit (nesting depth "
                    + MAX_NESTING_DEPTH + ", number length 64): " + firstLine(c.getOriginalMessage()));
        }
        if (e instanceof JsonMappingException m && m.getCause() instanceof StreamReadException parse) {
            return translate(parse);
        }
        if (e instanceof UnrecognizedPropertyException u) {
            List<String> known = u.getKnownPropertyIds() == null ? List.of()
                    : u.getKnownPropertyIds().stream().map(String::valueOf).sorted().toList();
            return new OperationException(path(u), "is not a known field here; known fields: " + known);
        }
        if (e instanceof InvalidFormatException f) {
            String field = path(f);
            return field.isEmpty()
                    ? new MalformedBodyException("The request body must be a JSON object")
                    : new OperationException(field, "has the wrong type or format; expected " + describe(f.getTargetType()));
        }
        if (e instanceof MismatchedInputException mi) {
            String field = path(mi);
            return field.isEmpty()
                    ? new MalformedBodyException("The request body must be a JSON object")
                    : new OperationException(field, "has the wrong JSON type; expected " + describe(mi.getTargetType()));
        }
        if (e instanceof JsonMappingException m) {
            String field = path(m);
            return field.isEmpty()
                    ? new MalformedBodyException("The request body could not be mapped: " + firstLine(m.getOriginalMessage()))
                    : new OperationException(field, "is invalid: " + firstLine(m.getOriginalMessage()));
        }
        if (e instanceof JsonProcessingException p) {
            return malformed(p);
        }
        return new MalformedBodyException("The request body could not be read");
    }

    private static RuntimeException malformed(JsonProcessingException e) {
        String what = firstLine(e.getOriginalMessage()).replaceAll("\\s*\\(start marker at \\[Source.*$", "");
        return new MalformedBodyException("The request body is not valid JSON: " + what + locationOf(e));
    }

    /** Serialises a response value. */
    public static byte[] write(Object value) {
        try {
            return MAPPER.writeValueAsBytes(value);
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("response could not be serialised: " + e.getOriginalMessage(), e);
        }
    }

    /**
     * A flat object of numbers, {@code {"name":1.5,...}} in the map's order, a null or non-finite
     * value as {@code null}: the very text {@link com.fasterxml.jackson.databind.node.ObjectNode#toString()} gives for it (JSON-quoted
     * names, {@link Double#toString(double)} numbers), written without building the tree; a run
     * stores a point's inputs and outputs in this form.
     */
    public static String numbers(Map<String, Double> values) {
        StringBuilder sb = new StringBuilder(32 * values.size() + 2).append('{');
        for (Map.Entry<String, Double> e : values.entrySet()) {
            if (sb.length() > 1) {
                sb.append(',');
            }
            sb.append('"');
            QUOTER.quoteAsString(e.getKey(), sb);
            sb.append("\":");
            Double v = e.getValue();
            if (v == null || !Double.isFinite(v)) {
                sb.append("null");
            } else {
                sb.append(v.doubleValue());
            }
        }
        return sb.append('}').toString();
    }

    /** The JSON path of a mapping failure: {@code lithosphere.ageMyr}, {@code points[2].depthKm}. */
    static String path(JsonMappingException e) {
        StringBuilder sb = new StringBuilder();
        for (JsonMappingException.Reference r : e.getPath()) {
            if (r.getFieldName() != null) {
                if (sb.length() > 0) {
                    sb.append('.');
                }
                sb.append(r.getFieldName());
            } else if (r.getIndex() >= 0) {
                sb.append('[').append(r.getIndex()).append(']');
            }
        }
        return sb.toString();
    }

    private static String describe(Class<?> type) {
        if (type == null) {
            return "another type";
        }
        if (Number.class.isAssignableFrom(type) || (type.isPrimitive() && type != boolean.class)) {
            return "a number";
        }
        if (type == Boolean.class || type == boolean.class) {
            return "true or false";
        }
        if (type == String.class || type.isEnum()) {
            return "a string";
        }
        if (List.class.isAssignableFrom(type) || type.isArray()) {
            return "an array";
        }
        if (Map.class.isAssignableFrom(type) || type.isRecord()) {
            return "an object";
        }
        return "another type";
    }

    private static String locationOf(JsonProcessingException e) {
        return e.getLocation() == null ? ""
                : " (line " + e.getLocation().getLineNr() + ", column " + e.getLocation().getColumnNr() + ")";
    }

    private static String firstLine(String s) {
        if (s == null) {
            return "";
        }
        int nl = s.indexOf('\n');
        String line = nl < 0 ? s : s.substring(0, nl);
        return line.length() > 200 ? line.substring(0, 200) + "…" : line;
    }

    /**
     * Reads a JSON number into a double, and nothing else: Jackson's own deserializer would take the
     * strings "NaN" and "Infinity" (and so let a non-finite value past any check that forgets it),
     * and turns a number beyond ±1.8e308 into Infinity. Both are refused here, naming the field.
     */
    private static final class StrictDoubleDeserializer
            extends com.fasterxml.jackson.databind.deser.std.StdScalarDeserializer<Double> {
        private static final long serialVersionUID = 1L;
        private final boolean primitive;

        StrictDoubleDeserializer(Class<?> type) {
            super(type);
            this.primitive = type.isPrimitive();
        }

        @Override
        public Double deserialize(com.fasterxml.jackson.core.JsonParser p,
                                  com.fasterxml.jackson.databind.DeserializationContext ctxt) throws IOException {
            com.fasterxml.jackson.core.JsonToken t = p.currentToken();
            if (t == com.fasterxml.jackson.core.JsonToken.VALUE_NUMBER_INT
                    || t == com.fasterxml.jackson.core.JsonToken.VALUE_NUMBER_FLOAT) {
                double d = p.getDoubleValue();
                if (!Double.isFinite(d)) {
                    throw JsonMappingException.from(p, "the number " + p.getText()
                            + " is beyond the range of a double (about ±1.8e308)");
                }
                return d;
            }
            return (Double) ctxt.handleUnexpectedToken(primitive ? double.class : Double.class, p);
        }

        @Override
        public Double getNullValue(com.fasterxml.jackson.databind.DeserializationContext ctxt)
                throws JsonMappingException {
            if (primitive) {
                return (Double) ctxt.reportInputMismatch(this, "null where a number is required");
            }
            return null;
        }

        @Override
        public LogicalType logicalType() {
            return LogicalType.Float;
        }
    }

    /** {@link ExplicitNull} components are always written, null included. */
    private static final class ExplicitNullIntrospector extends JacksonAnnotationIntrospector {
        private static final long serialVersionUID = 1L;

        @Override
        public JsonInclude.Value findPropertyInclusion(Annotated a) {
            if (a.hasAnnotation(ExplicitNull.class)) {
                return JsonInclude.Value.construct(JsonInclude.Include.ALWAYS, JsonInclude.Include.ALWAYS);
            }
            return super.findPropertyInclusion(a);
        }
    }

    /** Writes finite doubles; a NaN or Infinity in a response is a bug and fails the request. */
    private static final class FiniteDoubleSerializer extends StdSerializer<Double> {
        private static final long serialVersionUID = 1L;

        FiniteDoubleSerializer() {
            super(Double.class);
        }

        @Override
        public void serialize(Double value, JsonGenerator gen, SerializerProvider provider) throws IOException {
            if (!Double.isFinite(value)) {
                throw JsonMappingException.from(gen, "non-finite number in response at "
                        + gen.getOutputContext().pathAsPointer());
            }
            // -0.0 (from a negated or rounded zero, or echoed from the request) is written as 0.0
            gen.writeNumber(value == 0.0 ? 0.0 : value);
        }
    }

    /**
     * A published model as every answer lists it ({@code {"id", "citation", "doi"}}, an absent
     * member left out as everywhere): written as the same bytes encoded once per model when the
     * answer is written straight to bytes (each answer lists its models twice, in the result and in
     * its provenance, and their long citations were a twentieth of a one-point answer's time), and
     * member by member into anything else (a tree, a token buffer), so trees read as before.
     */
    private static final class ModelInfoSerializer extends StdSerializer<ModelInfo> {
        private static final long serialVersionUID = 1L;
        private static final Map<ModelInfo, com.fasterxml.jackson.core.io.SerializedString> ENCODED =
                new java.util.concurrent.ConcurrentHashMap<>();

        ModelInfoSerializer() {
            super(ModelInfo.class);
        }

        @Override
        public void serialize(ModelInfo m, JsonGenerator gen, SerializerProvider provider) throws IOException {
            if (gen instanceof com.fasterxml.jackson.core.json.UTF8JsonGenerator) {
                com.fasterxml.jackson.core.io.SerializedString raw = ENCODED.get(m);
                if (raw == null) {
                    java.io.StringWriter text = new java.io.StringWriter();
                    try (JsonGenerator g = MAPPER.getFactory().createGenerator(text)) {
                        members(m, g);
                    }
                    raw = new com.fasterxml.jackson.core.io.SerializedString(text.toString());
                    if (ENCODED.size() < 10_000) {   // the catalogue's models, and the few a request names
                        ENCODED.put(m, raw);
                    }
                }
                gen.writeRawValue(raw);
                return;
            }
            members(m, gen);
        }

        private static void members(ModelInfo m, JsonGenerator g) throws IOException {
            g.writeStartObject(m);
            if (m.id() != null) {
                g.writeStringField("id", m.id());
            }
            if (m.citation() != null) {
                g.writeStringField("citation", m.citation());
            }
            if (m.doi() != null) {
                g.writeStringField("doi", m.doi());
            }
            g.writeEndObject();
        }
    }
}
