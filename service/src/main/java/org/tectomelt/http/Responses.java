package org.tectomelt.http;

import io.javalin.http.Context;
import org.tectomelt.contract.Json;

/** Writes successful responses. */
final class Responses {

    /** Media type of every successful JSON answer. */
    static final String JSON = "application/json";
    /** Media type of a table answer. */
    static final String CSV = "text/csv; charset=utf-8";

    private static final String BODY_ATTR = "tectomelt.writtenBody";

    /** An answer as written: its media type and bytes (what the result cache keeps). */
    record Written(String contentType, byte[] bytes) {
    }

    private Responses() {
    }

    /** Writes {@code body} as {@code application/json} with status 200. */
    static void json(Context ctx, Object body) {
        bytes(ctx, new Written(JSON, Json.write(body)));
    }

    /** Writes an answer (a fresh one, or a cached one) with status 200. */
    static void bytes(Context ctx, Written w) {
        ctx.attribute(BODY_ATTR, w);
        ctx.contentType(w.contentType()).result(w.bytes());
    }

    /** The answer written by {@link #json} or {@link #bytes} for this request, or null when none. */
    static Written written(Context ctx) {
        return ctx.attribute(BODY_ATTR);
    }
}
