package org.tectomelt.runs;

import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.BitSet;
import java.util.Collection;
import java.util.EnumMap;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.function.Consumer;
import javax.sql.DataSource;
import org.tectomelt.engine.ModelInfo;

/**
 * The SQL of runs and points (one dialect for H2 and PostgreSQL). Every method opens its own
 * connection from the pool; a database error becomes {@link StorageUnavailableException}.
 */
public final class RunStore {

    private static final String COLUMNS = "id, kind, operation, owner_name, label, status, definition, provenance, "
            + "total_points, chunk_size, done_points, failed_points, created_at, started_at, finished_at, status_reason";

    /** SQLSTATE of a unique-key violation (H2 and PostgreSQL alike). */
    private static final String UNIQUE_VIOLATION = "23505";

    private final DataSource ds;
    private final String where;

    /** @param description where the data lives, for error messages */
    RunStore(DataSource ds, String description) {
        this.ds = ds;
        this.where = description;
    }

    /** Filter of {@link #list}: null fields match everything. */
    public record Filter(RunStatus status, String owner, String operation) {
    }

    /** Stores a new run. */
    void insert(RunRecord r) {
        run(c -> {
            try (PreparedStatement ps = c.prepareStatement("insert into runs (" + COLUMNS
                    + ") values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)")) {
                ps.setString(1, r.id());
                ps.setString(2, r.kind());
                ps.setString(3, r.operation());
                ps.setString(4, r.owner());
                ps.setString(5, r.label());
                ps.setString(6, r.status().wire());
                ps.setString(7, r.definition());
                ps.setString(8, r.provenance());
                ps.setInt(9, r.totalPoints());
                ps.setInt(10, r.chunkSize());
                ps.setInt(11, r.donePoints());
                ps.setInt(12, r.failedPoints());
                setTime(ps, 13, r.createdAt());
                setTime(ps, 14, r.startedAt());
                setTime(ps, 15, r.finishedAt());
                ps.setString(16, r.statusReason());
                ps.executeUpdate();
            }
            return null;
        });
    }

    /** The run, if stored. */
    public Optional<RunRecord> find(String id) {
        return run(c -> {
            try (PreparedStatement ps = c.prepareStatement("select " + COLUMNS + " from runs where id = ?")) {
                ps.setString(1, id);
                try (ResultSet rs = ps.executeQuery()) {
                    return rs.next() ? Optional.of(record(rs)) : Optional.<RunRecord>empty();
                }
            }
        });
    }

    /** Runs matching {@code filter}, newest first. */
    public List<RunRecord> list(Filter filter, int limit, int offset) {
        return run(c -> {
            List<Object> args = new ArrayList<>();
            String sql = "select " + COLUMNS + " from runs" + whereClause(filter, args)
                    + " order by created_at desc, id desc limit ? offset ?";
            try (PreparedStatement ps = c.prepareStatement(sql)) {
                int i = bind(ps, args);
                ps.setInt(i++, limit);
                ps.setInt(i, offset);
                List<RunRecord> out = new ArrayList<>();
                try (ResultSet rs = ps.executeQuery()) {
                    while (rs.next()) {
                        out.add(record(rs));
                    }
                }
                return out;
            }
        });
    }

    /** Number of runs matching {@code filter}. */
    public int count(Filter filter) {
        return run(c -> {
            List<Object> args = new ArrayList<>();
            try (PreparedStatement ps = c.prepareStatement("select count(*) from runs" + whereClause(filter, args))) {
                bind(ps, args);
                try (ResultSet rs = ps.executeQuery()) {
                    rs.next();
                    return rs.getInt(1);
                }
            }
        });
    }

    /** Queued or running runs of {@code owner}. */
    int activeCount(String owner) {
        return run(c -> {
            try (PreparedStatement ps = c.prepareStatement(
                    "select count(*) from runs where owner_name = ? and status in ('queued', 'running')")) {
                ps.setString(1, owner);
                try (ResultSet rs = ps.executeQuery()) {
                    rs.next();
                    return rs.getInt(1);
                }
            }
        });
    }

