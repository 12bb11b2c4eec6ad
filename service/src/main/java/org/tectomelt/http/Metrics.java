package org.tectomelt.http;

import io.javalin.config.Key;
import io.javalin.http.Context;
import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.FunctionCounter;
import io.micrometer.core.instrument.Gauge;
import io.micrometer.core.instrument.Timer;
import io.micrometer.core.instrument.binder.cache.CaffeineCacheMetrics;
import io.micrometer.core.instrument.binder.jvm.ClassLoaderMetrics;
import io.micrometer.core.instrument.binder.jvm.JvmGcMetrics;
import io.micrometer.core.instrument.binder.jvm.JvmMemoryMetrics;
import io.micrometer.core.instrument.binder.jvm.JvmThreadMetrics;
import io.micrometer.core.instrument.binder.system.ProcessorMetrics;
import io.micrometer.core.instrument.binder.system.UptimeMetrics;
import io.micrometer.prometheusmetrics.PrometheusConfig;
import io.micrometer.prometheusmetrics.PrometheusMeterRegistry;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.function.Supplier;
import org.tectomelt.runs.RunService;
import org.tectomelt.runs.RunStatus;

/**
 * The service's metrics, exposed at {@code GET /metrics} in the Prometheus text format:
 * <ul>
 *   <li>{@code tectomelt_http_requests_seconds} — a histogram per method, route template and status;</li>
 *   <li>{@code tectomelt_requests_rejected_total} — refused requests per reason (the problem type:
 *       {@code body-too-large}, {@code unsupported-media-type}, {@code validation},
 *       {@code malformed-json}, {@code unauthorized}, {@code busy}, {@code over-budget}, …);</li>
 *   <li>{@code tectomelt_engine_seconds} — engine time per route, recorded by handlers through
 *       {@link #engine(Context, Supplier)};</li>
 *   <li>{@code tectomelt_heavy_in_flight}, the result cache ({@code cache_*{cache="results"}}),
 *       the resident set size, and the JVM: memory pools, GC, threads, class loading, CPU, uptime.</li>
 * </ul>
 * One instance per app, reachable from a handler through {@code ctx.appData(Metrics.KEY)}.
 */
public final class Metrics implements AutoCloseable {

    /** Where the app keeps its instance. */
    static final Key<Metrics> KEY = new Key<>("tectomelt.metrics");

    /** Content type of the Prometheus text exposition format 0.0.4. */
    static final String CONTENT_TYPE = "text/plain; version=0.0.4; charset=utf-8";

    private static final Duration[] BUCKETS = {
        Duration.ofMillis(1), Duration.ofMillis(2), Duration.ofMillis(5), Duration.ofMillis(10),
        Duration.ofMillis(25), Duration.ofMillis(50), Duration.ofMillis(100), Duration.ofMillis(250),
        Duration.ofMillis(500), Duration.ofSeconds(1), Duration.ofMillis(2500), Duration.ofSeconds(5),
        Duration.ofSeconds(10), Duration.ofSeconds(30)};

    private final PrometheusMeterRegistry registry = new PrometheusMeterRegistry(PrometheusConfig.DEFAULT);
    private final JvmGcMetrics gc = new JvmGcMetrics();
    private final Map<String, Timer> requestTimers = new ConcurrentHashMap<>();
    private final Map<String, Counter> rejections = new ConcurrentHashMap<>();
    private final Map<String, Timer> engineTimers = new ConcurrentHashMap<>();

    Metrics(Heavy heavy, ResultCache cache) {
        new JvmMemoryMetrics().bindTo(registry);
        gc.bindTo(registry);
        new JvmThreadMetrics().bindTo(registry);
        new ClassLoaderMetrics().bindTo(registry);
        new ProcessorMetrics().bindTo(registry);
        new UptimeMetrics().bindTo(registry);
        Gauge.builder("tectomelt.process.resident.memory", Metrics::residentBytes).baseUnit("bytes")
                .description("Resident set size of the process (Linux /proc/self/status VmRSS)")
                .register(registry);
        Gauge.builder("tectomelt.heavy.in.flight", heavy, Heavy::inFlight)
                .description("Heavy requests being computed now").register(registry);
        Gauge.builder("tectomelt.heavy.slots", heavy, Heavy::concurrency)
                .description("Heavy requests that may be computed at once (TECTOMELT_HEAVY_CONCURRENCY)")
                .register(registry);
        if (cache.enabled()) {
            CaffeineCacheMetrics.monitor(registry, cache.caffeine(), "results");
        }
    }

    /**
     * Times one engine call for the {@code tectomelt_engine_seconds} histogram of the current
     * route, and returns its result. Use it around the engine call in a handler:
     * <pre>{@code
     * ColumnResult r = Metrics.engine(ctx, () -> column.integrate(potentialT, Heavy.deadline(ctx)));
     * }</pre>
     */
    public static <T> T engine(Context ctx, Supplier<T> work) {
        Metrics m = ctx.appData(KEY);
        long start = System.nanoTime();
        try {
            return work.get();
        } finally {
            m.engineTimer(routeLabel(ctx, 200)).record(Duration.ofNanos(System.nanoTime() - start));
        }
    }

