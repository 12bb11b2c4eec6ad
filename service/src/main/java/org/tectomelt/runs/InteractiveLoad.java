package org.tectomelt.runs;

import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.locks.LockSupport;

/**
 * Interactive requests in flight, so that background points give way to them: a worker about to
 * compute the next point first waits (a millisecond at a time, at most {@link #MAX_YIELD_NANOS}
 * per point) while any interactive request is being served. Java thread priorities are not
 * honoured by Linux without extra privileges; this gate works everywhere.
 */
public final class InteractiveLoad {

    /** Longest a worker waits before one point, so a steady stream of requests cannot starve a run. */
    static final long MAX_YIELD_NANOS = 20_000_000L;

    private final AtomicInteger inFlight = new AtomicInteger();

    /** One interactive request started. */
    public void begin() {
        inFlight.incrementAndGet();
    }

    /** One interactive request finished. */
    public void end() {
        inFlight.decrementAndGet();
    }

    /** Requests in flight now. */
    public int inFlight() {
        return inFlight.get();
    }

    /** Waits while interactive requests are in flight, at most {@link #MAX_YIELD_NANOS}. */
    void yieldToInteractive() {
        if (inFlight.get() <= 0) {
            return;
        }
        long until = System.nanoTime() + MAX_YIELD_NANOS;
        while (inFlight.get() > 0 && System.nanoTime() < until) {
            LockSupport.parkNanos(1_000_000L);
        }
    }
}
