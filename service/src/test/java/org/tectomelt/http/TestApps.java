package org.tectomelt.http;

import io.javalin.Javalin;
import io.restassured.RestAssured;
import io.restassured.specification.RequestSpecification;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.tectomelt.Config;

/**
 * Apps with their own configuration or extra test-only routes, for the contract tests of the
 * shared-server machinery. Their status codes are recorded in {@link TestServer#OBSERVED} like
 * the shared app's, so that a documented 401 or 503 counts as produced.
 */
final class TestApps {

    /** A token long enough for {@link Config}. */
    static final String TOKEN = "lab-token-0123456789abcdef";

    private TestApps() {
    }

    /**
     * The embedded defaults overridden by {@code env} (variable → value), on a free port. Unless
     * {@code env} says otherwise, the app stops without a grace period: a graceful stop waits for
     * the test client's idle keep-alive connections (a second or two), which only
     * {@code GracefulShutdownTest} needs.
     */
    static Config config(Map<String, String> env) {
        Map<String, String> all = new java.util.HashMap<>(env);
        all.putIfAbsent("TECTOMELT_SHUTDOWN_GRACE_MS", "0");
        return Config.fromEnvironment(all).withPort(0);
    }

    /** The production routes followed by {@code extra}. */
    static List<Route> routesPlus(Config config, Route... extra) {
        List<Route> routes = new ArrayList<>(App.routes(config));
        routes.addAll(List.of(extra));
        return routes;
    }

    /** Starts an app on loopback, recording statuses. */
    static Javalin start(Config config, List<Route> routes, Heavy heavy) {
        return App.create(config, (m, r, s) -> TestServer.OBSERVED.add(TestServer.key(m, r, s)), routes, heavy)
                .start("127.0.0.1", 0);
    }

    /**
     * Starts an app with the production routes, its runs in {@code runs} (which it closes when it
     * stops) and the member tokens of {@code tokens}.
     */
    static Javalin start(Config config, org.tectomelt.Tokens tokens, org.tectomelt.runs.RunService runs) {
        return App.create(config, tokens, runs, (m, r, s) -> TestServer.OBSERVED.add(TestServer.key(m, r, s)),
                App.routes(config), new Heavy(config)).start("127.0.0.1", 0);
    }

    /** Starts an app with the production routes. */
    static Javalin start(Config config) {
        return start(config, App.routes(config), new Heavy(config));
    }

    /** A request against {@code app}. */
    static RequestSpecification given(Javalin app) {
        return RestAssured.given().baseUri("http://127.0.0.1").port(app.port());
    }
}
