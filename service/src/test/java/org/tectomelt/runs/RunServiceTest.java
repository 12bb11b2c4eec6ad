package org.tectomelt.runs;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.BitSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.function.Predicate;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.tectomelt.RunsConfig;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.composition.Shaw1970;
import org.tectomelt.engine.composition.Zou1998DynamicMelting;
import org.tectomelt.engine.crust.HeatBudget;

/**
 * Storage and execution of runs against each backend ({@link Backends}): every point computed
 * once, failing points recorded while the run goes on, cancel, delete, limits, restart, and two
 * instances sharing one run. The evaluator here is a stand-in (the square of the index, a problem
 * at every seventh point): what is checked is the bookkeeping, not physics.
 */
class RunServiceTest {

    @TempDir
    Path dir;

    static Stream<String> backends() {
        return Backends.names().stream();
    }

    /** y = i², a recorded problem where i % 7 == 3; sleeps {@code millis} per point. */
    static Evaluator squares(long millis) {
        return run -> i -> {
            if (millis > 0) {
                try {
                    Thread.sleep(millis);
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
            }
            String inputs = "{\"i\":" + i + "}";
            return i % 7 == 3
                    ? new PointResult(i, inputs, null, "{\"type\":\"outside-model-range\",\"detail\":\"no number at " + i + "\"}", null)
                    : new PointResult(i, inputs, "{\"y\":" + ((long) i * i) + "}", null, null);
        };
    }

    /** {@code inner}, counting in {@code evaluated} every point it computes. */
    static Evaluator counted(Evaluator inner, java.util.concurrent.atomic.AtomicInteger evaluated) {
        return run -> {
            Evaluator.Prepared p = inner.prepare(run);
            return i -> {
                evaluated.incrementAndGet();
                return p.evaluate(i);
            };
        };
    }

    static NewRun run(String owner, int points) {
        return new NewRun("sweep", "test-squares", owner, "squares", "{\"n\":" + points + "}", "{\"v\":\"test\"}", points);
    }

    static RunRecord await(RunService s, String id, Predicate<RunRecord> until, Duration max) {
        Instant end = Instant.now().plus(max);
        RunRecord r = s.find(id).orElseThrow();
        while (!until.test(r)) {
            if (Instant.now().isAfter(end)) {
                throw new AssertionError("run " + id + " did not get there in " + max + ": " + r);
            }
            try {
                Thread.sleep(20);
            } catch (InterruptedException e) {
                throw new AssertionError(e);
            }
            r = s.find(id).orElseThrow();
        }
        return r;
    }

    static List<PointResult> allPoints(RunService s, String id) {
        List<PointResult> out = new ArrayList<>();
        int last = -1;
        while (true) {
            int before = out.size();
            last = s.points(id, last, 50, out::add);
            if (out.size() == before) {
                return out;
            }
        }
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void everyPointIsComputedOnceAndFailingPointsKeepTheirProblem(String backend) {
        RunsConfig cfg = Backends.fresh(backend, dir, "solo");
        try (RunService s = RunService.open(cfg, squares(0))) {
            s.start();
            RunRecord r = s.submit(run("ana", 100));
            assertEquals(RunStatus.QUEUED, r.status());
            RunRecord done = await(s, r.id(), x -> !x.status().active(), Duration.ofSeconds(30));
            assertEquals(RunStatus.SUCCEEDED, done.status());
            // i % 7 == 3 for i = 3, 10, ..., 94: 14 points
            assertEquals(14, done.failedPoints());
            assertEquals(86, done.donePoints());
            assertNotNull(done.startedAt());
            assertNotNull(done.finishedAt());
            List<PointResult> pts = allPoints(s, r.id());
            assertEquals(100, pts.size());
            for (int i = 0; i < 100; i++) {
                PointResult p = pts.get(i);
                assertEquals(i, p.index());
                assertEquals("solo", p.computedBy());
                if (i % 7 == 3) {
                    assertNull(p.outputs());
                    assertTrue(p.problem().contains("no number at " + i), p.problem());
                } else {
                    assertEquals("{\"y\":" + (i * i) + "}", p.outputs());
                }
            }
            assertEquals("{\"n\":100}", done.definition());
            assertEquals(Map.of("solo", 100), s.pointsByInstance(r.id()));
            assertEquals(1, s.countsByStatus().get(RunStatus.SUCCEEDED));
        }
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void aRunWhosePointsAllFailIsFailedWithItsReason(String backend) {
        Evaluator allFail = run -> i -> new PointResult(i, "{}", null, "{\"type\":\"outside-model-range\"}", null);
        try (RunService s = RunService.open(Backends.fresh(backend, dir, "solo"), allFail)) {
            s.start();
            RunRecord r = s.submit(run("ana", 5));
            RunRecord done = await(s, r.id(), x -> !x.status().active(), Duration.ofSeconds(30));
            assertEquals(RunStatus.FAILED, done.status());
            assertEquals("every point recorded a problem", done.statusReason());
            assertEquals(5, done.failedPoints());
        }
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void deleteCancelsARunningRunThenRemovesIt(String backend) throws Exception {
        try (RunService s = RunService.open(Backends.fresh(backend, dir, "solo"), squares(5))) {
            s.start();
            RunRecord r = s.submit(run("ana", 800));
            await(s, r.id(), x -> x.donePoints() > 0, Duration.ofSeconds(30));
            assertEquals(RunService.Deleted.CANCELLED, s.delete(r.id(), "ana"));
            RunRecord cancelled = s.find(r.id()).orElseThrow();
            assertEquals(RunStatus.CANCELLED, cancelled.status());
            assertEquals("cancelled by ana", cancelled.statusReason());
            Thread.sleep(1_500);
            RunRecord later = s.find(r.id()).orElseThrow();
            assertEquals(cancelled.donePoints() + cancelled.failedPoints(),
                    later.donePoints() + later.failedPoints(), "no point is counted after the cancel");
            assertTrue(later.donePoints() + later.failedPoints() < 800);
            assertEquals(later.donePoints() + later.failedPoints(), allPoints(s, r.id()).size(),
                    "the points computed before the cancel stay readable");
            assertEquals(RunService.Deleted.REMOVED, s.delete(r.id(), "ana"));
            assertTrue(s.find(r.id()).isEmpty());
            assertTrue(allPoints(s, r.id()).isEmpty());
            assertEquals(RunService.Deleted.NOT_FOUND, s.delete(r.id(), "ana"));
        }
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void listsNewestFirstWithFiltersAndPagesAndLimitsQueuedRunsPerOwner(String backend) {
        try (RunService s = RunService.open(Backends.fresh(backend, dir, "solo"), squares(20))) {
            // not started: the runs stay queued
            List<String> ids = new ArrayList<>();
            for (int i = 0; i < 3; i++) {
                ids.add(s.submit(run("ana", 10)).id());
            }
            ids.add(s.submit(new NewRun("sweep", "other-op", "ben", null, "{}", null, 4)).id());
            assertTrue(s.queueLimitProblem("ana").orElseThrow().contains("TECTOMELT_MAX_QUEUED_RUNS_PER_OWNER"));
            assertTrue(s.queueLimitProblem("ben").isEmpty());
            List<RunRecord> all = s.list(new RunStore.Filter(null, null, null), 10, 0);
            assertEquals(List.of(ids.get(3), ids.get(2), ids.get(1), ids.get(0)), all.stream().map(RunRecord::id).toList());
            assertEquals(List.of(ids.get(2), ids.get(1)),
                    s.list(new RunStore.Filter(null, "ana", null), 2, 0).stream().map(RunRecord::id).toList());
            assertEquals(List.of(ids.get(0)),
                    s.list(new RunStore.Filter(null, "ana", null), 2, 2).stream().map(RunRecord::id).toList());
            assertEquals(3, s.count(new RunStore.Filter(RunStatus.QUEUED, null, "test-squares")));
            assertEquals(1, s.count(new RunStore.Filter(null, null, "other-op")));
            assertEquals(0, s.count(new RunStore.Filter(RunStatus.SUCCEEDED, null, null)));
            assertEquals(4, s.queuedChunks() > 0 ? 4 : 0, "the chunks wait in the queue");
        }
    }

    @Test
    void restartOfTheEmbeddedDatabaseResumesTheRunWithoutRecomputingStoredPoints() {
        RunsConfig cfg = Backends.fresh("h2", dir, "first");
        String id;
        int before;
        try (RunService s = RunService.open(cfg, squares(4))) {
            s.start();
            id = s.submit(run("ana", 600)).id();
            RunRecord partial = await(s, id, x -> x.donePoints() > 20, Duration.ofSeconds(30));
            assertTrue(partial.status().active());
        }
        java.util.concurrent.atomic.AtomicInteger evaluated = new java.util.concurrent.atomic.AtomicInteger();
        Evaluator counting = counted(squares(0), evaluated);
        try (RunService s = RunService.open(Backends.sameDatabase(cfg, "second"), counting)) {
            RunRecord stopped = s.find(id).orElseThrow();
            before = stopped.donePoints() + stopped.failedPoints();
            assertTrue(before < 600, "stopped part-way: " + before);
            s.start();
            RunRecord done = await(s, id, x -> !x.status().active(), Duration.ofSeconds(30));
            assertEquals(RunStatus.SUCCEEDED, done.status());
            assertEquals(600, done.donePoints() + done.failedPoints());
            Map<String, Integer> by = s.pointsByInstance(id);
            assertEquals(before, by.get("first"), "points stored before the stop are kept");
            assertEquals(600 - before, by.get("second"));
            assertEquals(600 - before, evaluated.get(), "stored points are not computed again");
            assertEquals(600, allPoints(s, id).size());
        }
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void aRunPartlyStoredUnderAnotherLayoutIsCompletedOncePerPoint(String backend) throws Exception {
        // an earlier release cut runs into contiguous ranges of indexes: a run it left half done
        // (indexes 0..299 of 600 stored) is resumed by this one, whose chunks are spread (fresh to
        // db-scheduler, they compute the stored points again and the save skips them)
        try (RunService s = RunService.open(Backends.fresh(backend, dir, "solo"), squares(0));
             Database db = Database.open(Backends.sameDatabase(s.config(), "earlier"), 2)) {
            RunRecord r = s.submit(run("ana", 600));
            RunStore store = new RunStore(db.dataSource(), "test");
            List<PointResult> stored = new ArrayList<>();
            for (int i = 0; i < 300; i++) {
                stored.add(new PointResult(i, "{\"i\":" + i + "}", "{\"y\":" + ((long) i * i) + "}", null, "earlier"));
            }
            assertEquals(RunStore.Saved.STORED, store.save(r.id(), stored));
            ChunkLayout layout = r.layout();
            int held = 0;
            for (int k = 0; k < layout.chunks(); k++) {
                BitSet have = store.computed(r.id(), layout, k);
                for (int i : layout.indexes(k)) {
                    assertEquals(i < 300, have.get(i), "index " + i);
                }
                int chunk = k;
                assertEquals(0, have.stream().filter(i -> layout.chunkOf(i) != chunk).count(), "only the chunk's own");
                held += have.cardinality();
                assertEquals(have.cardinality(), store.computedPerChunk(r.id(), layout).getOrDefault(k, 0));
            }
            assertEquals(300, held, "the stored points, found through the database's reckoning of positions");
            s.start();
            RunRecord done = await(s, r.id(), x -> !x.status().active(), Duration.ofSeconds(60));
            assertEquals(RunStatus.SUCCEEDED, done.status());
            assertEquals(600, done.donePoints() + done.failedPoints(), "each point counted once");
            assertEquals(Map.of("earlier", 300, "solo", 300), s.pointsByInstance(r.id()));
            List<PointResult> all = allPoints(s, r.id());
            assertEquals(600, all.size());
            for (int i = 0; i < 600; i++) {
                assertEquals(i, all.get(i).index());
            }
        }
    }

    @Test
    void aChunkAKilledProcessHeldPartlyStoredIsResumedWithoutComputingItsStoredPointsAgain() throws Exception {
        // a process killed in the middle of a chunk leaves it picked on the embedded file, with the
        // points of its earlier saves stored; the next process frees it and computes only the rest
        RunsConfig cfg = Backends.fresh("h2", dir, "first");
        String id;
        ChunkLayout layout;
        try (RunService s = RunService.open(cfg, squares(0));
             Database db = Database.open(Backends.sameDatabase(cfg, "killed"), 2)) {
            RunRecord r = s.submit(run("ana", 400));   // queued, not started: nothing picked yet
            id = r.id();
            layout = r.layout();
            List<PointResult> saved = new ArrayList<>();
            int[] chunk0 = layout.indexes(0);
            for (int j = 0; j < chunk0.length / 2; j++) {
                int i = chunk0[j];
                saved.add(new PointResult(i, "{\"i\":" + i + "}", "{\"y\":" + ((long) i * i) + "}", null, "killed"));
            }
            new RunStore(db.dataSource(), "test").save(id, saved);
            try (java.sql.Connection c = db.dataSource().getConnection(); java.sql.Statement st = c.createStatement()) {
                assertEquals(1, st.executeUpdate("update scheduled_tasks set picked = true, picked_by = 'killed', "
                        + "last_heartbeat = current_timestamp, version = version + 1 where task_instance = '" + id + ":0'"));
            }
        }
        java.util.concurrent.atomic.AtomicInteger evaluated = new java.util.concurrent.atomic.AtomicInteger();
        Evaluator counting = counted(squares(0), evaluated);
        try (RunService s = RunService.open(Backends.sameDatabase(cfg, "second"), counting)) {
            s.start();
            RunRecord done = await(s, id, x -> !x.status().active(), Duration.ofSeconds(30));
            assertEquals(RunStatus.SUCCEEDED, done.status());
            assertEquals(400, done.donePoints() + done.failedPoints(), "each point counted once");
            int stored = layout.indexes(0).length / 2;
            assertEquals(400 - stored, evaluated.get(), "the interrupted chunk's stored points are not computed again");
            assertEquals(Map.of("killed", stored, "second", 400 - stored), s.pointsByInstance(id));
        }
    }

    /**
     * {@link #squares} whose computed points list published models as an operation's result does:
     * every computed point Shaw (1970) and Zou (1998), every tenth also the heat budget; a point
     * with a problem lists none. (The models stand in for what a result lists; only their
     * bookkeeping is checked.)
     */
    static Evaluator squaresWithModels(long millis) {
        Evaluator squares = squares(millis);
        return run -> {
            Evaluator.Prepared p = squares.prepare(run);
            return i -> {
                PointResult r = p.evaluate(i);
                List<ModelInfo> models = !r.ok() ? List.of() : i % 10 == 9
                        ? List.of(Shaw1970.INFO, Zou1998DynamicMelting.INFO, HeatBudget.INFO)
                        : List.of(Shaw1970.INFO, Zou1998DynamicMelting.INFO);
                return new PointResult(i, r.inputs(), r.outputs(), r.problem(), null, models);
            };
        };
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void savingTheSamePointsAtOnceFromEightWritersStoresAndCountsEachOnceAndFailsNone(String backend)
            throws Exception {
        // two executions of one chunk at once: a chunk revived after its heartbeats went stale
        // (a database outage, a long pause) while the first execution still computes
        try (RunService s = RunService.open(Backends.fresh(backend, dir, "solo"), squares(0));
             Database db = Database.open(Backends.sameDatabase(s.config(), "writers"), 10)) {
            RunStore store = new RunStore(db.dataSource(), "test");
            for (int round = 0; round < 5; round++) {
                RunRecord r = s.submit(run("ana", 20));
                List<PointResult> points = new ArrayList<>();
                for (int i = 0; i < 20; i++) {
                    points.add(new PointResult(i, "{\"i\":" + i + "}", "{\"y\":" + i + "}", null, "w"));
                }
                java.util.concurrent.CyclicBarrier go = new java.util.concurrent.CyclicBarrier(8);
                java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newFixedThreadPool(8);
                List<java.util.concurrent.Future<RunStore.Saved>> writers = new ArrayList<>();
                for (int w = 0; w < 8; w++) {
                    writers.add(pool.submit(() -> {
                        go.await();
                        return store.save(r.id(), points);
                    }));
                }
                int finished = 0;
                for (java.util.concurrent.Future<RunStore.Saved> f : writers) {
                    if (f.get(30, java.util.concurrent.TimeUnit.SECONDS) == RunStore.Saved.FINISHED) { // none failed
                        finished++;
                    }
                }
                pool.shutdown();
                RunRecord after = s.find(r.id()).orElseThrow();
                assertEquals(20, after.donePoints(), "each point counted once");
                assertEquals(RunStatus.SUCCEEDED, after.status());
                assertEquals(1, finished, "one writer finished the run");
                assertEquals(20, allPoints(s, r.id()).size());
            }
        }
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void recordingTheSameModelsAtOnceFromEightWritersStoresEachOnceAndFailsNone(String backend) throws Exception {
        try (RunService s = RunService.open(Backends.fresh(backend, dir, "solo"), squares(0));
             Database db = Database.open(Backends.sameDatabase(s.config(), "writers"), 10)) {
            RunStore store = new RunStore(db.dataSource(), "test");
            List<PointResult> points = List.of(new PointResult(4, "{}", "{}", null, "w", List.of(Shaw1970.INFO)),
                    new PointResult(5, "{}", "{}", null, "w", List.of(Zou1998DynamicMelting.INFO, Shaw1970.INFO)));
            for (int round = 0; round < 5; round++) {
                String id = s.submit(run("ana", 1)).id();
                java.util.concurrent.CyclicBarrier go = new java.util.concurrent.CyclicBarrier(8);
                java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newFixedThreadPool(8);
                List<java.util.concurrent.Future<?>> writers = new ArrayList<>();
                for (int w = 0; w < 8; w++) {
                    writers.add(pool.submit(() -> {
                        go.await();
                        store.recordModels(id, points, new java.util.HashSet<>());
                        return null;
                    }));
                }
                for (java.util.concurrent.Future<?> f : writers) {
                    f.get(30, java.util.concurrent.TimeUnit.SECONDS); // none failed
                }
                pool.shutdown();
                assertEquals(List.of(Shaw1970.INFO, Zou1998DynamicMelting.INFO), store.models(List.of(id)).get(id),
                        "each once, in the order of the first point that listed them");
            }
        }
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void modelsTheCallerKnowsAreStoredTakeNoStatementAndTheSetHoldsOnlyStoredOnes(String backend) throws Exception {
        try (RunService s = RunService.open(Backends.fresh(backend, dir, "solo"), squares(0));
             Database db = Database.open(Backends.sameDatabase(s.config(), "writers"), 4)) {
            java.util.concurrent.atomic.AtomicInteger connections = new java.util.concurrent.atomic.AtomicInteger();
            javax.sql.DataSource counting = (javax.sql.DataSource) java.lang.reflect.Proxy.newProxyInstance(
                    getClass().getClassLoader(), new Class<?>[] {javax.sql.DataSource.class}, (proxy, m, args) -> {
                        if (m.getName().equals("getConnection")) {
                            connections.incrementAndGet();
                        }
                        try {
                            return m.invoke(db.dataSource(), args);
                        } catch (java.lang.reflect.InvocationTargetException e) {
                            throw e.getCause();
                        }
                    });
            RunStore store = new RunStore(counting, "test");
            String id = s.submit(run("ana", 1)).id();
            List<PointResult> points = List.of(new PointResult(0, "{}", "{}", null, "w", List.of(Shaw1970.INFO)),
                    new PointResult(1, "{}", "{}", null, "w", List.of(Zou1998DynamicMelting.INFO, Shaw1970.INFO)));
            java.util.Set<String> known = new java.util.HashSet<>();
            store.recordModels(id, points, known);
            assertEquals(1, connections.get(), "one connection for the two new models");
            assertEquals(java.util.Set.of(Shaw1970.INFO.id(), Zou1998DynamicMelting.INFO.id()), known);
            store.recordModels(id, points, known);
            store.recordModels(id, points.subList(1, 2), known);
            assertEquals(1, connections.get(), "known models: no connection, no statement");
            assertEquals(List.of(Shaw1970.INFO, Zou1998DynamicMelting.INFO), store.models(List.of(id)).get(id));
            // a failing insert (no such run: the foreign key refuses it) leaves the id out of the set
            java.util.Set<String> other = new java.util.HashSet<>();
            assertThrows(RuntimeException.class, () -> store.recordModels("no-such-run", points, other));
            assertEquals(java.util.Set.of(), other);
        }
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void twoInstancesOnOneDatabaseShareTheChunksOfOneRunAndBothRecordItsModels(String backend) {
        // the embedded file cannot be shared by two processes, but two pools in one JVM can share it
        RunsConfig a = Backends.fresh(backend, dir, "instance-a");
        try (RunService sa = RunService.open(a, squaresWithModels(3));
             RunService sb = RunService.open(Backends.sameDatabase(a, "instance-b"), squaresWithModels(3))) {
            sa.start();
            sb.start();
            RunRecord r = sa.submit(run("ana", 800));
            RunRecord only = sa.submit(run("ana", 6)); // points 0..5: no tenth point, point 3 fails
            assertEquals(List.of(), sa.models(List.of(r.id())).get(r.id()), "nothing computed yet");
            RunRecord done = await(sb, r.id(), x -> !x.status().active(), Duration.ofSeconds(60));
            await(sb, only.id(), x -> !x.status().active(), Duration.ofSeconds(60));
            assertEquals(RunStatus.SUCCEEDED, done.status());
            Map<String, Integer> by = sa.pointsByInstance(r.id());
            assertEquals(800, by.values().stream().mapToInt(Integer::intValue).sum(), by.toString());
            assertTrue(by.getOrDefault("instance-a", 0) > 0 && by.getOrDefault("instance-b", 0) > 0,
                    "both instances computed points (and recorded their models): " + by);
            for (RunService s : List.of(sa, sb)) {
                Map<String, List<ModelInfo>> models = s.models(List.of(r.id(), only.id(), "no-such-run"));
                List<ModelInfo> all = models.get(r.id());
                assertEquals(3, all.size(), "each model once: " + all);
                assertEquals(Set.of(Shaw1970.INFO, Zou1998DynamicMelting.INFO, HeatBudget.INFO), Set.copyOf(all));
                assertEquals(Set.of(Shaw1970.INFO, Zou1998DynamicMelting.INFO), Set.copyOf(models.get(only.id())));
                assertEquals(List.of(), models.get("no-such-run"));
            }
            // removing a finished run removes its models
            assertEquals(RunService.Deleted.REMOVED, sa.delete(only.id(), "ana"));
            assertEquals(List.of(), sb.models(List.of(only.id())).get(only.id()));
        }
    }

    @Test
    void retentionDeletesRunsFinishedLongAgo() {
        try (RunService s = RunService.open(Backends.fresh("h2", dir, "solo"), squares(0))) {
            s.start();
            RunRecord r = s.submit(run("ana", 3));
            await(s, r.id(), x -> !x.status().active(), Duration.ofSeconds(30));
            RunStore store = new RunStore(Database.open(Backends.sameDatabase(s.config(), "x"), 2).dataSource(), "test");
            assertEquals(0, store.deleteFinishedBefore(Instant.now().minus(Duration.ofDays(1))));
            assertEquals(1, store.deleteFinishedBefore(Instant.now().plusSeconds(1)));
            assertTrue(s.find(r.id()).isEmpty());
        }
    }

    @Test
    void anUnreachableDatabaseIsRefusedWithOneLine() {
        RunsConfig cfg = RunsConfig.defaults().withDatabaseUrl("jdbc:postgresql://127.0.0.1:9/tectomelt", "x", "y");
        StorageUnavailableException e = assertThrows(StorageUnavailableException.class,
                () -> RunService.open(cfg, squares(0)));
        assertTrue(e.getMessage().startsWith("cannot reach the run database at jdbc:postgresql://127.0.0.1:9/tectomelt: "),
                e.getMessage());
        assertFalse(e.getMessage().contains("\n"), e.getMessage());
    }

    @Test
    void chunksCoverEveryPointOnce() {
        assertEquals(1, RunExecutor.chunkSize(1, 2));
        assertEquals(125, RunExecutor.chunkSize(2_000, 2));
        assertEquals(RunExecutor.MAX_CHUNK, RunExecutor.chunkSize(1_000_000, 2));
        assertEquals(2, RunExecutor.chunkSize(31, 2));
    }

    @Test
    void cheapPointsAreGatheredIntoFewerChunksStillSharedByTheThreads() {
        // unknown cost: as before
        assertEquals(125, RunExecutor.chunkSize(2_000, 2, null));
        // 100 µs a point: 0.1 s of work a chunk is 1,000 points, which still leaves one chunk per thread
        assertEquals(1_000, RunExecutor.chunkSize(2_000, 2, 100_000L));
        // 20 µs a point: 0.1 s of work would be 5,000 points, but at least one chunk per thread
        assertEquals(1_000, RunExecutor.chunkSize(2_000, 2, 20_000L));
        assertEquals(667, RunExecutor.chunkSize(2_000, 3, 20_000L));
        // a large cheap run: chunks of 0.1 s of work, many of them
        assertEquals(1_000, RunExecutor.chunkSize(50_000, 2, 100_000L));
        // dear points (9 ms): the chunks stay as small as without an estimate
        assertEquals(RunExecutor.chunkSize(1_200, 1), RunExecutor.chunkSize(1_200, 1, 9_000_000L));
        assertEquals(RunExecutor.chunkSize(50_000, 2), RunExecutor.chunkSize(50_000, 2, 9_000_000L));
        // free points: never fewer than one chunk per thread
        for (int total : new int[] {1, 3, 31, 2_000, 50_000}) {
            for (int threads : new int[] {1, 2, 4}) {
                int size = RunExecutor.chunkSize(total, threads, 1L);
                int chunks = (total + size - 1) / size;
                assertEquals(Math.min(total, threads), chunks, "chunks of " + total + " points, " + threads + " threads");
            }
        }
    }

    @ParameterizedTest(name = "[{0}]")
    @MethodSource("backends")
    void aLaterRunOfCheapPointsGetsLargerChunksAndStillEveryPointOnce(String backend) {
        try (RunService s = RunService.open(Backends.fresh(backend, dir, "solo"), squares(0))) {
            s.start();
            RunRecord first = s.submit(run("ana", 2_000));
            assertEquals(RunExecutor.chunkSize(2_000, s.config().threads()), first.chunkSize(), "nothing known yet");
            assertEquals(RunStatus.SUCCEEDED, await(s, first.id(), x -> !x.status().active(), Duration.ofSeconds(60)).status());
            RunRecord second = s.submit(run("ana", 2_000));
            int threads = s.config().threads();
            assertEquals((int) Math.ceil(2_000.0 / (threads * RunExecutor.MIN_CHUNKS_PER_THREAD)), second.chunkSize(),
                    "squares cost microseconds: the fewest chunks allowed");
            RunRecord done = await(s, second.id(), x -> !x.status().active(), Duration.ofSeconds(60));
            assertEquals(RunStatus.SUCCEEDED, done.status());
            List<PointResult> points = allPoints(s, second.id());
            assertEquals(2_000, points.size());
            for (int i = 0; i < points.size(); i++) {
                assertEquals(i, points.get(i).index());
            }
            assertEquals(2_000, done.donePoints() + done.failedPoints());
            assertEquals(2_000 / 7 + (2_000 % 7 > 3 ? 1 : 0), done.failedPoints());
        }
    }
}