    /** Runs per status, for the metrics. */
    public Map<RunStatus, Integer> countsByStatus() {
        return run(c -> {
            Map<RunStatus, Integer> out = new EnumMap<>(RunStatus.class);
            for (RunStatus s : RunStatus.values()) {
                out.put(s, 0);
            }
            try (PreparedStatement ps = c.prepareStatement("select status, count(*) from runs group by status");
                 ResultSet rs = ps.executeQuery()) {
                while (rs.next()) {
                    out.put(RunStatus.fromWire(rs.getString(1)), rs.getInt(2));
                }
            }
            return out;
        });
    }

    /** Ids of the queued and running runs, oldest first. */
    List<RunRecord> active() {
        return list(new Filter(null, null, null), Integer.MAX_VALUE, 0).stream()
                .filter(r -> r.status().active()).toList();
    }

    /** Queued → running; true when this call made the change. */
    boolean markStarted(String id, Instant now) {
        return update("update runs set status = 'running', started_at = ? where id = ? and status = 'queued'",
                ps -> {
                    setTime(ps, 1, now);
                    ps.setString(2, id);
                }) == 1;
    }

    /** Ends an active run with {@code status} and {@code reason}; true when it was active. */
    boolean finish(String id, RunStatus status, String reason, Instant now) {
        return update("update runs set status = ?, status_reason = ?, finished_at = ? where id = ? "
                + "and status in ('queued', 'running')", ps -> {
                    ps.setString(1, status.wire());
                    ps.setString(2, reason);
                    setTime(ps, 3, now);
                    ps.setString(4, id);
                }) == 1;
    }

    /** Sets the reason line of an active run (an interruption, say) without changing its status. */
    void note(String id, String reason) {
        update("update runs set status_reason = ? where id = ? and status in ('queued', 'running')", ps -> {
            ps.setString(1, reason);
            ps.setString(2, id);
        });
    }

    /** Deletes the run and its points; true when it existed. */
    boolean delete(String id) {
        return update("delete from runs where id = ?", ps -> ps.setString(1, id)) == 1;
    }

    /** Deletes runs that finished before {@code cutoff}; returns how many. */
    int deleteFinishedBefore(Instant cutoff) {
        return update("delete from runs where finished_at is not null and finished_at < ?",
                ps -> setTime(ps, 1, cutoff));
    }

    /** The indexes of chunk {@code chunk} (of {@code layout}) whose points are stored already. */
    BitSet computed(String runId, ChunkLayout layout, int chunk) {
        return run(c -> {
            BitSet out = new BitSet();
            String position = ChunkLayout.positionSql("idx");
            try (PreparedStatement ps = c.prepareStatement("select idx from run_points where run_id = ? and "
                    + position + " >= ? and " + position + " < ?")) {
                ps.setString(1, runId);
                layout.bindPosition(ps, 2);
                ps.setLong(4, layout.from(chunk));
                layout.bindPosition(ps, 5);
                ps.setLong(7, layout.to(chunk));
                try (ResultSet rs = ps.executeQuery()) {
                    while (rs.next()) {
                        out.set(rs.getInt(1));
                    }
                }
            }
            return out;
        });
    }

    /** Stored points per chunk number of {@code layout}, for the runs whose chunks are checked. */
    Map<Integer, Integer> computedPerChunk(String runId, ChunkLayout layout) {
        return run(c -> {
            Map<Integer, Integer> out = new HashMap<>();
            try (PreparedStatement ps = c.prepareStatement("select idx from run_points where run_id = ?")) {
                ps.setString(1, runId);
                try (ResultSet rs = ps.executeQuery()) {
                    while (rs.next()) {
                        out.merge(layout.chunkOf(rs.getInt(1)), 1, Integer::sum);
                    }
                }
            }
            return out;
        });
    }

