package org.tectomelt.operations;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.tectomelt.Config;

/**
 * The one list of operations: every computation the API offers, in the order
 * {@code GET /v1/operations} lists them. The HTTP skin, the runs executor and the studies all find
 * operations here (by name or path) and call them through {@code org.tectomelt.contract.Invoker}.
 */
public final class Operations {

    private static final Operations DEFAULTS = of(Config.defaults());

    private final List<Operation<?, ?>> all;
    private final Map<String, Operation<?, ?>> byName = new LinkedHashMap<>();
    private final Map<String, Operation<?, ?>> byPath = new LinkedHashMap<>();

    private Operations(List<Operation<?, ?>> all) {
        this.all = List.copyOf(all);
        for (Operation<?, ?> op : all) {
            if (byName.put(op.name(), op) != null || byPath.put(op.path(), op) != null) {
                throw new IllegalStateException("operation registered twice: " + op.name() + " " + op.path());
            }
        }
    }

    /** The catalogue for a server's configuration (the caps an operation enforces come from it). */
    public static Operations of(Config config) {
        return new Operations(List.of(
                new PressureOperation(config),
                new GeothermOperation(config),
                new MeltFractionOperation(config),
                new SolidusCrossingsOperation(config),
                new DecompressionOperation(),
                new MidOceanRidgeOperation(),
                new HotspotOperation(),
                new ContinentalRiftOperation(),
                new SubductionOperation(),
                new HeatBudgetOperation(),
                new SillModelOperation(config),
                new MeltCompositionOperation()));
    }

    /** Every operation with the embedded default caps. */
    public static List<Operation<?, ?>> all() {
        return DEFAULTS.list();
    }

    /** The operation called {@code name}, with the embedded default caps. */
    public static Optional<Operation<?, ?>> byName(String name) {
        return DEFAULTS.named(name);
    }

    /** Every operation of this catalogue, in listing order. */
    public List<Operation<?, ?>> list() {
        return all;
    }

    /** The operation called {@code name} ({@code melt-fraction}). */
    public Optional<Operation<?, ?>> named(String name) {
        return Optional.ofNullable(byName.get(name));
    }

    /** The operation served at {@code path} ({@code /v1/melt-fraction}). */
    public Optional<Operation<?, ?>> atPath(String path) {
        return Optional.ofNullable(byPath.get(path));
    }
}
