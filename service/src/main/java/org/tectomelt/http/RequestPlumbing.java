package org.tectomelt.http;

import io.javalin.http.Context;
import io.javalin.http.HandlerType;
import io.javalin.router.Endpoint;
import java.util.List;
import java.util.Map;
import java.util.UUID;
import java.util.regex.Pattern;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/** Request-scoped plumbing shared by every route: request id, body checks, the access log. */
final class RequestPlumbing {

    static final String REQUEST_ID_HEADER = "X-Request-Id";
    private static final String REQUEST_ID_ATTR = "tectomelt.requestId";
    private static final Pattern SAFE_ID = Pattern.compile("[A-Za-z0-9._:-]{1,64}");
    /** Refused bodies up to this many times the cap are read and dropped before the 413. */
    static final long DRAIN_FACTOR = 16;
    private static final Logger ACCESS = LoggerFactory.getLogger("tectomelt.access");

    private RequestPlumbing() {
    }

    /** Takes {@code X-Request-Id} from the request when it is safe to echo, else makes one; echoes it. */
    static void assignRequestId(Context ctx) {
        String given = ctx.header(REQUEST_ID_HEADER);
        String id = given != null && SAFE_ID.matcher(given).matches() ? given : UUID.randomUUID().toString();
        ctx.attribute(REQUEST_ID_ATTR, id);
        ctx.header(REQUEST_ID_HEADER, id);
    }

    /** The id assigned to this request ("-" before assignment). */
    static String requestId(Context ctx) {
        String id = ctx.attribute(REQUEST_ID_ATTR);
        return id == null ? "-" : id;
    }

    /** For a matched POST: the body must be JSON and within the size cap (checked before it is read). */
    static void checkBody(Context ctx, long maxBodyBytes) {
        if (ctx.method() != HandlerType.POST) {
            return;
        }
        long declared = ctx.req().getContentLengthLong();
        if (declared > maxBodyBytes) {
            discardBody(ctx, declared, maxBodyBytes);
            throw new ApiProblem(413, "body-too-large", "Request body too large",
                    "The body has " + declared + " bytes; the limit is " + maxBodyBytes
                            + " (TECTOMELT_MAX_BODY_BYTES)", List.of(), Map.of());
        }
        String ct = ctx.contentType();
        if (ct == null || !ct.toLowerCase(java.util.Locale.ROOT).startsWith("application/json")) {
            throw new ApiProblem(415, "unsupported-media-type", "Unsupported media type",
                    "Send the body as application/json (got " + (ct == null ? "no Content-Type" : ct) + ")",
                    List.of(), Map.of());
        }
    }

    /**
     * Reads and drops a refused body (without keeping it) when it is at most
     * {@value #DRAIN_FACTOR} times the cap, so the client, still sending, gets to read the 413
     * instead of a broken pipe. Larger bodies are not read: the connection is closed on them.
     */
    private static void discardBody(Context ctx, long declared, long maxBodyBytes) {
        if (declared > DRAIN_FACTOR * maxBodyBytes) {
            return;
        }
        byte[] sink = new byte[8192];
        try (java.io.InputStream in = ctx.req().getInputStream()) {
            while (in.read(sink) >= 0) {
                // dropped
            }
        } catch (java.io.IOException e) {
            // the client went away: nothing left to answer
        }
    }

    /** One access-log line per request, and the observer notification. */
    static void finished(Context ctx, Float millis, RequestObserver observer) {
        int status = ctx.status().getCode();
        String route = matchedRoute(ctx);
        ACCESS.info("{} {} {} {}ms requestId={}", ctx.method(), ctx.path(), status,
                String.format(java.util.Locale.ROOT, "%.1f", millis), requestId(ctx));
        observer.finished(ctx.method().name(), route, status);
    }

    private static String matchedRoute(Context ctx) {
        String route = endpointPath(ctx);
        return route == null ? ctx.path() : route;
    }

    /** The template of the route that served this request, or null when none matched. */
    static String endpointPath(Context ctx) {
        try {
            // the matched endpoint, even when a before-matched check refused the request (401, 413, 415)
            Endpoint e = ctx.endpoints().matchedHttpEndpoint();
            if (e == null) {
                e = ctx.endpoints().lastHttpEndpoint();
            }
            if (e != null && e.method.isHttpMethod()) {
                return e.path;
            }
        } catch (RuntimeException ignored) {
            // no endpoint matched
        }
        return null;
    }
}
