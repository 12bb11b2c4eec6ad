package org.tectomelt.project;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.MappingIterator;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.TestFactory;
import org.tectomelt.http.TestServer;

/**
 * Runs the README's marked examples against the app (started on a random port) and compares what
 * they print with the response the README states, so the examples cannot go stale.
 *
 * <p>The convention (also described in {@code DEVELOPERS.md}): a line
 * {@code <!-- example: NAME -->} (optionally {@code tolerance=1e-6}) marks the next {@code ```sh}
 * block, whose commands run in {@code bash} with {@code localhost:7070} pointing at the test's app,
 * and the fenced block right after it, the stated output. A {@code ```json} block is compared as a
 * sequence of JSON values: every member shown must be in the answer with the same value (members
 * left out are not checked), numbers within the relative tolerance (default 1e-9), an array shown
 * without {@code …} has the answer's length, an array with {@code …} elements lists some of the
 * answer's elements in order, the string {@code "…"} (or a bare {@code …} where a value
 * stands) matches any value, and a {@code …} within a string any text. Any other block is compared line by line: a line {@code …} skips any
 * number of lines, a {@code …} within a line matches any text, numbers within the tolerance.
 * Needs {@code bash}, {@code curl} and {@code jq} (Debian packages; {@code .ci/run} installs jq).
 */
class ReadmeExamplesTest {

    private static final Path README = Path.of("..", "README.md");
    private static final Pattern MARK = Pattern.compile("^<!-- example: (\\S+)(?: tolerance=(\\S+))? -->$");
    private static final String ELLIPSIS = "…";
    private static final ObjectMapper JSON = new ObjectMapper();

    /** One marked example: its name, the script, the stated output and its kind. */
    record Example(String name, int line, String script, String lang, String stated, double tolerance) {
    }

    static List<Example> examples(List<String> lines) {
        List<Example> out = new ArrayList<>();
        for (int i = 0; i < lines.size(); i++) {
            Matcher m = MARK.matcher(lines.get(i).strip());
            if (!m.matches()) {
                continue;
            }
            int at = i + 1;
            assertEquals("```sh", lines.get(at).strip(), "README line " + (at + 1) + ": a marked example starts with ```sh");
            StringBuilder script = new StringBuilder();
            int j = at + 1;
            for (; !lines.get(j).strip().equals("```"); j++) {
                script.append(lines.get(j)).append('\n');
            }
            j++;
            String fence = lines.get(j).strip();
            assertTrue(fence.startsWith("```"), "README line " + (j + 1) + ": the stated output follows the ```sh block");
            StringBuilder stated = new StringBuilder();
            for (j++; !lines.get(j).strip().equals("```"); j++) {
                stated.append(lines.get(j)).append('\n');
            }
            double tol = m.group(2) == null ? 1e-9 : Double.parseDouble(m.group(2));
            out.add(new Example(m.group(1), at + 1, script.toString(), fence.substring(3), stated.toString(), tol));
            i = j;
        }
        return out;
    }

    @TestFactory
    Stream<DynamicTest> everyMarkedExamplePrintsWhatTheReadmeStates() throws IOException {
        List<Example> all = examples(Files.readAllLines(README, StandardCharsets.UTF_8));
        assertTrue(all.size() >= 10, "the README marks its examples: " + all.size());
        String base = TestServer.baseUri();
        return all.stream().map(e -> DynamicTest.dynamicTest(e.name() + " (README line " + e.line() + ")", () -> {
            String printed = run(e.script().replace("localhost:7070", base.replace("http://", "")));
            if (e.lang().equals("json")) {
                compareJson(e, printed);
            } else {
                compareLines(e, printed);
            }
        }));
    }

    private static String run(String script) throws Exception {
        Path out = Files.createTempFile("readme-example", ".out");
        Path err = Files.createTempFile("readme-example", ".err");
        try {
            // set -e without pipefail, as a reader's shell runs it: "curl … | head -4" closes curl's pipe early
            Process p = new ProcessBuilder("bash", "-c", "set -e\n" + script)
                    .redirectInput(ProcessBuilder.Redirect.from(new java.io.File("/dev/null")))
                    .redirectOutput(out.toFile()).redirectError(err.toFile()).start();
            if (!p.waitFor(120, TimeUnit.SECONDS)) {
                p.descendants().forEach(ProcessHandle::destroyForcibly);
                p.destroyForcibly();
                fail("the example did not finish within 120 s; printed so far:\n" + Files.readString(out));
            }
            assertEquals(0, p.exitValue(), "the example's commands failed: " + Files.readString(err));
            return Files.readString(out, StandardCharsets.UTF_8);
        } finally {
            Files.deleteIfExists(out);
            Files.deleteIfExists(err);
        }
    }

