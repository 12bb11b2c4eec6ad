package org.tectomelt;

import java.lang.management.ManagementFactory;
import java.net.InetAddress;
import java.net.UnknownHostException;
import java.nio.file.Path;
import java.util.Map;

/**
 * Settings of the runs (persisted parameter sweeps): where they are stored, how they are computed
 * and the limits a group's server puts on them. Every field has an embedded default and can be
 * overridden by the environment variable named beside it; the README's Configuration table lists
 * them.
 *
 * @param dataDir               folder of the embedded database file ({@code TECTOMELT_DATA_DIR},
 *                              default {@code ./data}); not used when a database URL is set
 * @param databaseUrl           JDBC URL of a PostgreSQL database shared by every replica
 *                              ({@code TECTOMELT_DATABASE_URL}, e.g.
 *                              {@code jdbc:postgresql://db.lab:5432/tectomelt}); empty for the
 *                              embedded file database
 * @param databaseUser          its user ({@code TECTOMELT_DATABASE_USER})
 * @param databasePassword      its password ({@code TECTOMELT_DATABASE_PASSWORD})
 * @param maxRunPoints          most points in one run ({@code TECTOMELT_MAX_RUN_POINTS}, default 50,000)
 * @param maxQueuedRunsPerOwner most runs one owner may have queued or running at once
 *                              ({@code TECTOMELT_MAX_QUEUED_RUNS_PER_OWNER}, default 5)
 * @param retentionDays         finished runs are deleted this many days after they finished
 *                              ({@code TECTOMELT_RUN_RETENTION_DAYS}, default 30)
 * @param threads               points computed at once by this instance ({@code TECTOMELT_RUN_THREADS},
 *                              default: the number of processors)
 * @param heartbeatMillis       how often an instance tells the database it is alive; a chunk held
 *                              by an instance silent for four heartbeats is taken over by another
 *                              ({@code TECTOMELT_RUN_HEARTBEAT_MS}, default 10,000)
 * @param pollMillis            how often an instance looks for chunks queued by others
 *                              ({@code TECTOMELT_RUN_POLL_MS}, default 1,000)
 * @param instanceName          this instance's name in the job queue and in each computed point
 *                              ({@code TECTOMELT_INSTANCE_NAME}, default host name and process id)
 */
