package org.tectomelt.studies;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.CancellationException;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.IntConsumer;
import org.tectomelt.engine.Deadline;

/**
 * Where a study computes its samples: in the calling thread alone, or with helpers from a pool.
 *
 * <p>The samples are handed out in small chunks; the calling thread takes chunks too, so a study
 * finishes even when the pool is busy (helper tasks that never started are cancelled once every
 * chunk is done; running ones are waited for). Results must be written by sample index: the order of computation is not fixed,
 * and a study's results do not depend on it.
 */
public final class Workers {

    private static final Workers SERIAL = new Workers(null, 1);

    private final ExecutorService pool;
    private final int parallelism;

    private Workers(ExecutorService pool, int parallelism) {
        this.pool = pool;
        this.parallelism = parallelism;
    }

    /** Everything in the calling thread. */
    public static Workers serial() {
        return SERIAL;
    }

    /**
     * The calling thread plus up to {@code parallelism − 1} helper tasks on {@code pool}.
     *
     * @param pool        executor for the helper tasks
     * @param parallelism threads computing at once, at least 1
     */
    public static Workers on(ExecutorService pool, int parallelism) {
        Objects.requireNonNull(pool, "pool");
        if (parallelism < 1) {
            throw new IllegalArgumentException("parallelism must be at least 1, got " + parallelism);
        }
        return parallelism == 1 ? SERIAL : new Workers(pool, parallelism);
    }

    /** Threads computing at once. */
    public int parallelism() {
        return parallelism;
    }

    /**
     * Runs {@code body} for every index in [0, n), polling the deadline before each.
     *
     * @throws org.tectomelt.engine.BudgetExceededException when the deadline expires
     * @throws CancellationException                       when the calling thread is interrupted
     */
    public void forEach(int n, IntConsumer body, Deadline deadline) {
        if (n <= 0) {
            return;
        }
        if (pool == null) {
            for (int i = 0; i < n; i++) {
                deadline.check();
                body.accept(i);
            }
            return;
        }
        int chunk = Math.max(1, Math.min(64, n / (parallelism * 8)));
        AtomicInteger next = new AtomicInteger();
        AtomicBoolean stop = new AtomicBoolean();
        Runnable work = () -> {
            try {
                while (!stop.get()) {
                    int from = next.getAndAdd(chunk);
                    if (from >= n) {
                        return;
                    }
                    int to = Math.min(n, from + chunk);
                    for (int i = from; i < to; i++) {
                        deadline.check();
                        body.accept(i);
                    }
                }
            } catch (RuntimeException | Error e) {
                stop.set(true);
                throw e;
            }
        };
        int helpers = parallelism - 1;
        AtomicBoolean[] claimed = new AtomicBoolean[helpers];
        CountDownLatch[] done = new CountDownLatch[helpers];
        Throwable[] thrown = new Throwable[helpers];
        List<Future<?>> futures = new ArrayList<>();
        for (int t = 0; t < helpers; t++) {
            claimed[t] = new AtomicBoolean();
            done[t] = new CountDownLatch(1);
            int id = t;
            futures.add(pool.submit(() -> {
                if (!claimed[id].compareAndSet(false, true)) {
                    return; // the caller finished without it
                }
                try {
                    work.run();
                } catch (RuntimeException | Error e) {
                    thrown[id] = e;
                } finally {
                    done[id].countDown();
                }
            }));
        }
        Throwable first = null;
        try {
            work.run();
        } catch (RuntimeException | Error e) {
            first = e;
        }
        for (int t = 0; t < helpers; t++) {
            if (claimed[t].compareAndSet(false, true)) {
                futures.get(t).cancel(false); // never started: nothing to wait for
                continue;
            }
            try {
                done[t].await();
            } catch (InterruptedException e) {
                stop.set(true);
                Thread.currentThread().interrupt();
                if (first == null) {
                    first = new CancellationException("interrupted while waiting for the study's samples");
                }
                break;
            }
            if (first == null && thrown[t] != null) {
                first = thrown[t];
            }
        }
        if (first instanceof RuntimeException re) {
            throw re;
        }
        if (first instanceof Error err) {
            throw err;
        }
        if (first != null) {
            throw new IllegalStateException(first);
        }
    }
}
