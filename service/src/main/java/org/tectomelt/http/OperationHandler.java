package org.tectomelt.http;

import com.fasterxml.jackson.core.io.NumberOutput;
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
import org.tectomelt.contract.RecordCsv;
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

    /** One POST route per operation, heavy when its cost class is, and {@code GET /v1/operations}. */
    static List<Route> routes(Invoker invoker) {
        List<Route> routes = new ArrayList<>();
        byte[] listing = Json.write(listing(invoker));
        routes.add(Route.get("/v1/operations", ctx -> Responses.bytes(ctx, new Responses.Written(Responses.JSON,
                listing))));
        for (Operation<?, ?> op : invoker.operations().list()) {
            Handler h = ctx -> handle(ctx, invoker, op);
            routes.add(op.costClass() == Cost.HEAVY ? Route.heavyPost(op.path(), h) : Route.post(op.path(), h));
        }
        return routes;
    }

    /** One entry of {@code GET /v1/operations}. */
    record OperationInfo(String name, String method, String path, String cost, String rows, List<InputInfo> inputs,
                         List<OutputInfo> outputs) {
    }

    /** A sweepable input with its range from the spec. */
    record InputInfo(String name, String unit, String description, boolean sampleable, Double minimum,
                     Double maximum, @com.fasterxml.jackson.annotation.JsonProperty("default") Double defaultValue) {
    }

    /** A scalar output. */
    record OutputInfo(String name, String unit, String description) {
    }

    /** The listing: the catalogue's registrations with the spec's ranges and defaults. */
    static List<OperationInfo> listing(Invoker invoker) {
        List<OperationInfo> out = new ArrayList<>();
        for (Operation<?, ?> op : invoker.operations().list()) {
            List<InputInfo> inputs = new ArrayList<>();
            for (var in : op.inputs()) {
                var r = invoker.spec().range(op.path(), in.name()).orElseThrow(() -> new IllegalStateException(
                        op.name() + " declares input " + in.name() + ", which the spec does not document"));
                Double d = r.defaultValue() != null && r.defaultValue().isNumber() ? r.defaultValue().asDouble() : null;
                inputs.add(new InputInfo(in.name(), in.unit(), in.description(), in.sampleable(), r.minimum(),
                        r.maximum(), d));
            }
            List<OutputInfo> outputs = op.outputs().stream()
                    .map(o -> new OutputInfo(o.name(), o.unit(), o.description())).toList();
            out.add(new OperationInfo(op.name(), "POST", op.path(), op.costClass().name().toLowerCase(Locale.ROOT),
                    op.rows(), inputs, outputs));
        }
        return out;
    }

    private static <Q extends Record, R extends Record> void handle(Context ctx, Invoker invoker, Operation<Q, R> op)
            throws Exception {
        JsonNode body = RequestKey.parsedBody(ctx);
        Invoker.Prepared<Q, R> prepared = body != null ? invoker.prepare(op, body)
                : invoker.prepare(op, RequestIntake.body(ctx));
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
        boolean bibtex = MetaRoutes.wantsBibtex(ctx);
        if (!bibtex && (rows == null || (!csv && fields == null))) {
            // the common answer: the result and its provenance, serialised in one pass
            Responses.bytes(ctx, new Responses.Written(Responses.JSON, Provenance.json(result)));
            return;
        }
        if (!bibtex && csv && fields != null) {
            byte[] direct = RecordCsv.write(result, rows, fields);   // the same bytes, without a tree of every row
            if (direct != null) {
                Responses.bytes(ctx, new Responses.Written(Responses.CSV, direct));
                return;
            }
        }
        ObjectNode tree = Json.mapper().valueToTree(result);
        if (bibtex) {
            Responses.bytes(ctx, new Responses.Written(MetaRoutes.BIBTEX + "; charset=utf-8",
                    Provenance.bibtex(tree).getBytes(StandardCharsets.UTF_8)));
            return;
        }
        Provenance.attach(tree);
        if (csv) {
            byte[] table = treeCsv(tree, rows, fields);
            if (table != null) {
                Responses.bytes(ctx, new Responses.Written(Responses.CSV, table));
                return;
            }
            Responses.json(ctx, result);
            return;
        }
        JsonNode list = rowList(tree, rows);
        if (!(list instanceof ArrayNode array)) {
            Responses.json(ctx, result);
            return;
        }
        Table t = table(array, rows, fields);
        ArrayNode kept = Json.mapper().createArrayNode();
        for (Map<String, JsonNode> row : t.rows()) {
            ObjectNode o = kept.addObject();
            for (String c : t.columns()) {
                JsonNode v = row.get(c);
                if (v != null) {
                    o.set(c, v);
                }
            }
        }
        replace(tree, rows, kept);
        Responses.json(ctx, tree);
    }

    /** The rows of a result's tree, flattened, and the columns kept. */
    private record Table(Set<String> columns, List<Map<String, JsonNode>> rows) {
    }

    private static JsonNode rowList(JsonNode tree, String rows) {
        JsonNode list = tree;
        for (String part : rows.split("\\.")) {
            list = list.path(part);
        }
        return list;
    }

    private static Table table(ArrayNode array, String rows, List<String> fields) {
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
            columns.clear();
            columns.addAll(fields);
        }
        return new Table(columns, table);
    }

    /**
     * The CSV of the rows of a result's tree (with the {@code fields} kept, or every column), or
     * null when the result has no such list: the general way, which {@link RecordCsv} matches byte
     * for byte where it applies.
     */
    static byte[] treeCsv(JsonNode tree, String rows, List<String> fields) {
        JsonNode list = rowList(tree, rows);
        if (!(list instanceof ArrayNode array)) {
            return null;
        }
        Table t = table(array, rows, fields);
        return csv(t.columns(), t.rows());
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
            RecordCsv.cell(c, sb);
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
                    RecordCsv.cell(String.join("; ", items), sb);
                } else if (v.isFloatingPointNumber()) {
                    // the shortest decimal that reads back as the same double (Jackson's writer)
                    sb.append(NumberOutput.toString(v.doubleValue(), true));
                } else if (v.isNumber() || v.isBoolean()) {
                    sb.append(v.asText());
                } else {
                    RecordCsv.cell(v.asText(), sb);
                }
            }
            sb.append("\r\n");
        }
        return sb.toString().getBytes(StandardCharsets.UTF_8);
    }
}
