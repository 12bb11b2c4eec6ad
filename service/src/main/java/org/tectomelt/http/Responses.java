package org.tectomelt.http;

import io.javalin.http.Context;

/** Writes successful responses. */
final class Responses {

    /** Media type of every successful JSON answer. */
    static final String JSON = "application/json";

    private static final String BODY_ATTR = "tectomelt.jsonBody";

    private Responses() {
    }

    /** Writes {@code body} as {@code application/json} with status 200. */
    static void json(Context ctx, Object body) {
        bytes(ctx, Json.write(body));
    }

    /** Writes already serialised JSON (a cached answer) with status 200. */
    static void bytes(Context ctx, byte[] json) {
        ctx.attribute(BODY_ATTR, json);
        ctx.contentType(JSON).result(json);
    }

    /** The JSON bytes written by {@link #json} for this request, or null when it wrote none. */
    static byte[] written(Context ctx) {
        return ctx.attribute(BODY_ATTR);
    }
}
