package org.tectomelt;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ConfigTest {

    @Test
    void embeddedDefaultsApplyWithAnEmptyEnvironment() {
        assertEquals(Config.defaults(), Config.fromEnvironment(Map.of()));
        assertEquals(7070, Config.defaults().port());
        assertEquals("127.0.0.1", Config.defaults().host(), "a bare java -jar serves this machine only");
    }

    @Test
    void environmentOverridesEachSetting() {
        Config c = Config.fromEnvironment(Map.of("PORT", "8081", "HOST", "127.0.0.1",
                "TECTOMELT_MAX_BODY_BYTES", "2048"));
        assertEquals(8081, c.port());
        assertEquals("127.0.0.1", c.host());
        assertEquals(2048, c.maxBodyBytes());
    }

    @Test
    void unusableValuesAreRefusedWithTheVariableNamed() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Config.fromEnvironment(Map.of("PORT", "seventy")));
        assertEquals("PORT must be an integer, got 'seventy'", e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> Config.fromEnvironment(Map.of("PORT", "70000")));
    }

    @Test
    void theCapsHaveTheirDocumentedDefaults() {
        Config d = Config.defaults();
        assertEquals(1_048_576L, d.maxBodyBytes());
        assertEquals(10_000, d.maxBatchPoints());
        assertEquals(5_000, d.maxProfilePoints());
        assertEquals(100_000_000L, d.maxSillCellSteps());
        assertEquals(20.0, d.maxSillDurationMyr());
        assertEquals(Math.max(1, Runtime.getRuntime().availableProcessors()), d.heavyConcurrency());
        assertEquals(200, d.heavyQueueMillis());
        assertEquals(10_000, d.heavyBudgetMillis());
        assertEquals(32, d.cacheMegabytes());
        assertEquals(12_000, d.shutdownGraceMillis());
        assertFalse(d.accessControlled());
        assertEquals(List.of(), d.corsOrigins());
        assertEquals(10_000, d.bodyTimeoutMillis());
        assertEquals(16, d.threadsPerClient());
        assertEquals(1_000, d.heavyBatchPoints());
        assertEquals(1, d.compressionLevel());
        assertEquals(d, new Config("127.0.0.1", 7070, 1_048_576L), "the first release's constructor keeps working");
    }

    @Test
    void everyCapAndSharedServerSettingIsReadFromTheEnvironment() {
        Config c = Config.fromEnvironment(Map.ofEntries(
                Map.entry("TECTOMELT_MAX_BATCH_POINTS", "500"),
                Map.entry("TECTOMELT_MAX_PROFILE_POINTS", "800"),
                Map.entry("TECTOMELT_MAX_SILL_CELL_STEPS", "1000000"),
                Map.entry("TECTOMELT_MAX_SILL_DURATION_MYR", "2.5"),
                Map.entry("TECTOMELT_HEAVY_CONCURRENCY", "3"),
                Map.entry("TECTOMELT_HEAVY_QUEUE_MS", "0"),
                Map.entry("TECTOMELT_HEAVY_BUDGET_MS", "2500"),
                Map.entry("TECTOMELT_CACHE_MB", "0"),
                Map.entry("TECTOMELT_TOKEN", "  s3cret-token-for-the-lab  "),
                Map.entry("TECTOMELT_CORS_ORIGINS", "https://dash.example.org, http://localhost:8888/"),
                Map.entry("TECTOMELT_SHUTDOWN_GRACE_MS", "3000"),
                Map.entry("TECTOMELT_COMPRESSION_LEVEL", "0")));
        assertEquals(500, c.maxBatchPoints());
        assertEquals(800, c.maxProfilePoints());
        assertEquals(1_000_000L, c.maxSillCellSteps());
        assertEquals(2.5, c.maxSillDurationMyr());
        assertEquals(3, c.heavyConcurrency());
        assertEquals(0, c.heavyQueueMillis());
        assertEquals(2500, c.heavyBudgetMillis());
        assertEquals(0, c.cacheMegabytes());
        assertEquals("s3cret-token-for-the-lab", c.token());
        assertTrue(c.accessControlled());
        assertEquals(List.of("https://dash.example.org", "http://localhost:8888"), c.corsOrigins());
        assertEquals(3000, c.shutdownGraceMillis());
        assertEquals(0, c.compressionLevel());
    }

    @Test
    void theTokenCanComeFromAFileButNotFromBothPlaces(@TempDir Path dir) throws Exception {
        Path file = dir.resolve("token");
        Files.writeString(file, "from-a-file-0123456789\n");
        assertEquals("from-a-file-0123456789",
                Config.fromEnvironment(Map.of("TECTOMELT_TOKEN_FILE", file.toString())).token());
        IllegalArgumentException both = assertThrows(IllegalArgumentException.class, () -> Config.fromEnvironment(
                Map.of("TECTOMELT_TOKEN_FILE", file.toString(), "TECTOMELT_TOKEN", "another-token-0123456789")));
        assertTrue(both.getMessage().contains("not both"));
        IllegalArgumentException missing = assertThrows(IllegalArgumentException.class, () ->
                Config.fromEnvironment(Map.of("TECTOMELT_TOKEN_FILE", dir.resolve("absent").toString())));
        assertTrue(missing.getMessage().startsWith("TECTOMELT_TOKEN_FILE: cannot read"));
    }

    @Test
    void aShortOrOddTokenIsRefusedAndNeverPrinted() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Config.fromEnvironment(Map.of("TECTOMELT_TOKEN", "short")));
        assertTrue(e.getMessage().contains("at least 16"));
        assertFalse(e.getMessage().contains("short'"));
        assertThrows(IllegalArgumentException.class,
                () -> Config.fromEnvironment(Map.of("TECTOMELT_TOKEN", "has spaces inside the token")));
        Config c = Config.fromEnvironment(Map.of("TECTOMELT_TOKEN", "s3cret-token-for-the-lab"));
        assertFalse(c.toString().contains("s3cret"), c.toString());
        assertTrue(c.toString().contains("token=(set)"));
    }

    @Test
    void unusableCapsAndOriginsAreRefusedWithTheVariableNamed() {
        for (Map<String, String> bad : List.of(
                Map.of("TECTOMELT_MAX_BATCH_POINTS", "0"),
                Map.of("TECTOMELT_MAX_PROFILE_POINTS", "many"),
                Map.of("TECTOMELT_MAX_SILL_DURATION_MYR", "NaN"),
                Map.of("TECTOMELT_MAX_SILL_DURATION_MYR", "-1"),
                Map.of("TECTOMELT_HEAVY_CONCURRENCY", "0"),
                Map.of("TECTOMELT_HEAVY_BUDGET_MS", "5"),
                Map.of("TECTOMELT_CACHE_MB", "-1"),
                Map.of("TECTOMELT_COMPRESSION_LEVEL", "10"),
                Map.of("TECTOMELT_CORS_ORIGINS", "dash.example.org"),
                Map.of("TECTOMELT_CORS_ORIGINS", "https://dash.example.org/path"),
                Map.of("TECTOMELT_CORS_ORIGINS", "*, https://dash.example.org"))) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> Config.fromEnvironment(bad), bad.toString());
            String variable = bad.keySet().iterator().next();
            assertTrue(e.getMessage().startsWith(variable), e.getMessage());
        }
    }
}