public record RunsConfig(Path dataDir, String databaseUrl, String databaseUser, String databasePassword,
                         int maxRunPoints, int maxQueuedRunsPerOwner, int retentionDays, int threads,
                         long heartbeatMillis, long pollMillis, String instanceName) {

    /** Default {@link #maxRunPoints()}. */
    public static final int DEFAULT_MAX_RUN_POINTS = 50_000;
    /** Default {@link #maxQueuedRunsPerOwner()}. */
    public static final int DEFAULT_MAX_QUEUED_RUNS_PER_OWNER = 5;
    /** Default {@link #retentionDays()}. */
    public static final int DEFAULT_RETENTION_DAYS = 30;

    /** Normalises the components. */
    public RunsConfig {
        databaseUrl = databaseUrl == null ? "" : databaseUrl.trim();
        databaseUser = databaseUser == null ? "" : databaseUser;
        databasePassword = databasePassword == null ? "" : databasePassword;
    }

    /** Embedded defaults: the file database under {@code ./data}. */
    public static RunsConfig defaults() {
        return new RunsConfig(Path.of("data"), "", "", "", DEFAULT_MAX_RUN_POINTS,
                DEFAULT_MAX_QUEUED_RUNS_PER_OWNER, DEFAULT_RETENTION_DAYS,
                Math.max(1, Runtime.getRuntime().availableProcessors()), 10_000, 1_000, defaultInstanceName());
    }

    /**
     * Reads the settings from an environment map, falling back to {@link #defaults()}.
     *
     * @throws IllegalArgumentException when a variable is present but unusable
     */
    public static RunsConfig fromEnvironment(Map<String, String> env) {
        RunsConfig d = defaults();
        String dir = env.get("TECTOMELT_DATA_DIR");
        String url = env.getOrDefault("TECTOMELT_DATABASE_URL", "").trim();
        if (!url.isEmpty() && !url.startsWith("jdbc:postgresql:") && !url.startsWith("jdbc:h2:")) {
            throw new IllegalArgumentException("TECTOMELT_DATABASE_URL must be a PostgreSQL JDBC URL like "
                    + "jdbc:postgresql://db.lab:5432/tectomelt, got '" + url + "'");
        }
        String name = env.get("TECTOMELT_INSTANCE_NAME");
        return new RunsConfig(
                dir == null || dir.isBlank() ? d.dataDir() : Path.of(dir.trim()),
                url,
                env.getOrDefault("TECTOMELT_DATABASE_USER", ""),
                env.getOrDefault("TECTOMELT_DATABASE_PASSWORD", ""),
                (int) Config.longVar(env, "TECTOMELT_MAX_RUN_POINTS", d.maxRunPoints(), 1, 10_000_000),
                (int) Config.longVar(env, "TECTOMELT_MAX_QUEUED_RUNS_PER_OWNER", d.maxQueuedRunsPerOwner(), 1, 100_000),
                (int) Config.longVar(env, "TECTOMELT_RUN_RETENTION_DAYS", d.retentionDays(), 1, 36_500),
                (int) Config.longVar(env, "TECTOMELT_RUN_THREADS", d.threads(), 1, 1_024),
                Config.longVar(env, "TECTOMELT_RUN_HEARTBEAT_MS", d.heartbeatMillis(), 100, 3_600_000),
                Config.longVar(env, "TECTOMELT_RUN_POLL_MS", d.pollMillis(), 50, 600_000),
                name == null || name.isBlank() ? d.instanceName() : name.trim());
    }

    /** An in-memory H2 database (tests and apps built without storage settings). */
    public static RunsConfig inMemory() {
        RunsConfig d = defaults();
        return d.withDatabaseUrl("jdbc:h2:mem:runs-" + java.util.UUID.randomUUID() + ";DB_CLOSE_DELAY=-1", "", "");
    }

    /** A copy on another database. */
    public RunsConfig withDatabaseUrl(String url, String user, String password) {
        return new RunsConfig(dataDir, url, user, password, maxRunPoints, maxQueuedRunsPerOwner, retentionDays,
                threads, heartbeatMillis, pollMillis, instanceName);
    }

    /** True when the runs live in PostgreSQL rather than the embedded file. */
    public boolean postgres() {
        return databaseUrl.startsWith("jdbc:postgresql:");
    }

    /** The JDBC URL in use: the configured one, or the embedded file under {@link #dataDir()}. */
    public String jdbcUrl() {
        if (!databaseUrl.isEmpty()) {
            return databaseUrl;
        }
        // closed by the service on shutdown (after its job queue stopped), not by H2's own hook;
        // WRITE_DELAY=0: every commit reaches the file at once (H2's default delays writes by
        // 500 ms, so a process killed just after a chunk committed lost that chunk's points)
        return "jdbc:h2:file:" + dataDir.toAbsolutePath().normalize().resolve("tectomelt")
                + ";DB_CLOSE_ON_EXIT=FALSE;WRITE_DELAY=0";
    }

    /** Never prints the password. */
    @Override
    public String toString() {
        return "RunsConfig[database=" + (databaseUrl.isEmpty() ? "embedded file under " + dataDir : databaseUrl)
                + ", maxRunPoints=" + maxRunPoints + ", maxQueuedRunsPerOwner=" + maxQueuedRunsPerOwner
                + ", retentionDays=" + retentionDays + ", threads=" + threads + ", heartbeatMillis=" + heartbeatMillis
                + ", pollMillis=" + pollMillis + ", instanceName=" + instanceName + "]";
    }

    private static String defaultInstanceName() {
        String host;
        try {
            host = InetAddress.getLocalHost().getHostName();
        } catch (UnknownHostException e) {
            host = "localhost";
        }
        return host + "-" + ManagementFactory.getRuntimeMXBean().getPid();
    }
}
