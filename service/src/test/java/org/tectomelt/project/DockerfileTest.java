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
    void runsTheJarTheWayTheReadmeDoes() throws Exception {
        String readme = read("README.md");
        String cmd = group(read("Dockerfile"), "^CMD \\[(.*)]$");
        assertEquals("\"java\", \"-jar\", \"/app/tectomelt.jar\"", cmd);
        assertTrue(readme.contains("java -jar " + builtJar()), "README must start the service with java -jar "
                + builtJar());
    }

    @Test
    void isMultiStageNonRootWithHealthcheckAndExpose() throws Exception {
        String df = read("Dockerfile");
        List<String> froms = Pattern.compile("^FROM ", Pattern.MULTILINE).matcher(df).results()
                .map(r -> r.group()).toList();
        assertEquals(2, froms.size(), "a build stage and a runtime stage");
        assertTrue(df.contains("AS build"));
        assertTrue(Pattern.compile("^FROM \\S*jre", Pattern.MULTILINE).matcher(df).find(), "slim JRE runtime");
        String user = group(df, "^USER (\\S+)$");
        assertTrue(!user.equals("root") && !user.equals("0"), "runs as a non-root user");
        assertEquals("7070", group(df, "^EXPOSE (\\d+)$"));
        assertTrue(group(df, "(?s)HEALTHCHECK(.*?)\\n\\S").contains("/v1/health"));
        assertTrue(df.contains("-Xmx"), "the container's heap is stated");
        assertTrue(df.contains("PORT=7070") && df.contains("HOST="), "configuration through environment");
    }
}
