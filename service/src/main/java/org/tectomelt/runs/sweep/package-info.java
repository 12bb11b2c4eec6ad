/**
 * Parameter sweeps as runs: the request of {@code POST /v1/runs} read and checked up front
 * ({@link org.tectomelt.runs.sweep.Sweep}: the Cartesian product of the axes, every point held to
 * the spec through the same {@code SpecContract} the HTTP handler uses), and the
 * {@link org.tectomelt.runs.Evaluator} that computes a point on the operations' engine path
 * through {@code org.tectomelt.contract.Invoker} ({@link org.tectomelt.runs.sweep.SweepEvaluator}).
 * Knows JSON and the operations; knows nothing of HTTP.
 */
package org.tectomelt.runs.sweep;
