package org.tectomelt.contract;

import com.fasterxml.jackson.databind.JsonNode;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaContext;
import com.networknt.schema.SchemaLocation;
import com.networknt.schema.dialect.Dialect;
import com.networknt.schema.dialect.Dialects;
import com.networknt.schema.keyword.Keyword;
import com.networknt.schema.keyword.KeywordValidator;
import com.networknt.schema.keyword.MaximumValidator;
import com.networknt.schema.keyword.MinimumValidator;
import java.util.Iterator;
import java.util.Set;

/**
 * networknt's {@code minimum} and {@code maximum} keywords with a quick accept in front: a number
 * strictly inside the bound is passed at once, everything else (the bound itself, beyond it, a big
 * integer, a non-number) goes to the library's own validator, which decides and words the error.
 *
 * <p>Why: the library compares every number as a {@code BigDecimal} built from its decimal text, so
 * each double is first printed; in a 10,000-point batch those two conversions per bound were a fifth
 * of the server's time. Why it is exact: the instance and the bound are compared as the doubles
 * they parse to, and parsing is monotonic — a double strictly above the double nearest the bound's
 * decimal lies above every decimal that rounds to that double, the bound included (and the shortest
 * decimal of the instance, which the library would compare, rounds back to the instance). So the
 * quick accept passes exactly the numbers the library passes strictly inside the bound, whether the
 * bound is exclusive or not; ties and failures are the library's.
 */
final class QuickBounds {

    private QuickBounds() {
    }

    /**
     * The OpenAPI 3.0 dialect with the two bounds, {@code items} ({@link QuickItems}) and
     * {@code properties} ({@link QuickProperties}) replaced, for schemas in {@code document}.
     */
    static Dialect openApi30(JsonNode document) {
        return Dialect.builder(Dialects.getOpenApi30())
                .keyword(new Bound("minimum", true))
                .keyword(new Bound("maximum", false))
                .keyword(new QuickItems(document))
                .keyword(new QuickProperties(document))
                .build();
    }

    /** Keys a plain bounded number schema may have: none the library checks beyond type and bounds. */
    private static final Set<String> NUMBER_KEYS = Set.of("type", "format", "minimum", "maximum", "exclusiveMinimum",
            "exclusiveMaximum", "description", "example", "default");

    /**
     * {lower, upper} (NaN: none) of a plain bounded number schema ({@code type: number}, an optional
     * {@code format: double}, numeric bounds, OpenAPI 3.0's boolean exclusive flags, and words), or
     * null when it is not one.
     */
    static double[] bounds(JsonNode p) {
        if (!p.isObject() || !"number".equals(p.path("type").asText())) {
            return null;
        }
        for (Iterator<String> k = p.fieldNames(); k.hasNext(); ) {
            if (!NUMBER_KEYS.contains(k.next())) {
                return null;
            }
        }
        if (p.has("format") && !"double".equals(p.get("format").asText())) {
            return null;   // "float", "int32"…: a format the library may assert on the value
        }
        if (p.has("minimum") && !p.get("minimum").isNumber() || p.has("maximum") && !p.get("maximum").isNumber()
                || p.has("exclusiveMinimum") && !p.get("exclusiveMinimum").isBoolean()
                || p.has("exclusiveMaximum") && !p.get("exclusiveMaximum").isBoolean()) {
            return null;
        }
        return new double[] {p.has("minimum") ? p.get("minimum").doubleValue() : Double.NaN,
                p.has("maximum") ? p.get("maximum").doubleValue() : Double.NaN};
    }

    /**
     * True when {@code v} is a double or an int strictly inside {@code b} ({lower, upper}, NaN: no
     * bound on that side): then the library passes it too (see the class comment).
     */
    static boolean inside(JsonNode v, double[] b) {
        if (!(v.isDouble() || v.isInt())) {
            return false;
        }
        double x = v.doubleValue();
        return (Double.isNaN(b[0]) || x > b[0]) && (Double.isNaN(b[1]) || x < b[1]);
    }

    /** The keyword: builds the library's validator and puts the quick accept in front of it. */
    private record Bound(String name, boolean lower) implements Keyword {
        @Override
        public String getValue() {
            return name;
        }

        @Override
        public KeywordValidator newValidator(SchemaLocation location, JsonNode schemaNode, Schema parent,
                                             SchemaContext context) {
            KeywordValidator library = lower ? new MinimumValidator(location, schemaNode, parent, context)
                    : new MaximumValidator(location, schemaNode, parent, context);
            double bound = schemaNode.doubleValue();
            return new Quick(library, !schemaNode.isNumber() ? null
                    : lower ? new double[] {bound, Double.NaN} : new double[] {Double.NaN, bound});
        }
    }

    /** One bound of one schema ({lower, upper} with the other side open; null: a bound that is not a number). */
    private record Quick(KeywordValidator library, double[] bounds) implements QuickAccept {
        @Override
        public boolean accepts(JsonNode node) {
            return bounds != null && inside(node, bounds);
        }
    }
}