    /** What {@link #save} did. */
    enum Saved {
        /** Points stored, the run goes on. */
        STORED,
        /** Points stored and they were the last: the run is finished. */
        FINISHED,
        /** The run is no longer active (cancelled, deleted): nothing stored. */
        GONE
    }

    /** Attempts of {@link #save} when another writer stores the same points at the same moment. */
    private static final int SAVE_ATTEMPTS = 5;

    /**
     * Stores computed points and advances the run's counters in one transaction. A point already
     * stored (by another instance that held the chunk before) is skipped and not counted twice.
     * The points go in as one JDBC batch of plain inserts (the caller computed only points it found
     * missing); when the primary key refuses one because another writer stored it meanwhile (two
     * executions of one chunk: one revived after its heartbeats went stale while the first still
     * ran), the transaction is rolled back and tried again point by point, skipping the stored
     * ones. That is not a database failure. A save that completes the run stamps its
     * {@code finished_at} once the points are inserted, just before the commit.
     */
    Saved save(String runId, List<PointResult> points) {
        return run(c -> {
            c.setAutoCommit(false);
            for (int attempt = 1; ; attempt++) {
                try {
                    Saved saved = saveOnce(c, runId, points, attempt > 1);
                    c.commit();
                    return saved;
                } catch (SQLException e) {
                    c.rollback();
                    if (!uniqueViolation(e) || attempt >= SAVE_ATTEMPTS) {
                        throw e;
                    }
                } catch (RuntimeException e) {
                    c.rollback();
                    throw e;
                }
            }
        });
    }

    /** True when {@code e} (or an exception it chains, as a batch's does) is a unique-key violation. */
    private static boolean uniqueViolation(SQLException e) {
        for (Throwable t = e; t != null; t = t.getCause() == t ? null : t.getCause()) {
            if (t instanceof SQLException q) {
                for (SQLException n = q; n != null; n = n.getNextException()) {
                    if (UNIQUE_VIOLATION.equals(n.getSQLState())) {
                        return true;
                    }
                }
            }
        }
        return false;
    }

    /**
     * One attempt of {@link #save}, in the caller's transaction (GONE rolls back itself): a batch
     * of plain inserts, or with {@code skipStored} one insert per point that skips a stored point.
     */
    private static Saved saveOnce(Connection c, String runId, List<PointResult> points, boolean skipStored)
            throws SQLException {
        int done = 0;
        int failed = 0;
        if (!skipStored) {
            try (PreparedStatement ps = c.prepareStatement("insert into run_points "
                    + "(run_id, idx, inputs, outputs, problem, computed_by) values (?, ?, ?, ?, ?, ?)")) {
                for (PointResult p : points) {
                    bindPoint(ps, runId, p);
                    ps.addBatch();
                    if (p.ok()) {
                        done++;
                    } else {
                        failed++;
                    }
                }
                if (!points.isEmpty()) {
                    ps.executeBatch();
                }
            }
        } else {
            try (PreparedStatement ps = c.prepareStatement("insert into run_points "
                    + "(run_id, idx, inputs, outputs, problem, computed_by) select ?, ?, ?, ?, ?, ? "
                    + "where not exists (select 1 from run_points where run_id = ? and idx = ?)")) {
                for (PointResult p : points) {
                    bindPoint(ps, runId, p);
                    ps.setString(7, runId);
                    ps.setInt(8, p.index());
                    if (ps.executeUpdate() == 1) {
                        if (p.ok()) {
                            done++;
                        } else {
                            failed++;
                        }
                    }
                }
            }
        }
        int updated;
        try (PreparedStatement ps = c.prepareStatement("update runs set done_points = done_points + ?, "
                + "failed_points = failed_points + ? where id = ? and status in ('queued', 'running')")) {
            ps.setInt(1, done);
            ps.setInt(2, failed);
            ps.setString(3, runId);
            updated = ps.executeUpdate();
        }
        if (updated == 0) {
            c.rollback();
            return Saved.GONE;
        }
        int finished;
        try (PreparedStatement ps = c.prepareStatement("update runs set "
                + "status = case when done_points = 0 then 'failed' else 'succeeded' end, "
                + "status_reason = case when done_points = 0 then 'every point recorded a problem' "
                + "else status_reason end, finished_at = ? "
                + "where id = ? and status in ('queued', 'running') and done_points + failed_points >= total_points")) {
            setTime(ps, 1, Instant.now());   // the last points are in: the run's finishing moment
            ps.setString(2, runId);
            finished = ps.executeUpdate();
        }
        return finished == 1 ? Saved.FINISHED : Saved.STORED;
    }

