package org.tectomelt.http;

import io.javalin.http.Context;
import io.javalin.http.HandlerType;
import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.tectomelt.Tokens;

/**
 * Optional bearer-token access control for a shared server ({@code TECTOMELT_TOKEN} or
 * {@code TECTOMELT_TOKEN_FILE}). When a token is configured, every {@code /v1} route except
 * {@code /v1/health}, and {@code /metrics}, require {@code Authorization: Bearer <token>}; the page,
 * its static files and {@code /openapi.yaml} stay open so people can read what the service does.
 * CORS preflight requests ({@code OPTIONS}) carry no credentials by design and pass.
 *
 * <p>The comparison is constant-time: both sides are hashed with SHA-256 and compared with
 * {@link MessageDigest#isEqual}, so neither the content nor the length of the token leaks through
 * response timing.
 */
final class AccessControl {

    private static final String CALLER_ATTR = "tectomelt.caller";

    private final List<byte[]> hashes = new ArrayList<>();
    private final List<String> names = new ArrayList<>();

    /** @param token the configured token; empty for an open server */
    AccessControl(String token) {
        this(Tokens.fromEnvironment(Map.of(), token));
    }

    /**
     * @param tokens every accepted token with its member's name ({@code TECTOMELT_TOKEN} as
     *               {@value Tokens#SHARED_TOKEN_NAME}, {@code TECTOMELT_TOKENS_FILE}); none for an
     *               open server
     */
    AccessControl(Tokens tokens) {
        tokens.byToken().forEach((token, name) -> {
            hashes.add(sha256(token));
            names.add(name);
        });
    }

    /** True when a token is required. */
    boolean enabled() {
        return !hashes.isEmpty();
    }

    /**
     * The name of the member whose token the request carried ({@value Tokens#ANONYMOUS} on an open
     * server): the owner a new run records.
     */
    static String caller(Context ctx) {
        String name = ctx.attribute(CALLER_ATTR);
        return name == null ? Tokens.ANONYMOUS : name;
    }

    /** Whether the route template {@code path} needs the token (when one is configured). */
    static boolean protects(String path) {
        return (path.startsWith("/v1/") && !path.equals("/v1/health")) || path.equals("/metrics");
    }

    /**
     * Lets the request through or throws 401.
     *
     * @throws ApiProblem 401 {@code unauthorized} with a {@code WWW-Authenticate} challenge
     */
    void check(Context ctx) {
        // decided on the route that will serve the request, not on the raw path: /metrics/ is /metrics
        String route = RequestPlumbing.endpointPath(ctx);
        if (hashes.isEmpty() || ctx.method() == HandlerType.OPTIONS
                || !protects(route == null ? ctx.path() : route)) {
            return;
        }
        String header = ctx.header("Authorization");
        if (header == null || header.isBlank()) {
            throw unauthorized("Bearer realm=\"tectomelt\"",
                    "This server requires an access token: send Authorization: Bearer <token>");
        }
        String given = bearer(header);
        String name = given == null ? null : nameOf(sha256(given));
        if (name == null) {
            throw unauthorized("Bearer realm=\"tectomelt\", error=\"invalid_token\"",
                    "The access token is not valid for this server");
        }
        ctx.attribute(CALLER_ATTR, name);
    }

    /** The member whose token hashes to {@code given}; every entry is compared, so timing tells nothing. */
    private String nameOf(byte[] given) {
        String found = null;
        for (int i = 0; i < hashes.size(); i++) {
            if (MessageDigest.isEqual(given, hashes.get(i))) {
                found = names.get(i);
            }
        }
        return found;
    }

    /** The token of a {@code Bearer} credential, or null when the scheme is another one. */
    private static String bearer(String header) {
        String h = header.trim();
        if (h.length() < 7 || !h.regionMatches(true, 0, "Bearer ", 0, 7)) {
            return null;
        }
        return h.substring(7).trim();
    }

    private static ApiProblem unauthorized(String challenge, String detail) {
        return new ApiProblem(401, "unauthorized", "Access token required", detail, List.of(),
                Map.of("WWW-Authenticate", challenge));
    }

    private static byte[] sha256(String s) {
        try {
            return MessageDigest.getInstance("SHA-256").digest(s.getBytes(StandardCharsets.UTF_8));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every Java platform", e);
        }
    }
}
