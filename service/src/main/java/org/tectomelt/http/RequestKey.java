package org.tectomelt.http;

import com.fasterxml.jackson.databind.JsonNode;
import io.javalin.http.Context;
import io.javalin.http.HandlerType;
import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Base64;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.tectomelt.contract.Json;

/**
 * The canonical form of a request and the entity tag derived from it.
 *
 * <p>Every route is deterministic: the same request to the same build with the same caps gets
 * byte-identical JSON. So the tag is computed from the request, before any work: SHA-256 over the
 * service version, the caps ({@link org.tectomelt.Config#resultFingerprint()}), the method, the
 * path, the sorted query parameters and the body in canonical form ({@link Canonical}: object keys
 * sorted, whitespace dropped, floating-point numbers as the bits of the double they parse to,
 * integers as integers).
 * Two bodies that differ only in key order, spacing or the spelling of a number ({@code 1.50} and
 * {@code 1.5e0}) share a tag and a cache entry; a body that is not JSON, or breaks the parser's
 * limits, gets none (the handler rejects it anyway).
 */
final class RequestKey {

    private static final String ATTR = "tectomelt.requestKey";
    private static final String TREE_ATTR = "tectomelt.requestTree";
    private static final String NONE = "";

    private final String seed;

    /** @param seed version and caps, mixed into every key */
    RequestKey(String seed) {
        this.seed = seed;
    }

    /** The strong entity tag of this request ({@code "…"}, quotes included), or null when there is none. */
    String etag(Context ctx) {
        String cached = ctx.attribute(ATTR);
        if (cached == null) {
            cached = compute(ctx);
            ctx.attribute(ATTR, cached);
        }
        return cached.equals(NONE) ? null : cached;
    }

    /**
     * The body as parsed for the key (parsed once per request: the handler reuses it), or null when
     * no key was computed or the body was not JSON.
     */
    static JsonNode parsedBody(Context ctx) {
        return ctx.attribute(TREE_ATTR);
    }

    /** True when {@code If-None-Match} lists {@code etag} (weak comparison, as RFC 9110 §13.1.2 asks). */
    static boolean matches(String ifNoneMatch, String etag) {
        if (ifNoneMatch == null || etag == null) {
            return false;
        }
        for (String part : ifNoneMatch.split(",")) {
            String t = part.trim();
            if (t.startsWith("W/")) {
                t = t.substring(2);
            }
            if (t.equals(etag)) {
                return true;
            }
        }
        return false;
    }

    private String compute(Context ctx) {
        StringBuilder sb = new StringBuilder(256);
        sb.append(seed).append('\n').append(ctx.method().name()).append(' ').append(ctx.path()).append('\n');
        String queryString = ctx.queryString();
        Map<String, List<String>> given = queryString == null || queryString.isEmpty() ? Map.of() : ctx.queryParamMap();
        Map<String, List<String>> query = given.isEmpty() ? given : new TreeMap<>(given);
        for (Map.Entry<String, List<String>> q : query.entrySet()) {
            List<String> values = new ArrayList<>(q.getValue());
            values.sort(null);
            sb.append(q.getKey()).append('=').append(values).append('&');
        }
        sb.append('\n');
        // the representation asked for is part of the answer (JSON or a CSV table)
        sb.append(MetaRoutes.wantsBibtexQuietly(ctx) ? "bibtex" : OperationHandler.wantsCsv(ctx) ? "csv" : "json")
                .append('\n');
        Canonical c = Canonical.start(sb.toString());
        if (ctx.method() == HandlerType.POST) {
            byte[] body = RequestIntake.body(ctx);
            JsonNode tree;
            try {
                tree = Json.mapper().readTree(body);
            } catch (Exception e) {
                return NONE;
            }
            if (tree == null || tree.isMissingNode()) {
                return NONE;
            }
            c.node(tree);
            ctx.attribute(TREE_ATTR, tree);
        }
        return "\"" + c.finish() + "\"";
    }

