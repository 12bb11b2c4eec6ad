package org.tectomelt.contract;

import static org.junit.jupiter.api.Assertions.assertEquals;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Random;
import org.junit.jupiter.api.Test;

/** {@link Json#numbers}: the text of the tree it replaces, byte for byte. */
class JsonNumbersTest {

    /** What a run stored before: the tree's own text. */
    private static String viaTree(Map<String, Double> values) {
        ObjectNode o = Json.mapper().createObjectNode();
        values.forEach((k, v) -> {
            if (v == null || !Double.isFinite(v)) {
                o.putNull(k);
            } else {
                o.put(k, v);
            }
        });
        return o.toString();
    }

    @Test
    void edgeValuesAndNamesAreWrittenAsTheTreeWritesThem() {
        Map<String, Double> m = new LinkedHashMap<>();
        m.put("potentialTemperatureC", 1250.0);
        m.put("zero", 0.0);
        m.put("negativeZero", -0.0);
        m.put("tiny", 4.9e-324);
        m.put("huge", Double.MAX_VALUE);
        m.put("third", 1.0 / 3.0);
        m.put("small", 1.0e-7);
        m.put("large", 1.0e7);
        m.put("none", null);
        m.put("nan", Double.NaN);
        m.put("inf", Double.POSITIVE_INFINITY);
        m.put("quote\"back\\slash", 2.5);
        m.put("ünïcode and \t tab", -7.25);
        assertEquals(viaTree(m), Json.numbers(m));
        assertEquals("{}", Json.numbers(Map.of()));
        assertEquals(viaTree(Map.of()), Json.numbers(Map.of()));
    }

    @Test
    void randomNumbersAreWrittenAsTheTreeWritesThem() {
        Random r = new Random(20261202);
        for (int k = 0; k < 20_000; k++) {
            Map<String, Double> m = new LinkedHashMap<>();
            m.put("a", Double.longBitsToDouble(r.nextLong()));
            m.put("b", (r.nextDouble() - 0.5) * Math.pow(10, r.nextInt(40) - 20));
            m.put("c", (double) r.nextInt(100_000));
            assertEquals(viaTree(m), Json.numbers(m));
        }
    }
}
