package org.tectomelt.runs.study;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.tectomelt.contract.Invoker;
import org.tectomelt.contract.Json;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.operations.Operation;
import org.tectomelt.operations.Output;
import org.tectomelt.studies.MonteCarlo;
import org.tectomelt.studies.PosteriorInversion;
import org.tectomelt.studies.SamplingInversion;
import org.tectomelt.studies.Workers;

/**
 * A study on an operation, cut into blocks a run can compute anywhere: {@value #BLOCK_SAMPLES}
 * samples (or draws) of a forward study or a sampling inversion, or one grid point (with all its
 * nuisance draws) of a posterior. Each block is stored as JSON text; {@link #assemble} turns all
 * blocks of one request (one sweep point) into its result, identical to computing the study in one
 * go, whatever computed which block.
 */
public final class StudyRun {

    /** Samples per block of a forward study or a sampling inversion. */
    public static final int BLOCK_SAMPLES = 250;

    /** What a study computes. */
    public enum Kind {
        /** Forward Monte Carlo. */
        FORWARD,
        /** Posterior on a grid. */
        POSTERIOR,
        /** One root per draw. */
        SAMPLING;

        /** The name in results ({@code forward}, {@code posterior}, {@code sampling}). */
        public String label() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }
    }

    private final Invoker invoker;
    private final Operation<?, ?> operation;
    private final StudyRequest study;
    private final List<String> outputs;
    private final Map<String, String> units = new LinkedHashMap<>();

    /**
     * @param invoker   the spec and the operations
     * @param operation the operation studied
     * @param study     the checked study parts
     * @param outputs   outputs to summarise (a forward study; an inversion reads its observed outputs)
     */
    public StudyRun(Invoker invoker, Operation<?, ?> operation, StudyRequest study, List<String> outputs) {
        this.invoker = invoker;
        this.operation = operation;
        this.study = study;
        this.outputs = study.solve() != null ? List.copyOf(study.observed().keySet()) : List.copyOf(outputs);
        Map<String, String> byName = new LinkedHashMap<>();
        for (Output<?> o : operation.outputs()) {
            byName.put(o.name(), o.unit());
        }
        this.outputs.forEach(o -> units.put(o, byName.getOrDefault(o, "")));
    }

    /** What this study computes. */
    public Kind kind() {
        if (study.solve() == null) {
            return Kind.FORWARD;
        }
        return "sampling".equals(study.solve().method()) ? Kind.SAMPLING : Kind.POSTERIOR;
    }

    /** The study parts. */
    public StudyRequest study() {
        return study;
    }

    /** Blocks per request (per sweep point). */
    public int blocks() {
        return switch (kind()) {
            case POSTERIOR -> study.solve().gridPoints();
            default -> (study.samples() + BLOCK_SAMPLES - 1) / BLOCK_SAMPLES;
        };
    }

    /**
     * Computes block {@code block} of the study of {@code request} (a sweep point's request) in the
     * calling thread, and returns it as JSON text.
     *
     * @param deadline polled before each sample
     */
    public String evaluate(ObjectNode request, int block, Deadline deadline) {
        return evaluateBlock(request, block, deadline).json();
    }

    /**
     * One computed block: its JSON text and the published models its samples' results listed.
     *
     * @param json   the block as stored
     * @param models the union of the models the block's evaluations listed
     */
    public record Block(String json, List<ModelInfo> models) {
    }

    /** {@link #evaluate}, with the models the block's evaluations listed. */
    public Block evaluateBlock(ObjectNode request, int block, Deadline deadline) {
        OperationModel model = new OperationModel(invoker, operation, request, outputs);
        Object b = switch (kind()) {
            case FORWARD -> MonteCarlo.evaluate(model, study.inputs(), outputs, study.seed(), block * BLOCK_SAMPLES,
                    Math.min(study.samples(), (block + 1) * BLOCK_SAMPLES), Workers.serial(), deadline);
            case POSTERIOR -> PosteriorInversion.evaluate(model, posterior(), block, deadline);
            case SAMPLING -> SamplingInversion.evaluate(model, sampling(), block * BLOCK_SAMPLES,
                    Math.min(study.samples(), (block + 1) * BLOCK_SAMPLES), Workers.serial(), deadline);
        };
        try {
            return new Block(Json.mapper().writeValueAsString(b), model.models());
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("a study block could not be written as JSON", e);
        }
    }

    /**
     * The result of one request's study from all its blocks (JSON texts, any order), as a JSON
     * object: {@code study} (forward, posterior or sampling) and the result's fields.
     *
     * @throws IllegalArgumentException when a block is missing or unreadable
     */
    public ObjectNode assemble(List<String> blocks) {
        Object result = switch (kind()) {
            case FORWARD -> MonteCarlo.summarise(study.seed(), units, read(blocks, MonteCarlo.Block.class));
            case POSTERIOR -> PosteriorInversion.assemble(posterior(), read(blocks, PosteriorInversion.GridPoint.class));
            case SAMPLING -> SamplingInversion.assemble(sampling(), read(blocks, SamplingInversion.Block.class));
        };
        ObjectNode out = Json.mapper().createObjectNode();
        out.put("study", kind().label());
        out.put("seed", study.seed());
        out.setAll((ObjectNode) Json.mapper().valueToTree(result));
        return out;
    }

    private static final List<String> STATS = List.of("mean", "sd", "p2_5", "p16", "p50", "p84", "p97_5");

    /**
     * Column names of one result flattened for CSV: per summarised output its statistics
     * ({@code crustalThicknessKm.mean}, {@code crustalThicknessKm.p16}, …) and counts for a forward
     * study; the solved field's estimate and the bound masses for a posterior; its summary and the
     * counts of draws without a single root for sampling.
     */
    public List<String> csvColumns() {
        List<String> c = new ArrayList<>();
        switch (kind()) {
            case FORWARD -> {
                for (String o : outputs) {
                    STATS.forEach(x -> c.add(o + "." + x));
                    c.add(o + ".n");
                }
                c.addAll(List.of("failed", "outOfRange"));
            }
            case POSTERIOR -> {
                String f = study.solve().field();
                List.of("mean", "sd", "mode", "p2_5", "p16", "p50", "p84", "p97_5").forEach(x -> c.add(f + "." + x));
                c.addAll(List.of("massAtMin", "massAtMax", "failed"));
            }
            case SAMPLING -> {
                String f = study.solve().field();
                STATS.forEach(x -> c.add(f + "." + x));
                c.addAll(List.of("solved", "noRootAbove", "noRootBelow", "severalRoots", "failed"));
            }
        }
        return c;
    }

    /** The values of {@link #csvColumns()} from an {@link #assemble}d result (null where absent). */
    public List<JsonNode> csvValues(ObjectNode result) {
        List<JsonNode> v = new ArrayList<>();
        switch (kind()) {
            case FORWARD -> {
                for (String o : outputs) {
                    JsonNode s = result.path("summaries").path(o);
                    STATS.forEach(x -> v.add(s.get(x)));
                    v.add(s.get("n"));
                }
                v.add(result.get("failed"));
                int outside = 0;
                for (JsonNode n : result.path("outOfRange")) {
                    outside += n.asInt();
                }
                v.add(Json.mapper().getNodeFactory().numberNode(outside));
            }
            case POSTERIOR -> {
                JsonNode e = result.path("estimate");
                List.of("mean", "sd", "mode", "p2_5", "p16", "p50", "p84", "p97_5").forEach(x -> v.add(e.get(x)));
                v.add(result.get("massAtMin"));
                v.add(result.get("massAtMax"));
                v.add(result.get("failed"));
            }
            case SAMPLING -> {
                JsonNode s = result.path("summary");
                STATS.forEach(x -> v.add(s.get(x)));
                List.of("solved", "noRootAbove", "noRootBelow", "severalRoots", "failed").forEach(x -> v.add(result.get(x)));
            }
        }
        return v;
    }

    private static <T> List<T> read(List<String> blocks, Class<T> type) {
        List<T> out = new ArrayList<>(blocks.size());
        for (String b : blocks) {
            try {
                out.add(Json.mapper().readValue(b, type));
            } catch (JsonProcessingException e) {
                throw new IllegalArgumentException("a stored study block is not readable: " + e.getOriginalMessage());
            }
        }
        return out;
    }

    private PosteriorInversion.Setup posterior() {
        StudyRequest.Solve s = study.solve();
        return new PosteriorInversion.Setup(s.field(), s.range(), s.min(), s.max(), s.gridPoints(), study.observed(),
                study.inputs(), study.samples(), study.seed());
    }

    private SamplingInversion.Setup sampling() {
        StudyRequest.Solve s = study.solve();
        String output = outputs.get(0);
        return new SamplingInversion.Setup(s.field(), s.unit(), s.range(), s.min(), s.max(), output,
                study.observed().get(output), study.inputs(), study.samples(), study.seed(), s.scanPoints());
    }
}
