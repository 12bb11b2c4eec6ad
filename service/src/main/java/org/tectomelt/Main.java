package org.tectomelt;

import io.javalin.Javalin;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.tectomelt.http.App;
import org.tectomelt.runs.RunService;
import org.tectomelt.runs.StorageUnavailableException;

/** Entry point: reads the configuration from the environment, builds the app and starts it. */
public final class Main {

    private static final Logger LOG = LoggerFactory.getLogger(Main.class);

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
            System.exit(2);
            return;
        }
        RunService runs;
        try {
            runs = RunService.open(runsConfig, App.evaluator(config));
        } catch (StorageUnavailableException e) {
            System.err.println("tectomelt: not starting: " + e.getMessage());
            System.exit(3);
            return;
        }
        Javalin app = App.create(config, tokens, runs);
        Runtime.getRuntime().addShutdownHook(new Thread(app::stop, "tectomelt-shutdown"));
        app.start(config.host(), config.port());
        LOG.info("settings: {}", config);
        LOG.info("runs: {}; {}", runsConfig, tokens);
        LOG.info("tectomelt {} listening on http://{}:{}/", App.VERSION, config.host(), app.port());
    }
}
