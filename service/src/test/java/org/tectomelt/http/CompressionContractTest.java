package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.javalin.Javalin;
import io.restassured.RestAssured;
import io.restassured.config.DecoderConfig;
import io.restassured.http.ContentType;
import io.restassured.response.Response;
import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.util.Map;
import java.util.zip.GZIPInputStream;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;

/**
 * {@code TECTOMELT_COMPRESSION_LEVEL}: large answers go gzip-compressed to clients that accept gzip
 * (at level 1 by default), small ones and those to clients that do not stay plain, level 0 turns it
 * off; the compressed bytes are the plain answer's bytes.
 */
class CompressionContractTest {

    private static Response post(Javalin app, String body, String encoding) {
        return TestApps.given(app)
                .config(RestAssured.config().decoderConfig(DecoderConfig.decoderConfig().noContentDecoders()))
                .header("Accept-Encoding", encoding).accept("text/csv").contentType(ContentType.JSON).body(body)
                .post("/v1/melt-fraction");
    }

    private static String gunzip(byte[] bytes) throws Exception {
        try (GZIPInputStream in = new GZIPInputStream(new ByteArrayInputStream(bytes))) {
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
    }

    @Test
    void largeAnswersAreGzippedForClientsThatAcceptIt() throws Exception {
        Config config = TestApps.config(Map.of());
        Javalin app = TestApps.start(config, App.routes(config), new Heavy(config));
        try {
            String body = HeavyBatchContractTest.batch(200);
            Response plain = post(app, body, "identity");
            Response zipped = post(app, body, "gzip");
            assertEquals(200, plain.statusCode());
            assertEquals(200, zipped.statusCode());
            assertNull(plain.getHeader("Content-Encoding"));
            assertEquals("gzip", zipped.getHeader("Content-Encoding"));
            String text = plain.asString();
            assertTrue(text.length() > 1500, "a large answer: " + text.length());
            assertEquals(text, gunzip(zipped.asByteArray()));
            assertTrue(zipped.asByteArray().length < text.length() / 2, "compressed " + zipped.asByteArray().length);
            // a one-point answer is below the threshold: plain even when gzip is accepted
            assertNull(post(app, HeavyBatchContractTest.batch(1), "gzip").getHeader("Content-Encoding"));
        } finally {
            app.stop();
        }
    }

    @Test
    void levelZeroSendsEveryAnswerPlain() {
        Config config = TestApps.config(Map.of("TECTOMELT_COMPRESSION_LEVEL", "0"));
        Javalin app = TestApps.start(config, App.routes(config), new Heavy(config));
        try {
            Response r = post(app, HeavyBatchContractTest.batch(200), "gzip");
            assertEquals(200, r.statusCode());
            assertNull(r.getHeader("Content-Encoding"));
            byte[] bytes = r.asByteArray();
            assertTrue(bytes.length > 1500 && bytes[0] != (byte) 0x1f, "plain CSV, not a gzip stream");
        } finally {
            app.stop();
        }
    }
}
