package org.tectomelt.http;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import io.javalin.http.Context;
import io.javalin.http.Handler;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.Json;
import org.tectomelt.operations.Cost;
import org.tectomelt.operations.Operation;
import org.tectomelt.operations.OperationException;

/**
 * The one handler of every operation: read body → check against the spec and bind
 * ({@link Invoker#prepare}) → run (a heavy request through the limiter, with its deadline) →
 * {@link #respond}, the one place a computing response is built: JSON, or a table as
 * {@code text/csv} when the client's {@code Accept} asks for it and the result has rows; the
 * {@code fields} query parameter keeps only the named row columns.
 */
final class OperationHandler {

    /** The query parameter choosing row columns: {@code ?fields=meltFraction,solidusC}. */
    static final String FIELDS = "fields";

    private OperationHandler() {
    }

    /** One POST route per operation, heavy when its cost class is. */
    static List<Route> routes(Invoker invoker) {
        List<Route> routes = new ArrayList<>();
        for (Operation<?, ?> op : invoker.operations().list()) {
            Handler h = ctx -> handle(ctx, invoker, op);
            routes.add(op.costClass() == Cost.HEAVY ? Route.heavyPost(op.path(), h) : Route.post(op.path(), h));
        }
        return routes;
    }

    private static <Q extends Record, R extends Record> void handle(Context ctx, Invoker invoker, Operation<Q, R> op)
            throws Exception {
        JsonNode body = RequestKey.parsedBody(ctx);
        Invoker.Prepared<Q, R> prepared = body != null ? invoker.prepare(op, body)
                : invoker.prepare(op, ctx.bodyAsBytes());
        if (prepared.cost() == Cost.HEAVY && !Heavy.inSlot(ctx)) {
            // a heavy request of a cheap operation (a large batch): limiter and budget as for heavy routes
            Heavy heavy = ctx.appData(Heavy.KEY);
            heavy.run(ctx, c -> respond(c, prepared));
        } else {
            respond(ctx, prepared);
        }
    }

    /** Runs the request and writes its answer: the one place a computing response is built. */
    private static <Q extends Record, R extends Record> void respond(Context ctx, Invoker.Prepared<Q, R> prepared) {
        R result = Metrics.engine(ctx, () -> prepared.run(Heavy.deadline(ctx)));
        String rows = prepared.operation().rows(result);
        List<String> fields = fields(ctx);
        boolean csv = wantsCsv(ctx);
        ObjectNode tree = Json.mapper().valueToTree(result);
        if (MetaRoutes.wantsBibtex(ctx)) {
            Responses.bytes(ctx, new Responses.Written(MetaRoutes.BIBTEX + "; charset=utf-8",
                    Provenance.bibtex(tree).getBytes(StandardCharsets.UTF_8)));
            return;
        }
        Provenance.attach(tree);
        if (rows == null || (!csv && fields == null)) {
            Responses.json(ctx, tree);
            return;
        }
        JsonNode list = tree;
        for (String part : rows.split("\\.")) {
            list = list.path(part);
        }
        if (!(list instanceof ArrayNode array)) {
            Responses.json(ctx, result);
            return;
        }
        List<Map<String, JsonNode>> table = new ArrayList<>(array.size());
        Set<String> columns = new LinkedHashSet<>();
        for (JsonNode row : array) {
            Map<String, JsonNode> flat = new LinkedHashMap<>();
            flatten("", row, flat);
            columns.addAll(flat.keySet());
            table.add(flat);
        }
        if (fields != null) {
            List<String> unknown = fields.stream().filter(f -> !columns.contains(f)).toList();
            if (!unknown.isEmpty() && !table.isEmpty()) {
                throw new OperationException(FIELDS, "names no column of " + rows + ": " + unknown + "; columns: "
                        + columns);
            }
            columns.retainAll(fields);
            columns.clear();
            columns.addAll(fields);
        }
        if (csv) {
            Responses.bytes(ctx, new Responses.Written(Responses.CSV, csv(columns, table)));
            return;
        }
        ArrayNode kept = Json.mapper().createArrayNode();
        for (Map<String, JsonNode> row : table) {
            ObjectNode o = kept.addObject();
            for (String c : columns) {
                JsonNode v = row.get(c);
                if (v != null) {
                    o.set(c, v);
                }
            }
        }
        replace(tree, rows, kept);
        Responses.json(ctx, tree);
    }

    /** True when the client asks for {@code text/csv} (and does not prefer JSON). */
    static boolean wantsCsv(Context ctx) {
        String accept = ctx.header("Accept");
        if (accept == null) {
            return false;
        }
        String a = accept.toLowerCase(Locale.ROOT);
        int csv = a.indexOf("text/csv");
        int json = a.indexOf("application/json");
        return csv >= 0 && (json < 0 || csv < json);
    }

    private static List<String> fields(Context ctx) {
        String raw = ctx.queryParam(FIELDS);
        if (raw == null || raw.isBlank()) {
            return null;
        }
        List<String> out = new ArrayList<>();
        for (String f : raw.split(",")) {
            if (!f.isBlank()) {
                out.add(f.trim());
            }
        }
        return out.isEmpty() ? null : out;
    }

    private static void flatten(String prefix, JsonNode node, Map<String, JsonNode> out) {
        if (node.isObject()) {
            for (Iterator<Map.Entry<String, JsonNode>> it = node.fields(); it.hasNext(); ) {
                Map.Entry<String, JsonNode> e = it.next();
                flatten(prefix.isEmpty() ? e.getKey() : prefix + "." + e.getKey(), e.getValue(), out);
            }
        } else {
            out.put(prefix, node);
        }
    }

    private static void replace(JsonNode tree, String dotted, JsonNode value) {
        String[] parts = dotted.split("\\.");
        JsonNode parent = tree;
        for (int i = 0; i < parts.length - 1; i++) {
            parent = parent.path(parts[i]);
        }
        ((ObjectNode) parent).set(parts[parts.length - 1], value);
    }

    /** RFC 4180 CSV: a header of column names, one line per row, CRLF line ends. */
    private static byte[] csv(Set<String> columns, List<Map<String, JsonNode>> table) {
        StringBuilder sb = new StringBuilder(32 * (table.size() + 1) * Math.max(1, columns.size()));
        boolean first = true;
        for (String c : columns) {
            sb.append(first ? "" : ",");
            cell(c, sb);
            first = false;
        }
        sb.append("\r\n");
        for (Map<String, JsonNode> row : table) {
            first = true;
            for (String c : columns) {
                sb.append(first ? "" : ",");
                first = false;
                JsonNode v = row.get(c);
                if (v == null || v.isNull()) {
                    continue;
                }
                if (v.isArray()) {
                    List<String> items = new ArrayList<>();
                    v.forEach(x -> items.add(x.asText()));
                    cell(String.join("; ", items), sb);
                } else if (v.isNumber() || v.isBoolean()) {
                    sb.append(v.asText());
                } else {
                    cell(v.asText(), sb);
                }
            }
            sb.append("\r\n");
        }
        return sb.toString().getBytes(StandardCharsets.UTF_8);
    }

    private static void cell(String s, StringBuilder sb) {
        if (s.indexOf(',') < 0 && s.indexOf('"') < 0 && s.indexOf('\n') < 0 && s.indexOf('\r') < 0) {
            sb.append(s);
            return;
        }
        sb.append('"').append(s.replace("\"", "\"\"")).append('"');
    }
}
