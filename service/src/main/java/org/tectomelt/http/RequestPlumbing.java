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
    private static final Logger LOG = LoggerFactory.getLogger(RequestPlumbing.class);

    private RequestPlumbing() {
    }

    /** Takes {@code X-Request-Id} from the request when it is safe to echo, else makes one; echoes it. */
    static void assignRequestId(Context ctx) {
        String given = ctx.header(REQUEST_ID_HEADER);
        String id = given != null && SAFE_ID.matcher(given).matches() ? given : newRequestId();
        ctx.attribute(REQUEST_ID_ATTR, id);
        ctx.header(REQUEST_ID_HEADER, id);
    }

    /**
     * A fresh random (version 4) UUID. A request id needs uniqueness, not secrecy, so it is drawn
     * from the thread's own generator instead of {@code UUID.randomUUID()}'s shared secure one
     * (which every request thread would otherwise queue on).
     */
    static String newRequestId() {
        java.util.concurrent.ThreadLocalRandom r = java.util.concurrent.ThreadLocalRandom.current();
        long hi = (r.nextLong() & ~0xF000L) | 0x4000L;                 // version 4
        long lo = (r.nextLong() & 0x3FFFFFFFFFFFFFFFL) | 0x8000000000000000L;   // IETF variant
        return new UUID(hi, lo).toString();
    }

    /** The id assigned to this request ("-" before assignment). */
    static String requestId(Context ctx) {
        String id = ctx.attribute(REQUEST_ID_ATTR);
        return id == null ? "-" : id;
    }

    /**
     * For a matched POST: the body arrived whole ({@link RequestIntake}), is within the size cap
     * (checked before it is read), is exactly {@code application/json} in UTF-8, and is not encoded.
     */
    static void checkBody(Context ctx, long maxBodyBytes) {
        if (ctx.method() != HandlerType.POST) {
            return;
        }
        RequestIntake.BodyFailure failure = RequestIntake.failure(ctx);
        if (failure == RequestIntake.BodyFailure.TIMEOUT) {
            LOG.warn("request body timed out: {} {} requestId={}", ctx.method(), ctx.path(), requestId(ctx));
            throw new ApiProblem(408, "body-timeout", "Request body too slow",
                    "The request body did not arrive in time (TECTOMELT_BODY_TIMEOUT_MS); send it at once",
                    List.of(), Map.of("Connection", "close"));
        }
        if (failure == RequestIntake.BodyFailure.INCOMPLETE) {
            throw incompleteBody(ctx);
        }
        long declared = ctx.req().getContentLengthLong();
        if (declared > maxBodyBytes) {
            discardBody(ctx, declared, maxBodyBytes);
            throw new ApiProblem(413, "body-too-large", "Request body too large",
                    "The body has " + declared + " bytes; the limit is " + maxBodyBytes
                            + " (TECTOMELT_MAX_BODY_BYTES)", List.of(), Map.of());
        }
        String encoding = ctx.header("Content-Encoding");
        if (encoding != null && !encoding.isBlank() && !encoding.trim().equalsIgnoreCase("identity")) {
            throw unsupported("Send the body uncompressed: Content-Encoding " + clip(encoding)
                    + " is not accepted (only identity)");
        }
        String ct = ctx.header("Content-Type");
        MediaType media = MediaType.parse(ct);
        if (media == null || !media.type().equals(JSON)) {
            throw unsupported("Send the body as application/json (got "
                    + (ct == null ? "no Content-Type" : clip(ct)) + ")");
        }
        String charset = media.charset();
        if (charset != null && !charset.equalsIgnoreCase("utf-8")) {
            throw unsupported("The body must be UTF-8: send Content-Type: application/json; charset=utf-8 "
                    + "or no charset (got charset " + clip(charset) + ")");
        }
    }

    /** The only request media type the service reads. */
    static final String JSON = "application/json";

    /** A parsed Content-Type: the lower-case type/subtype and the charset parameter (or null). */
    record MediaType(String type, String charset) {
        private static final Pattern TYPE = Pattern.compile("[a-z0-9!#$&^_.+-]+/[a-z0-9!#$&^_.+-]+");

        /** Null when the header is absent or not a media type. */
        static MediaType parse(String header) {
            if (header == null) {
                return null;
            }
            String[] parts = header.split(";");
            String type = parts[0].trim().toLowerCase(java.util.Locale.ROOT);
            if (!TYPE.matcher(type).matches()) {
                return null;
            }
            String charset = null;
            for (int i = 1; i < parts.length; i++) {
                String p = parts[i].trim();
                int eq = p.indexOf('=');
                if (eq > 0 && p.substring(0, eq).trim().equalsIgnoreCase("charset")) {
                    charset = p.substring(eq + 1).trim().replace("\"", "");
                }
            }
            return new MediaType(type, charset);
        }
    }

    /**
     * 400 for a body that ended before its declared length or whose connection failed while it was
     * read: one WARN line (no stack trace), counted as a client error.
     */
    static ApiProblem incompleteBody(Context ctx) {
        LOG.warn("request body incomplete (client closed or sent less than its Content-Length): {} {} "
                + "requestId={}", ctx.method(), ctx.path(), requestId(ctx));
        return new ApiProblem(400, "incomplete-body", "Incomplete request body",
                "The request body ended before its declared length or the connection failed while it was read",
                List.of(), Map.of("Connection", "close"));
    }

    private static ApiProblem unsupported(String detail) {
        return new ApiProblem(415, "unsupported-media-type", "Unsupported media type", detail, List.of(), Map.of());
    }

    /** A header value quoted in a problem: printable, at most 60 characters. */
    private static String clip(String s) {
        String p = s.replaceAll("[^\\x20-\\x7e]", "?");
        return p.length() <= 60 ? p : p.substring(0, 60) + "…";
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
    static void finished(Context ctx, Float millis, RequestObserver observer, AccessLog log) {
        int status = ctx.status().getCode();
        String route = matchedRoute(ctx);
        log.line(ctx.method().name(), ctx.path(), status, millis, requestId(ctx));
        observer.finished(ctx.method().name(), route, status);
    }

    /** {@code millis} with one decimal ({@code 12.3}), as {@code %.1f} writes it, without a Formatter. */
    static String tenths(float millis) {
        StringBuilder sb = new StringBuilder(12);
        appendTenths(millis, sb);
        return sb.toString();
    }

    /** Appends {@link #tenths} to {@code sb} (the access log's form, written with no string in between). */
    static void appendTenths(float millis, StringBuilder sb) {
        if (!Float.isFinite(millis) || millis < 0 || millis >= 1e9f) {
            sb.append(String.format(java.util.Locale.ROOT, "%.1f", millis));
            return;
        }
        long t = Math.round(millis * 10.0);
        sb.append(t / 10).append('.').append(t % 10);
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
