/**
 * Runs: parameter sweeps (and, later, other many-point studies) kept in a SQL database and
 * computed in the background, in chunks, by every instance sharing that database.
 *
 * <p>A run is a list of {@code totalPoints} indexed points plus an opaque definition that only the
 * {@link org.tectomelt.runs.Evaluator} understands (the operation, its base request, the sweep);
 * this package stores the definition, the inputs, outputs or problem of each computed point as
 * text it is handed, and never parses them. Storage: embedded H2 file or PostgreSQL through JDBC,
 * a HikariCP pool and Flyway migrations ({@link org.tectomelt.runs.Database}). Execution: chunks
 * are db-scheduler one-time tasks in the same database ({@link org.tectomelt.runs.RunExecutor}).
 * Nothing here imports HTTP.
 */
package org.tectomelt.runs;
