package org.tectomelt.runs;

import com.github.kagkarlsson.scheduler.Scheduler;
import com.github.kagkarlsson.scheduler.SchedulerName;
import com.github.kagkarlsson.scheduler.exceptions.DbSchedulerException;
import com.github.kagkarlsson.scheduler.task.ExecutionComplete;
import com.github.kagkarlsson.scheduler.task.ExecutionOperations;
import com.github.kagkarlsson.scheduler.task.SchedulableInstance;
import com.github.kagkarlsson.scheduler.task.TaskInstanceId;
import com.github.kagkarlsson.scheduler.task.helper.OneTimeTask;
import com.github.kagkarlsson.scheduler.task.helper.RecurringTask;
import com.github.kagkarlsson.scheduler.task.helper.Tasks;
import com.github.kagkarlsson.scheduler.task.schedule.FixedDelay;
import java.sql.Connection;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.BitSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicLong;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.tectomelt.RunsConfig;

/**
 * Computes runs in chunks through db-scheduler, whose queue lives in the run database itself
 * (table {@code scheduled_tasks}): every instance pointed at the same database picks chunks of
 * the same run, a chunk held by an instance that stopped sending heartbeats is taken over by
 * another, and a restarted instance finds its queue where it left it.
 *
 * <p>A chunk is a contiguous range of positions of the run's {@link ChunkLayout}, which spreads
 * each chunk over the whole sweep so that its chunks cost alike. It computes the points not yet stored,
 * saving them (with the run's counters, in one transaction) at least every
 * {@link #SAVE_EVERY_NANOS}, so an interrupted chunk loses at most that much work and a re-run
 * chunk never counts a point twice. Before each point the worker gives way to interactive requests
 * ({@link InteractiveLoad}).
 */
final class RunExecutor implements AutoCloseable {

    /** db-scheduler task name of a chunk; its instance id is {@code runId:chunkNumber}. */
    static final String CHUNK_TASK = "run-chunk";
    /** The recurring clean-up: retention and the check that every active run has its chunks queued. */
    static final String HOUSEKEEPING_TASK = "runs-housekeeping";
    /** Most points in one chunk. */
    static final int MAX_CHUNK = 200;
    /** Chunks per worker thread a run is cut into (when it has enough points). */
    static final int CHUNKS_PER_THREAD = 8;
    /** Longest time computed points wait in memory before being saved. */
    static final long SAVE_EVERY_NANOS = 500_000_000L;
    /**
     * Chunks per worker thread a run of cheap points is still cut into at least: one, since the
     * {@link ChunkLayout} makes a run's chunks cost alike (with contiguous chunks it was two, so
     * that a thread done with a cheap chunk took another while the dear one computed).
     */
    static final int MIN_CHUNKS_PER_THREAD = 1;
    /** Work a chunk of cheap points holds at least. */
    static final long CHUNK_WORK_NANOS = 100_000_000L;
    /** A chunk failing this many times in a row for a reason other than the database fails its run. */
    static final int MAX_CHUNK_FAILURES = 5;

    private static final Logger LOG = LoggerFactory.getLogger(RunExecutor.class);

    private final Database db;
    private final RunStore store;
    private final Evaluator evaluator;
    private final RunsConfig config;
    private final InteractiveLoad load;
    private final OneTimeTask<Void> chunkTask;
    private final Scheduler scheduler;
    private final ExecutorService workers;
    private final AtomicLong pointsComputed = new AtomicLong();
    private final ArrayDeque<long[]> recent = new ArrayDeque<>();
    /** What a point cost here (wall time computing it, giving way excluded), per {@link Evaluator#costKey}. */
    private final Map<String, Long> nanosPerPoint = new ConcurrentHashMap<>();
    private volatile String storageProblem;
    /**
     * Per active run, the models stored for it already (by this instance's chunks or found stored),
     * so that a chunk does not record them again: a run's points list the same few models.
     */
    private final Map<String, Set<String>> modelsRecorded = new ConcurrentHashMap<>();
    /** Chunks a killed process held on the embedded file (freed at start): their points may be stored. */
    private final Set<String> interrupted = ConcurrentHashMap.newKeySet();

