package org.tectomelt.http;

import io.javalin.Javalin;
import io.javalin.compression.CompressionStrategy;
import io.javalin.compression.Gzip;
import io.javalin.http.Context;
import io.javalin.http.Handler;
import io.javalin.http.HandlerType;
import io.javalin.http.staticfiles.Location;
import java.util.ArrayList;
import java.util.List;
import java.time.Duration;
import java.util.Map;
import org.tectomelt.Config;
import org.tectomelt.RunsConfig;
import org.tectomelt.Tokens;
import org.tectomelt.runs.Evaluator;
import org.tectomelt.runs.InteractiveLoad;
import org.tectomelt.runs.RunService;
import org.tectomelt.runs.sweep.SweepEvaluator;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.SpecContract;
import org.tectomelt.operations.Operations;

/**
 * Factory: configuration in, unstarted Javalin app out (routes, problem mapping, static page, and
 * the shared-server machinery: access control, CORS, the heavy-route limiter and budget, ETags, the
 * result cache, metrics and graceful shutdown).
 */
public final class App {

    /** The service version, from the build. */
    public static final String VERSION = BuildInfo.CURRENT.version();

    private App() {
    }

    /**
     * Gzip at {@code level} (0: none). The service's own media types are listed as allowed, so a
     * response of one of them skips Javalin's case-insensitive scan of its excluded types.
     */
    static CompressionStrategy compression(int level) {
        if (level == 0) {
            return CompressionStrategy.NONE;
        }
        CompressionStrategy s = new CompressionStrategy(null, new Gzip(level));
        s.setAllowedMimeTypes(List.of(Responses.JSON, Responses.CSV, Problems.PROBLEM_JSON));
        return s;
    }

    /** The app for production: no request observer. */
    public static Javalin create(Config config) {
        return create(config, RequestObserver.NONE);
    }

    /**
     * Builds the app.
     *
     * @param config   settings
     * @param observer told about every finished request (tests record status codes with it)
     */
    public static Javalin create(Config config, RequestObserver observer) {
        return create(config, observer, routes(config));
    }

    /** Builds the app with an explicit route list (tests add failing routes with it). */
    static Javalin create(Config config, RequestObserver observer, List<Route> routes) {
        return create(config, observer, routes, new Heavy(config));
    }

    /** Builds the app with an explicit route list and heavy-route limiter (tests saturate it). */
    static Javalin create(Config config, RequestObserver observer, List<Route> routes, Heavy heavy) {
        return create(config, Tokens.fromEnvironment(Map.of(), config.token()), null, observer, routes, heavy);
    }

    /**
     * The app for production: its runs kept in {@code runs} (opened by {@code Main} on the
     * configured database), and every member token of {@code tokens} accepted.
     */
    public static Javalin create(Config config, Tokens tokens, RunService runs) {
        return create(config, tokens, runs, RequestObserver.NONE, routes(config), new Heavy(config));
    }

    /**
     * Builds the app. {@code runs} may be null: the app then keeps its runs in a private in-memory
     * database (tests, and every app built without storage settings). The app starts computing
     * runs when the server has started and closes {@code runs} when it stops.
     */
    static Javalin create(Config config, Tokens tokens, RunService givenRuns, RequestObserver observer,
                          List<Route> routes, Heavy heavy) {
        RunService runs = givenRuns != null ? givenRuns : RunService.open(RunsConfig.inMemory(), evaluator(config));
        ResultCache cache = new ResultCache(config.cacheMegabytes());
        Metrics metrics = new Metrics(heavy, cache);
        metrics.bindRuns(runs);
        RequestKey keys = new RequestKey(VERSION + ";" + BuildInfo.CURRENT.commitLabel() + ";"
                + config.resultFingerprint());
        AccessControl access = new AccessControl(tokens);
        InteractiveLoad load = runs.interactiveLoad();
        AccessLog accessLog = new AccessLog();
        Javalin app = Javalin.create(c -> {
            c.startup.showJavalinBanner = false;
            c.startup.showOldJavalinVersionWarning = false;
            c.http.maxRequestSize = config.maxBodyBytes();
            c.http.prefer405over404 = true;
            c.http.compressionStrategy = compression(config.compressionLevel());
            c.appData(Metrics.KEY, metrics);
            c.appData(Heavy.KEY, heavy);
            c.appData(RunsRoutes.KEY, runs);
            c.staticFiles.add(sf -> {
                sf.hostedPath = "/";
                sf.directory = "/public";
                sf.location = Location.CLASSPATH;
            });
            // the API reference's renderer, from the packaged webjar (GET /docs loads it from here)
            c.staticFiles.add(sf -> {
                sf.hostedPath = MetaRoutes.DOCS_UI_PATH;
                sf.directory = MetaRoutes.docsUiDirectory();
                sf.location = Location.CLASSPATH;
            });
            Cors.configure(c, config.corsOrigins());
            // graceful stop, bodies read without a thread, threads per client, problem+json from Jetty itself
            c.jetty.modifyServer(server -> JettySetup.configure(server, config));
            c.routes.before(RequestPlumbing::assignRequestId);
            // background run points give way while an interactive request is being served
            c.routes.before(ctx -> interactiveBegin(ctx, load));
            c.routes.after(ctx -> interactiveEnd(ctx, load));
            // after every before-handler (the CORS plugin's among them), so refusals carry CORS headers
            c.routes.beforeMatched(ctx -> Cors.acceptUnlistedOrigin(ctx, config.corsOrigins()));
            c.routes.beforeMatched(access::check);
            c.routes.beforeMatched(ctx -> RequestPlumbing.checkBody(ctx, config.maxBodyBytes()));
            for (Route r : routes) {
                Handler h = serve(r, heavy, cache, keys);
                if (r.method() == HandlerType.GET) {
                    c.routes.get(r.path(), h);
                } else if (r.method() == HandlerType.POST) {
                    c.routes.post(r.path(), h);
                } else if (r.method() == HandlerType.DELETE) {
                    c.routes.delete(r.path(), h);
                } else {
                    throw new IllegalArgumentException("unsupported method " + r.method());
                }
            }
            Problems.register(c.routes);
            c.requestLogger.http((ctx, ms) -> {
                interactiveEnd(ctx, load);
                metrics.finished(ctx, ms);
                RequestPlumbing.finished(ctx, ms, observer, accessLog);
            });
            // heavy work still running when the grace period ends has no one left to answer: cancel it
            c.events.serverStopping(() -> heavy.cancelAllAfter(config.shutdownGraceMillis()));
            c.events.serverStarted(runs::start);
            c.events.serverStopped(() -> {
                heavy.cancelAll();
                metrics.close();
            });
            c.events.serverStopped(runs::close);
            c.events.serverStopped(accessLog::close);
        });
        return app;
    }

