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
 */
public record Route(HandlerType method, String path, Handler handler) {

    /** A GET route. */
    public static Route get(String path, Handler handler) {
        return new Route(HandlerType.GET, path, handler);
    }

    /** A POST route. */
    public static Route post(String path, Handler handler) {
        return new Route(HandlerType.POST, path, handler);
    }
}
