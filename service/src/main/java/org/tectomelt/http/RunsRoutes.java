package org.tectomelt.http;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import io.javalin.config.Key;
import io.javalin.http.Context;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.Json;
import org.tectomelt.contract.SpecContract;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.operations.Operation;
import org.tectomelt.operations.OperationException;
import org.tectomelt.runs.NewRun;
import org.tectomelt.runs.PointResult;
import org.tectomelt.runs.RunRecord;
import org.tectomelt.runs.RunService;
import org.tectomelt.runs.RunStatus;
import org.tectomelt.runs.RunStore;
import org.tectomelt.runs.study.StudyRequest;
import org.tectomelt.runs.study.StudyRun;
import org.tectomelt.runs.sweep.Sweep;

/**
 * {@code /v1/runs}: parameter sweeps as persisted, asynchronous runs any token holder can read.
 * The app keeps its {@link RunService} under {@link #KEY}; the handlers only translate.
 */
final class RunsRoutes {

    /** Where the app keeps its run service. */
    static final Key<RunService> KEY = new Key<>("tectomelt.runs");

    /** Media type of streamed results. */
    static final String NDJSON = "application/x-ndjson";
    /** Rows read from the database per page while streaming results. */
    private static final int PAGE = 500;

    private RunsRoutes() {
    }

    static List<Route> routes(Invoker invoker) {
        return List.of(
                Route.livePost("/v1/runs", ctx -> submit(ctx, invoker)),
                Route.liveGet("/v1/runs", ctx -> list(ctx, invoker)),
                Route.liveGet("/v1/runs/{id}", ctx -> ctx.contentType(Responses.JSON).result(Json.write(view(ctx, found(ctx))))),
                Route.liveGet("/v1/runs/{id}/results", ctx -> results(ctx, invoker)),
                Route.delete("/v1/runs/{id}", RunsRoutes::delete));
    }

    private static RunService runs(Context ctx) {
        return ctx.appData(KEY);
    }

    // ---- POST /v1/runs ---------------------------------------------------------------------

    private static void submit(Context ctx, Invoker invoker) {
        RunService runs = runs(ctx);
        JsonNode body = Json.readTree(RequestIntake.body(ctx));
        Sweep sweep = Sweep.parse(body, invoker, runs.config().maxRunPoints());
        String owner = AccessControl.caller(ctx);
        runs.queueLimitProblem(owner).ifPresent(detail -> {
            throw new ApiProblem(429, "too-many-runs", "Too many runs queued", detail, List.of(),
                    Map.of("Retry-After", "30"));
        });
        RunRecord r = runs.submit(new NewRun(Sweep.KIND, sweep.operation(), owner, sweep.label(), sweep.definition(),
                provenance(invoker, sweep), sweep.points()));
        ctx.status(202).header("Location", "/v1/runs/" + r.id()).contentType(Responses.JSON).result(Json.write(view(r, List.of())));
    }

    /**
     * What is stored with a run when it is accepted: the build that accepted it (version and
     * commit, as {@code /v1/health} reports them), the operation and its path. The models are
     * added when the run is shown, from those its computed points listed ({@link #view}).
     */
    private static String provenance(Invoker invoker, Sweep sweep) {
        ObjectNode p = Json.mapper().createObjectNode();
        p.put("version", App.VERSION);
        p.put("commit", BuildInfo.CURRENT.commitLabel());
        p.put("operation", sweep.operation());
        Operation<?, ?> op = invoker.operation(sweep.operation());
        p.put("path", op.path());
        p.put("spec", "/openapi.yaml");
        return p.toString();
    }

    // ---- GET /v1/runs/{id} and the listing ----------------------------------------------------

    private static RunRecord found(Context ctx) {
        String id = ctx.pathParam("id");
        return runs(ctx).find(id).orElseThrow(() -> new ApiProblem(404, "run-not-found", "No such run",
                "No run has the id '" + id + "' (finished runs are kept TECTOMELT_RUN_RETENTION_DAYS days)",
                List.of(), Map.of()));
    }

    /** {@link #view(RunRecord, List)} with the run's models read from the database. */
    private static ObjectNode view(Context ctx, RunRecord r) {
        return view(r, runs(ctx).models(List.of(r.id())).get(r.id()));
    }

