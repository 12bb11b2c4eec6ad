package org.tectomelt;

import io.javalin.Javalin;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.tectomelt.http.App;

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
        try {
            config = Config.fromEnvironment(System.getenv());
        } catch (IllegalArgumentException e) {
            System.err.println("tectomelt: bad configuration: " + e.getMessage());
            System.exit(2);
            return;
        }
        Javalin app = App.create(config);
        Runtime.getRuntime().addShutdownHook(new Thread(app::stop, "tectomelt-shutdown"));
        app.start(config.host(), config.port());
        LOG.info("settings: {}", config);
        LOG.info("tectomelt {} listening on http://{}:{}/", App.VERSION, config.host(), app.port());
    }
}
