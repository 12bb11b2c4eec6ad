package org.tectomelt;

import java.util.Map;

/**
 * Service settings. Every field has an embedded default and can be overridden by the
 * environment variable named beside it; the README lists them all.
 *
 * @param host              interface to bind ({@code HOST}, default 0.0.0.0)
 * @param port              TCP port ({@code PORT}, default 7070; 0 picks a free port)
 * @param maxBodyBytes      largest accepted request body in bytes
 *                          ({@code TECTOMELT_MAX_BODY_BYTES}, default 1 MiB)
 */
public record Config(String host, int port, long maxBodyBytes) {

    /** Embedded defaults, as used by {@code java -jar} with no environment set. */
    public static Config defaults() {
        return new Config("0.0.0.0", 7070, 1_048_576L);
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
                longVar(env, "TECTOMELT_MAX_BODY_BYTES", d.maxBodyBytes(), 1_024, 1_073_741_824L));
    }

    /** A copy listening on another port (tests use 0). */
    public Config withPort(int newPort) {
        return new Config(host, newPort, maxBodyBytes);
    }

    /** A copy with another body-size cap. */
    public Config withMaxBodyBytes(long newMax) {
        return new Config(host, port, newMax);
    }

    private static long longVar(Map<String, String> env, String name, long fallback, long min, long max) {
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
}
