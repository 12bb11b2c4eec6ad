package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/** The buffered access log: every line written, in order, in the logger's layout; none when off. */
class AccessLogTest {

    private static String capture(Runnable r) {
        PrintStream original = System.err;
        ByteArrayOutputStream captured = new ByteArrayOutputStream();
        System.setErr(new PrintStream(captured, true, StandardCharsets.UTF_8));
        try {
            r.run();
        } finally {
            System.setErr(original);
        }
        return captured.toString(StandardCharsets.UTF_8);
    }

    @Test
    void linesFromManyThreadsAreAllWrittenInTheLoggersLayout() {
        String out = capture(() -> {
            AccessLog log = new AccessLog(true);
            List<Thread> threads = new ArrayList<>();
            for (int t = 0; t < 4; t++) {
                int id = t;
                Thread th = new Thread(() -> {
                    for (int i = 0; i < 2500; i++) {
                        log.line("POST", "/v1/pressure", 200, 0.42f, "t" + id + "-" + i);
                    }
                }, "worker-" + t);
                threads.add(th);
                th.start();
            }
            for (Thread th : threads) {
                try {
                    th.join();
                } catch (InterruptedException e) {
                    throw new IllegalStateException(e);
                }
            }
            log.close();
        });
        String[] lines = out.split("\\R");
        assertEquals(10_000, lines.length);
        assertTrue(lines[0].matches("\\[worker-\\d] INFO tectomelt.access - POST /v1/pressure 200 0.4ms "
                + "requestId=t\\d-\\d+"), lines[0]);
        // each thread's lines keep their order
        for (int t = 0; t < 4; t++) {
            int next = 0;
            for (String l : lines) {
                if (l.endsWith("requestId=t" + t + "-" + next)) {
                    next++;
                }
            }
            assertEquals(2500, next, "thread " + t);
        }
    }

    @Test
    void aLineIsWrittenWithinTheFlushDelayWithoutClosing() throws Exception {
        PrintStream original = System.err;
        ByteArrayOutputStream captured = new ByteArrayOutputStream();
        System.setErr(new PrintStream(captured, true, StandardCharsets.UTF_8));
        AccessLog log = new AccessLog(true);
        try {
            log.line("GET", "/v1/health", 200, 0.1f, "abc");
            long deadline = System.nanoTime() + 5_000_000_000L;
            // other tests' servers may write to the same standard error meanwhile: wait for this line
            while (!captured.toString(StandardCharsets.UTF_8).contains("requestId=abc")
                    && System.nanoTime() < deadline) {
                Thread.sleep(AccessLog.FLUSH_MILLIS / 4);
            }
        } finally {
            System.setErr(original);
            log.close();
        }
        assertTrue(captured.toString(StandardCharsets.UTF_8).contains("GET /v1/health 200 0.1ms requestId=abc"));
    }

    @Test
    void offWritesNothing() {
        String out = capture(() -> {
            AccessLog log = new AccessLog(false);
            log.line("GET", "/v1/health", 200, 0.1f, "abc");
            log.close();
        });
        assertEquals("", out);
    }
}
