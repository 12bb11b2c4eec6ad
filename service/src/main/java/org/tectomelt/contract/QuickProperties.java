package org.tectomelt.contract;

import com.fasterxml.jackson.databind.JsonNode;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaContext;
import com.networknt.schema.SchemaLocation;
import com.networknt.schema.keyword.Keyword;
import com.networknt.schema.keyword.KeywordValidator;
import com.networknt.schema.keyword.PropertiesValidator;
import java.util.HashMap;
import java.util.HashSet;
import java.util.Iterator;
import java.util.Map;
import java.util.Set;

/**
 * networknt's {@code properties} keyword with a quick accept in front for a small request of plain
 * values: when every member present has a plain schema — a number with bounds (as {@link QuickItems}
 * takes them), or a string with nothing but {@code description}, {@code example}, {@code default} (which the
 * library does not check) and {@code enum}
 * — and each value passes it (a double or an int strictly inside its bounds; a
 * string, in the enum when there is one), the members are passed at once. A member with any other
 * schema (an object, a list, a {@code $ref} to one), a member that fails, or a member the keyword
 * does not name (the sibling {@code additionalProperties} keeps its own check) sends the object to
 * the library's own validator, which decides and words every error.
 *
 * <p>Why: the library walks each member with its own bookkeeping (a node path, the member's
 * keyword validators); for a one-point request that was most of the spec check's few microseconds.
 * Why it is exact: for such member schemas the library checks only the value's type, its bounds
 * and its enum, which the quick accept checks the same way.
 */
final class QuickProperties implements Keyword {

    private static final Set<String> STRING_KEYS = Set.of("type", "description", "example", "enum", "default");

    private final JsonNode document;

    /** @param document the spec (or any document whose local references the schemas use) */
    QuickProperties(JsonNode document) {
        this.document = document;
    }

    @Override
    public String getValue() {
        return "properties";
    }

    @Override
    public KeywordValidator newValidator(SchemaLocation location, JsonNode schemaNode, Schema parent,
                                         SchemaContext context) {
        Map<String, Member> members = new HashMap<>();
        for (Iterator<Map.Entry<String, JsonNode>> it = schemaNode.fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> e = it.next();
            Member m = member(e.getValue());
            if (m != null) {
                members.put(e.getKey(), m);
            }
        }
        return new Quick(new PropertiesValidator(location, schemaNode, parent, context), members);
    }

    /** The quick check of a member's schema, or null when it is not plain. */
    private Member member(JsonNode s) {
        s = QuickItems.local(document, s);
        if (s == null || !s.isObject()) {
            return null;
        }
        String type = s.path("type").asText();
        if ("number".equals(type)) {
            double[] b = QuickBounds.bounds(s);
            return b == null ? null : new Member(b, null);
        }
        if (!"string".equals(type)) {
            return null;
        }
        for (Iterator<String> k = s.fieldNames(); k.hasNext(); ) {
            if (!STRING_KEYS.contains(k.next())) {
                return null;
            }
        }
        if (!s.has("enum")) {
            return new Member(null, null);
        }
        if (!s.get("enum").isArray()) {
            return null;
        }
        Set<String> allowed = new HashSet<>();
        for (JsonNode v : s.get("enum")) {
            if (!v.isTextual()) {
                return null;
            }
            allowed.add(v.asText());
        }
        return new Member(null, allowed);
    }

    /**
     * A plain member: a bounded number ({@code bounds}), or a string when {@code bounds} is null
     * (within {@code allowed} when that is not null).
     */
    private record Member(double[] bounds, Set<String> allowed) {
        boolean accepts(JsonNode v) {
            if (bounds == null) {
                return v.isTextual() && (allowed == null || allowed.contains(v.textValue()));
            }
            return QuickBounds.inside(v, bounds);
        }
    }

    /** The keyword of one schema: the quick accept, then the library. */
    private record Quick(PropertiesValidator library, Map<String, Member> members) implements QuickAccept {
        /** True when every member passes every check the library would make (see the class comment). */
        @Override
        public boolean accepts(JsonNode node) {
            if (!node.isObject()) {
                return false;
            }
            for (Iterator<Map.Entry<String, JsonNode>> it = node.fields(); it.hasNext(); ) {
                Map.Entry<String, JsonNode> e = it.next();
                Member m = members.get(e.getKey());
                if (m == null || !m.accepts(e.getValue())) {
                    return false;
                }
            }
            return true;
        }
    }
}
