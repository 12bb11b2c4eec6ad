package org.tectomelt.http;

import java.io.PrintStream;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import org.slf4j.LoggerFactory;

/**
 * The access log: one line per request, laid out as every other log line
 * ({@code [thread] INFO tectomelt.access - POST /v1/pressure 200 0.4ms requestId=…}), on standard
 * error.
 *
 * <p>Lines are collected and written together at most {@value #FLUSH_MILLIS} ms later (or when
 * {@value #BUFFER_CHARS} characters are waiting, and when the server stops), like a web server's
 * buffered access log: a line written and flushed on its own cost a cheap request about a sixth
 * of its time (one system call each; measured with {@code .ci/load/wrk-bench.sh}). Warnings and
 * errors still go through the logger at once, so a warning can precede the access line of its
 * own request by up to that delay. The log's switch stays the logger's level:
 * {@code -Dorg.slf4j.simpleLogger.log.tectomelt.access=warn} turns the lines off.
 */
final class AccessLog implements AutoCloseable {

    /** Longest time a line waits before it is written. */
    static final long FLUSH_MILLIS = 100;
    /** Waiting characters that make the next line write everything at once. */
    static final int BUFFER_CHARS = 32 * 1024;

    private final boolean enabled;
    private final StringBuilder pending = new StringBuilder(BUFFER_CHARS + 512);
    private final Object writing = new Object();
    private final ScheduledExecutorService flusher;

    /** An access log on when the {@code tectomelt.access} logger logs INFO. */
    AccessLog() {
        this(LoggerFactory.getLogger("tectomelt.access").isInfoEnabled());
    }

    AccessLog(boolean enabled) {
        this.enabled = enabled;
        if (enabled) {
            flusher = Executors.newSingleThreadScheduledExecutor(r -> {
                Thread t = new Thread(r, "tectomelt-access-log");
                t.setDaemon(true);
                return t;
            });
            flusher.scheduleWithFixedDelay(this::flush, FLUSH_MILLIS, FLUSH_MILLIS, TimeUnit.MILLISECONDS);
        } else {
            flusher = null;
        }
    }

    /** Records one finished request. */
    void line(String method, String path, int status, float millis, String requestId) {
        if (!enabled) {
            return;
        }
        String thread = Thread.currentThread().getName();
        boolean full;
        synchronized (pending) {
            pending.append('[').append(thread).append("] INFO tectomelt.access - ").append(method).append(' ')
                    .append(path).append(' ').append(status).append(' ');
            RequestPlumbing.appendTenths(millis, pending);
            pending.append("ms requestId=").append(requestId).append(System.lineSeparator());
            full = pending.length() >= BUFFER_CHARS;
        }
        if (full) {
            flush();
        }
    }

    /** Writes every waiting line now. */
    void flush() {
        synchronized (writing) {   // one writer at a time, so lines keep their order
            String out;
            synchronized (pending) {
                if (pending.length() == 0) {
                    return;
                }
                out = pending.toString();
                pending.setLength(0);
            }
            PrintStream err = System.err;   // looked up each time, as the logger does
            err.print(out);
            err.flush();
        }
    }

    /** Writes what is waiting and stops the timer. */
    @Override
    public void close() {
        if (flusher != null) {
            flusher.shutdown();
        }
        flush();
    }
}
