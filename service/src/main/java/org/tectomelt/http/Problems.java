package org.tectomelt.http;

import io.javalin.config.RoutesConfig;
import io.javalin.http.Context;
import io.javalin.http.HttpResponseException;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.tectomelt.engine.BudgetExceededException;
import org.tectomelt.contract.Json;
import org.tectomelt.contract.MalformedBodyException;
import org.tectomelt.engine.EngineException;
import org.tectomelt.operations.OperationException;
import org.tectomelt.runs.StorageUnavailableException;

/**
 * The one place where failures become RFC 9457 {@code application/problem+json} responses.
 * No stack trace or exception message of an unexpected failure ever reaches the client; it gets
 * a generic 500 with the request id, which the log line carries too.
 */
public final class Problems {

    /** Media type of every error response. */
    public static final String PROBLEM_JSON = "application/problem+json";

    private static final Logger LOG = LoggerFactory.getLogger(Problems.class);
    private static final String TYPE_ATTR = "tectomelt.problemType";

    private Problems() {
    }

    /** Registers the exception and error handlers on the app's routing config. */
    static void register(RoutesConfig routes) {
        routes.exception(ApiProblem.class, (e, ctx) -> write(ctx, e));
        routes.exception(OperationException.class, (e, ctx) -> write(ctx, ApiProblem.invalid(e.violations().stream()
                .map(v -> new FieldError(v.field(), v.message())).toList())));
        routes.exception(StorageUnavailableException.class, (e, ctx) -> {
            LOG.warn("run storage unavailable, requestId={}: {}", RequestPlumbing.requestId(ctx), e.getMessage());
            write(ctx, new ApiProblem(503, "storage-unavailable", "Run storage unavailable", e.getMessage()
                    + "; runs resume when it answers again", List.of(), Map.of("Retry-After", "10")));
        });
        routes.exception(MalformedBodyException.class, (e, ctx) -> write(ctx, ApiProblem.malformed(e.getMessage())));
        routes.exception(EngineException.class, (e, ctx) -> write(ctx, new ApiProblem(400, "outside-model-range",
                "Outside what the model can compute", e.getMessage(), List.of(), Map.of())));
        routes.exception(BudgetExceededException.class, (e, ctx) -> write(ctx, new ApiProblem(503, "over-budget",
                "Computation budget exceeded", e.getMessage() + " (TECTOMELT_HEAVY_BUDGET_MS); ask for fewer points,"
                        + " a coarser grid or a shorter duration", List.of(),
                Map.of("Retry-After", String.valueOf(Heavy.RETRY_AFTER_SECONDS)))));
        routes.exception(HttpResponseException.class, (e, ctx) -> write(ctx, fromStatus(e.getStatus(), ctx)));
        routes.exception(Exception.class, (e, ctx) -> {
            if (clientIo(e)) {
                write(ctx, RequestPlumbing.incompleteBody(ctx));
                return;
            }
            LOG.error("unexpected failure, requestId={} {} {}", RequestPlumbing.requestId(ctx), ctx.method(),
                    ctx.path(), e);
            write(ctx, new ApiProblem(500, "internal", "Internal error",
                    "The request failed unexpectedly; quote requestId " + RequestPlumbing.requestId(ctx)
                            + " when reporting it", List.of(), Map.of()));
        });
        for (int status : new int[] {404, 405, 413, 415}) {
            routes.error(status, ctx -> {
                if (!isProblem(ctx)) {
                    write(ctx, fromStatus(status, ctx));
                }
            });
        }
    }

    /**
     * True when {@code e} comes from the client's connection while the body was read (it closed,
     * or sent less than it declared): a client error, not the service's.
     */
    static boolean clientIo(Throwable e) {
        for (Throwable t = e; t != null; t = t.getCause()) {
            // a JSON (de)serialisation failure is an IOException too, but never the client's connection
            if (t instanceof com.fasterxml.jackson.core.JacksonException) {
                return false;
            }
            if (t instanceof java.io.IOException || t instanceof org.eclipse.jetty.http.BadMessageException) {
                return true;
            }
            if (t.getCause() == t) {
                break;
            }
        }
        return false;
    }

    /** A problem for a bare status code raised by the framework or the plumbing. */
    static ApiProblem fromStatus(int status, Context ctx) {
        return switch (status) {
            case 404 -> new ApiProblem(404, "not-found", "Not found",
                    "No resource at " + ctx.path() + "; see /openapi.yaml for the routes", List.of(), Map.of());
            case 405 -> new ApiProblem(405, "method-not-allowed", "Method not allowed",
                    ctx.method() + " is not allowed on " + ctx.path(), List.of(), Map.of());
            case 413 -> new ApiProblem(413, "body-too-large", "Request body too large",
                    "The request body exceeds the configured limit", List.of(), Map.of());
            case 415 -> new ApiProblem(415, "unsupported-media-type", "Unsupported media type",
                    "Send the body as application/json", List.of(), Map.of());
            default -> new ApiProblem(status, "http-" + status, "HTTP " + status,
                    "The request could not be served (" + status + ")", List.of(), Map.of());
        };
    }

    /** Writes {@code p} as the response. */
    static void write(Context ctx, ApiProblem p) {
        Map<String, Object> body = new LinkedHashMap<>();
        body.put("type", "/problems/" + p.type());
        body.put("title", p.title());
        body.put("status", p.status());
        body.put("detail", p.getMessage());
        body.put("instance", ctx.path());
        body.put("requestId", RequestPlumbing.requestId(ctx));
        if (!p.errors().isEmpty()) {
            body.put("errors", p.errors());
        }
        p.headers().forEach(ctx::header);
        ctx.attribute(TYPE_ATTR, p.type());
        ctx.status(p.status()).contentType(PROBLEM_JSON).result(Json.write(body));
    }

    /** The type slug of the problem written for this request ({@code validation}, {@code busy}…), or null. */
    static String problemType(Context ctx) {
        return ctx.attribute(TYPE_ATTR);
    }

    private static boolean isProblem(Context ctx) {
        String ct = ctx.res().getContentType();
        return ct != null && ct.startsWith(PROBLEM_JSON);
    }
}
