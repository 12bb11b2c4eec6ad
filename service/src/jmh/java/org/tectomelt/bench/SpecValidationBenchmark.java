package org.tectomelt.bench;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.State;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.Json;
import org.tectomelt.contract.SpecContract;
import org.tectomelt.operations.Operation;

/**
 * What the spec contract costs a small request: the one-point melt-fraction body of the load
 * test, checked against the spec (networknt, defaults filled), and the whole preparation the
 * handler does (parse, check, bind to the request record).
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
public class SpecValidationBenchmark {

    private static final byte[] BODY = ("{\"lithology\": \"peridotite-katz2003\", \"pressureGPa\": 2,"
            + " \"temperatureC\": 1400, \"bulkWaterWtPct\": 0.02}").getBytes(StandardCharsets.UTF_8);

    private final Invoker invoker = Invoker.standard();
    private final SpecContract spec = invoker.spec();
    private final Operation<?, ?> meltFraction = invoker.operation("melt-fraction");
    private final JsonNode tree = Json.readTree(BODY);

    /** Parsing the body into a tree (what any JSON endpoint pays). */
    @Benchmark
    public JsonNode parseOnly() {
        return Json.readTree(BODY);
    }

    /** The spec check of a parsed body (copy of the tree included, as the check fills defaults in place). */
    @Benchmark
    public Object checkAgainstTheSpec() {
        return spec.check("/v1/melt-fraction", (ObjectNode) tree.deepCopy(), List.of());
    }

    /** Parse, check and bind: the handler's whole preparation. */
    @Benchmark
    public Object prepare() {
        return invoker.prepare(meltFraction, BODY);
    }
}