    /**
     * The canonical form of a request, fed to SHA-256 as it is written (through one small buffer per
     * thread, never as one string): the prefix (version, caps, method, path, query, representation)
     * as UTF-8, then the body. Object keys sorted; every value tagged with its kind and framed
     * (strings and keys by their UTF-8 length, objects and arrays by their size), so no two trees
     * share a form; a floating-point number as the 8 bytes of the double it parses to (1.50 and
     * 1.5e0 alike), an integer as its decimal digits (35 and 35.0 differ, as JSON's types do).
     */
    static final class Canonical {
        private static final ThreadLocal<Canonical> PER_THREAD = ThreadLocal.withInitial(Canonical::new);

        private final byte[] buf = new byte[16 * 1024];
        private int n;
        private MessageDigest md;

        static Canonical start(String prefix) {
            Canonical c = PER_THREAD.get();
            c.md = SHA256.get();
            c.md.reset();
            c.n = 0;
            c.bytes(prefix.getBytes(StandardCharsets.UTF_8));
            return c;
        }

        void node(JsonNode node) {
            switch (node.getNodeType()) {
                case OBJECT -> {
                    String[] keys = new String[node.size()];
                    int k = 0;
                    for (Iterator<String> it = node.fieldNames(); it.hasNext(); ) {
                        keys[k++] = it.next();
                    }
                    Arrays.sort(keys);   // the parser refuses duplicate keys, so the names are distinct
                    tag('{');
                    count(keys.length);
                    for (String key : keys) {
                        text(key);
                        node(node.get(key));
                    }
                }
                case ARRAY -> {
                    tag('[');
                    count(node.size());
                    for (int i = 0; i < node.size(); i++) {
                        node(node.get(i));
                    }
                }
                case NUMBER -> {
                    if (node.isIntegralNumber()) {
                        tag('i');
                        bytes((node.canConvertToLong() ? Long.toString(node.longValue())
                                : node.bigIntegerValue().toString()).getBytes(StandardCharsets.US_ASCII));
                        tag(';');
                    } else {
                        tag('d');
                        long bits = Double.doubleToLongBits(node.doubleValue());
                        room(8);
                        for (int shift = 56; shift >= 0; shift -= 8) {
                            buf[n++] = (byte) (bits >>> shift);
                        }
                    }
                }
                case STRING -> {
                    tag('s');
                    text(node.textValue());
                }
                case BOOLEAN -> tag(node.booleanValue() ? 't' : 'f');
                default -> tag('n');
            }
        }

        /** The first 18 bytes of the digest, base64url: 24 characters. */
        String finish() {
            md.update(buf, 0, n);
            n = 0;
            byte[] d = md.digest();
            return Base64.getUrlEncoder().withoutPadding().encodeToString(Arrays.copyOf(d, 18));
        }

        private void text(String s) {
            int len = s.length();
            boolean ascii = true;
            for (int i = 0; i < len && ascii; i++) {
                ascii = s.charAt(i) < 0x80;
            }
            if (!ascii) {
                byte[] utf8 = s.getBytes(StandardCharsets.UTF_8);
                count(utf8.length);
                bytes(utf8);
                return;
            }
            count(len);
            for (int i = 0; i < len; ) {
                int m = Math.min(len - i, buf.length);
                room(m);
                for (int j = 0; j < m; j++) {
                    buf[n++] = (byte) s.charAt(i + j);
                }
                i += m;
            }
        }

        private void count(int size) {
            room(4);
            buf[n++] = (byte) (size >>> 24);
            buf[n++] = (byte) (size >>> 16);
            buf[n++] = (byte) (size >>> 8);
            buf[n++] = (byte) size;
        }

        private void tag(char c) {
            room(1);
            buf[n++] = (byte) c;
        }

        private void bytes(byte[] b) {
            if (b.length > buf.length - n) {
                md.update(buf, 0, n);
                n = 0;
                if (b.length > buf.length) {
                    md.update(b);
                    return;
                }
            }
            System.arraycopy(b, 0, buf, n, b.length);
            n += b.length;
        }

        private void room(int k) {
            if (n + k > buf.length) {
                md.update(buf, 0, n);
                n = 0;
            }
        }
    }

    /** A SHA-256 digest per thread: looking one up by name for every request costs more than hashing. */
    private static final ThreadLocal<MessageDigest> SHA256 = ThreadLocal.withInitial(() -> {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every Java platform", e);
        }
    });
}
