package org.tectomelt.http;

import io.javalin.http.Context;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Semaphore;
import java.util.concurrent.TimeUnit;
import org.tectomelt.Config;
import org.tectomelt.engine.Deadline;

/**
 * What a heavy route gets from the app: one of {@code TECTOMELT_HEAVY_CONCURRENCY} slots and a
 * wall-clock budget of {@code TECTOMELT_HEAVY_BUDGET_MS}.
 *
 * <p>A heavy request waits at most {@code TECTOMELT_HEAVY_QUEUE_MS} for a slot; if none frees up it
 * is refused with 503 {@code /problems/busy} and a {@code Retry-After} header, so a burst of sweeps
 * can neither exhaust memory nor tie up the threads that serve the cheap routes. The handler reads
 * its budget with {@link #deadline(Context)} and passes it to the engine, whose long loops poll it.
 */
public final class Heavy {

    /** Seconds a refused client is told to wait before retrying. */
    static final int RETRY_AFTER_SECONDS = 2;

    private static final String DEADLINE_ATTR = "tectomelt.deadline";

    /** The app's limiter, for a handler that decides per request ({@code ctx.appData(Heavy.KEY)}). */
    static final io.javalin.config.Key<Heavy> KEY = new io.javalin.config.Key<>("tectomelt.heavy");

    private final Semaphore slots;
    private final int concurrency;
    private final long queueMillis;
    private final Duration budget;
    /** Deadlines of the heavy requests being computed now, so a stopping server can cancel them. */
    private final java.util.Set<Deadline> live = java.util.concurrent.ConcurrentHashMap.newKeySet();

    Heavy(Config config) {
        this(config.heavyConcurrency(), config.heavyQueueMillis(), Duration.ofMillis(config.heavyBudgetMillis()));
    }

    Heavy(int concurrency, long queueMillis, Duration budget) {
        this.slots = new Semaphore(concurrency, true);
        this.concurrency = concurrency;
        this.queueMillis = queueMillis;
        this.budget = budget;
    }

    /**
     * The wall-clock budget of this request, to hand to the engine. {@link Deadline#none()} on
     * routes that are not heavy.
     */
    public static Deadline deadline(Context ctx) {
        Deadline d = ctx.attribute(DEADLINE_ATTR);
        return d == null ? Deadline.none() : d;
    }

    /** True when this request already holds a slot (it is served as heavy). */
    static boolean inSlot(Context ctx) {
        return ctx.attribute(DEADLINE_ATTR) != null;
    }

    /** Heavy requests being computed now. */
    int inFlight() {
        return concurrency - slots.availablePermits();
    }

    /** The configured number of slots. */
    int concurrency() {
        return concurrency;
    }

    /**
     * Runs {@code work} in a slot with a fresh deadline attached to {@code ctx}.
     *
     * @throws ApiProblem 503 {@code busy} when no slot frees up in time
     */
    void run(Context ctx, io.javalin.http.Handler work) throws Exception {
        boolean acquired;
        try {
            acquired = queueMillis == 0 ? slots.tryAcquire() : slots.tryAcquire(queueMillis, TimeUnit.MILLISECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            acquired = false;
        }
        if (!acquired) {
            throw busy();
        }
        Deadline deadline = Deadline.after(budget);
        live.add(deadline);
        try {
            ctx.attribute(DEADLINE_ATTR, deadline);
            work.handle(ctx);
        } finally {
            live.remove(deadline);
            slots.release();
        }
    }

    /**
     * Cancels every heavy computation still running (their next deadline poll ends them). The app
     * calls it once the server has stopped: after the grace period nobody is left to read the
     * answers, and the work would otherwise run on until the process exits.
     *
     * @return how many were cancelled
     */
    int cancelAll() {
        int n = 0;
        for (Deadline d : live) {
            d.cancel();
            n++;
        }
        return n;
    }

    /** Calls {@link #cancelAll()} once {@code millis} have passed, on a daemon thread. */
    void cancelAllAfter(long millis) {
        Thread t = new Thread(() -> {
            try {
                Thread.sleep(millis);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
            cancelAll();
        }, "tectomelt-cancel-heavy");
        t.setDaemon(true);
        t.start();
    }

    /** Takes every slot (tests use it to saturate the limiter); returns how many were taken. */
    int drain() {
        return slots.drainPermits();
    }

    /** Gives back {@code n} slots taken by {@link #drain()}. */
    void refill(int n) {
        slots.release(n);
    }

    private ApiProblem busy() {
        return new ApiProblem(503, "busy", "Server busy",
                "All " + concurrency + " slots for long computations are in use (TECTOMELT_HEAVY_CONCURRENCY); "
                        + "retry after " + RETRY_AFTER_SECONDS + " s",
                List.of(), Map.of("Retry-After", String.valueOf(RETRY_AFTER_SECONDS)));
    }
}
