package org.tectomelt.contract;

import com.fasterxml.jackson.databind.JsonNode;
import com.networknt.schema.ExecutionContext;
import com.networknt.schema.SchemaLocation;
import com.networknt.schema.keyword.KeywordValidator;
import com.networknt.schema.path.NodePath;

/**
 * One of networknt's keyword validators with an exact quick accept in front ({@link QuickBounds},
 * {@link QuickItems}, {@link QuickProperties}): a value the accept passes is one the library would
 * pass; everything else — and walking, preloading, the keyword's name and location — is the
 * library's own.
 */
interface QuickAccept extends KeywordValidator {

    /** The library's validator of the same keyword and schema. */
    KeywordValidator library();

    /** True only for a value the library would pass. */
    boolean accepts(JsonNode node);

    @Override
    default void validate(ExecutionContext context, JsonNode node, JsonNode root, NodePath location) {
        if (!accepts(node)) {
            library().validate(context, node, root, location);
        }
    }

    @Override
    default void walk(ExecutionContext context, JsonNode node, JsonNode root, NodePath location,
                      boolean shouldValidateSchema) {
        library().walk(context, node, root, location, shouldValidateSchema);
    }

    @Override
    default void preloadSchema() {
        library().preloadSchema();
    }

    @Override
    default String getKeyword() {
        return library().getKeyword();
    }

    @Override
    default SchemaLocation getSchemaLocation() {
        return library().getSchemaLocation();
    }
}
