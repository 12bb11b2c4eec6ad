package org.tectomelt.http;

import java.io.ByteArrayOutputStream;
import java.nio.ByteBuffer;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import org.eclipse.jetty.http.HttpField;
import org.eclipse.jetty.http.HttpFields;
import org.eclipse.jetty.http.HttpHeader;
import org.eclipse.jetty.io.Content;
import org.eclipse.jetty.server.Handler;
import org.eclipse.jetty.server.Request;
import org.eclipse.jetty.server.Response;
import org.eclipse.jetty.util.Callback;
import org.eclipse.jetty.util.thread.Invocable;
import org.eclipse.jetty.util.thread.Scheduler;

/**
 * The first handler a request meets (a Jetty core handler in front of Javalin's servlet): it reads
 * a request body completely <em>before</em> a thread is given to the request, and it removes the
 * method-override headers.
 *
 * <p><b>Why.</b> The route handlers read their body with a blocking read. A client that sends its
 * body one byte every few seconds would hold a server thread for as long as it likes, and a few
 * hundred such clients would hold them all (no thread left for {@code /v1/health}). Here the body
 * is read with Jetty's non-blocking demand: a slow client holds a buffer, not a thread, and the
 * request is handed to the app only once its whole body is in memory (at most the body-size cap),
 * or once its time is up ({@code TECTOMELT_BODY_TIMEOUT_MS}): the app then answers 408
 * {@code body-timeout}. A body that ends early (the client closed, or sent fewer bytes than its
 * {@code Content-Length}) is handed over marked {@code incomplete}: the app answers 400
 * {@code incomplete-body} where an answer can still be sent, and logs one line. The app reads the
 * marks with {@link #failure(io.javalin.http.Context)}.
 *
 * <p>A declared body over the cap is read and dropped (up to {@link RequestPlumbing#DRAIN_FACTOR}
 * times the cap) so the client, still sending, reads the 413; larger ones are not read at all.
 *
 * <p><b>Method override.</b> {@code X-HTTP-Method-Override} (and its variants) would let a POST be
 * routed as another method; the service offers no such tunnel, so the headers are dropped here.
 */
final class RequestIntake extends Handler.Wrapper {

    /** Request attribute holding a {@link BodyFailure} when the body did not arrive whole. */
    static final String FAILURE_ATTR = "tectomelt.bodyFailure";

    /** Headers that some frameworks honour to change the request's method; never here. */
    static final java.util.List<String> OVERRIDE_HEADERS = java.util.List.of(
            "X-HTTP-Method-Override", "X-HTTP-Method", "X-Method-Override");

    /** Why a body was not delivered whole. */
    enum BodyFailure {
        /** The body took longer than {@code TECTOMELT_BODY_TIMEOUT_MS}. */
        TIMEOUT,
        /** The body ended before its declared length, or the connection failed while it was read. */
        INCOMPLETE
    }

    private final long maxBodyBytes;
    private final long bodyTimeoutMillis;

    /**
     * @param maxBodyBytes      the body-size cap ({@code TECTOMELT_MAX_BODY_BYTES})
     * @param bodyTimeoutMillis the longest time a body may take to arrive ({@code TECTOMELT_BODY_TIMEOUT_MS})
     */
    RequestIntake(long maxBodyBytes, long bodyTimeoutMillis) {
        this.maxBodyBytes = maxBodyBytes;
        this.bodyTimeoutMillis = bodyTimeoutMillis;
    }

    /** Request attribute holding the whole body (bytes) when it arrived complete and within the cap. */
    static final String BODY_ATTR = "tectomelt.body";

    /**
     * The request body: the bytes read here when the body arrived whole within the cap, otherwise
     * what the framework reads ({@code ctx.bodyAsBytes()}, which enforces the cap itself).
     */
    static byte[] body(io.javalin.http.Context ctx) {
        Object b = ctx.attribute(BODY_ATTR);
        return b instanceof byte[] bytes ? bytes : ctx.bodyAsBytes();
    }

    /** The failure mark of this request's body, or null when it arrived whole (or there was none). */
    static BodyFailure failure(io.javalin.http.Context ctx) {
        Object f = ctx.attribute(FAILURE_ATTR);
        return f instanceof BodyFailure b ? b : null;
    }

    @Override
    public boolean handle(Request request, Response response, Callback callback) throws Exception {
        Handler next = getHandler();
        if (next == null) {
            return false;
        }
        Request req = withoutOverride(request);
        HttpFields headers = req.getHeaders();
        long declared = headers.getLongField(HttpHeader.CONTENT_LENGTH);
        boolean chunked = headers.contains(HttpHeader.TRANSFER_ENCODING, "chunked");
        if (declared <= 0 && !chunked) {
            return next.handle(req, response, callback);
        }
        if (declared > RequestPlumbing.DRAIN_FACTOR * maxBodyBytes) {
            // not worth reading: the app refuses it with 413 and the connection closes
            return next.handle(req, response, callback);
        }
        new Loader(next, req, response, callback, declared > maxBodyBytes).start();
        return true;
    }

