package org.tectomelt.http;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import io.javalin.http.Context;
import java.util.ArrayList;
import java.util.List;
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
