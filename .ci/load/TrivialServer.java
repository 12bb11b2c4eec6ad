import io.javalin.Javalin;

/**
 * The load test's yardstick: a Javalin app on the same build as the service (run with the
 * service's jar on the class path) with one GET route answering a constant, and nothing else
 * (no request id, no access log, no metrics). wrk-bench.sh --baseline starts it beside the
 * service, so every figure can be read as a fraction of what the framework itself serves.
 *
 * Run: java -cp service/target/tectomelt.jar .ci/load/TrivialServer.java [port]
 */
public final class TrivialServer {
    public static void main(String[] args) {
        int port = args.length > 0 ? Integer.parseInt(args[0]) : 0;
        byte[] body = "{\"status\":\"up\"}".getBytes(java.nio.charset.StandardCharsets.UTF_8);
        Javalin app = Javalin.create(c -> {
            c.startup.showJavalinBanner = false;
            c.startup.showOldJavalinVersionWarning = false;
            c.routes.get("/trivial", ctx -> ctx.contentType("application/json").result(body));
        });
        app.start("127.0.0.1", port);
        System.out.println("trivial listening on http://127.0.0.1:" + app.port() + "/");
    }
}
