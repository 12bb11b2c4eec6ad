package org.tectomelt;

import io.javalin.Javalin;
import java.io.IOException;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.net.ServerSocket;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.tectomelt.http.App;
import org.tectomelt.runs.RunService;
import org.tectomelt.runs.StorageUnavailableException;

/**
 * Entry point: reads the configuration from the environment, builds the app and starts it.
 *
 * <p>Exit status: 0 after a clean stop (SIGTERM or Ctrl-C: the port closes, requests in flight get
 * {@code TECTOMELT_SHUTDOWN_GRACE_MS}); 2 for a bad setting; 3 when the runs storage cannot be
 * opened; 4 when the address cannot be bound (port in use, no permission). Each failure is one line on standard error, no stack trace.
 */
public final class Main {

    private static final Logger LOG = LoggerFactory.getLogger(Main.class);

    /** Exit status for a bad setting. */
    static final int EXIT_BAD_CONFIG = 2;
    /** Exit status when the runs storage cannot be opened. */
    static final int EXIT_NO_STORAGE = 3;
    /** Exit status when the address cannot be bound. */
    static final int EXIT_CANNOT_BIND = 4;

    private Main() {
    }

    /**
     * Starts the service.
     *
     * @param args ignored; every setting comes from environment variables (see {@link Config})
     */
    public static void main(String[] args) {
        Config config;
        RunsConfig runsConfig;
        Tokens tokens;
        try {
            config = Config.fromEnvironment(System.getenv());
            runsConfig = RunsConfig.fromEnvironment(System.getenv());
            tokens = Tokens.fromEnvironment(System.getenv(), config.token());
        } catch (IllegalArgumentException e) {
            System.err.println("tectomelt: bad configuration: " + e.getMessage());
            System.exit(EXIT_BAD_CONFIG);
            return;
        }
        String unbindable = cannotBind(config.host(), config.port());
        if (unbindable != null) {
            System.err.println("tectomelt: " + unbindable);
            System.exit(EXIT_CANNOT_BIND);
            return;
        }
        RunService runs;
        try {
            runs = RunService.open(runsConfig, App.evaluator(config));
        } catch (StorageUnavailableException e) {
            System.err.println("tectomelt: not starting: " + e.getMessage());
            System.exit(EXIT_NO_STORAGE);
            return;
        }
        Javalin app = App.create(config, tokens, runs);
        try {
            app.start(config.host(), config.port());
        } catch (RuntimeException e) {
            // lost a race for the port after the check above, or another start-up failure
            System.err.println("tectomelt: cannot start on " + config.host() + ":" + config.port() + ": "
                    + e.getMessage());
            System.exit(EXIT_CANNOT_BIND);
            return;
        }
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            try {
                app.stop();
                LOG.info("stopped");
            } catch (RuntimeException e) {
                LOG.warn("stopped; requests still running after TECTOMELT_SHUTDOWN_GRACE_MS were cut off ({})",
                        e.getMessage());
            }
            System.out.flush();
            System.err.flush();
            // a stop on SIGTERM is the normal end of a service: status 0, not the JVM's 143
            Runtime.getRuntime().halt(0);
        }, "tectomelt-shutdown"));
        LOG.info("settings: {}", config);
        LOG.info("runs: {}; {}", runsConfig, tokens);
        LOG.info("tectomelt {} listening on http://{}:{}/ ({})", App.VERSION, config.host(), app.port(),
                reach(config.host()));
    }

    /** Who can reach the service at this bind address, for the start-up line. */
    static String reach(String host) {
        try {
            InetAddress a = InetAddress.getByName(host);
            if (a.isLoopbackAddress()) {
                return "this machine only; set HOST=0.0.0.0 to serve the network";
            }
            if (a.isAnyLocalAddress()) {
                return "every network interface; set TECTOMELT_TOKEN on a shared network";
            }
        } catch (IOException e) {
            // reported by the bind itself
        }
        return "interface " + host;
    }

    /** Null when {@code host:port} can be bound now; otherwise the reason in one line. */
    static String cannotBind(String host, int port) {
        if (port == 0) {
            return null;
        }
        try (ServerSocket s = new ServerSocket()) {
            s.setReuseAddress(true);
            s.bind(new InetSocketAddress(InetAddress.getByName(host), port));
            return null;
        } catch (java.net.BindException e) {
            String why = e.getMessage() != null && e.getMessage().contains("ermission")
                    ? "permission denied (ports below 1024 need privileges)" : "the port is already in use";
            return "cannot listen on " + host + ":" + port + ": " + why + "; set PORT to another port";
        } catch (IOException | SecurityException e) {
            return "cannot listen on " + host + ":" + port + ": " + e.getMessage();
        }
    }
}