    private static Request withoutOverride(Request request) {
        HttpFields headers = request.getHeaders();
        boolean any = false;
        for (String h : OVERRIDE_HEADERS) {
            any |= headers.contains(h);
        }
        if (!any) {
            return request;
        }
        HttpFields.Mutable kept = HttpFields.build();
        for (HttpField f : headers) {
            boolean drop = false;
            for (String h : OVERRIDE_HEADERS) {
                drop |= f.getName().equalsIgnoreCase(h);
            }
            if (!drop) {
                kept.add(f);
            }
        }
        HttpFields fixed = kept.asImmutable();
        return new Request.Wrapper(request) {
            @Override
            public HttpFields getHeaders() {
                return fixed;
            }
        };
    }

    /** Reads one body with non-blocking demand, then hands the request to the app. */
    private final class Loader implements Invocable.Task {
        private final Handler next;
        private final Request request;
        private final Response response;
        private final Callback callback;
        /** Declared over the cap: read and drop, the app answers 413. */
        private final boolean discard;
        private final ByteArrayOutputStream body = new ByteArrayOutputStream();
        private long received;
        private boolean dispatched;
        private Scheduler.Task timer;

        Loader(Handler next, Request request, Response response, Callback callback, boolean discard) {
            this.next = next;
            this.request = request;
            this.response = response;
            this.callback = callback;
            this.discard = discard;
        }

        void start() {
            // a small body usually came with the headers: read it at once, and start the body's clock
            // only when the rest has to be waited for (saves a timer per request)
            read(false);
        }

        @Override
        public InvocationType getInvocationType() {
            return InvocationType.NON_BLOCKING;
        }

        @Override
        public void run() {
            read(true);
        }

        /**
         * @param fromDemand true when called back by Jetty's demand (maybe on a selector thread, which
         *                   must not run the app: the hand-over then goes to a pool thread)
         */
        private void read(boolean fromDemand) {
            Content.Chunk tail = null;
            BodyFailure failure = null;
            synchronized (this) {
                if (dispatched) {
                    return;
                }
                while (true) {
                    Content.Chunk chunk = request.read();
                    if (chunk == null) {
                        if (timer == null) {
                            timer = request.getComponents().getScheduler().schedule(this::timedOut,
                                    bodyTimeoutMillis, TimeUnit.MILLISECONDS);
                        }
                        request.demand(this);
                        return;
                    }
                    if (Content.Chunk.isFailure(chunk)) {
                        failure = BodyFailure.INCOMPLETE;
                        break;
                    }
                    ByteBuffer b = chunk.getByteBuffer();
                    int n = b.remaining();
                    received += n;
                    if (!discard && received <= maxBodyBytes + 1) {
                        byte[] copy = new byte[n];
                        b.get(copy);
                        body.write(copy, 0, n);
                    }
                    boolean last = chunk.isLast();
                    chunk.release();
                    if (last) {
                        break;
                    }
                    if (!discard && received > maxBodyBytes) {
                        // a chunked body over the cap: hand over what is here and the rest of the stream;
                        // the app refuses it with 413
                        tail = Content.Chunk.EMPTY;
                        break;
                    }
                }
                dispatched = true;
            }
            if (timer != null) {
                timer.cancel();
            }
            BodyFailure f = failure;
            boolean rest = tail != null;
            if (fromDemand) {
                request.getContext().execute(() -> dispatch(f, rest));
            } else {
                dispatch(f, rest);
            }
        }

        private void timedOut() {
            synchronized (this) {
                if (dispatched) {
                    return;
                }
                dispatched = true;
            }
            // hand over on a pool thread: the scheduler's thread must not run the app
            request.getContext().execute(() -> dispatch(BodyFailure.TIMEOUT, false));
        }

        private void dispatch(BodyFailure failure, boolean streamRest) {
            Request delivered;
            if (failure != null) {
                request.setAttribute(FAILURE_ATTR, failure);
                delivered = new Buffered(request, null, false, failure);
            } else {
                byte[] bytes = discard ? null : body.toByteArray();
                if (bytes != null && !streamRest) {
                    // the whole body, within the cap: the app reads it from here without a second copy
                    request.setAttribute(BODY_ATTR, bytes);
                }
                delivered = new Buffered(request, bytes, streamRest, null);
            }
            try {
                if (!next.handle(delivered, response, callback)) {
                    Response.writeError(request, response, callback, 404);
                }
            } catch (Throwable t) {
                Response.writeError(request, response, callback, t);
            }
        }
    }

    /** The request as the app sees it: its body from memory. */
    private static final class Buffered extends Request.Wrapper {
        private byte[] bytes;
        private final boolean streamRest;
        private final BodyFailure failure;

        Buffered(Request wrapped, byte[] bytes, boolean streamRest, BodyFailure failure) {
            super(wrapped);
            this.bytes = bytes;
            this.streamRest = streamRest;
            this.failure = failure;
        }

        @Override
        public Content.Chunk read() {
            if (failure != null) {
                return Content.Chunk.from(new java.io.IOException("request body "
                        + failure.name().toLowerCase(Locale.ROOT)), true);
            }
            if (bytes != null) {
                byte[] b = bytes;
                bytes = null;
                return Content.Chunk.from(ByteBuffer.wrap(b), !streamRest);
            }
            return streamRest ? super.read() : Content.Chunk.EOF;
        }

        @Override
        public void demand(Runnable demandCallback) {
            if (failure != null || bytes != null || !streamRest) {
                demandCallback.run();
            } else {
                super.demand(demandCallback);
            }
        }
    }
}