    RunExecutor(Database db, RunStore store, Evaluator evaluator, RunsConfig config, InteractiveLoad load) {
        this.db = db;
        this.store = store;
        this.evaluator = evaluator;
        this.config = config;
        this.load = load;
        this.chunkTask = Tasks.oneTime(CHUNK_TASK)
                .onFailure(this::chunkFailed)
                .onDeadExecutionRevive()
                .execute((instance, ctx) -> executeChunk(instance.getId(), ctx.getExecution().consecutiveFailures > 0));
        RecurringTask<Void> housekeeping = Tasks.recurring(HOUSEKEEPING_TASK, FixedDelay.ofSeconds(60))
                .execute((instance, ctx) -> housekeeping());
        AtomicInteger n = new AtomicInteger();
        this.workers = Executors.newFixedThreadPool(config.threads(), r -> {
            Thread t = new Thread(r, "tectomelt-run-" + n.incrementAndGet());
            t.setDaemon(true);
            t.setPriority(Thread.MIN_PRIORITY);
            return t;
        });
        var builder = Scheduler.create(db.dataSource(), List.of(chunkTask))
                .startTasks(housekeeping)
                .threads(config.threads())
                .executorService(workers)
                .schedulerName(new SchedulerName.Fixed(config.instanceName()))
                .pollingInterval(Duration.ofMillis(config.pollMillis()))
                .heartbeatInterval(Duration.ofMillis(config.heartbeatMillis()))
                .missedHeartbeatsLimit(4)
                .shutdownMaxWait(Duration.ofSeconds(10))
                .alwaysPersistTimestampInUTC()
                .enableImmediateExecution();
        if (db.postgres()) {
            // SELECT ... FOR UPDATE SKIP LOCKED: an instance takes at most as many chunks as it has threads
            builder = builder.pollUsingLockAndFetch(0.5, 1.0);
        }
        this.scheduler = builder.build();
    }

    /** Starts polling; on the embedded database first frees chunks a killed process still held. */
    void start() {
        if (!db.postgres()) {
            // the H2 file is open by this process alone, so a picked chunk belongs to a dead one
            try (Connection c = db.dataSource().getConnection(); Statement s = c.createStatement()) {
                try (ResultSet rs = s.executeQuery("select task_instance from scheduled_tasks where picked = true "
                        + "and task_name = '" + CHUNK_TASK + "'")) {
                    while (rs.next()) {
                        interrupted.add(rs.getString(1));
                    }
                }
                int freed = s.executeUpdate("update scheduled_tasks set picked = false, picked_by = null, "
                        + "last_heartbeat = null where picked = true and task_name = '" + CHUNK_TASK + "'");
                if (freed > 0) {
                    LOG.info("runs: {} interrupted chunk(s) queued again after a restart", freed);
                }
            } catch (SQLException e) {
                throw new StorageUnavailableException("cannot read the run queue: " + Database.rootMessage(e), e);
            }
        }
        scheduler.start();
        try {
            reconcile();
        } catch (StorageUnavailableException e) {
            LOG.warn("runs: could not check the queue at start ({}); the housekeeping task will, within a minute", e.getMessage());
        }
    }

    /**
     * How many points a run gets per chunk when nothing is known about the cost of its points:
     * about {@link #CHUNKS_PER_THREAD} chunks per thread, at most {@link #MAX_CHUNK} points each.
     */
    static int chunkSize(int totalPoints, int threads) {
        int perChunk = (int) Math.ceil(totalPoints / (double) (threads * CHUNKS_PER_THREAD));
        return Math.max(1, Math.min(MAX_CHUNK, perChunk));
    }

    /**
     * How many points a run gets per chunk, given what one of its points cost this instance
     * ({@code nanosPerPoint}, null when unknown). Cheap points are gathered into chunks holding at
     * least {@link #CHUNK_WORK_NANOS} of work (a chunk's own bookkeeping, some ten statements
     * and three commits, is then a small share of it), but never fewer than
     * {@link #MIN_CHUNKS_PER_THREAD} chunks per thread, so that threads and other instances still
     * share the run; dear points keep {@link #chunkSize(int, int)}.
     */
    static int chunkSize(int totalPoints, int threads, Long nanosPerPoint) {
        int size = chunkSize(totalPoints, threads);
        if (nanosPerPoint == null) {
            return size;
        }
        long enough = CHUNK_WORK_NANOS / Math.max(1, nanosPerPoint);
        int most = (int) Math.ceil(totalPoints / (double) (threads * MIN_CHUNKS_PER_THREAD));
        return (int) Math.max(size, Math.min(enough, most));
    }

    /** How many points a new run gets per chunk on this instance. */
    int chunkSize(NewRun run) {
        return chunkSize(run.totalPoints(), config.threads(),
                nanosPerPoint.get(evaluator.costKey(run.operation(), run.definition())));
    }

    /** Queues every chunk of a new run. */
    void schedule(RunRecord run) {
        List<SchedulableInstance<?>> all = new ArrayList<>();
        for (int k = 0; k < run.chunks(); k++) {
            all.add(chunkTask.schedulableInstance(run.id() + ":" + k));
        }
        scheduler.scheduleBatch(all);
    }

    /** Removes the queued chunks of a run; a chunk being computed stops at its next save. */
    void cancelChunks(RunRecord run) {
        for (int k = 0; k < run.chunks(); k++) {
            try {
                scheduler.cancel(TaskInstanceId.of(CHUNK_TASK, run.id() + ":" + k));
            } catch (DbSchedulerException e) {
                // done already, or being computed (picked between the look-up and the delete):
                // such a chunk finds the run inactive when it saves
            }
        }
    }

