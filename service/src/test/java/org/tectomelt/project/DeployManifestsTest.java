package org.tectomelt.project;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.MappingIterator;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.tectomelt.Config;
import org.tectomelt.http.App;
import org.tectomelt.http.Route;

/**
 * No cluster runs here, so this keeps {@code deploy/kubernetes/} honest by reading it: the
 * container port is the image's and the service's default, every environment variable is one
 * the service reads (or the JVM's), the probes ask a route the service serves (the one the
 * Dockerfile's HEALTHCHECK uses), the replicas share a PostgreSQL, the heap fits the memory
 * request and the grace period covers the service's own.
 */
class DeployManifestsTest {

    private static final Path ROOT = Path.of("..");
    private static final Path DIR = ROOT.resolve("deploy/kubernetes");

    private static List<JsonNode> documents() throws Exception {
        List<JsonNode> out = new ArrayList<>();
        ObjectMapper yaml = new ObjectMapper(new YAMLFactory());
        try (Stream<Path> files = Files.list(DIR)) {
            for (Path f : files.filter(p -> p.toString().endsWith(".yaml")).sorted().toList()) {
                try (MappingIterator<JsonNode> it = yaml.readerFor(JsonNode.class).readValues(f.toFile())) {
                    while (it.hasNext()) {
                        JsonNode d = it.next();
                        if (d != null && !d.isNull() && !d.isEmpty()) {
                            out.add(d);
                        }
                    }
                }
            }
        }
        return out;
    }

    private static JsonNode one(List<JsonNode> docs, String kind, String name) {
        return docs.stream().filter(d -> d.path("kind").asText().equals(kind)
                && d.path("metadata").path("name").asText().equals(name)).findFirst()
                .orElseThrow(() -> new AssertionError("no " + kind + " " + name + " in " + DIR));
    }

    /** Every environment variable name the service's settings classes read. */
    private static Set<String> variablesTheServiceReads() throws Exception {
        Set<String> names = new TreeSet<>();
        Pattern literal = Pattern.compile("\"((?:TECTOMELT_[A-Z_]+)|PORT|HOST)\"");
        for (String f : List.of("Config.java", "RunsConfig.java", "Tokens.java")) {
            Matcher m = literal.matcher(Files.readString(ROOT.resolve("service/src/main/java/org/tectomelt/" + f)));
            while (m.find()) {
                names.add(m.group(1));
            }
        }
        return names;
    }

    private static long mebibytes(String quantity) {
        Matcher m = Pattern.compile("(\\d+)(Mi|Gi)").matcher(quantity);
        assertTrue(m.matches(), "memory as Mi or Gi: " + quantity);
        return Long.parseLong(m.group(1)) * (m.group(2).equals("Gi") ? 1024 : 1);
    }

