package org.tectomelt.http;

import io.javalin.http.Handler;
import io.javalin.http.HandlerType;

/**
 * One endpoint of the service. The app registers exactly the routes returned by
 * {@link App#routes}, and the spec-consistency test compares that same list with
 * {@code api-spec/openapi.yaml}.
 *
 * @param method  HTTP method
 * @param path    path template as written in the spec
 * @param handler thin handler: parse, validate, call the engine, write JSON
 * @param kind    how the app serves it (see {@link Kind})
 */
public record Route(HandlerType method, String path, Handler handler, Kind kind) {

    /** How the app serves a route. */
    public enum Kind {
        /**
         * Fast and deterministic (milliseconds, bounded by the caps): served at once; a successful
         * JSON answer carries an {@code ETag} and honours {@code If-None-Match}.
         */
        CHEAP,
        /**
         * Long computations (sill model, long columns, large batches): at most
         * {@code TECTOMELT_HEAVY_CONCURRENCY} at once (503 with {@code Retry-After} beyond, after
         * {@code TECTOMELT_HEAVY_QUEUE_MS} of waiting), a wall-clock budget the handler reads with
         * {@link Heavy#deadline}, results kept in the bounded result cache; ETag as for CHEAP.
         */
        HEAVY,
        /** An answer that changes from call to call (metrics, liveness): no ETag, never cached. */
        LIVE
    }

    /** A cheap route, as in the first release. */
    public Route(HandlerType method, String path, Handler handler) {
        this(method, path, handler, Kind.CHEAP);
    }

    /** A cheap GET route. */
    public static Route get(String path, Handler handler) {
        return new Route(HandlerType.GET, path, handler, Kind.CHEAP);
    }

    /** A cheap POST route. */
    public static Route post(String path, Handler handler) {
        return new Route(HandlerType.POST, path, handler, Kind.CHEAP);
    }

    /** A heavy POST route: concurrency-limited, with a wall-clock budget and a result cache. */
    public static Route heavyPost(String path, Handler handler) {
        return new Route(HandlerType.POST, path, handler, Kind.HEAVY);
    }

    /** A POST route whose effect is not a pure function of its body (it creates something): no ETag. */
    public static Route livePost(String path, Handler handler) {
        return new Route(HandlerType.POST, path, handler, Kind.LIVE);
    }

    /** A DELETE route (never conditional). */
    public static Route delete(String path, Handler handler) {
        return new Route(HandlerType.DELETE, path, handler, Kind.LIVE);
    }

    /** A GET route whose answer changes from call to call. */
    public static Route liveGet(String path, Handler handler) {
        return new Route(HandlerType.GET, path, handler, Kind.LIVE);
    }

    /** True for {@link Kind#HEAVY}. */
    public boolean heavy() {
        return kind == Kind.HEAVY;
    }
}
