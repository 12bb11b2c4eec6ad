package org.tectomelt.operations;

import java.util.List;
import org.tectomelt.engine.Deadline;

/**
 * One computation the API offers: a request record in API units → a result record.
 *
 * <p>The request arrives already checked against the spec and with the spec's defaults filled in
 * (through {@code org.tectomelt.contract.Invoker}), so a component the spec gives a default is never
 * null here. The operation turns the request into engine inputs (SI, via {@code Units}), calls the
 * engine, and builds the result; it checks only what the spec cannot say, throwing
 * {@link OperationException} (→ 400) for a broken cross-field rule and letting the engine's
 * {@code EngineException} (→ 400 outside-model-range) and {@code BudgetExceededException} (→ 503) fly.
 *
 * @param <Q> the request record (boxed components; the JSON field names)
 * @param <R> the result record (the JSON field names)
 */
public interface Operation<Q extends Record, R extends Record> {

    /** Stable name: {@code melt-fraction}, {@code mid-ocean-ridge}, {@code sill-model}. */
    String name();

    /** The HTTP path it is served at: {@code /v1/settings/mid-ocean-ridge}. */
    String path();

    /** The request record's class. */
    Class<Q> requestType();

    /**
     * The cost class of the operation as a whole: {@link Cost#HEAVY} operations are always served
     * through the limiter; a {@link Cost#CHEAP} one only when {@link #cost(Record)} says so for a
     * request.
     */
    Cost costClass();

    /** The cost of one request (a large batch of a cheap operation may be heavy). */
    default Cost cost(Q request) {
        return costClass();
    }

    /**
     * The operation's own rules that can be checked without computing (a lithology's pressure
     * limit, a rule across fields), recorded in {@code rules}. {@link #run} applies them too; the
     * invoker also calls this when the spec has already refused the body, so that every error comes
     * back in one answer: then components may be null and list elements missing, and a failure
     * here is ignored. Default: none.
     */
    default void check(Q request, Rules rules) {
    }

    /** Runs the computation; long loops poll {@code deadline}. */
    R run(Q request, Deadline deadline);

    /** Numeric request fields a sweep or a sample may address. */
    List<Input> inputs();

    /** Numeric scalar outputs a sweep or a study may read. */
    List<Output<R>> outputs();

    /** Server caps on request list lengths (enforced by the contract instead of the spec's maxItems). */
    default List<Cap> caps() {
        return List.of();
    }

    /**
     * The dotted path of the result's list of rows ({@code results}, {@code profile},
     * {@code column.profile}) offered as a table ({@code text/csv}, a {@code fields} choice); null
     * when the result has none. {@link #rows(Record)} may choose it per result.
     */
    default String rows() {
        return null;
    }

    /** The rows path for this result (a single-point answer of a batch operation has none). */
    default String rows(R result) {
        return rows();
    }
}