    /** Records a finished request. */
    void finished(Context ctx, float millis) {
        int status = ctx.status().getCode();
        String route = routeLabel(ctx, status);
        String method = ctx.method().name();
        requestTimer(method, route, status).record(Duration.ofNanos((long) (millis * 1_000_000.0)));
        String problem = Problems.problemType(ctx);
        if (problem != null && status >= 400) {
            rejections.computeIfAbsent(problem + "|" + status, k -> Counter.builder("tectomelt.requests.rejected")
                    .description("Requests refused, by reason (the problem type)")
                    .tag("reason", problem).tag("status", String.valueOf(status))
                    .register(registry)).increment();
        }
    }

    /**
     * The runs' meters: {@code tectomelt_runs{status}} (runs per status, all instances),
     * {@code tectomelt_run_queue_chunks} (chunks waiting, all instances),
     * {@code tectomelt_run_points_total} (points this instance computed) and
     * {@code tectomelt_run_points_per_second} (this instance, last ten seconds). The database is
     * read at most once a second; while it is unreachable the shared figures are NaN.
     */
    void bindRuns(RunService runs) {
        Supplier<Map<RunStatus, Integer>> counts = cached(runs::countsByStatus);
        for (RunStatus s : RunStatus.values()) {
            Gauge.builder("tectomelt.runs", () -> {
                Map<RunStatus, Integer> m = counts.get();
                return m == null ? Double.NaN : m.get(s);
            }).tag("status", s.wire()).description("Runs per status (every instance sharing the database)")
                    .register(registry);
        }
        Supplier<Integer> queued = cached(runs::queuedChunks);
        Gauge.builder("tectomelt.run.queue.chunks", () -> {
            Integer q = queued.get();
            return q == null ? Double.NaN : q;
        }).description("Chunks of runs waiting to be computed (every instance)").register(registry);
        FunctionCounter.builder("tectomelt.run.points", runs, RunService::pointsComputed)
                .description("Points of runs this instance computed").register(registry);
        Gauge.builder("tectomelt.run.points.per.second", runs, RunService::pointsPerSecond)
                .description("Points of runs this instance computed per second, over the last ten seconds")
                .register(registry);
    }

    /** {@code read} at most once a second; null while it fails. */
    private static <T> Supplier<T> cached(Supplier<T> read) {
        Object[] box = {null, 0L};
        return () -> {
            synchronized (box) {
                long now = System.nanoTime();
                if ((long) box[1] == 0L || now - (long) box[1] > 1_000_000_000L) {
                    try {
                        box[0] = read.get();
                    } catch (RuntimeException e) {
                        box[0] = null;
                    }
                    box[1] = now;
                }
                @SuppressWarnings("unchecked")
                T t = (T) box[0];
                return t;
            }
        };
    }

    /** The Prometheus text exposition of every meter. */
    String scrape() {
        return registry.scrape(CONTENT_TYPE);
    }

    /** The registry, for tests and extensions. */
    PrometheusMeterRegistry registry() {
        return registry;
    }

    @Override
    public void close() {
        gc.close();
        registry.close();
    }

    private Timer requestTimer(String method, String route, int status) {
        return requestTimers.computeIfAbsent(method + " " + route + " " + status,
                k -> Timer.builder("tectomelt.http.requests")
                        .description("HTTP requests by method, route template and status")
                        .tag("method", method).tag("route", route).tag("status", String.valueOf(status))
                        .serviceLevelObjectives(BUCKETS)
                        .register(registry));
    }

    private Timer engineTimer(String route) {
        return engineTimers.computeIfAbsent(route, r -> Timer.builder("tectomelt.engine")
                .description("Time spent in the engine, by route")
                .tag("route", r)
                .serviceLevelObjectives(BUCKETS)
                .register(registry));
    }

    /**
     * The route template, so that label values stay few: a raw path would let any caller create
     * series at will. Requests that matched no route are "unmatched" (4xx) or "static" (the page).
     */
    static String routeLabel(Context ctx, int status) {
        String route = RequestPlumbing.endpointPath(ctx);
        if (route != null) {
            return route;
        }
        return status >= 400 ? "unmatched" : "static";
    }

    private static double residentBytes() {
        try {
            for (String line : Files.readAllLines(Path.of("/proc/self/status"))) {
                if (line.startsWith("VmRSS:")) {
                    String[] parts = line.trim().split("\\s+");
                    return Double.parseDouble(parts[1]) * 1024.0;
                }
            }
        } catch (IOException | RuntimeException e) {
            // not on Linux: no value
        }
        return Double.NaN;
    }
}
