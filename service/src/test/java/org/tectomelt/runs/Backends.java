package org.tectomelt.runs;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.UUID;
import org.tectomelt.RunsConfig;

/**
 * The databases the storage tests run against: the embedded H2 file always, and PostgreSQL when
 * {@code TECTOMELT_TEST_POSTGRES_URL} names one (with {@code TECTOMELT_TEST_POSTGRES_USER} and
 * {@code _PASSWORD}); {@code .ci/run} starts a throwaway cluster and sets them, and fails when the
 * PostgreSQL cases did not run. Each call gets a fresh schema, so tests never see each other's runs.
 */
public final class Backends {

    /** The variable naming the test PostgreSQL database. */
    public static final String POSTGRES_URL_VAR = "TECTOMELT_TEST_POSTGRES_URL";

    private Backends() {
    }

    /** "h2" and, when configured, "postgres". */
    public static List<String> names() {
        List<String> out = new ArrayList<>(List.of("h2"));
        if (postgresUrl() != null) {
            out.add("postgres");
        }
        return out;
    }

    /** The test PostgreSQL URL, or null. */
    public static String postgresUrl() {
        String url = System.getenv(POSTGRES_URL_VAR);
        return url == null || url.isBlank() ? null : url.trim();
    }

    /** Settings for a fresh, empty database of {@code backend}; an H2 file lives under {@code dir}. */
    public static RunsConfig fresh(String backend, Path dir, String instanceName) {
        RunsConfig base = new RunsConfig(dir, "", "", "", 1_000, 3, 30, 2, 500, 100, instanceName);
        if (backend.equals("h2")) {
            return base;
        }
        String schema = "t_" + UUID.randomUUID().toString().replace("-", "").substring(0, 16).toLowerCase(Locale.ROOT);
        try (Connection c = DriverManager.getConnection(postgresUrl(), user(), password());
             Statement s = c.createStatement()) {
            s.execute("create schema " + schema);
        } catch (SQLException e) {
            throw new IllegalStateException("cannot prepare the test schema on " + postgresUrl(), e);
        }
        String url = postgresUrl() + (postgresUrl().contains("?") ? "&" : "?") + "currentSchema=" + schema;
        recordPostgresCase(schema);
        return base.withDatabaseUrl(url, user(), password());
    }

    /** The same database as {@code config}, seen by another instance. */
    public static RunsConfig sameDatabase(RunsConfig config, String instanceName) {
        return new RunsConfig(config.dataDir(), config.databaseUrl(), config.databaseUser(), config.databasePassword(),
                config.maxRunPoints(), config.maxQueuedRunsPerOwner(), config.retentionDays(), config.threads(),
                config.heartbeatMillis(), config.pollMillis(), instanceName);
    }

    /**
     * Appends the schema and the calling test to {@code target/postgres-cases.txt}, which
     * {@code .ci/run} reads to prove the PostgreSQL cases ran.
     */
    private static void recordPostgresCase(String schema) {
        String caller = StackWalker.getInstance().walk(frames -> frames
                .map(f -> f.getClassName() + "." + f.getMethodName())
                .filter(n -> !n.startsWith(Backends.class.getName()))
                .findFirst().orElse("?"));
        try {
            Path file = Path.of("target", "postgres-cases.txt");
            Files.createDirectories(file.getParent());
            Files.writeString(file, schema + " " + caller + System.lineSeparator(), StandardCharsets.UTF_8,
                    StandardOpenOption.CREATE, StandardOpenOption.APPEND);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    static String user() {
        return System.getenv().getOrDefault("TECTOMELT_TEST_POSTGRES_USER", "tectomelt");
    }

    static String password() {
        return System.getenv().getOrDefault("TECTOMELT_TEST_POSTGRES_PASSWORD", "tectomelt");
    }
}