    /**
     * The JSON of a run: what {@code POST}, {@code GET /v1/runs/{id}} and the listing show.
     *
     * @param models the published models its computed points listed (none before the first is stored)
     */
    static ObjectNode view(RunRecord r, List<ModelInfo> models) {
        ObjectNode o = Json.mapper().createObjectNode();
        o.put("id", r.id());
        o.put("kind", r.kind());
        o.put("status", r.status().wire());
        o.put("operation", r.operation());
        if (r.label() != null) {
            o.put("label", r.label());
        }
        o.put("owner", r.owner());
        ObjectNode progress = o.putObject("progress");
        progress.put("done", r.donePoints() + r.failedPoints());
        progress.put("total", r.totalPoints());
        progress.put("failed", r.failedPoints());
        JsonNode d = tree(r.definition());
        o.set("request", d.path("request"));
        o.set("sweep", d.path("sweep"));
        o.set("outputs", d.path("outputs"));
        if (d.has("study")) {
            o.set("study", d.get("study")); // uncertainty (with its seed), solve, observed
        }
        o.put("createdAt", r.createdAt().toString());
        if (r.startedAt() != null) {
            o.put("startedAt", r.startedAt().toString());
        }
        if (r.finishedAt() != null) {
            o.put("finishedAt", r.finishedAt().toString());
        }
        if (r.statusReason() != null) {
            o.put("statusReason", r.statusReason());
        }
        o.set("provenance", provenance(r, models));
        ObjectNode links = o.putObject("links");
        links.put("self", "/v1/runs/" + r.id());
        links.put("results", "/v1/runs/" + r.id() + "/results");
        links.put("page", "/#/runs/" + r.id());
        return o;
    }

    /**
     * {@code provenance: {version, commit, models, operation, path, spec}}: the stored part, with
     * the models of its computed points. A run accepted before commits were stored says
     * {@code unknown} for the commit (the build that accepted it is not known).
     */
    private static ObjectNode provenance(RunRecord r, List<ModelInfo> models) {
        JsonNode stored = r.provenance() == null ? Json.mapper().createObjectNode() : tree(r.provenance());
        ObjectNode p = Json.mapper().createObjectNode();
        p.put("version", stored.path("version").asText(App.VERSION));
        p.put("commit", stored.path("commit").asText(BuildInfo.UNKNOWN));
        p.set("models", Json.mapper().valueToTree(models));
        stored.fields().forEachRemaining(e -> {
            if (!p.has(e.getKey())) {
                p.set(e.getKey(), e.getValue());
            }
        });
        return p;
    }

    private static void list(Context ctx, Invoker invoker) {
        RunService runs = runs(ctx);
        // the filters and the page are read as the spec documents them (its enum, range and defaults;
        // a blank value is absent)
        SpecContract.Query q = invoker.spec().query("get", "/v1/runs", ctx.queryParamMap());
        if (!q.violations().isEmpty()) {
            throw new OperationException(q.violations());
        }
        RunStatus status = q.text("status") == null ? null : RunStatus.fromWire(q.text("status"));
        int limit = (int) q.integer("limit");
        int offset = (int) Math.min(q.integer("offset"), Integer.MAX_VALUE); // past the last run: an empty page
        RunStore.Filter f = new RunStore.Filter(status, q.text("owner"), q.text("operation"));
        ObjectNode o = Json.mapper().createObjectNode();
        ArrayNode items = o.putArray("runs");
        List<RunRecord> page = runs.list(f, limit, offset);
        Map<String, List<ModelInfo>> models = runs.models(page.stream().map(RunRecord::id).toList());
        for (RunRecord r : page) {
            items.add(view(r, models.get(r.id())));
        }
        o.put("total", runs.count(f));
        o.put("limit", limit);
        o.put("offset", offset);
        ctx.contentType(Responses.JSON).result(Json.write(o));
    }

    // ---- DELETE /v1/runs/{id} ---------------------------------------------------------------

    private static void delete(Context ctx) {
        RunRecord r = found(ctx);
        String caller = AccessControl.caller(ctx);
        if (!caller.equals(r.owner())) {
            throw new ApiProblem(403, "not-owner", "Only the owner may delete a run",
                    "Run " + r.id() + " belongs to " + r.owner() + "; " + caller + " may read it but not delete it",
                    List.of(), Map.of());
        }
        switch (runs(ctx).delete(r.id(), caller)) {
            case CANCELLED -> ctx.contentType(Responses.JSON).result(Json.write(view(ctx, runs(ctx).find(r.id()).orElseThrow())));
            case REMOVED -> ctx.status(204);
            case NOT_FOUND -> throw new ApiProblem(404, "run-not-found", "No such run",
                    "Run " + r.id() + " was deleted meanwhile", List.of(), Map.of());
        }
    }