    private static void bindPoint(PreparedStatement ps, String runId, PointResult p) throws SQLException {
        ps.setString(1, runId);
        ps.setInt(2, p.index());
        ps.setString(3, p.inputs());
        ps.setString(4, p.outputs());
        ps.setString(5, p.problem());
        ps.setString(6, p.computedBy());
    }

    /**
     * Hands the computed points of a run with index above {@code afterIndex} to {@code sink}, in
     * index order, at most {@code limit}; returns the last index handed (or {@code afterIndex}).
     */
    public int points(String runId, int afterIndex, int limit, Consumer<PointResult> sink) {
        return run(c -> {
            int last = afterIndex;
            try (PreparedStatement ps = c.prepareStatement("select idx, inputs, outputs, problem, computed_by "
                    + "from run_points where run_id = ? and idx > ? order by idx limit ?")) {
                ps.setString(1, runId);
                ps.setInt(2, afterIndex);
                ps.setInt(3, limit);
                try (ResultSet rs = ps.executeQuery()) {
                    while (rs.next()) {
                        last = rs.getInt(1);
                        sink.accept(new PointResult(last, rs.getString(2), rs.getString(3), rs.getString(4),
                                rs.getString(5)));
                    }
                }
            }
            return last;
        });
    }

    /** Computed points per instance name, for one run. */
    public Map<String, Integer> pointsByInstance(String runId) {
        return run(c -> {
            Map<String, Integer> out = new HashMap<>();
            try (PreparedStatement ps = c.prepareStatement(
                    "select computed_by, count(*) from run_points where run_id = ? group by computed_by")) {
                ps.setString(1, runId);
                try (ResultSet rs = ps.executeQuery()) {
                    while (rs.next()) {
                        out.put(rs.getString(1), rs.getInt(2));
                    }
                }
            }
            return out;
        });
    }

    /**
     * Records the models {@code points} list that this run does not have yet ({@code known}: the
     * ids recorded for it already, by this caller or by others sharing the set; an id is added
     * once its insert has been committed, so a caller skipping it knows it is stored). Each model
     * is its own statement outside any transaction, so a second writer recording the same model at
     * the same moment (the primary key refuses one of the two) changes nothing and fails nothing.
     * Called before the points are saved: a stored point's models are always stored. When every
     * model is known, no connection is taken.
     */
    void recordModels(String runId, List<PointResult> points, Set<String> known) {
        Map<String, Object[]> missing = new LinkedHashMap<>();
        for (PointResult p : points) {
            for (int k = 0; k < p.models().size(); k++) {
                ModelInfo m = p.models().get(k);
                if (!known.contains(m.id())) {
                    missing.putIfAbsent(m.id(), new Object[] {m, p.index(), k});
                }
            }
        }
        if (missing.isEmpty()) {
            return;
        }
        run(c -> {
            try (PreparedStatement ps = c.prepareStatement("insert into run_models "
                    + "(run_id, model_id, citation, doi, first_point, list_order) select ?, ?, ?, ?, ?, ? "
                    + "where not exists (select 1 from run_models where run_id = ? and model_id = ?)")) {
                for (Object[] first : missing.values()) {
                    ModelInfo m = (ModelInfo) first[0];
                    ps.setString(1, runId);
                    ps.setString(2, m.id());
                    ps.setString(3, m.citation());
                    ps.setString(4, m.doi() == null ? "" : m.doi());
                    ps.setInt(5, (Integer) first[1]);
                    ps.setInt(6, (Integer) first[2]);
                    ps.setString(7, runId);
                    ps.setString(8, m.id());
                    try {
                        ps.executeUpdate();
                    } catch (SQLException e) {
                        if (!UNIQUE_VIOLATION.equals(e.getSQLState())) {
                            throw e;
                        }
                        // recorded by another instance between the check and the insert
                    }
                    known.add(m.id());
                }
            }
            return null;
        });
    }

