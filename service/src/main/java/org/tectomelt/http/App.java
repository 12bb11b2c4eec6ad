package org.tectomelt.http;

import io.javalin.Javalin;
import io.javalin.http.HandlerType;
import io.javalin.http.staticfiles.Location;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Properties;
import org.tectomelt.Config;

/** Factory: configuration in, unstarted Javalin app out (routes, problem mapping, static page). */
public final class App {

    /** The service version, from the build. */
    public static final String VERSION = loadVersion();

    private App() {
    }

    /** The app for production: no request observer. */
    public static Javalin create(Config config) {
        return create(config, RequestObserver.NONE);
    }

    /**
     * Builds the app.
     *
     * @param config   settings
     * @param observer told about every finished request (tests record status codes with it)
     */
    public static Javalin create(Config config, RequestObserver observer) {
        return create(config, observer, routes(config));
    }

    /** Builds the app with an explicit route list (tests add failing routes with it). */
    static Javalin create(Config config, RequestObserver observer, List<Route> routes) {
        return Javalin.create(c -> {
            c.startup.showJavalinBanner = false;
            c.startup.showOldJavalinVersionWarning = false;
            c.http.maxRequestSize = config.maxBodyBytes();
            c.http.prefer405over404 = true;
            c.staticFiles.add(sf -> {
                sf.hostedPath = "/";
                sf.directory = "/public";
                sf.location = Location.CLASSPATH;
            });
            c.routes.before(RequestPlumbing::assignRequestId);
            c.routes.beforeMatched(ctx -> RequestPlumbing.checkBody(ctx, config.maxBodyBytes()));
            for (Route r : routes) {
                if (r.method() == HandlerType.GET) {
                    c.routes.get(r.path(), r.handler());
                } else if (r.method() == HandlerType.POST) {
                    c.routes.post(r.path(), r.handler());
                } else {
                    throw new IllegalArgumentException("unsupported method " + r.method());
                }
            }
            Problems.register(c.routes);
            c.requestLogger.http((ctx, ms) -> RequestPlumbing.finished(ctx, ms, observer));
        });
    }

    /** Every route the service serves; the spec-consistency test reads this same list. */
    public static List<Route> routes(Config config) {
        List<Route> all = new ArrayList<>();
        all.addAll(MetaRoutes.routes());
        all.addAll(PressureRoutes.routes());
        // thermal: geotherm routes
        all.addAll(GeothermRoutes.routes());

        // melting: lithologies, melt fraction, solidus crossings
        all.addAll(MeltingRoutes.routes());

        // settings: decompression column, ridge, hotspot, rift
        all.addAll(DecompressionRoutes.routes());

        // settings: subduction
        all.addAll(SubductionRoutes.routes());

        // crust: crustal heating budget and sill model

        // operations: metrics and the like

        return List.copyOf(all);
    }

    private static String loadVersion() {
        try (InputStream in = App.class.getResourceAsStream("/tectomelt-version.properties")) {
            if (in == null) {
                return "dev";
            }
            Properties p = new Properties();
            p.load(in);
            return p.getProperty("version", "dev");
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
