package org.tectomelt;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Pattern;

/**
 * Service settings. Every field has an embedded default and can be overridden by the
 * environment variable named beside it; the README's Configuration table lists them all.
 *
 * <p>The caps ({@code max*}) are read by the routes that enforce them: {@code App.routes(config)}
 * hands this record to every {@code *Routes} class, so a handler checks, for example,
 * {@code v.list("points", req.points(), 1, config.maxBatchPoints())}.
 *
 * @param host                interface to bind ({@code HOST}, default 127.0.0.1: a bare {@code java -jar}
 *                            serves this machine only; the container image sets 0.0.0.0)
 * @param port                TCP port ({@code PORT}, default 7070; 0 picks a free port)
 * @param maxBodyBytes        largest accepted request body in bytes
 *                            ({@code TECTOMELT_MAX_BODY_BYTES}, default 1 MiB)
 * @param maxBatchPoints      most independent points in one batch request, e.g. pressure–temperature
 *                            points for a melt fraction ({@code TECTOMELT_MAX_BATCH_POINTS}, default 10,000)
 * @param maxProfilePoints    most points in one profile (a geotherm, a column, a depth list)
 *                            ({@code TECTOMELT_MAX_PROFILE_POINTS}, default 5,000)
 * @param maxSillCellSteps    largest grid cells × time steps of one sill-model run
 *                            ({@code TECTOMELT_MAX_SILL_CELL_STEPS}, default 100,000,000: the
 *                            2 Myr, 20-sill, 7,000-cell case needs about 27,000,000)
 * @param maxSillDurationMyr  longest simulated time of one sill-model run, Myr
 *                            ({@code TECTOMELT_MAX_SILL_DURATION_MYR}, default 20)
 * @param heavyConcurrency    heavy requests computed at once ({@code TECTOMELT_HEAVY_CONCURRENCY},
 *                            default: the number of processors)
 * @param heavyQueueMillis    how long a heavy request waits for a free slot before a 503
 *                            ({@code TECTOMELT_HEAVY_QUEUE_MS}, default 200)
 * @param heavyBudgetMillis   wall-clock budget of one heavy request; beyond it the work is abandoned
 *                            with a 503 ({@code TECTOMELT_HEAVY_BUDGET_MS}, default 10,000)
 * @param cacheMegabytes      size of the in-memory cache of heavy results in MiB; 0 turns it off
 *                            ({@code TECTOMELT_CACHE_MB}, default 32)
 * @param token               bearer token required on {@code /v1} routes (except health) and
 *                            {@code /metrics}; empty for an open server ({@code TECTOMELT_TOKEN} or
 *                            the file named by {@code TECTOMELT_TOKEN_FILE}, default none)
 * @param corsOrigins         browser origins allowed to call the API from other pages
 *                            ({@code TECTOMELT_CORS_ORIGINS}, comma-separated, default none)
 * @param shutdownGraceMillis how long a stopping server lets in-flight requests finish
 *                            ({@code TECTOMELT_SHUTDOWN_GRACE_MS}, default 12,000)
 * @param bodyTimeoutMillis   longest time a request body may take to arrive; a slower one is answered
 *                            408 ({@code TECTOMELT_BODY_TIMEOUT_MS}, default 10,000: at least 100 kB/s
 *                            for a body at the default 1 MiB cap)
 * @param threadsPerClient    most server threads one client address may hold at once; its further
 *                            requests wait, holding no thread ({@code TECTOMELT_THREADS_PER_CLIENT},
 *                            default 16)
 * @param heavyBatchPoints    a melt-fraction batch with more points than this is served as a heavy
 *                            request (limiter and budget) ({@code TECTOMELT_HEAVY_BATCH_POINTS},
 *                            default 1,000)
 * @param compressionLevel    gzip level of answers of 1,500 bytes or more to clients that accept gzip, 1
 *                            (fastest) to 9 (smallest); 0 sends every answer uncompressed
 *                            ({@code TECTOMELT_COMPRESSION_LEVEL}, default 1: a 10,000-point CSV batch
 *                            of numbers shrinks about 2.5× at level 1 and little more at 6, which costs
 *                            about five times the processor time)
 */
