package org.tectomelt.http;

import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.equalTo;
import static org.hamcrest.Matchers.matchesPattern;
import static org.hamcrest.Matchers.startsWith;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;

/** Health, the packaged spec, the page and the request id. */
class MetaContractTest {

    @Test
    void healthSaysUpWithTheBuildVersion() {
        TestServer.given().get("/v1/health").then()
                .statusCode(200)
                .contentType(startsWith("application/json"))
                .body("status", equalTo("up"))
                .body("version", equalTo(App.VERSION))
                .body("version", matchesPattern("\\d+\\.\\d+\\.\\d+.*"))
                .body("version", equalTo(BuildInfo.CURRENT.version()))
                // the git commit of the build (a fresh clone), or "unknown" where the build had no .git
                .body("commit", matchesPattern("[0-9a-f]{40}(-dirty)?|unknown"))
                .body("commit", equalTo(BuildInfo.CURRENT.commitLabel()));
    }

    @Test
    void anUnfilledBuildPlaceholderReadsAsUnknown() {
        org.junit.jupiter.api.Assertions.assertEquals("unknown", BuildInfo.known("${git.commit.id}", "unknown"));
        org.junit.jupiter.api.Assertions.assertEquals("unknown", BuildInfo.known("", "unknown"));
        org.junit.jupiter.api.Assertions.assertEquals("abc123", BuildInfo.known(" abc123 ", "unknown"));
    }

    @Test
    void openApiYamlIsTheSameBytesAsTheFileInApiSpec() throws Exception {
        byte[] served = TestServer.given().get("/openapi.yaml").then()
                .statusCode(200)
                .contentType(startsWith("application/yaml"))
                .extract().asByteArray();
        byte[] onDisk = Files.readAllBytes(Path.of("..", "api-spec", "openapi.yaml"));
        assertArrayEquals(onDisk, served);
    }

    @Test
    void rootServesThePageWithTheCautionsAndSpecLink() {
        TestServer.given().get("/").then()
                .statusCode(200)
                .contentType(startsWith("text/html"))
                .body(containsString("research estimates"))
                .body(containsString("licensed professional practice"))
                .body(containsString("href=\"openapi.yaml\""));
    }

    @Test
    void aSafeRequestIdIsEchoedAndAnUnsafeOneReplaced() {
        TestServer.given().header("X-Request-Id", "nb-42.sweep_7").get("/v1/health").then()
                .header("X-Request-Id", equalTo("nb-42.sweep_7"));
        TestServer.given().header("X-Request-Id", "bad id <script>").get("/v1/health").then()
                .header("X-Request-Id", matchesPattern("[0-9a-f-]{36}"));
    }

    @Test
    void docsRendersTheSpecFromFilesInTheJar() {
        String html = TestServer.given().get("/docs").then().statusCode(200)
                .contentType(startsWith("text/html")).extract().asString();
        org.junit.jupiter.api.Assertions.assertTrue(html.contains("src=\"/docs/ui/swagger-ui-bundle.js\""), html);
        org.junit.jupiter.api.Assertions.assertFalse(html.contains("http://") || html.contains("https://"),
                "no external resource: " + html);
        TestServer.given().get("/docs/ui/swagger-ui-bundle.js").then().statusCode(200);
        TestServer.given().get("/docs/ui/swagger-ui.css").then().statusCode(200);
        String init = TestServer.given().get("/docs-reference.js").then().statusCode(200).extract().asString();
        org.junit.jupiter.api.Assertions.assertTrue(init.contains("url: \"/openapi.yaml\"") && init.contains("validatorUrl: null"),
                init);
        TestServer.given().get("/").then().body(containsString("href=\"docs\""));
    }
}