    /**
     * The models of the runs {@code runIds} (each run's list in the order its points first
     * listed them); a run without recorded models maps to an empty list.
     */
    public Map<String, List<ModelInfo>> models(Collection<String> runIds) {
        Map<String, List<ModelInfo>> out = new LinkedHashMap<>();
        runIds.forEach(id -> out.put(id, new ArrayList<>()));
        if (runIds.isEmpty()) {
            return out;
        }
        return run(c -> {
            String marks = String.join(", ", java.util.Collections.nCopies(out.size(), "?"));
            try (PreparedStatement ps = c.prepareStatement("select run_id, model_id, citation, doi from run_models "
                    + "where run_id in (" + marks + ") order by run_id, first_point, list_order, model_id")) {
                int i = 1;
                for (String id : out.keySet()) {
                    ps.setString(i++, id);
                }
                try (ResultSet rs = ps.executeQuery()) {
                    while (rs.next()) {
                        out.get(rs.getString(1)).add(new ModelInfo(rs.getString(2), rs.getString(3), rs.getString(4)));
                    }
                }
            }
            return out;
        });
    }

    // ---- plumbing ----------------------------------------------------------------------------

    @FunctionalInterface
    private interface Work<T> {
        T apply(Connection c) throws SQLException;
    }

    @FunctionalInterface
    private interface Binder {
        void bind(PreparedStatement ps) throws SQLException;
    }

    private <T> T run(Work<T> work) {
        try (Connection c = ds.getConnection()) {
            return work.apply(c);
        } catch (SQLException e) {
            throw new StorageUnavailableException("the run database (" + where + ") failed: "
                    + Database.rootMessage(e), e);
        }
    }

    private int update(String sql, Binder binder) {
        return run(c -> {
            try (PreparedStatement ps = c.prepareStatement(sql)) {
                binder.bind(ps);
                return ps.executeUpdate();
            }
        });
    }

    private static String whereClause(Filter f, List<Object> args) {
        List<String> parts = new ArrayList<>();
        if (f.status() != null) {
            parts.add("status = ?");
            args.add(f.status().wire());
        }
        if (f.owner() != null) {
            parts.add("owner_name = ?");
            args.add(f.owner());
        }
        if (f.operation() != null) {
            parts.add("operation = ?");
            args.add(f.operation());
        }
        return parts.isEmpty() ? "" : " where " + String.join(" and ", parts);
    }

    private static int bind(PreparedStatement ps, List<Object> args) throws SQLException {
        int i = 1;
        for (Object a : args) {
            ps.setString(i++, (String) a);
        }
        return i;
    }

    private static RunRecord record(ResultSet rs) throws SQLException {
        return new RunRecord(rs.getString(1), rs.getString(2), rs.getString(3), rs.getString(4), rs.getString(5),
                RunStatus.fromWire(rs.getString(6)), rs.getString(7), rs.getString(8), rs.getInt(9), rs.getInt(10),
                rs.getInt(11), rs.getInt(12), time(rs, 13), time(rs, 14), time(rs, 15), rs.getString(16));
    }

    private static void setTime(PreparedStatement ps, int i, Instant t) throws SQLException {
        if (t == null) {
            ps.setObject(i, null, java.sql.Types.TIMESTAMP_WITH_TIMEZONE);
        } else {
            ps.setObject(i, OffsetDateTime.ofInstant(t, ZoneOffset.UTC));
        }
    }

    private static Instant time(ResultSet rs, int i) throws SQLException {
        OffsetDateTime t = rs.getObject(i, OffsetDateTime.class);
        return t == null ? null : t.toInstant();
    }
}
