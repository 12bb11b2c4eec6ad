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
 * path, the sorted query parameters and the body in canonical form (object keys sorted, whitespace
 * dropped, floating-point numbers written as the bits of the double they parse to, integers as
 * integers).
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
            canonical(tree, sb);
            ctx.attribute(TREE_ATTR, tree);
        }
        return "\"" + hash(sb.toString()) + "\"";
    }

    /** Appends {@code node} in canonical form. */
    static void canonical(JsonNode node, StringBuilder sb) {
        switch (node.getNodeType()) {
            case OBJECT -> {
                String[] keys = new String[node.size()];
                int k = 0;
                for (Iterator<String> it = node.fieldNames(); it.hasNext(); ) {
                    keys[k++] = it.next();
                }
                Arrays.sort(keys);   // the parser refuses duplicate keys, so the names are distinct
                sb.append('{');
                for (int i = 0; i < keys.length; i++) {
                    if (i > 0) {
                        sb.append(',');
                    }
                    quote(keys[i], sb);
                    sb.append(':');
                    canonical(node.get(keys[i]), sb);
                }
                sb.append('}');
            }
            case ARRAY -> {
                sb.append('[');
                for (int i = 0; i < node.size(); i++) {
                    if (i > 0) {
                        sb.append(',');
                    }
                    canonical(node.get(i), sb);
                }
                sb.append(']');
            }
            // a floating-point number as the bits of the double it parses to (1.50 and 1.5e0 alike;
            // four times cheaper to write than its decimal form, which a 10,000-point batch felt)
            case NUMBER -> {
                if (node.isIntegralNumber()) {
                    sb.append(node.bigIntegerValue());
                } else {
                    sb.append('x').append(Long.toHexString(Double.doubleToLongBits(node.doubleValue())));
                }
            }
            case STRING -> quote(node.textValue(), sb);
            case BOOLEAN -> sb.append(node.booleanValue());
            default -> sb.append("null");
        }
    }

    private static void quote(String s, StringBuilder sb) {
        sb.append('"');
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            if (c == '"' || c == '\\') {
                sb.append('\\').append(c);
            } else if (c < 0x20) {
                sb.append(String.format("\\u%04x", (int) c));
            } else {
                sb.append(c);
            }
        }
        sb.append('"');
    }

    /** A SHA-256 digest per thread: looking one up by name for every request costs more than hashing. */
    private static final ThreadLocal<MessageDigest> SHA256 = ThreadLocal.withInitial(() -> {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every Java platform", e);
        }
    });

    private static String hash(String canonical) {
        MessageDigest md = SHA256.get();
        md.reset();
        byte[] d = md.digest(canonical.getBytes(StandardCharsets.UTF_8));
        return Base64.getUrlEncoder().withoutPadding().encodeToString(Arrays.copyOf(d, 18));
    }
}
