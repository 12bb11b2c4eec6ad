package org.tectomelt.contract;

import com.fasterxml.jackson.databind.JsonNode;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaContext;
import com.networknt.schema.SchemaLocation;
import com.networknt.schema.keyword.ItemsLegacyValidator;
import com.networknt.schema.keyword.Keyword;
import com.networknt.schema.keyword.KeywordValidator;
import java.util.HashMap;
import java.util.HashSet;
import java.util.Iterator;
import java.util.Map;
import java.util.Set;

/**
 * networknt's {@code items} keyword (OpenAPI 3.0: one schema for every item) with a quick accept in
 * front for a batch of plain points or numbers. A list of numbers whose item schema is a number with
 * bounds and nothing else (the field keys below) is passed at once when every item is a double or an
 * int strictly inside the bounds. For points: when the item schema is an object of number fields with bounds
 * and nothing else (its keys among {@code type}, {@code additionalProperties: false},
 * {@code required}, {@code properties}, {@code description}, {@code example}; each field's among
 * {@code type: number}, {@code format}, {@code minimum}, {@code maximum}, OpenAPI 3.0's boolean
 * {@code exclusiveMinimum}/{@code exclusiveMaximum}, {@code description}, {@code example}, {@code default},
 * which the library does not check), an array whose every item is such an object — only known fields, every
 * required one, each a double or an int strictly inside its bounds — is passed at once. Any other
 * array, and any other item schema, goes to the library's own validator, which decides and words
 * every error.
 *
 * <p>Why: the library walks each item with its own bookkeeping (a node path per item and field); in
 * a 10,000-point batch that was a seventh of the server's time. Why it is exact: for such an item
 * schema the library's checks are the type of the item, the required and unknown names, and each
 * field's type and bounds; the quick accept passes an item only when each of them passes, with the
 * bounds compared as {@link QuickBounds} does (strictly inside, so an exclusive bound or a bound
 * that is not an exact double makes no difference).
 */
final class QuickItems implements Keyword {

    private static final Set<String> ITEM_KEYS = Set.of("type", "additionalProperties", "required", "properties",
            "description", "example");

    /** The document the item schemas' local {@code $ref}s point into. */
    private final JsonNode document;

    /** @param document the spec (or any document whose local references the schemas use) */
    QuickItems(JsonNode document) {
        this.document = document;
    }

    @Override
    public String getValue() {
        return "items";
    }

    @Override
    public KeywordValidator newValidator(SchemaLocation location, JsonNode schemaNode, Schema parent,
                                         SchemaContext context) {
        return new Quick(new ItemsLegacyValidator(location, schemaNode, parent, context), plain(schemaNode));
    }

    /** True when arrays under the item schema {@code items} get the quick accept (for tests). */
    boolean quickFor(JsonNode items) {
        return plain(items) != null;
    }

    /** The fields of a plain point schema (name → {lower, upper}, NaN for none), or null when it is not one. */
    private Plain plain(JsonNode items) {
        JsonNode s = local(document, items);
        if (s != null && s.isObject() && "number".equals(s.path("type").asText())) {
            double[] b = QuickBounds.bounds(s);
            return b == null ? null : new Plain(null, null, b);
        }
        if (s == null || !s.isObject() || !"object".equals(s.path("type").asText())
                || !s.path("additionalProperties").isBoolean() || s.path("additionalProperties").booleanValue()
                || !s.path("properties").isObject()) {
            return null;
        }
        for (Iterator<String> it = s.fieldNames(); it.hasNext(); ) {
            if (!ITEM_KEYS.contains(it.next())) {
                return null;
            }
        }
        Map<String, double[]> fields = new HashMap<>();
        for (Iterator<Map.Entry<String, JsonNode>> it = s.get("properties").fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> f = it.next();
            double[] b = QuickBounds.bounds(f.getValue());
            if (b == null) {
                return null;
            }
            fields.put(f.getKey(), b);
        }
        JsonNode required = s.path("required");
        if (!required.isMissingNode() && !required.isArray()) {
            return null;
        }
        Set<String> req = new HashSet<>();
        for (JsonNode r : required) {
            if (!r.isTextual() || !fields.containsKey(r.asText())) {
                return null;
            }
            req.add(r.asText());
        }
        return new Plain(fields, req, null);
    }

    /**
     * The schema itself, or what its lone local {@code $ref} points to in {@code document}; null for
     * any other reference (a {@code $ref} with siblings, or to another document).
     */
    static JsonNode local(JsonNode document, JsonNode s) {
        if (s == null || !s.has("$ref")) {
            return s;
        }
        String ref = s.get("$ref").asText();
        return s.size() != 1 || !ref.startsWith("#/") ? null : document.at(ref.substring(1));
    }

    /**
     * A plain point schema, or a plain bounded number.
     *
     * @param fields   name → {lower, upper} bound (NaN: none); null for numbers
     * @param required the required names; null for numbers
     * @param number   {lower, upper} of a number item; null for points
     */
    private record Plain(Map<String, double[]> fields, Set<String> required, double[] number) {

        /** True when every item passes every check of the schema (see the class comment). */
        boolean accepts(JsonNode array) {
            if (number != null) {
                for (int i = 0; i < array.size(); i++) {
                    if (!QuickBounds.inside(array.get(i), number)) {
                        return false;
                    }
                }
                return true;
            }
            for (int i = 0; i < array.size(); i++) {
                JsonNode item = array.get(i);
                if (!item.isObject() || item.size() > fields.size()) {
                    return false;
                }
                int present = 0;
                for (Iterator<Map.Entry<String, JsonNode>> it = item.fields(); it.hasNext(); ) {
                    Map.Entry<String, JsonNode> e = it.next();
                    double[] b = fields.get(e.getKey());
                    if (b == null || !QuickBounds.inside(e.getValue(), b)) {
                        return false;
                    }
                    if (required.contains(e.getKey())) {
                        present++;
                    }
                }
                if (present != required.size()) {
                    return false;
                }
            }
            return true;
        }
    }

    /** The keyword of one schema: the quick accept, then the library. */
    private record Quick(ItemsLegacyValidator library, Plain plain) implements QuickAccept {
        @Override
        public boolean accepts(JsonNode node) {
            // every item passes every check the library would make (see the class comment)
            return plain != null && node.isArray() && plain.accepts(node);
        }
    }
}
