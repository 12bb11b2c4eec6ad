package org.tectomelt.runs;

import java.time.Instant;
import java.util.Collection;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.UUID;
import java.util.function.Consumer;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.tectomelt.RunsConfig;
import org.tectomelt.engine.ModelInfo;

/**
 * The runs of this service: accept, read, list, cancel and delete them; they are computed in the
 * background by {@link RunExecutor}. One instance per app; {@link #open} connects to the database
 * (refusing to start when it cannot), {@link #start} starts computing, {@link #close} stops.
 */
public final class RunService implements AutoCloseable {

    private static final Logger LOG = LoggerFactory.getLogger(RunService.class);

    private final RunsConfig config;
    private final Database db;
    private final RunStore store;
    private final RunExecutor executor;
    private final InteractiveLoad load;

    private RunService(RunsConfig config, Database db, Evaluator evaluator, InteractiveLoad load) {
        this.config = config;
        this.db = db;
        this.store = new RunStore(db.dataSource(), db.description());
        this.load = load;
        this.executor = new RunExecutor(db, store, evaluator, config, load);
    }

    /**
     * Connects to the run database and migrates it; nothing is computed until {@link #start}.
     *
     * @throws StorageUnavailableException with one line naming the database and the cause
     */
    public static RunService open(RunsConfig config, Evaluator evaluator) {
        Database db = Database.open(config, config.threads() + 6);
        try {
            return new RunService(config, db, evaluator, new InteractiveLoad());
        } catch (RuntimeException e) {
            db.close();
            throw e;
        }
    }

    /** Starts computing queued runs (those left by a previous start included). */
    public void start() {
        executor.start();
        LOG.info("runs: stored in {}, computed by {} thread(s) as '{}'", db.description(), config.threads(),
                config.instanceName());
    }

    /** The settings. */
    public RunsConfig config() {
        return config;
    }

    /** The counter of interactive requests the workers give way to. */
    public InteractiveLoad interactiveLoad() {
        return load;
    }

    /** Why the limit on queued runs refuses {@code owner}, or empty when it may start one more. */
    public Optional<String> queueLimitProblem(String owner) {
        int active = store.activeCount(owner);
        if (active >= config.maxQueuedRunsPerOwner()) {
            return Optional.of(owner + " already has " + active + " runs queued or running; at most "
                    + config.maxQueuedRunsPerOwner() + " are allowed (TECTOMELT_MAX_QUEUED_RUNS_PER_OWNER)");
        }
        return Optional.empty();
    }

    /** Stores a validated run and queues its chunks. */
    public RunRecord submit(NewRun run) {
        RunRecord r = new RunRecord(UUID.randomUUID().toString(), run.kind(), run.operation(), run.owner(),
                run.label(), RunStatus.QUEUED, run.definition(), run.provenance(), run.totalPoints(),
                executor.chunkSize(run), 0, 0, Instant.now(), null, null, null);
        store.insert(r);
        try {
            executor.schedule(r);
        } catch (RuntimeException e) {
            // the housekeeping task queues the chunks of an accepted run it finds without any
            LOG.warn("runs: run {} stored but its chunks could not be queued yet ({}); housekeeping will",
                    r.id(), e.getMessage());
        }
        return r;
    }

    /** The run, if stored. */
    public Optional<RunRecord> find(String id) {
        return store.find(id);
    }

    /** Runs matching {@code filter}, newest first. */
    public List<RunRecord> list(RunStore.Filter filter, int limit, int offset) {
        return store.list(filter, limit, offset);
    }

    /** Number of runs matching {@code filter}. */
    public int count(RunStore.Filter filter) {
        return store.count(filter);
    }

    /** Computed points after {@code afterIndex}, in order, at most {@code limit}; returns the last index. */
    public int points(String id, int afterIndex, int limit, Consumer<PointResult> sink) {
        return store.points(id, afterIndex, limit, sink);
    }

    /**
     * The published models behind each run's computed points (the union over its points, in the
     * order they were first listed), as stored by whichever instance computed them.
     */
    public Map<String, List<ModelInfo>> models(Collection<String> ids) {
        return store.models(ids);
    }

    /** Points computed per instance, for one run. */
    public Map<String, Integer> pointsByInstance(String id) {
        return store.pointsByInstance(id);
    }

    /** What {@link #delete} did. */
    public enum Deleted {
        /** It was queued or running: now cancelled, its computed points kept. */
        CANCELLED,
        /** It had finished: removed with its points. */
        REMOVED,
        /** No such run. */
        NOT_FOUND
    }

    /** Cancels an active run, removes a finished one. The caller has checked the owner. */
    public Deleted delete(String id, String by) {
        RunRecord r = store.find(id).orElse(null);
        if (r == null) {
            return Deleted.NOT_FOUND;
        }
        if (r.status().active() && store.finish(id, RunStatus.CANCELLED, "cancelled by " + by, Instant.now())) {
            executor.cancelChunks(r);
            return Deleted.CANCELLED;
        }
        return store.delete(id) ? Deleted.REMOVED : Deleted.NOT_FOUND;
    }

    /** Runs per status (all instances). */
    public Map<RunStatus, Integer> countsByStatus() {
        return store.countsByStatus();
    }

    /** Chunks waiting in the queue (all instances). */
    public int queuedChunks() {
        return executor.queuedChunks();
    }

    /** Points this instance computed since it started. */
    public long pointsComputed() {
        return executor.pointsComputed();
    }

    /** Points per second this instance computed over the last ten seconds. */
    public double pointsPerSecond() {
        return executor.pointsPerSecond();
    }

    /** True when the database answers. */
    public boolean storageReachable() {
        return db.reachable();
    }

    /** Where the runs live (no password). */
    public String storageDescription() {
        return db.description();
    }

    /** Stops computing (running chunks get up to ten seconds), then closes the database. */
    @Override
    public void close() {
        try {
            executor.close();
        } finally {
            db.close();
        }
    }
}