public record Config(String host, int port, long maxBodyBytes,
                     int maxBatchPoints, int maxProfilePoints, long maxSillCellSteps, double maxSillDurationMyr,
                     int heavyConcurrency, long heavyQueueMillis, long heavyBudgetMillis, int cacheMegabytes,
                     String token, List<String> corsOrigins, long shutdownGraceMillis,
                     long bodyTimeoutMillis, int threadsPerClient, int heavyBatchPoints, int compressionLevel) {

    /** Default {@link #maxBatchPoints()}. */
    public static final int DEFAULT_MAX_BATCH_POINTS = 10_000;
    /** Default {@link #maxProfilePoints()}. */
    public static final int DEFAULT_MAX_PROFILE_POINTS = 5_000;
    /** Default {@link #maxSillCellSteps()}. */
    public static final long DEFAULT_MAX_SILL_CELL_STEPS = 100_000_000L;
    /** Default {@link #maxSillDurationMyr()}. */
    public static final double DEFAULT_MAX_SILL_DURATION_MYR = 20.0;
    /** Default {@link #host()}: this machine only. */
    public static final String DEFAULT_HOST = "127.0.0.1";
    /** Default {@link #bodyTimeoutMillis()}. */
    public static final long DEFAULT_BODY_TIMEOUT_MILLIS = 10_000;
    /** Default {@link #threadsPerClient()}. */
    public static final int DEFAULT_THREADS_PER_CLIENT = 16;
    /** Default {@link #heavyBatchPoints()}. */
    public static final int DEFAULT_HEAVY_BATCH_POINTS = 1_000;
    /** Default {@link #compressionLevel()}. */
    public static final int DEFAULT_COMPRESSION_LEVEL = 1;
    /** Shortest token accepted, so that a shared server is not guarded by a guessable word. */
    public static final int MIN_TOKEN_LENGTH = 16;

    /** RFC 6750 b64token characters. */
    static final Pattern TOKEN_CHARS = Pattern.compile("[A-Za-z0-9\\-._~+/]+=*");
    /** An origin as browsers send it: scheme, host and optional port, nothing else. */
    private static final Pattern ORIGIN = Pattern.compile("https?://[A-Za-z0-9.\\-]+(:\\d{1,5})?|https?://\\[[0-9a-fA-F:]+](:\\d{1,5})?");

    /** Validates and normalises the components. */
    public Config {
        token = token == null ? "" : token;
        corsOrigins = List.copyOf(corsOrigins);
    }

    /** The three settings of the first release; every other one takes its default. */
    public Config(String host, int port, long maxBodyBytes) {
        this(host, port, maxBodyBytes, DEFAULT_MAX_BATCH_POINTS, DEFAULT_MAX_PROFILE_POINTS,
                DEFAULT_MAX_SILL_CELL_STEPS, DEFAULT_MAX_SILL_DURATION_MYR, defaultConcurrency(), 200, 10_000, 32,
                "", List.of(), 12_000, DEFAULT_BODY_TIMEOUT_MILLIS, DEFAULT_THREADS_PER_CLIENT,
                DEFAULT_HEAVY_BATCH_POINTS, DEFAULT_COMPRESSION_LEVEL);
    }

    /** Embedded defaults, as used by {@code java -jar} with no environment set. */
    public static Config defaults() {
        return new Config(DEFAULT_HOST, 7070, 1_048_576L);
    }

    /**
     * Reads the settings from an environment map, falling back to {@link #defaults()}.
     *
     * @throws IllegalArgumentException when a variable is present but unusable
     */
    public static Config fromEnvironment(Map<String, String> env) {
        Config d = defaults();
        return new Config(
                env.getOrDefault("HOST", d.host()),
                (int) longVar(env, "PORT", d.port(), 0, 65_535),
                longVar(env, "TECTOMELT_MAX_BODY_BYTES", d.maxBodyBytes(), 1_024, 1_073_741_824L),
                (int) longVar(env, "TECTOMELT_MAX_BATCH_POINTS", d.maxBatchPoints(), 1, 10_000_000),
                (int) longVar(env, "TECTOMELT_MAX_PROFILE_POINTS", d.maxProfilePoints(), 2, 10_000_000),
                longVar(env, "TECTOMELT_MAX_SILL_CELL_STEPS", d.maxSillCellSteps(), 1_000, 1_000_000_000_000L),
                doubleVar(env, "TECTOMELT_MAX_SILL_DURATION_MYR", d.maxSillDurationMyr(), 1e-6, 4_500),
                (int) longVar(env, "TECTOMELT_HEAVY_CONCURRENCY", d.heavyConcurrency(), 1, 1_024),
                longVar(env, "TECTOMELT_HEAVY_QUEUE_MS", d.heavyQueueMillis(), 0, 60_000),
                longVar(env, "TECTOMELT_HEAVY_BUDGET_MS", d.heavyBudgetMillis(), 10, 3_600_000),
                (int) longVar(env, "TECTOMELT_CACHE_MB", d.cacheMegabytes(), 0, 65_536),
                token(env),
                origins(env.get("TECTOMELT_CORS_ORIGINS")),
                longVar(env, "TECTOMELT_SHUTDOWN_GRACE_MS", d.shutdownGraceMillis(), 0, 600_000),
                longVar(env, "TECTOMELT_BODY_TIMEOUT_MS", d.bodyTimeoutMillis(), 100, 600_000),
                (int) longVar(env, "TECTOMELT_THREADS_PER_CLIENT", d.threadsPerClient(), 1, 10_000),
                (int) longVar(env, "TECTOMELT_HEAVY_BATCH_POINTS", d.heavyBatchPoints(), 1, 10_000_000),
                (int) longVar(env, "TECTOMELT_COMPRESSION_LEVEL", d.compressionLevel(), 0, 9));
    }

    /** A copy listening on another port (tests use 0). */
    public Config withPort(int newPort) {
        return new Config(host, newPort, maxBodyBytes, maxBatchPoints, maxProfilePoints, maxSillCellSteps,
                maxSillDurationMyr, heavyConcurrency, heavyQueueMillis, heavyBudgetMillis, cacheMegabytes, token,
                corsOrigins, shutdownGraceMillis, bodyTimeoutMillis, threadsPerClient, heavyBatchPoints,
                compressionLevel);
    }

    /** A copy with another body-size cap. */
    public Config withMaxBodyBytes(long newMax) {
        return new Config(host, port, newMax, maxBatchPoints, maxProfilePoints, maxSillCellSteps,
                maxSillDurationMyr, heavyConcurrency, heavyQueueMillis, heavyBudgetMillis, cacheMegabytes, token,
                corsOrigins, shutdownGraceMillis, bodyTimeoutMillis, threadsPerClient, heavyBatchPoints,
                compressionLevel);
    }

    /** True when a bearer token is required. */
    public boolean accessControlled() {
        return !token.isEmpty();
    }

    /**
     * The settings that can change what a request is answered (the caps), as a stable string. It
     * goes into every ETag, so a tag issued under other caps never matches.
     */
    public String resultFingerprint() {
        return String.format(Locale.ROOT, "batch=%d;profile=%d;sillCellSteps=%d;sillMyr=%s",
                maxBatchPoints, maxProfilePoints, maxSillCellSteps, Double.toString(maxSillDurationMyr));
    }

    /** Never prints the token. */
    @Override
    public String toString() {
        return "Config[host=" + host + ", port=" + port + ", maxBodyBytes=" + maxBodyBytes
                + ", maxBatchPoints=" + maxBatchPoints + ", maxProfilePoints=" + maxProfilePoints
                + ", maxSillCellSteps=" + maxSillCellSteps + ", maxSillDurationMyr=" + maxSillDurationMyr
                + ", heavyConcurrency=" + heavyConcurrency + ", heavyQueueMillis=" + heavyQueueMillis
                + ", heavyBudgetMillis=" + heavyBudgetMillis + ", cacheMegabytes=" + cacheMegabytes
                + ", token=" + (token.isEmpty() ? "none" : "(set)") + ", corsOrigins=" + corsOrigins
                + ", shutdownGraceMillis=" + shutdownGraceMillis + ", bodyTimeoutMillis=" + bodyTimeoutMillis
                + ", threadsPerClient=" + threadsPerClient + ", heavyBatchPoints=" + heavyBatchPoints
                + ", compressionLevel=" + compressionLevel + "]";
    }

    private static int defaultConcurrency() {
        return Math.max(1, Runtime.getRuntime().availableProcessors());
    }

    private static String token(Map<String, String> env) {
        String direct = env.get("TECTOMELT_TOKEN");
        String file = env.get("TECTOMELT_TOKEN_FILE");
        boolean hasDirect = direct != null && !direct.isBlank();
        boolean hasFile = file != null && !file.isBlank();
        if (hasDirect && hasFile) {
            throw new IllegalArgumentException("set TECTOMELT_TOKEN or TECTOMELT_TOKEN_FILE, not both");
        }
        String name = hasFile ? "TECTOMELT_TOKEN_FILE" : "TECTOMELT_TOKEN";
        String value;
        if (hasFile) {
            try {
                value = Files.readString(Path.of(file.trim()), StandardCharsets.UTF_8).trim();
            } catch (IOException | RuntimeException e) {
                throw new IllegalArgumentException("TECTOMELT_TOKEN_FILE: cannot read '" + file.trim() + "' ("
                        + e.getClass().getSimpleName() + ")");
            }
        } else if (hasDirect) {
            value = direct.trim();
        } else {
            return "";
        }
        if (value.length() < MIN_TOKEN_LENGTH || !TOKEN_CHARS.matcher(value).matches()) {
            throw new IllegalArgumentException(name + " must hold a token of at least " + MIN_TOKEN_LENGTH
                    + " characters from A-Z a-z 0-9 - . _ ~ + / (e.g. from: openssl rand -hex 24)");
        }
        return value;
    }

    private static List<String> origins(String raw) {
        if (raw == null || raw.isBlank()) {
            return List.of();
        }
        List<String> out = new ArrayList<>();
        for (String part : raw.split(",")) {
            String o = part.trim();
            if (o.isEmpty()) {
                continue;
            }
            if (o.endsWith("/")) {
                o = o.substring(0, o.length() - 1);
            }
            if (!o.equals("*") && !ORIGIN.matcher(o).matches()) {
                throw new IllegalArgumentException("TECTOMELT_CORS_ORIGINS: '" + part.trim()
                        + "' is not an origin like https://dash.example.org or http://localhost:8888 (or *)");
            }
            out.add(o);
        }
        if (out.contains("*") && out.size() > 1) {
            throw new IllegalArgumentException("TECTOMELT_CORS_ORIGINS: '*' allows every origin; list no others with it");
        }
        return out;
    }

    static long longVar(Map<String, String> env, String name, long fallback, long min, long max) {
        String raw = env.get(name);
        if (raw == null || raw.isBlank()) {
            return fallback;
        }
        long value;
        try {
            value = Long.parseLong(raw.trim());
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException(name + " must be an integer, got '" + raw + "'");
        }
        if (value < min || value > max) {
            throw new IllegalArgumentException(name + " must be between " + min + " and " + max + ", got " + value);
        }
        return value;
    }

    private static double doubleVar(Map<String, String> env, String name, double fallback, double min, double max) {
        String raw = env.get(name);
        if (raw == null || raw.isBlank()) {
            return fallback;
        }
        double value;
        try {
            value = Double.parseDouble(raw.trim());
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException(name + " must be a number, got '" + raw + "'");
        }
        if (!(value >= min && value <= max)) {
            throw new IllegalArgumentException(name + " must be between " + min + " and " + max + ", got " + raw.trim());
        }
        return value;
    }
}
