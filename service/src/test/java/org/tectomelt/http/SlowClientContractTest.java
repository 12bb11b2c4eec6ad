package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.javalin.Javalin;
import java.io.IOException;
import java.io.OutputStream;
import java.net.Socket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/**
 * Fault 1 of issue 13: 400 clients each trickling a POST body (one byte every second) must not
 * stop the server from answering {@code /v1/health} within a second; a body slower than
 * {@code TECTOMELT_BODY_TIMEOUT_MS} is answered 408. The test runs for a bounded time (about
 * 6 s) and closes every connection it opened.
 */
class SlowClientContractTest {

    private static final int SLOW_CLIENTS = 400;

    @Test
    void fourHundredTricklingBodiesLeaveHealthAnsweringWithinASecond() throws Exception {
        Config config = TestApps.config(Map.of("TECTOMELT_BODY_TIMEOUT_MS", "30000"));
        Javalin app = TestApps.start(config);
        List<Socket> slow = new ArrayList<>();
        HttpClient client = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(2)).build();
        HttpRequest health = HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + app.port() + "/v1/health"))
                .timeout(Duration.ofSeconds(3)).build();
        try {
            // warm up the route and the client's connection before the slow clients arrive
            for (int i = 0; i < 5; i++) {
                assertEquals(200, client.send(health, HttpResponse.BodyHandlers.ofString()).statusCode());
            }
            for (int i = 0; i < SLOW_CLIENTS; i++) {
                Socket s = new Socket("127.0.0.1", app.port());
                s.setSoTimeout(8_000);
                s.getOutputStream().write(("POST /v1/pressure HTTP/1.1\r\nHost: localhost\r\n"
                        + "Content-Type: application/json\r\nContent-Length: 200\r\n\r\n{")
                        .getBytes(StandardCharsets.US_ASCII));
                slow.add(s);
            }
            List<Long> millis = new ArrayList<>();
            long worstMillis = 0;
            int probes = 0;
            for (int round = 0; round < 3; round++) {
                for (Socket s : slow) {
                    trickle(s);
                }
                for (int p = 0; p < 3; p++) {
                    long start = System.nanoTime();
                    HttpResponse<String> r = client.send(health, HttpResponse.BodyHandlers.ofString());
                    long ms = (System.nanoTime() - start) / 1_000_000;
                    assertEquals(200, r.statusCode(), r.body());
                    worstMillis = Math.max(worstMillis, ms);
                    millis.add(ms);
                    probes++;
                    Thread.sleep(300);
                }
            }
            assertEquals(9, probes);
            assertTrue(worstMillis < 1000, "health answered within 1 s under " + SLOW_CLIENTS
                    + " slow bodies (each probe, ms: " + millis + ")");

        } finally {
            for (Socket s : slow) {
                try {
                    s.close();
                } catch (IOException ignored) {
                    // already closed by the server
                }
            }
            app.stop();
        }
    }

    @Test
    void aBodySlowerThanTheTimeoutIsA408Problem() throws Exception {
        Javalin app = TestApps.start(TestApps.config(Map.of("TECTOMELT_BODY_TIMEOUT_MS", "1000")));
        try (Socket s = new Socket("127.0.0.1", app.port())) {
            s.setSoTimeout(8_000);
            s.getOutputStream().write(("POST /v1/pressure HTTP/1.1\r\nHost: localhost\r\n"
                    + "Content-Type: application/json\r\nContent-Length: 200\r\n\r\n{")
                    .getBytes(StandardCharsets.US_ASCII));
            String answer = new String(s.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
            assertTrue(answer.startsWith("HTTP/1.1 408"), answer);
            assertTrue(answer.contains("/problems/body-timeout"), answer);
            assertTrue(answer.contains("TECTOMELT_BODY_TIMEOUT_MS"), answer);
        } finally {
            app.stop();
        }
    }

    private static void trickle(Socket s) {
        try {
            OutputStream out = s.getOutputStream();
            out.write(' ');
            out.flush();
        } catch (IOException e) {
            // the server may already have answered and closed this one
        }
    }
}
