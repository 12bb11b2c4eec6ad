package org.tectomelt.runs;

import com.zaxxer.hikari.HikariConfig;
import com.zaxxer.hikari.HikariDataSource;
import java.io.IOException;
import java.nio.file.Files;
import java.sql.Connection;
import java.sql.SQLException;
import javax.sql.DataSource;
import org.flywaydb.core.Flyway;
import org.tectomelt.RunsConfig;

/**
 * The run database: a HikariCP pool on the embedded H2 file (default) or on PostgreSQL
 * ({@code TECTOMELT_DATABASE_URL}), with its schema brought up to date by Flyway
 * ({@code src/main/resources/db/migration/h2} and {@code .../postgresql}, one folder per vendor
 * with the same version numbers).
 */
public final class Database implements AutoCloseable {

    private final HikariDataSource pool;
    private final boolean postgres;
    private final String description;

    private Database(HikariDataSource pool, boolean postgres, String description) {
        this.pool = pool;
        this.postgres = postgres;
        this.description = description;
    }

    /**
     * Opens the pool and migrates the schema.
     *
     * @param config    the storage settings
     * @param poolSize  connections to keep at most
     * @throws StorageUnavailableException with one line naming the database and the cause when
     *                                     it cannot be reached, created or migrated
     */
    public static Database open(RunsConfig config, int poolSize) {
        String url = config.jdbcUrl();
        String description = config.databaseUrl().isEmpty()
                ? "the embedded database under " + config.dataDir().toAbsolutePath().normalize()
                : redact(url);
        if (config.databaseUrl().isEmpty()) {
            try {
                Files.createDirectories(config.dataDir());
            } catch (IOException | RuntimeException e) {
                throw new StorageUnavailableException("cannot create TECTOMELT_DATA_DIR "
                        + config.dataDir().toAbsolutePath().normalize() + " (" + e.getClass().getSimpleName()
                        + ": " + e.getMessage() + ")", e);
            }
        }
        HikariConfig hc = new HikariConfig();
        hc.setJdbcUrl(url);
        if (!config.databaseUser().isEmpty()) {
            hc.setUsername(config.databaseUser());
        }
        if (!config.databasePassword().isEmpty()) {
            hc.setPassword(config.databasePassword());
        }
        hc.setPoolName("tectomelt-runs");
        hc.setMaximumPoolSize(Math.max(4, poolSize));
        hc.setMinimumIdle(1);
        hc.setConnectionTimeout(5_000);
        hc.setValidationTimeout(2_000);
        hc.setInitializationFailTimeout(5_000);
        HikariDataSource pool;
        try {
            pool = new HikariDataSource(hc);
        } catch (RuntimeException e) {
            throw new StorageUnavailableException("cannot reach the run database at " + description + ": "
                    + rootMessage(e), e);
        }
        boolean postgres = config.postgres();
        try {
            Flyway.configure()
                    .dataSource(pool)
                    .locations("classpath:db/migration/" + (postgres ? "postgresql" : "h2"))
                    .load()
                    .migrate();
        } catch (RuntimeException e) {
            pool.close();
            throw new StorageUnavailableException("cannot bring the run database at " + description
                    + " up to date: " + rootMessage(e), e);
        }
        return new Database(pool, postgres, description);
    }

    /** The pooled data source. */
    public DataSource dataSource() {
        return pool;
    }

    /** True on PostgreSQL, false on H2. */
    public boolean postgres() {
        return postgres;
    }

    /** Where the runs live, for logs and messages (no password). */
    public String description() {
        return description;
    }

    /** True when a connection can be had and answers within two seconds. */
    public boolean reachable() {
        try (Connection c = pool.getConnection()) {
            return c.isValid(2);
        } catch (SQLException | RuntimeException e) {
            return false;
        }
    }

    @Override
    public void close() {
        if (!postgres) {
            // a clean close of the file database, now that nothing writes any more
            try (Connection c = pool.getConnection(); var s = c.createStatement()) {
                s.execute("SHUTDOWN");
            } catch (SQLException | RuntimeException e) {
                // already closed or unreachable: nothing more to flush
            }
        }
        pool.close();
    }

    /** The deepest cause's message: the one a person can act on. */
    static String rootMessage(Throwable e) {
        Throwable t = e;
        while (t.getCause() != null && t.getCause() != t) {
            t = t.getCause();
        }
        String m = t.getMessage();
        String line = (m == null ? t.getClass().getSimpleName() : m).strip();
        int nl = line.indexOf('\n');
        return nl < 0 ? line : line.substring(0, nl).strip();
    }

    private static String redact(String url) {
        return url.replaceAll("(?i)(password=)[^&;]*", "$1***");
    }
}