    /**
     * Wraps a route's handler in what its kind asks for: the {@code If-None-Match} check, then for
     * heavy routes the result cache and the limiter with its budget; the {@code ETag} on success.
     */
    private static Handler serve(Route r, Heavy heavy, ResultCache cache, RequestKey keys) {
        if (r.kind() == Route.Kind.LIVE) {
            return r.handler();
        }
        return ctx -> {
            // the build that answers, on every computed answer (a cached one included)
            Provenance.headers(ctx);
            String etag = keys.etag(ctx);
            if (etag != null && RequestKey.matches(ctx.header("If-None-Match"), etag)) {
                ctx.header("ETag", etag).status(304);
                return;
            }
            if (r.heavy()) {
                Responses.Written hit = cache.get(etag);
                if (hit != null) {
                    Responses.bytes(ctx, hit);
                } else {
                    heavy.run(ctx, r.handler());
                    if (succeeded(ctx)) {
                        cache.put(etag, Responses.written(ctx));
                    }
                }
            } else {
                r.handler().handle(ctx);
            }
            if (etag != null && succeeded(ctx)) {
                ctx.header("ETag", etag);
            }
        };
    }

    private static final String INTERACTIVE_ATTR = "tectomelt.interactive";

    private static void interactiveBegin(Context ctx, InteractiveLoad load) {
        ctx.attribute(INTERACTIVE_ATTR, Boolean.TRUE);
        load.begin();
    }

    /** Idempotent: called by the after-handler and by the request logger, whichever comes first. */
    private static void interactiveEnd(Context ctx, InteractiveLoad load) {
        if (ctx.attribute(INTERACTIVE_ATTR) != null) {
            ctx.attribute(INTERACTIVE_ATTR, null);
            load.end();
        }
    }

    /** What computes the points of runs: the operations on their engine path, per-point budget as a heavy request's. */
    public static Evaluator evaluator(Config config) {
        return new SweepEvaluator(new Invoker(SpecContract.standard(), Operations.of(config)),
                Duration.ofMillis(config.heavyBudgetMillis()));
    }

    private static boolean succeeded(Context ctx) {
        return ctx.status().getCode() == 200 && Responses.written(ctx) != null;
    }

    /**
     * The app enforcing the request rules of another spec document (a test builds one on a modified
     * copy of the spec to show a range changes with no Java edit).
     */
    public static Javalin create(Config config, SpecContract spec) {
        return create(config, RequestObserver.NONE, routes(config, spec));
    }

    /** Every route the service serves; the spec-consistency test reads this same list. */
    public static List<Route> routes(Config config) {
        return routes(config, SpecContract.standard());
    }

    private static List<Route> routes(Config config, SpecContract spec) {
        List<Route> all = new ArrayList<>();
        all.addAll(MetaRoutes.routes());
        // every computation registered in org.tectomelt.operations, served by the one generic handler
        Invoker invoker = new Invoker(spec, Operations.of(config));
        all.addAll(OperationHandler.routes(invoker));
        // runs: parameter sweeps of those operations, persisted and computed in the background
        all.addAll(RunsRoutes.routes(invoker));
        // melting: the lithology catalogue
        all.addAll(MeltingRoutes.routes());

        // operations: metrics and the like
        all.addAll(OperationsRoutes.routes());

        return List.copyOf(all);
    }
}
