package org.tectomelt.http;

import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.JsonSerializer;
import com.fasterxml.jackson.databind.SerializerProvider;
import com.fasterxml.jackson.databind.annotation.JsonSerialize;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.databind.ser.BeanPropertyWriter;
import com.fasterxml.jackson.databind.ser.PropertyWriter;
import com.fasterxml.jackson.databind.ser.std.BeanSerializerBase;
import com.fasterxml.jackson.databind.ser.std.StdSerializer;
import com.fasterxml.jackson.databind.util.NameTransformer;
import io.javalin.http.Context;
import java.io.IOException;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.tectomelt.contract.Json;
import org.tectomelt.engine.ModelInfo;

/**
 * What made a computed answer: {@code provenance: {version, commit, models}} on every computing
 * response (the build and the published models with citation and DOI), so a saved JSON says which
 * release and which models produced it; on request ({@code ?cite=bibtex} or
 * {@code Accept: application/x-bibtex}) the same as BibTeX. A CSV answer carries the build in the
 * {@code X-Tectomelt-Version} and {@code X-Tectomelt-Commit} headers.
 */
final class Provenance {

    /** Response headers naming the build, on every computing answer (CSV included). */
    static final String VERSION_HEADER = "X-Tectomelt-Version";
    static final String COMMIT_HEADER = "X-Tectomelt-Commit";

    private Provenance() {
    }

    /** The models a result lists under {@code models} (none when it lists none). */
    static List<ModelInfo> models(JsonNode result) {
        List<ModelInfo> out = new ArrayList<>();
        JsonNode models = result.path("models");
        if (models.isArray()) {
            for (JsonNode m : models) {
                out.add(new ModelInfo(m.path("id").asText(), m.path("citation").asText(), m.path("doi").asText("")));
            }
        }
        return out;
    }

    /** Adds {@code provenance} to a result tree (an object) and returns it. */
    static ObjectNode attach(ObjectNode result) {
        BuildInfo b = BuildInfo.CURRENT;
        ObjectNode p = Json.mapper().createObjectNode();
        p.put("version", b.version());
        p.put("commit", b.commitLabel());
        ArrayNode models = p.putArray("models");
        JsonNode listed = result.path("models");
        if (listed.isArray()) {
            models.addAll((ArrayNode) listed.deepCopy());
        }
        result.set("provenance", p);
        return result;
    }

    /**
     * {@code result} as JSON with {@code provenance} appended, written in one pass: the same bytes
     * as {@code Json.write(attach(valueToTree(result)))} without building the tree (the answer of
     * a cheap request is mostly serialisation; {@code ProvenanceWriterTest} holds the two equal).
     */
    static byte[] json(Object result) {
        return Json.write(new Attached(result));
    }

    /** A result on its way out, serialised by {@link AttachedSerializer}. */
    @JsonSerialize(using = AttachedSerializer.class)
    record Attached(Object result) {
    }

    /** Writes the result's own properties, then {@code provenance: {version, commit, models}}. */
    static final class AttachedSerializer extends StdSerializer<Attached> {
        private static final long serialVersionUID = 1L;
        private static final Map<Class<?>, JsonSerializer<Object>> UNWRAPPED = new ConcurrentHashMap<>();

        AttachedSerializer() {
            super(Attached.class);
        }

        @Override
        public void serialize(Attached a, JsonGenerator gen, SerializerProvider provider) throws IOException {
            Object result = a.result();
            JsonSerializer<Object> whole = provider.findValueSerializer(result.getClass());
            if (!(whole instanceof BeanSerializerBase bean)) {
                // not a plain bean (never the case for an operation's result record): the tree way
                gen.writeTree(attach(Json.mapper().valueToTree(result)));
                return;
            }
            JsonSerializer<Object> fields = UNWRAPPED.computeIfAbsent(result.getClass(),
                    c -> whole.unwrappingSerializer(NameTransformer.NOP));
            gen.writeStartObject(result);
            fields.serialize(result, gen, provider);
            BuildInfo b = BuildInfo.CURRENT;
            gen.writeFieldName("provenance");
            gen.writeStartObject();
            gen.writeStringField("version", b.version());
            gen.writeStringField("commit", b.commitLabel());
            gen.writeFieldName("models");
            Object models = models(bean, result);
            if (models instanceof java.util.Collection<?> || (models != null && models.getClass().isArray())) {
                provider.defaultSerializeValue(models, gen);
            } else {
                gen.writeStartArray();
                gen.writeEndArray();
            }
            gen.writeEndObject();
            gen.writeEndObject();
        }

        /** The value of the result's {@code models} property, or null when it has none. */
        private static Object models(BeanSerializerBase bean, Object result) throws IOException {
            for (Iterator<PropertyWriter> it = bean.properties(); it.hasNext(); ) {
                PropertyWriter w = it.next();
                if ("models".equals(w.getName()) && w instanceof BeanPropertyWriter bw) {
                    try {
                        return bw.get(result);
                    } catch (Exception e) {
                        throw new IOException("models of " + result.getClass().getSimpleName(), e);
                    }
                }
            }
            return null;
        }
    }

    /** Names the build in the response headers. */
    static void headers(Context ctx) {
        ctx.header(VERSION_HEADER, BuildInfo.CURRENT.version());
        ctx.header(COMMIT_HEADER, BuildInfo.CURRENT.commitLabel());
    }

    /** BibTeX of the software and of each model the result lists. */
    static String bibtex(JsonNode result) {
        StringBuilder sb = new StringBuilder(MetaRoutes.softwareBibtex());
        for (ModelInfo m : models(result)) {
            sb.append('\n').append(m.bibtex().text());
        }
        return sb.toString();
    }
}