    // ---- GET /v1/runs/{id}/results -------------------------------------------------------------

    enum Format { JSON, CSV, NDJSON }

    static Format format(Context ctx) {
        String f = ctx.queryParam("format");
        if (f != null && !f.isBlank()) {
            return switch (f.trim().toLowerCase(Locale.ROOT)) {
                case "json" -> Format.JSON;
                case "csv" -> Format.CSV;
                case "ndjson" -> Format.NDJSON;
                default -> throw ApiProblem.invalid("format", "must be json, csv or ndjson, got '" + f + "'");
            };
        }
        String accept = ctx.header("Accept");
        if (accept != null) {
            // the first of the three media types the client lists wins
            String a = accept.toLowerCase(Locale.ROOT);
            Format best = Format.JSON;
            int at = Integer.MAX_VALUE;
            for (Map.Entry<String, Format> e : Map.of("application/json", Format.JSON, "text/csv", Format.CSV,
                    NDJSON, Format.NDJSON).entrySet()) {
                int i = a.indexOf(e.getKey());
                if (i >= 0 && i < at) {
                    at = i;
                    best = e.getValue();
                }
            }
            return best;
        }
        return Format.JSON;
    }

    private static void results(Context ctx, Invoker invoker) throws IOException {
        RunRecord r = found(ctx);
        Format format = format(ctx);
        RunService runs = runs(ctx);
        JsonNode d = tree(r.definition());
        List<String> inputs = new ArrayList<>();
        d.path("axes").fieldNames().forEachRemaining(inputs::add);
        List<String> outputs = new ArrayList<>();
        d.path("outputs").forEach(x -> outputs.add(x.asText()));
        ctx.header("X-Run-Status", r.status().wire());
        ctx.header("X-Run-Progress", (r.donePoints() + r.failedPoints()) + "/" + r.totalPoints());
        ctx.contentType(switch (format) {
            case JSON -> Responses.JSON;
            case CSV -> Responses.CSV;
            case NDJSON -> NDJSON + "; charset=utf-8";
        });
        if (format == Format.CSV) {
            ctx.header("Content-Disposition", "attachment; filename=\"run-" + r.id() + ".csv\"");
        }
        if (d.has("study")) {
            studyResults(ctx, r, format, invoker);
            return;
        }
        OutputStream out = ctx.outputStream();
        StringBuilder sb = new StringBuilder(64 * 1024);
        if (format == Format.JSON) {
            sb.append('[');
        } else if (format == Format.CSV) {
            List<String> header = new ArrayList<>(List.of("index"));
            header.addAll(inputs);
            header.addAll(outputs);
            header.add("problem");
            sb.append(String.join(",", header)).append("\r\n");
        }
        boolean[] first = {true};
        int last = -1;
        while (true) {
            int before = last;
            last = runs.points(r.id(), last, PAGE, p -> {
                switch (format) {
                    case JSON -> {
                        sb.append(first[0] ? "" : ",").append(row(p));
                        first[0] = false;
                    }
                    case NDJSON -> sb.append(row(p)).append('\n');
                    case CSV -> csvRow(p, inputs, outputs, sb);
                }
            });
            out.write(sb.toString().getBytes(StandardCharsets.UTF_8));
            sb.setLength(0);
            if (last == before) {
                break;
            }
            out.flush();
        }
        if (format == Format.JSON) {
            out.write(']');
        }
        out.flush();
    }