    @org.junit.jupiter.api.Test
    void theComparisonFindsWhatDiffersAndOnlyThat() throws IOException {
        JsonNode got = JSON.readTree("{\"a\": 1.0000000001, \"b\": [1, 2, 3], \"c\": \"depth to pressure: mantle\","
                + " \"d\": null, \"e\": {\"f\": true}}");
        List<String> ok = new ArrayList<>();
        match(values(statedJson("{\"a\": 1, \"b\": [1, …, 3], \"c\": \"depth to …\", \"d\": null, \"e\": {…}}")).get(0),
                got, "", 1e-9, ok);
        assertEquals(List.of(), ok);
        for (String wrong : List.of("{\"a\": 1.01}", "{\"b\": [1, 2]}", "{\"b\": [3, …, 1]}", "{\"x\": …}",
                "{\"c\": \"height …\"}", "{\"d\": 0}", "{\"e\": {\"f\": false}}")) {
            List<String> d = new ArrayList<>();
            match(values(statedJson(wrong)).get(0), got, "", 1e-9, d);
            assertEquals(1, d.size(), wrong + " -> " + d);
        }
        assertTrue(lineMatches("ETag: \"…\"", "ETag: \"PNY_mEo0\"", 1e-9));
        assertTrue(lineMatches("0,1250.0,3.2858010194", "0,1250,3.28580101940001", 1e-9));
        assertTrue(!lineMatches("304", "200", 1e-9) && !lineMatches("1,2.5", "1,2.6", 1e-9));
    }

    // ------------------------------------------------------------------ JSON

    /** The stated JSON with the README's elisions written as JSON: {@code …} values, {@code , …} members. */
    static String statedJson(String stated) {
        String s = stated.replaceAll(",\\s*…\\s*}", "}").replace("{…}", "\"…\"");
        return s.replaceAll("(?<![\"\\w])…(?![\"\\w])", "\"…\"");
    }

    private static List<JsonNode> values(String text) throws IOException {
        List<JsonNode> out = new ArrayList<>();
        try (MappingIterator<JsonNode> it = JSON.readerFor(JsonNode.class).readValues(text)) {
            while (it.hasNext()) {
                out.add(it.next());
            }
        }
        return out;
    }

    private static void compareJson(Example e, String printed) throws IOException {
        List<JsonNode> want = values(statedJson(e.stated()));
        List<JsonNode> got = values(printed);
        assertEquals(want.size(), got.size(), "number of JSON values printed; got: " + printed);
        List<String> diffs = new ArrayList<>();
        for (int i = 0; i < want.size(); i++) {
            match(want.get(i), got.get(i), "[" + i + "]", e.tolerance(), diffs);
        }
        if (!diffs.isEmpty()) {
            fail("README example " + e.name() + " differs from the answer:\n  " + String.join("\n  ", diffs)
                    + "\nprinted:\n" + printed);
        }
    }

    static void match(JsonNode want, JsonNode got, String at, double tol, List<String> diffs) {
        if (want.isTextual() && want.asText().equals(ELLIPSIS)) {
            if (got == null || got.isMissingNode()) {
                diffs.add(at + ": missing");
            }
        } else if (got == null || got.isMissingNode()) {
            diffs.add(at + ": missing, README shows " + want);
        } else if (want.isTextual() && want.asText().contains(ELLIPSIS)) {
            String pattern = Pattern.quote(want.asText()).replace(ELLIPSIS, "\\E.*\\Q");
            if (!got.isTextual() || !Pattern.compile(pattern, Pattern.DOTALL).matcher(got.asText()).matches()) {
                diffs.add(at + ": README " + want + ", answer " + got);
            }
        } else if (want.isNumber() && got.isNumber()) {
            double w = want.doubleValue();
            double g = got.doubleValue();
            if (Math.abs(w - g) > tol * Math.max(Math.abs(w), Math.abs(g)) + 1e-300) {
                diffs.add(at + ": README " + want + ", answer " + got);
            }
        } else if (want.isObject() && got.isObject()) {
            for (Iterator<Map.Entry<String, JsonNode>> it = want.fields(); it.hasNext(); ) {
                Map.Entry<String, JsonNode> f = it.next();
                match(f.getValue(), got.get(f.getKey()), at + "." + f.getKey(), tol, diffs);
            }
        } else if (want.isArray() && got.isArray()) {
            matchArray(want, got, at, tol, diffs);
        } else if (!want.equals(got)) {
            diffs.add(at + ": README " + want + ", answer " + got);
        }
    }

