package org.tectomelt.http;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.UUID;
import org.eclipse.jetty.http.HttpFields;
import org.eclipse.jetty.http.HttpHeader;
import org.eclipse.jetty.server.Request;
import org.eclipse.jetty.server.Response;
import org.eclipse.jetty.server.handler.ErrorHandler;
import org.eclipse.jetty.util.Callback;
import org.tectomelt.contract.Json;

/**
 * Errors that Jetty answers itself, before a request reaches the app: an unparseable request (no
 * {@code Host}, two {@code Content-Length}s, a bad header), a refused URI ({@code /../x},
 * {@code %00}, ambiguous separators), oversized headers. Jetty's default writes an HTML page; this
 * writes the same RFC 9457 {@code application/problem+json} body the app writes, with a fresh
 * request id, so a client sees one error format whatever refused it.
 */
final class JettyProblems extends ErrorHandler {

    JettyProblems() {
        setShowStacks(false);
        setShowCauses(false);
    }

    @Override
    protected void generateResponse(Request request, Response response, int code, String message, Throwable cause,
                                    Callback callback) throws IOException {
        String id = UUID.randomUUID().toString();
        response.getHeaders().put(HttpHeader.CONTENT_TYPE, Problems.PROBLEM_JSON);
        response.getHeaders().put(RequestPlumbing.REQUEST_ID_HEADER, id);
        String path = null;
        try {
            path = request.getHttpURI() == null ? null : request.getHttpURI().getPath();
        } catch (RuntimeException e) {
            // a URI Jetty refused may not decode
        }
        response.write(true, ByteBuffer.wrap(body(code, message, path, id)), callback);
    }

    @Override
    public ByteBuffer badMessageError(int status, String reason, HttpFields.Mutable fields) {
        String id = UUID.randomUUID().toString();
        fields.put(HttpHeader.CONTENT_TYPE, Problems.PROBLEM_JSON);
        fields.put(RequestPlumbing.REQUEST_ID_HEADER, id);
        return ByteBuffer.wrap(body(status, reason, null, id));
    }

    /** The problem body for a status Jetty chose, with its reason when it gave a printable one. */
    static byte[] body(int status, String reason, String path, String requestId) {
        Map<String, Object> body = new LinkedHashMap<>();
        body.put("type", "/problems/" + type(status));
        body.put("title", title(status));
        body.put("status", status);
        String why = printable(reason);
        body.put("detail", why == null ? "The request could not be served (" + status + ")"
                : "The request was refused before it reached the service: " + why);
        if (printable(path) != null) {
            body.put("instance", printable(path));
        }
        body.put("requestId", requestId);
        return Json.write(body);
    }

    /** Type slug and title of each status Jetty answers by itself. */
    private static final Map<Integer, String[]> KINDS = Map.ofEntries(
            Map.entry(400, new String[] {"bad-request", "Bad request"}),
            Map.entry(404, new String[] {"not-found", "Not found"}),
            Map.entry(405, new String[] {"method-not-allowed", "Method not allowed"}),
            Map.entry(408, new String[] {"request-timeout", "Request timeout"}),
            Map.entry(413, new String[] {"body-too-large", "Request body too large"}),
            Map.entry(414, new String[] {"uri-too-long", "URI too long"}),
            Map.entry(415, new String[] {"unsupported-media-type", "Unsupported media type"}),
            Map.entry(431, new String[] {"headers-too-large", "Request headers too large"}),
            Map.entry(500, new String[] {"internal", "Internal error"}),
            Map.entry(503, new String[] {"unavailable", "Service unavailable"}));

    private static String type(int status) {
        String[] k = KINDS.get(status);
        return k == null ? "http-" + status : k[0];
    }

    private static String title(int status) {
        String[] k = KINDS.get(status);
        return k == null ? "HTTP " + status : k[1];
    }

    /** Short printable ASCII, or null: a reason never carries a stack trace or control characters. */
    private static String printable(String s) {
        if (s == null || s.isBlank()) {
            return null;
        }
        StringBuilder sb = new StringBuilder();
        for (char c : s.toCharArray()) {
            if (c >= 0x20 && c < 0x7f) {
                sb.append(c);
            }
            if (sb.length() >= 160) {
                break;
            }
        }
        String out = sb.toString().trim();
        return out.isEmpty() || out.contains("Exception") ? null : out;
    }
}
