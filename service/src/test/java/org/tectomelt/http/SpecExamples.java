package org.tectomelt.http;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import org.tectomelt.contract.Invoker;
import org.tectomelt.operations.Operation;

/** The request examples the spec documents for an operation: its {@code example} and every named one. */
final class SpecExamples {

    private SpecExamples() {
    }

    static List<JsonNode> of(Invoker invoker, Operation<?, ?> op) {
        JsonNode content = invoker.spec().document().at("/paths/" + op.path().replace("/", "~1")
                + "/post/requestBody/content/application~1json");
        List<JsonNode> out = new ArrayList<>();
        if (content.has("example")) {
            out.add(content.get("example"));
        }
        for (Iterator<JsonNode> it = content.path("examples").elements(); it.hasNext(); ) {
            JsonNode value = it.next().get("value");
            if (value instanceof ObjectNode) {
                out.add(value);
            }
        }
        return out;
    }
}
