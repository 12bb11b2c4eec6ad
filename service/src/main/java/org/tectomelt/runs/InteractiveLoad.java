package org.tectomelt.runs;

import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.locks.Condition;
import java.util.concurrent.locks.ReentrantLock;

/**
 * Interactive requests in flight, so that background points give way to them: a worker about to
 * compute the next point first waits while any interactive request is being served, at most
 * {@link #MAX_YIELD_NANOS} per point, and goes on as soon as the last of them ends (the request
 * that ends last wakes the waiting workers; a request finding no worker waiting pays one atomic
 * decrement and one read). Java thread priorities are not honoured by Linux without extra
 * privileges; this gate works everywhere.
 */
public final class InteractiveLoad {

    /** Longest a worker waits before one point, so a steady stream of requests cannot starve a run. */
    static final long MAX_YIELD_NANOS = 20_000_000L;

    private final AtomicInteger inFlight = new AtomicInteger();
    private final AtomicInteger waiting = new AtomicInteger();
    private final ReentrantLock lock = new ReentrantLock();
    private final Condition idle = lock.newCondition();

    /** One interactive request started. */
    public void begin() {
        inFlight.incrementAndGet();
    }

    /** One interactive request finished; the last one in flight wakes the workers waiting for it. */
    public void end() {
        if (inFlight.decrementAndGet() <= 0 && waiting.get() > 0) {
            lock.lock();
            try {
                idle.signalAll();
            } finally {
                lock.unlock();
            }
        }
    }

    /** Requests in flight now. */
    public int inFlight() {
        return inFlight.get();
    }

    /**
     * Waits while interactive requests are in flight, at most {@link #MAX_YIELD_NANOS}.
     *
     * @return the nanoseconds waited (0 when nothing was in flight)
     */
    long yieldToInteractive() {
        if (inFlight.get() <= 0) {
            return 0;
        }
        long start = System.nanoTime();
        long left = MAX_YIELD_NANOS;
        waiting.incrementAndGet();
        lock.lock();
        try {
            // checked under the lock: an end() between the check and the await signals under it too
            while (inFlight.get() > 0 && left > 0) {
                left = idle.awaitNanos(left);
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        } finally {
            lock.unlock();
            waiting.decrementAndGet();
        }
        return System.nanoTime() - start;
    }

    /** For tests: waits until a worker is waiting in {@link #yieldToInteractive}, at most {@code ms}. */
    boolean awaitWaiter(long ms) throws InterruptedException {
        long until = System.nanoTime() + TimeUnit.MILLISECONDS.toNanos(ms);
        while (waiting.get() == 0) {
            if (System.nanoTime() > until) {
                return false;
            }
            Thread.sleep(1);
        }
        return true;
    }
}
