package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;

import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.tectomelt.contract.Json;

/** The canonical form behind the entity tag: one form per JSON value, whatever its spelling. */
class RequestKeyCanonicalTest {

    private static String tag(String json) {
        RequestKey.Canonical c = RequestKey.Canonical.start("v\n");
        try {
            c.node(Json.mapper().readTree(json));   // any JSON value, as the key's own parse reads it
        } catch (java.io.IOException e) {
            throw new IllegalArgumentException(e);
        }
        return c.finish();
    }

    @Test
    void spellingKeyOrderAndSpacingDoNotMatter() {
        assertEquals(tag("{\"a\": 1.50, \"b\": [1, 2]}"), tag("{\"b\":[1,2],\"a\":1.5e0}"));
        assertEquals(tag("{\"t\": \"Ämtal\"}"), tag("{\"t\":\"\\u00c4mtal\"}"));
    }

    @Test
    void distinctValuesHaveDistinctForms() {
        List<String> values = List.of("{\"a\":\"bc\"}", "{\"ab\":\"c\"}", "[\"a\",\"b\"]", "[\"ab\"]", "[[\"a\"],\"b\"]",
                "[\"a\",[\"b\"]]", "35", "35.0", "-0.0", "0.0", "\"35\"", "true", "false", "null", "[]", "{}", "[null]",
                "{\"a\":{}}", "{\"a\":[]}", "12345678901234567890123", "12345678901234567890124", "\"Ä\"", "\"A\"",
                "{\"a\":1,\"b\":2}", "{\"a\":2,\"b\":1}", "[1,2]", "[2,1]");
        Set<String> tags = new HashSet<>();
        for (String v : values) {
            tags.add(tag(v));
        }
        assertEquals(values.size(), tags.size(), "each value its own tag");
        assertNotEquals(tag("\"" + "x".repeat(40_000) + "\""), tag("\"" + "x".repeat(40_001) + "\""),
                "strings longer than the buffer are hashed whole");
    }
}