    /**
     * The results of a run whose sweep points carry a study: one row per sweep point with its
     * assembled study once all its blocks are computed, {@code pending} (blocks done of total) before,
     * or the problem of a block that failed.
     */
    private static void studyResults(Context ctx, RunRecord r, Format format, Invoker invoker) throws IOException {
        Sweep sweep = Sweep.fromDefinition(r.definition(), r.label());
        Operation<?, ?> op = invoker.operation(sweep.operation());
        StudyRun study = new StudyRun(invoker, op, StudyRequest.parse(sweep.study(), op, invoker), sweep.outputs());
        int blocks = sweep.blocks();
        Map<Integer, List<PointResult>> bySweepPoint = new TreeMap<>();
        int last = -1;
        while (true) {
            int before = last;
            last = runs(ctx).points(r.id(), last, PAGE,
                    p -> bySweepPoint.computeIfAbsent(p.index() / blocks, k -> new ArrayList<>()).add(p));
            if (last == before) {
                break;
            }
        }
        List<String> inputs = new ArrayList<>(sweep.axes().keySet());
        StringBuilder sb = new StringBuilder(64 * 1024);
        List<String> columns = study.csvColumns();
        switch (format) {
            case JSON -> sb.append('[');
            case CSV -> {
                List<String> header = new ArrayList<>(List.of("index"));
                header.addAll(inputs);
                header.addAll(columns);
                header.addAll(List.of("pending", "problem"));
                sb.append(String.join(",", header)).append("\r\n");
            }
            case NDJSON -> { }
        }
        boolean first = true;
        for (Map.Entry<Integer, List<PointResult>> e : bySweepPoint.entrySet()) {
            ObjectNode row = Json.mapper().createObjectNode();
            row.put("index", e.getKey());
            ObjectNode in = row.putObject("inputs");
            sweep.inputs(e.getKey()).forEach(in::put);
            List<PointResult> parts = e.getValue();
            PointResult failed = parts.stream().filter(p -> !p.ok()).findFirst().orElse(null);
            ObjectNode result = null;
            if (failed != null) {
                row.set("problem", tree(failed.problem()));
            } else if (parts.size() < blocks) {
                row.putObject("pending").put("done", parts.size()).put("total", blocks);
            } else {
                result = study.assemble(parts.stream().map(PointResult::outputs).toList());
                row.set("study", result);
            }
            switch (format) {
                case JSON -> sb.append(first ? "" : ",").append(row);
                case NDJSON -> sb.append(row).append('\n');
                case CSV -> {
                    sb.append(e.getKey());
                    for (String f : inputs) {
                        sb.append(',');
                        number(in.get(f), sb);
                    }
                    List<JsonNode> values = result == null ? null : study.csvValues(result);
                    for (int i = 0; i < columns.size(); i++) {
                        sb.append(',');
                        number(values == null ? null : values.get(i), sb);
                    }
                    sb.append(',').append(row.has("pending") ? parts.size() + "/" + blocks : "").append(',');
                    if (failed != null) {
                        sb.append('"').append(row.path("problem").path("detail").asText("").replace("\"", "\"\""))
                                .append('"');
                    }
                    sb.append("\r\n");
                }
            }
            first = false;
        }
        if (format == Format.JSON) {
            sb.append(']');
        }
        OutputStream out = ctx.outputStream();
        out.write(sb.toString().getBytes(StandardCharsets.UTF_8));
        out.flush();
    }

    /** One result row as JSON text: index, inputs, and outputs or problem. */
    private static String row(PointResult p) {
        StringBuilder sb = new StringBuilder(160);
        sb.append("{\"index\":").append(p.index()).append(",\"inputs\":").append(p.inputs());
        if (p.ok()) {
            sb.append(",\"outputs\":").append(p.outputs());
        } else {
            sb.append(",\"problem\":").append(p.problem());
        }
        return sb.append('}').toString();
    }

    private static void csvRow(PointResult p, List<String> inputs, List<String> outputs, StringBuilder sb) {
        sb.append(p.index());
        JsonNode in = tree(p.inputs());
        for (String f : inputs) {
            sb.append(',');
            number(in.get(f), sb);
        }
        JsonNode out = p.ok() ? tree(p.outputs()) : Json.mapper().createObjectNode();
        for (String f : outputs) {
            sb.append(',');
            number(out.get(f), sb);
        }
        sb.append(',');
        if (!p.ok()) {
            String detail = tree(p.problem()).path("detail").asText("");
            sb.append('"').append(detail.replace("\"", "\"\"")).append('"');
        }
        sb.append("\r\n");
    }

    private static void number(JsonNode v, StringBuilder sb) {
        if (v != null && v.isNumber()) {
            sb.append(v.asText());
        }
    }

    // ---- helpers -------------------------------------------------------------------------------

    private static JsonNode tree(String json) {
        try {
            return Json.mapper().readTree(json);
        } catch (IOException e) {
            throw new IllegalStateException("stored JSON is unreadable", e);
        }
    }
}
