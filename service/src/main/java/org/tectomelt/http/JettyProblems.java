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

    private static String type(int status) {
        return switch (status) {
            case 400 -> "bad-request";
            case 404 -> "not-found";
            case 405 -> "method-not-allowed";
            case 408 -> "request-timeout";
            case 413 -> "body-too-large";
            case 414 -> "uri-too-long";
            case 415 -> "unsupported-media-type";
            case 431 -> "headers-too-large";
            case 500 -> "internal";
            case 503 -> "unavailable";
            default -> "http-" + status;
        };
    }

    private static String title(int status) {
        return switch (status) {
            case 400 -> "Bad request";
            case 404 -> "Not found";
            case 405 -> "Method not allowed";
            case 408 -> "Request timeout";
            case 413 -> "Request body too large";
            case 414 -> "URI too long";
            case 415 -> "Unsupported media type";
            case 431 -> "Request headers too large";
            case 500 -> "Internal error";
            case 503 -> "Service unavailable";
            default -> "HTTP " + status;
        };
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
