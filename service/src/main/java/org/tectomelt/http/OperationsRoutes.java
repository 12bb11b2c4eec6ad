package org.tectomelt.http;

import io.javalin.http.Context;
import java.util.List;

/** Routes for running the shared server: {@code GET /metrics}. */
final class OperationsRoutes {

    private OperationsRoutes() {
    }

    static List<Route> routes() {
        return List.of(Route.liveGet("/metrics", OperationsRoutes::metrics));
    }

    /** Every meter in the Prometheus text exposition format 0.0.4. */
    static void metrics(Context ctx) {
        Metrics m = ctx.appData(Metrics.KEY);
        ctx.contentType(Metrics.CONTENT_TYPE).result(m.scrape());
    }
}
