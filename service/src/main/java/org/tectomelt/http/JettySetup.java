package org.tectomelt.http;

import org.eclipse.jetty.server.Server;
import org.eclipse.jetty.server.handler.GracefulHandler;
import org.eclipse.jetty.server.handler.ThreadLimitHandler;
import org.tectomelt.Config;

/**
 * The Jetty server under Javalin, hardened for a shared network: the handler chain in front of
 * the app and the error pages Jetty writes itself.
 *
 * <pre>
 *   GracefulHandler      on stop: no new requests, in-flight ones get TECTOMELT_SHUTDOWN_GRACE_MS
 *   RequestIntake        reads each body without a thread (TECTOMELT_BODY_TIMEOUT_MS), drops
 *                        method-override headers
 *   ThreadLimitHandler   at most TECTOMELT_THREADS_PER_CLIENT threads per client address; the
 *                        rest wait without a thread
 *   (Javalin's servlet)
 * </pre>
 */
final class JettySetup {

    private JettySetup() {
    }

    static void configure(Server server, Config config) {
        server.setStopTimeout(config.shutdownGraceMillis());
        ThreadLimitHandler perClient = new ThreadLimitHandler();
        perClient.setThreadLimit(config.threadsPerClient());
        server.setHandler(new GracefulHandler(
                chain(new RequestIntake(config.maxBodyBytes(), config.bodyTimeoutMillis()), perClient)));
        server.setErrorHandler(new JettyProblems());
    }

    private static org.eclipse.jetty.server.Handler.Wrapper chain(org.eclipse.jetty.server.Handler.Wrapper outer,
                                                                  org.eclipse.jetty.server.Handler.Wrapper inner) {
        outer.setHandler(inner);
        return outer;
    }
}