    /** Chunks waiting in the queue (all instances). */
    int queuedChunks() {
        int[] n = {0};
        scheduler.fetchScheduledExecutionsForTask(CHUNK_TASK, Void.class, e -> n[0]++);
        return n[0];
    }

    /** Points this instance computed since it started. */
    long pointsComputed() {
        return pointsComputed.get();
    }

    /** Points per second this instance computed over the last ten seconds. */
    double pointsPerSecond() {
        long now = System.nanoTime();
        long window = 10_000_000_000L;
        long sum = 0;
        synchronized (recent) {
            while (!recent.isEmpty() && now - recent.peekFirst()[0] > window) {
                recent.pollFirst();
            }
            for (long[] e : recent) {
                sum += e[1];
            }
        }
        return sum / 10.0;
    }

    /** The last database failure seen by a chunk, while it lasts; null when the database answers. */
    String storageProblem() {
        return storageProblem;
    }

    // ---- one chunk ---------------------------------------------------------------------------

    /**
     * @param instanceId the chunk, {@code runId:chunkNumber}
     * @param failedBefore true when db-scheduler ran the chunk before (it failed, or it was revived
     *                     after its instance fell silent): some of its points may be stored
     */
    private void executeChunk(String instanceId, boolean failedBefore) {
        boolean freedAtStart = interrupted.remove(instanceId);
        int colon = instanceId.lastIndexOf(':');
        String runId = instanceId.substring(0, colon);
        int chunk = Integer.parseInt(instanceId.substring(colon + 1));
        long began = System.nanoTime();
        RunRecord run = store.find(runId).orElse(null);
        if (run == null || !run.status().active()) {
            return;
        }
        if (storageProblem != null) {
            recovered(run);
        }
        if (run.status() == RunStatus.QUEUED) {
            store.markStarted(runId, Instant.now());
        }
        Evaluator.Prepared prepared;
        try {
            prepared = evaluator.prepare(run);
        } catch (IllegalArgumentException e) {
            store.finish(runId, RunStatus.FAILED, "the run cannot be carried out: " + e.getMessage(), Instant.now());
            cancelChunks(run);
            return;
        }
        ChunkLayout layout = run.layout();
        int[] indexes = layout.indexes(chunk);
        // only a chunk run before can have stored points: asking the database which costs a scan
        // of the run's rows (a chunk's points are spread over the run), 5 ms on PostgreSQL for a
        // 50,000-point run; a chunk re-queued by reconcile() is fresh to db-scheduler, and should
        // it hold stored points after all, the save skips them (RunStore.save)
        BitSet have = (failedBefore || freedAtStart) && run.donePoints() + run.failedPoints() > 0
                ? store.computed(runId, layout, chunk) : new BitSet();
        List<PointResult> batch = new ArrayList<>();
        Set<String> modelsRecorded = modelsRecordedFor(runId);
        long computing = System.nanoTime();
        long lastSave = computing;
        long saving = 0;
        long yielded = 0;
        for (int index : indexes) {
            if (have.get(index)) {
                continue;
            }
            yielded += load.yieldToInteractive();
            PointResult p = prepared.evaluate(index);
            batch.add(new PointResult(index, p.inputs(), p.outputs(), p.problem(), config.instanceName(), p.models()));
            if (System.nanoTime() - lastSave > SAVE_EVERY_NANOS) {
                long t = System.nanoTime();
                if (!save(runId, batch, modelsRecorded)) {
                    return;
                }
                lastSave = System.nanoTime();
                saving += lastSave - t;
            }
        }
        long t = System.nanoTime();
        if (!batch.isEmpty() || have.cardinality() == indexes.length) {
            save(runId, batch, modelsRecorded);
        }
        long end = System.nanoTime();
        int computed = indexes.length - have.cardinality();
        if (computed > 0) {
            long perPoint = Math.max(1, (t - computing - saving - yielded) / computed);
            if (nanosPerPoint.size() > 1_000) {
                nanosPerPoint.clear(); // many different sweeps: start learning again
            }
            nanosPerPoint.merge(evaluator.costKey(run.operation(), run.definition()), perPoint, (a, b) -> (a + b) / 2);
        }
        if (LOG.isDebugEnabled()) {
            LOG.debug("runs: chunk {} of run {} on {}: {} points; reading the run {} ms, computing {} ms ({} ms of it "
                    + "giving way to requests), saving {} ms", chunk, runId, Thread.currentThread().getName(),
                    computed, millis(computing - began), millis(t - computing - saving),
                    millis(yielded), millis(saving + end - t));
        }
    }

