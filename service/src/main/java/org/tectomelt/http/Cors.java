package org.tectomelt.http;

import io.javalin.config.JavalinConfig;
import io.javalin.http.Context;
import java.util.List;

/**
 * Cross-origin access for dashboards and notebooks served from other origins
 * ({@code TECTOMELT_CORS_ORIGINS}), through Javalin's bundled CORS plugin.
 *
 * <p>An allowed origin gets {@code Access-Control-Allow-Origin}, the request headers it asks for in
 * a preflight (so {@code Authorization} and {@code If-None-Match} can be sent) and the response
 * headers a client needs exposed: {@code ETag}, {@code X-Request-Id}, {@code Retry-After},
 * {@code WWW-Authenticate}. An origin not on the list gets no CORS headers, so the browser keeps the
 * answer from the page that asked; the server itself does not refuse the request, because a
 * browser also sends {@code Origin} with same-origin POSTs (the service's own page) and with
 * requests from tools that are not browsers.
 */
final class Cors {

    private static final List<String> EXPOSED = List.of("ETag", RequestPlumbing.REQUEST_ID_HEADER, "Retry-After",
            "WWW-Authenticate");

    private Cors() {
    }

    /** Enables the CORS plugin for {@code origins} (nothing when the list is empty). */
    static void configure(JavalinConfig c, List<String> origins) {
        if (origins.isEmpty()) {
            return;
        }
        c.bundledPlugins.enableCors(cors -> cors.addRule(rule -> {
            if (origins.contains("*")) {
                rule.anyHost();
            } else {
                rule.allowHost(origins.get(0), origins.subList(1, origins.size()).toArray(String[]::new));
            }
            EXPOSED.forEach(rule::exposeHeader);
        }));
    }

    /**
     * Undoes the plugin's 400 for an origin that is not on the list: such a request gets no CORS
     * headers (the browser enforces the policy) but is otherwise served, so the service's own page
     * (whose same-origin POSTs carry an {@code Origin} header) keeps working. Runs before the
     * endpoint, when only the plugin can have set a status.
     */
    static void acceptUnlistedOrigin(Context ctx, List<String> origins) {
        if (!origins.isEmpty() && ctx.header("Origin") != null && ctx.status().getCode() == 400
                && ctx.res().getHeader("Access-Control-Allow-Origin") == null) {
            ctx.status(200);
        }
    }
}