    private static void matchArray(JsonNode want, JsonNode got, String at, double tol, List<String> diffs) {
        boolean elided = false;
        for (JsonNode w : want) {
            elided |= w.isTextual() && w.asText().equals(ELLIPSIS);
        }
        if (!elided) {
            if (want.size() != got.size()) {
                diffs.add(at + ": README shows " + want.size() + " elements, answer has " + got.size());
                return;
            }
            for (int i = 0; i < want.size(); i++) {
                match(want.get(i), got.get(i), at + "[" + i + "]", tol, diffs);
            }
            return;
        }
        // with elisions: the elements shown appear in the answer in this order
        int g = 0;
        for (JsonNode w : want) {
            if (w.isTextual() && w.asText().equals(ELLIPSIS)) {
                continue;
            }
            boolean found = false;
            for (; g < got.size() && !found; g++) {
                List<String> d = new ArrayList<>();
                match(w, got.get(g), at, tol, d);
                found = d.isEmpty();
            }
            if (!found) {
                diffs.add(at + ": no element like " + w + " (in the README's order)");
                return;
            }
        }
    }

    // ------------------------------------------------------------------ text

    private static final Pattern NUMBER = Pattern.compile("-?\\d+(?:\\.\\d+)?(?:[eE][-+]?\\d+)?");

    private static void compareLines(Example e, String printed) {
        List<String> want = e.stated().lines().map(String::stripTrailing).toList();
        List<String> got = printed.lines().map(String::stripTrailing).toList();
        assertTrue(linesMatch(want, 0, got, 0, e.tolerance()),
                "README example " + e.name() + " states:\n" + e.stated() + "but printed:\n" + printed);
    }

    private static boolean linesMatch(List<String> want, int w, List<String> got, int g, double tol) {
        if (w == want.size()) {
            return g == got.size();
        }
        if (want.get(w).strip().equals(ELLIPSIS)) {
            for (int k = g; k <= got.size(); k++) {
                if (linesMatch(want, w + 1, got, k, tol)) {
                    return true;
                }
            }
            return false;
        }
        return g < got.size() && lineMatches(want.get(w), got.get(g), tol) && linesMatch(want, w + 1, got, g + 1, tol);
    }

    /** One line: {@code …} matches any text, numbers within the tolerance, the rest exactly. */
    static boolean lineMatches(String want, String got, double tol) {
        StringBuilder regex = new StringBuilder("^");
        List<Double> numbers = new ArrayList<>();
        Matcher m = Pattern.compile(NUMBER.pattern() + "|" + ELLIPSIS).matcher(want);
        int last = 0;
        while (m.find()) {
            regex.append(Pattern.quote(want.substring(last, m.start())));
            if (m.group().equals(ELLIPSIS)) {
                regex.append(".*?");
            } else {
                regex.append("(").append(NUMBER.pattern()).append(")");
                numbers.add(Double.parseDouble(m.group()));
            }
            last = m.end();
        }
        regex.append(Pattern.quote(want.substring(last))).append("$");
        Matcher g = Pattern.compile(regex.toString()).matcher(got);
        if (!g.matches()) {
            return false;
        }
        for (int i = 0; i < numbers.size(); i++) {
            double w = numbers.get(i);
            double v = Double.parseDouble(g.group(i + 1));
            if (Math.abs(w - v) > tol * Math.max(Math.abs(w), Math.abs(v)) + 1e-300) {
                return false;
            }
        }
        return true;
    }
}
