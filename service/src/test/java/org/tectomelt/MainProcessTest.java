package org.tectomelt;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;

/**
 * The service as an operator starts it: {@code java -cp ... org.tectomelt.Main} in its own process,
 * with settings in the environment. A clean SIGTERM ends it with status 0; a bare start binds
 * loopback and says so; a port in use is one line on standard error, no stack trace.
 */
class MainProcessTest {

    private static Process launch(Map<String, String> env) throws IOException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        ProcessBuilder pb = new ProcessBuilder(java, "-Xmx128m", "-cp", System.getProperty("java.class.path"),
                "org.tectomelt.Main");
        pb.environment().keySet().removeIf(k -> k.equals("HOST") || k.equals("PORT") || k.startsWith("TECTOMELT_"));
        pb.environment().putAll(env);
        pb.redirectErrorStream(true);
        return pb.start();
    }

    /** Reads lines until one contains {@code marker} (or the process ends); returns all lines read. */
    private static List<String> readUntil(Process p, String marker) throws IOException {
        List<String> lines = new ArrayList<>();
        BufferedReader r = new BufferedReader(new InputStreamReader(p.getInputStream(), StandardCharsets.UTF_8));
        String line;
        while ((line = r.readLine()) != null) {
            lines.add(line);
            if (line.contains(marker)) {
                break;
            }
        }
        return lines;
    }

    @Test
    void aBareStartBindsLoopbackSaysSoAndExitsZeroOnSigterm() throws Exception {
        Process p = launch(Map.of("PORT", "0", "TECTOMELT_SHUTDOWN_GRACE_MS", "500"));
        try {
            List<String> lines = readUntil(p, "listening on");
            String listening = lines.get(lines.size() - 1);
            assertTrue(listening.contains("listening on http://127.0.0.1:"), String.join("\n", lines));
            assertTrue(listening.contains("this machine only") && listening.contains("HOST=0.0.0.0"), listening);
            p.destroy();   // SIGTERM
            assertTrue(p.waitFor(30, TimeUnit.SECONDS), "stopped after SIGTERM");
            assertEquals(0, p.exitValue(), "a clean stop on SIGTERM exits with status 0");
        } finally {
            p.destroyForcibly();
        }
    }

    @Test
    void aPortInUseIsOneClearLine() throws Exception {
        try (ServerSocket taken = new ServerSocket(0, 50, InetAddress.getLoopbackAddress())) {
            Process p = launch(Map.of("HOST", "127.0.0.1", "PORT", String.valueOf(taken.getLocalPort())));
            try {
                assertTrue(p.waitFor(60, TimeUnit.SECONDS), "gave up on the taken port");
                String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
                assertEquals(Main.EXIT_CANNOT_BIND, p.exitValue(), out);
                List<String> lines = out.lines().filter(l -> !l.isBlank()).toList();
                assertEquals(1, lines.size(), out);
                assertTrue(lines.get(0).contains("already in use") && lines.get(0).contains("PORT"), out);
                assertFalse(out.contains("\tat ") || out.contains("Exception"), out);
            } finally {
                p.destroyForcibly();
            }
        }
    }
}
