package org.tectomelt.http;

import io.javalin.Javalin;
import io.restassured.RestAssured;
import io.restassured.config.JsonConfig;
import io.restassured.config.RestAssuredConfig;
import io.restassured.path.json.config.JsonPathConfig;
import io.restassured.http.ContentType;
import io.restassured.specification.RequestSpecification;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import org.tectomelt.Config;

/**
 * One app for all contract tests, started once on a random port with the embedded defaults.
 * Every finished request is recorded in {@link #OBSERVED} so that {@code SpecConsistencyTest}
 * can prove each documented status code is really produced.
 */
public final class TestServer {

    /** "METHOD route status" of every request any contract test made. */
    public static final Set<String> OBSERVED = ConcurrentHashMap.newKeySet();

    private static Javalin app;

    static {
        // JSON numbers as doubles, so closeTo(...) compares like with like
        RestAssured.config = RestAssuredConfig.config().jsonConfig(
                JsonConfig.jsonConfig().numberReturnType(JsonPathConfig.NumberReturnType.DOUBLE));
    }

    private TestServer() {
    }

    /** The running app's port, starting it on first use. */
    public static synchronized int port() {
        if (app == null) {
            app = App.create(Config.defaults().withPort(0),
                    (method, route, status) -> OBSERVED.add(key(method, route, status)));
            app.start("127.0.0.1", 0);
            Runtime.getRuntime().addShutdownHook(new Thread(app::stop));
        }
        return app.port();
    }

    /** Base URI of the running app. */
    public static String baseUri() {
        return "http://127.0.0.1:" + port();
    }

    /** A REST Assured request against the shared app. */
    public static RequestSpecification given() {
        return RestAssured.given().baseUri("http://127.0.0.1").port(port());
    }

    /** A JSON POST request with {@code body}. */
    public static RequestSpecification json(String body) {
        return given().contentType(ContentType.JSON).body(body);
    }

    static String key(String method, String route, int status) {
        return method.toUpperCase(java.util.Locale.ROOT) + " " + route + " " + status;
    }
}