    /** The models recorded for {@code runId} as far as this instance knows (shared by its chunks). */
    private Set<String> modelsRecordedFor(String runId) {
        if (modelsRecorded.size() > 1_000) {
            modelsRecorded.clear(); // runs dropped without finishing here (cancelled, taken over): start again
        }
        return modelsRecorded.computeIfAbsent(runId, k -> ConcurrentHashMap.newKeySet());
    }

    private static String millis(long nanos) {
        return String.format(java.util.Locale.ROOT, "%.1f", nanos / 1e6);
    }

    /**
     * Records the models of {@code batch} the run lacks ({@code modelsRecorded}: those this instance
     * knows are stored), then saves and clears the batch; false when the run is no longer active.
     */
    private boolean save(String runId, List<PointResult> batch, Set<String> modelsRecorded) {
        store.recordModels(runId, batch, modelsRecorded);
        RunStore.Saved saved = store.save(runId, batch);
        long n = batch.size();
        batch.clear();
        if (saved == RunStore.Saved.GONE) {
            modelsRecorded.remove(runId);
            return false;
        }
        pointsComputed.addAndGet(n);
        synchronized (recent) {
            recent.addLast(new long[] {System.nanoTime(), n});
        }
        if (saved == RunStore.Saved.FINISHED) {
            modelsRecorded.remove(runId);
            LOG.info("runs: run {} finished", runId);
        }
        return true;
    }

    private void chunkFailed(ExecutionComplete complete, ExecutionOperations<Void> ops) {
        Throwable cause = complete.getCause().orElse(null);
        int failures = complete.getExecution().consecutiveFailures + 1;
        String id = complete.getExecution().taskInstance.getId();
        if (cause instanceof StorageUnavailableException) {
            if (storageProblem == null) {
                storageProblem = cause.getMessage() + " (since " + Instant.now() + ")";
            }
            LOG.warn("runs: chunk {} interrupted, the database failed: {}; trying again", id, cause.getMessage());
            ops.reschedule(complete, Instant.now().plusSeconds(Math.min(30, 2L * failures)));
            return;
        }
        String runId = id.substring(0, id.lastIndexOf(':'));
        if (failures >= MAX_CHUNK_FAILURES) {
            LOG.error("runs: chunk {} failed {} times; the run fails", id, failures, cause);
            String reason = "a chunk failed " + failures + " times: "
                    + (cause == null ? "unknown error" : cause.getClass().getSimpleName() + ": " + cause.getMessage());
            try {
                store.finish(runId, RunStatus.FAILED, reason, Instant.now());
            } finally {
                ops.remove();
            }
            return;
        }
        LOG.warn("runs: chunk {} failed ({}), trying again", id, cause == null ? "?" : cause.toString());
        ops.reschedule(complete, Instant.now().plusSeconds(failures));
    }

    /** Notes on the run that the database was lost for a while, once it answers again. */
    private void recovered(RunRecord run) {
        String problem = storageProblem;
        storageProblem = null;
        if (problem != null) {
            String note = "interrupted: " + problem + "; resumed at " + Instant.now();
            LOG.info("runs: the database answers again; {}", note);
            for (RunRecord r : store.active()) {
                store.note(r.id(), note.length() > 1900 ? note.substring(0, 1900) : note);
            }
        }
    }

    // ---- housekeeping ------------------------------------------------------------------------

    private void housekeeping() {
        int deleted = store.deleteFinishedBefore(Instant.now().minus(Duration.ofDays(config.retentionDays())));
        if (deleted > 0) {
            LOG.info("runs: {} finished run(s) older than {} days deleted (TECTOMELT_RUN_RETENTION_DAYS)",
                    deleted, config.retentionDays());
        }
        reconcile();
    }

    /**
     * Makes sure no accepted run is silently dropped: every chunk of an active run that still
     * has points to compute is in the queue, and a run whose points are all stored is finished.
     */
    void reconcile() {
        for (RunRecord run : store.active()) {
            ChunkLayout layout = run.layout();
            Map<Integer, Integer> have = store.computedPerChunk(run.id(), layout);
            int missing = 0;
            for (int k = 0; k < run.chunks(); k++) {
                if (have.getOrDefault(k, 0) < layout.to(k) - layout.from(k)
                        && scheduler.scheduleIfNotExists(chunkTask.schedulableInstance(run.id() + ":" + k))) {
                    missing++;
                }
            }
            if (missing > 0) {
                LOG.warn("runs: run {} had {} chunk(s) missing from the queue; queued again", run.id(), missing);
            }
            if (have.values().stream().mapToInt(Integer::intValue).sum() >= run.totalPoints()) {
                store.save(run.id(), List.of());
            }
        }
    }

    /** Stops polling, lets running chunks finish (up to ten seconds), stops the workers. */
    @Override
    public void close() {
        scheduler.stop();
        workers.shutdownNow();
    }
}
