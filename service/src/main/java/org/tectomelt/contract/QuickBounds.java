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

    /** The OpenAPI 3.0 dialect with the two keywords replaced. */
    static Dialect openApi30() {
        return Dialect.builder(Dialects.getOpenApi30())
                .keyword(new Bound("minimum", true))
                .keyword(new Bound("maximum", false))
                .build();
    }

    /**
     * The OpenAPI 3.0 dialect with the two bounds, {@code items} ({@link QuickItems}) and
     * {@code properties} ({@link QuickProperties}) replaced,
     * for schemas in {@code document}.
     */
    static Dialect openApi30(JsonNode document) {
        return Dialect.builder(Dialects.getOpenApi30())
                .keyword(new Bound("minimum", true))
                .keyword(new Bound("maximum", false))
                .keyword(new QuickItems(document))
                .keyword(new QuickProperties(document))
                .build();
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
            return new Quick(library, schemaNode.isNumber() ? schemaNode.doubleValue() : Double.NaN, lower);
        }
    }

    /** One bound of one schema. */
    private record Quick(KeywordValidator library, double bound, boolean lower) implements QuickAccept {
        @Override
        public boolean accepts(JsonNode node) {
            // strictly inside: the library would pass it too (see the class comment)
            return (node.isDouble() || node.isInt()) && (lower ? node.doubleValue() > bound : node.doubleValue() < bound);
        }
    }
}
