package org.tectomelt.project;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;

/**
 * No Docker engine runs here, so this keeps the Dockerfile honest by reading it: it copies the
 * jar the build really produces, runs it the way the README does, and has the hardening the
 * deployment needs (non-root user, EXPOSE, HEALTHCHECK on the health route, a stated heap).
 */
class DockerfileTest {

    private static final Path ROOT = Path.of("..");

    private static String read(String name) throws Exception {
        return Files.readString(ROOT.resolve(name));
    }

    private static String group(String text, String regex) {
        Matcher m = Pattern.compile(regex, Pattern.MULTILINE).matcher(text);
        assertTrue(m.find(), "pattern not found: " + regex);
        return m.group(1);
    }

    private static String builtJar() throws Exception {
        String pom = read("service/pom.xml");
        return "service/target/" + group(pom, "<finalName>([^<]+)</finalName>") + ".jar";
    }

    @Test
    void copiesTheJarTheBuildProduces() throws Exception {
        String copied = group(read("Dockerfile"), "^COPY --from=build /src/(\\S+) /app/tectomelt\\.jar$");
        assertEquals(builtJar(), copied);
    }

    @Test
    void runsTheJarTheWayTheReadmeDoesThroughAnEntrypointWithJavaOpts() throws Exception {
        String readme = read("README.md");
        String df = read("Dockerfile");
        assertEquals("\"/app/entrypoint.sh\"", group(df, "^ENTRYPOINT \\[(.*)]$"));
        assertTrue(df.contains("COPY --chmod=0755 deploy/docker/entrypoint.sh /app/entrypoint.sh"), df);
        String entry = read("deploy/docker/entrypoint.sh");
        assertTrue(entry.contains("exec java ${JAVA_OPTS:-} -jar /app/tectomelt.jar \"$@\""), entry);
        assertTrue(readme.contains("java -jar " + builtJar()), "README must start the service with java -jar "
                + builtJar());
    }

    @Test
    void jvmDefaultsAreInJavaOptsNotInJavaToolOptions() throws Exception {
        String df = read("Dockerfile");
        // the JVM reads JAVA_TOOL_OPTIONS itself: defaults kept there would vanish when a user sets it
        assertTrue(!df.contains("JAVA_TOOL_OPTIONS=") && !df.contains("JAVA_TOOL_OPTIONS=\""), df);
        assertTrue(Pattern.compile("JAVA_OPTS=\"[^\"]*-Xmx\\d+m").matcher(df).find(), "JAVA_OPTS states the heap");
        assertTrue(read("deploy/docker/entrypoint.sh").contains("JAVA_TOOL_OPTIONS"),
                "the entrypoint says when JAVA_TOOL_OPTIONS repeats a JAVA_OPTS option");
    }

    @Test
    void baseImagesAreExactReleasesCoveredByThePinScript() throws Exception {
        String df = read("Dockerfile");
        List<String> froms = Pattern.compile("^FROM (\\S+)", Pattern.MULTILINE).matcher(df).results()
                .map(r -> r.group(1)).toList();
        assertEquals(List.of("${BUILD_IMAGE}", "${RUNTIME_IMAGE}"), froms, "every base image comes from a pinned ARG");
        String script = read("deploy/docker/pin-base-images.sh");
        for (String arg : List.of("BUILD_IMAGE", "RUNTIME_IMAGE")) {
            String ref = group(df, "^ARG " + arg + "=(\\S+)$");
            // an exact release (digits after the last separator), optionally already pinned by digest
            assertTrue(ref.matches("[a-z0-9./-]+:[0-9][0-9A-Za-z._-]*(@sha256:[0-9a-f]{64})?"),
                    arg + " is an exact release tag (no floating 17-jre or latest): " + ref);
            assertTrue(script.contains(arg), "the pin script covers " + arg);
        }
    }

    @Test
    void noFailureIsHiddenAndTheContextIsSmall() throws Exception {
        String df = read("Dockerfile");
        assertTrue(!df.contains("|| true"), "no dependency step may hide its failure");
        String ignore = read(".dockerignore");
        for (String kept : List.of("**/target/", ".git/", ".venv/", "**/node_modules/")) {
            assertTrue(ignore.lines().anyMatch(l -> l.trim().equals(kept)), ".dockerignore keeps out " + kept);
        }
    }

    @Test
    void fixedNumericUserOciLabelsAndTheCommitInTheBuild() throws Exception {
        String df = read("Dockerfile");
        assertEquals("10001:10001", group(df, "^USER (\\S+)$"), "a fixed numeric uid:gid, for secrets and volumes");
        assertTrue(df.contains("--uid 10001") && df.contains("--gid 10001"));
        for (String label : List.of("version", "revision", "source", "licenses")) {
            assertTrue(df.contains("org.opencontainers.image." + label + "="), "OCI label " + label);
        }
        assertTrue(df.contains("org.opencontainers.image.licenses=\"Apache-2.0\""));
        assertTrue(df.contains("-Dgit.commit.id=\"${GIT_COMMIT}\""), "the build gets the commit without .git");
        assertEquals(group(read("pom.xml"), "<artifactId>tectomelt-parent</artifactId>\\s*<version>([^<]+)</version>"),
                group(df, "^ARG VERSION=(\\S+)$"), "the image's version label is the release");
    }

    @Test
    void composeAndSystemdRunTheSameServiceWithATokenFileAndHealth() throws Exception {
        String compose = read("compose.yaml");
        assertTrue(compose.contains("TECTOMELT_TOKEN_FILE: /run/secrets/tectomelt_token"), compose);
        assertTrue(compose.contains("tectomelt-data:/data"), "a volume for the stored runs");
        assertTrue(compose.contains("restart: unless-stopped") && compose.contains("/v1/health"), compose);
        assertTrue(read(".gitignore").lines().anyMatch(l -> l.trim().equals("secrets/")), "secrets are never committed");
        String unit = read("deploy/systemd/tectomelt.service");
        assertTrue(unit.contains("ExecStart=/usr/bin/java $JAVA_OPTS -jar /opt/tectomelt/tectomelt.jar"), unit);
        assertTrue(unit.contains("TECTOMELT_TOKEN_FILE=%d/token") && unit.contains("LoadCredential=token:"), unit);
        assertTrue(unit.contains("User=tectomelt") && unit.contains("Restart=on-failure"), unit);
        assertTrue(Files.exists(ROOT.resolve("deploy/compose/tectomelt.env.example")));
    }

    @Test
    void isMultiStageNonRootWithHealthcheckAndExpose() throws Exception {
        String df = read("Dockerfile");
        List<String> froms = Pattern.compile("^FROM ", Pattern.MULTILINE).matcher(df).results()
                .map(r -> r.group()).toList();
        assertEquals(2, froms.size(), "a build stage and a runtime stage");
        assertTrue(df.contains("AS build"));
        assertTrue(Pattern.compile("^ARG RUNTIME_IMAGE=\\S*jre", Pattern.MULTILINE).matcher(df).find(), "slim JRE runtime");
        String user = group(df, "^USER (\\S+)$");
        assertTrue(!user.startsWith("root") && !user.startsWith("0:") && !user.equals("0"), "runs as a non-root user");
        assertEquals("7070", group(df, "^EXPOSE (\\d+)$"));
        assertTrue(group(df, "(?s)HEALTHCHECK(.*?)\\n\\S").contains("/v1/health"));
        assertTrue(df.contains("-Xmx"), "the container's heap is stated");
        assertTrue(df.contains("PORT=7070") && df.contains("HOST="), "configuration through environment");
    }
}
