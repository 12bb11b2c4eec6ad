package org.tectomelt.http;

import io.javalin.http.Context;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.List;

/** Routes about the service itself: health and the OpenAPI document. */
final class MetaRoutes {

    /** Classpath location of the spec, copied byte for byte from {@code api-spec/} by the build. */
    static final String SPEC_RESOURCE = "/api-spec/openapi.yaml";

    private static final byte[] SPEC = loadSpec();

    private MetaRoutes() {
    }

    static List<Route> routes() {
        return List.of(
                Route.liveGet("/v1/health", MetaRoutes::health),
                Route.get("/openapi.yaml", MetaRoutes::spec));
    }

    /** Health body. */
    record Health(String status, String version) {
    }

    static void health(Context ctx) {
        Responses.json(ctx, new Health("up", App.VERSION));
    }

    static void spec(Context ctx) {
        ctx.contentType("application/yaml").result(SPEC);
    }

    private static byte[] loadSpec() {
        try (InputStream in = MetaRoutes.class.getResourceAsStream(SPEC_RESOURCE)) {
            if (in == null) {
                throw new IllegalStateException("the build did not package " + SPEC_RESOURCE);
            }
            return in.readAllBytes();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
