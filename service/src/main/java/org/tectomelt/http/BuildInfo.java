package org.tectomelt.http;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.Properties;

/**
 * What build is running: the release version and the git commit it was built from, written into
 * {@code tectomelt-version.properties} at build time (the version from the POM, the commit by the
 * git-commit-id plugin from {@code .git}, or {@code -Dgit.commit.id=...} where there is no
 * {@code .git}, as in a Docker build). A build without either says {@code unknown}, never a
 * placeholder.
 *
 * @param version release version, e.g. {@code 0.1.0} ({@code dev} outside a Maven build)
 * @param commit  full git commit id, or {@code unknown}
 * @param dirty   true when the working tree had uncommitted changes at build time
 */
public record BuildInfo(String version, String commit, boolean dirty) {

    /** Placeholder for a value the build could not determine. */
    public static final String UNKNOWN = "unknown";

    /** The running build. */
    public static final BuildInfo CURRENT = load();

    /** The commit as reported: the id, with {@code -dirty} when the tree had uncommitted changes. */
    public String commitLabel() {
        return dirty && !commit.equals(UNKNOWN) ? commit + "-dirty" : commit;
    }

    private static BuildInfo load() {
        try (InputStream in = BuildInfo.class.getResourceAsStream("/tectomelt-version.properties")) {
            if (in == null) {
                return new BuildInfo("dev", UNKNOWN, false);
            }
            Properties p = new Properties();
            p.load(in);
            return new BuildInfo(known(p.getProperty("version"), "dev"), known(p.getProperty("commit"), UNKNOWN),
                    "true".equals(known(p.getProperty("dirty"), "false")));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The value, or {@code fallback} when it is absent, empty or an unfilled {@code ${...}}. */
    static String known(String value, String fallback) {
        if (value == null || value.isBlank() || value.contains("${")) {
            return fallback;
        }
        return value.trim();
    }
}