    @Test
    void theDeploymentMatchesTheImageTheSettingsAndTheRoutes() throws Exception {
        List<JsonNode> docs = documents();
        JsonNode deployment = one(docs, "Deployment", "tectomelt");
        JsonNode pod = deployment.path("spec").path("template").path("spec");
        JsonNode container = pod.path("containers").get(0);
        String dockerfile = Files.readString(ROOT.resolve("Dockerfile"));

        // the port: the image's EXPOSE, the service's default, the container's and the Service's target
        Matcher expose = Pattern.compile("^EXPOSE (\\d+)$", Pattern.MULTILINE).matcher(dockerfile);
        assertTrue(expose.find());
        int port = container.path("ports").get(0).path("containerPort").asInt();
        assertEquals(Integer.parseInt(expose.group(1)), port);
        assertEquals(Config.defaults().port(), port);
        Map<String, String> env = new HashMap<>();
        for (JsonNode e : container.path("env")) {
            env.put(e.path("name").asText(), e.path("value").asText(null));
        }
        assertEquals(String.valueOf(port), env.get("PORT"));
        JsonNode service = one(docs, "Service", "tectomelt");
        String target = service.path("spec").path("ports").get(0).path("targetPort").asText();
        assertEquals(container.path("ports").get(0).path("name").asText(), target, "the Service targets the named port");

        // every variable is one the service (or the JVM) reads
        Set<String> known = variablesTheServiceReads();
        known.add("JAVA_OPTS");
        for (String name : env.keySet()) {
            assertTrue(known.contains(name), name + " is not read by Config, RunsConfig or Tokens: " + known);
        }

        // replicas share one PostgreSQL, each with its own instance name
        assertTrue(deployment.path("spec").path("replicas").asInt() >= 2, "several replicas");
        assertTrue(env.get("TECTOMELT_DATABASE_URL").startsWith("jdbc:postgresql://tectomelt-postgres:5432/"),
                env.get("TECTOMELT_DATABASE_URL"));
        one(docs, "Service", "tectomelt-postgres");
        one(docs, "StatefulSet", "tectomelt-postgres");
        String instance = container.path("env").findValues("fieldPath").stream().map(JsonNode::asText)
                .filter(p -> p.equals("metadata.name")).findFirst().orElse(null);
        assertEquals("metadata.name", instance, "TECTOMELT_INSTANCE_NAME from the pod name");

        // the tokens file comes from a Secret mounted where TECTOMELT_TOKENS_FILE points
        String tokens = env.get("TECTOMELT_TOKENS_FILE");
        JsonNode mount = container.path("volumeMounts").get(0);
        assertTrue(tokens.startsWith(mount.path("mountPath").asText() + "/"), tokens);
        String volume = mount.path("name").asText();
        JsonNode secret = null;
        for (JsonNode v : pod.path("volumes")) {
            if (v.path("name").asText().equals(volume)) {
                secret = v.path("secret");
            }
        }
        assertTrue(secret != null && !secret.path("secretName").asText().isEmpty(), "the tokens volume is a Secret");

        // probes ask the health route, the one the Dockerfile's HEALTHCHECK asks, on the named port
        Set<String> liveGets = new TreeSet<>();
        for (Route r : App.routes(Config.defaults())) {
            if (r.method().name().equals("GET") && r.kind() == Route.Kind.LIVE) {
                liveGets.add(r.path());
            }
        }
        for (String probe : List.of("readinessProbe", "livenessProbe")) {
            JsonNode get = container.path(probe).path("httpGet");
            String path = get.path("path").asText();
            assertEquals("/v1/health", path, probe);
            assertTrue(liveGets.contains(path), probe + " asks a route the service serves");
            assertTrue(dockerfile.contains(path), "the Dockerfile's HEALTHCHECK asks the same route");
            assertEquals(target, get.path("port").asText());
        }

        // the heap fits the memory request; the grace period covers the service's own
        Matcher xmx = Pattern.compile("-Xmx(\\d+)m").matcher(env.get("JAVA_OPTS"));
        assertTrue(xmx.find());
        long heap = Long.parseLong(xmx.group(1));
        long request = mebibytes(container.path("resources").path("requests").path("memory").asText());
        long limit = mebibytes(container.path("resources").path("limits").path("memory").asText());
        assertTrue(heap <= request * 0.75, "heap " + heap + " MiB leaves a quarter of the " + request + " MiB request");
        assertTrue(limit >= request);
        long grace = pod.path("terminationGracePeriodSeconds").asLong();
        long shutdown = Long.parseLong(env.getOrDefault("TECTOMELT_SHUTDOWN_GRACE_MS",
                String.valueOf(Config.defaults().shutdownGraceMillis())));
        assertTrue(grace * 1000 > shutdown + 5_000, "terminationGracePeriodSeconds " + grace + " covers "
                + shutdown + " ms and the runs' 10 s chunk wait has the rest");
        assertEquals(String.valueOf(container.path("resources").path("requests").path("cpu").asText()),
                env.get("TECTOMELT_RUN_THREADS"), "one run thread per requested core");
        assertTrue(container.path("image").asText().toLowerCase(Locale.ROOT).startsWith("tectomelt:"));
    }
}
