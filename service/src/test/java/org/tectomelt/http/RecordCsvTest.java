package org.tectomelt.http;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.Json;
import org.tectomelt.contract.RecordCsv;
import org.tectomelt.engine.Deadline;
import org.tectomelt.operations.Operation;
import org.tectomelt.operations.OperationException;

/**
 * The direct CSV of named columns ({@link RecordCsv}) is byte for byte the tree way's
 * ({@link OperationHandler#treeCsv}), for every documented example of every operation with rows and
 * for a hydrous melt-fraction batch, for every column alone, all of them and shuffled subsets; where
 * it cannot be exact (an unknown column) it stands aside.
 */
class RecordCsvTest {

    private static final Invoker INVOKER = Invoker.standard();
    private static final String BATCH = """
            {"lithology": "peridotite-katz2003", "bulkWaterWtPct": 0.1, "points": [
              {"pressureGPa": 1.5, "temperatureC": 1350}, {"pressureGPa": 0.5, "temperatureC": 1000},
              {"pressureGPa": 6, "temperatureC": 1500.25}, {"pressureGPa": 3, "temperatureC": 1900}]}""";

    @Test
    void theDirectWayWritesTheTreeWaysBytes() {
        Random random = new Random(7);
        int direct = 0;
        List<Object[]> cases = new ArrayList<>();
        for (Operation<?, ?> op : INVOKER.operations().list()) {
            for (JsonNode example : SpecExamples.of(INVOKER, op)) {
                cases.add(new Object[] {op, example});
            }
        }
        cases.add(new Object[] {INVOKER.operation("melt-fraction"), Json.readTree(BATCH.getBytes(StandardCharsets.UTF_8))});
        for (Object[] c : cases) {
            Operation<?, ?> op = (Operation<?, ?>) c[0];
            JsonNode example = (JsonNode) c[1];
            Record result = INVOKER.run(op, example.deepCopy(), Deadline.none());
            String rows = rows(op, result);
            if (rows == null) {
                continue;
            }
            JsonNode tree = Provenance.attach(Json.mapper().valueToTree(result));
            byte[] all = OperationHandler.treeCsv(tree, rows, null);
            if (all == null) {
                continue;
            }
            String header = new String(all, StandardCharsets.UTF_8).split("\r\n", 2)[0];
            List<String> columns = List.of(header.split(","));
            List<List<String>> asks = new ArrayList<>();
            asks.add(columns);
            columns.forEach(col -> asks.add(List.of(col)));
            for (int k = 0; k < 5; k++) {
                List<String> some = new ArrayList<>(columns);
                Collections.shuffle(some, random);
                asks.add(some.subList(0, 1 + random.nextInt(some.size())));
            }
            for (List<String> ask : asks) {
                byte[] fast = RecordCsv.write(result, rows, ask);
                if (fast != null) {
                    assertArrayEquals(OperationHandler.treeCsv(tree, rows, ask), fast, op.name() + " " + ask + ": "
                            + example);
                    direct++;
                }
            }
        }
        assertTrue(direct > 50, "the direct way served many of the tables: " + direct);
    }

    @Test
    void theBatchGoesTheDirectWayAndAnUnknownColumnTheTreeWay() {
        Operation<?, ?> op = INVOKER.operation("melt-fraction");
        Record result = INVOKER.run(op, Json.readTree(BATCH.getBytes(StandardCharsets.UTF_8)), Deadline.none());
        assertNotNull(RecordCsv.write(result, "results", List.of("meltFraction", "solidusC", "waterInMeltWtPct")));
        assertNotNull(RecordCsv.write(result, "results", List.of("warnings", "cpxExhausted")));
        assertNull(RecordCsv.write(result, "results", List.of("meltFraction", "colourIndex")));
        JsonNode tree = Provenance.attach(Json.mapper().valueToTree(result));
        assertThrows(OperationException.class, () -> OperationHandler.treeCsv(tree, "results",
                List.of("meltFraction", "colourIndex")));
    }

    @Test
    void aLongBatchWrittenInBlocksOnEveryCoreIsTheTreeWaysToo() {
        StringBuilder body = new StringBuilder("{\"lithology\": \"peridotite-katz2003\", \"bulkWaterWtPct\": 0.05,"
                + " \"points\": [");
        for (int i = 0; i < 9_001; i++) {
            body.append(i == 0 ? "" : ",").append("{\"pressureGPa\": ").append(0.5 + (i % 97) * 0.05)
                    .append(", \"temperatureC\": ").append(1000 + (i % 89) * 5.5).append('}');
        }
        Operation<?, ?> op = INVOKER.operation("melt-fraction");
        Record result = INVOKER.run(op, Json.readTree(body.append("]}").toString().getBytes(StandardCharsets.UTF_8)),
                Deadline.none());
        JsonNode tree = Provenance.attach(Json.mapper().valueToTree(result));
        for (List<String> ask : List.of(List.of("meltFraction", "solidusC", "waterInMeltWtPct"),
                List.of("warnings", "liquidusC", "cpxExhausted", "drySolidusC"))) {
            byte[] fast = RecordCsv.write(result, "results", ask);
            assertNotNull(fast);
            assertArrayEquals(OperationHandler.treeCsv(tree, "results", ask), fast, ask.toString());
        }
    }

    @SuppressWarnings("unchecked")
    private static <R extends Record> String rows(Operation<?, R> op, Record result) {
        return op.rows((R) result);
    }
}
