package org.tectomelt.http;

import io.javalin.http.Context;

/** Writes successful responses. */
final class Responses {

    private Responses() {
    }

    /** Writes {@code body} as {@code application/json} with status 200. */
    static void json(Context ctx, Object body) {
        ctx.contentType("application/json").result(Json.write(body));
    }
}
