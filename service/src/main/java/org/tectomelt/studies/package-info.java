/**
 * Studies over a computation: forward Monte Carlo uncertainty and one-dimensional inversion from
 * observations.
 *
 * <p>Everything here is generic over a {@link org.tectomelt.studies.StudyModel}: named numeric
 * inputs (API units) in, named numeric outputs out, an absent output as {@code null}, a failure as
 * an exception. The package knows nothing of HTTP or JSON (an ArchUnit test checks it); the runs
 * and the HTTP skin adapt an operation to a {@code StudyModel} and turn the results into JSON.
 *
 * <ul>
 *   <li>{@link org.tectomelt.studies.Distribution}: normal, truncated normal, lognormal, uniform,
 *       triangular, each checked against the input field's range before any draw
 *       ({@link org.tectomelt.studies.UncertainInputs}).</li>
 *   <li>{@link org.tectomelt.studies.SampleRandom}: the generator of sample {@code i} depends only on
 *       (seed, i), so results are bit-identical for any number of threads.</li>
 *   <li>{@link org.tectomelt.studies.MonteCarlo}: forward propagation; one
 *       {@link org.tectomelt.studies.Summary} per output, failures and out-of-range draws counted.</li>
 *   <li>{@link org.tectomelt.studies.PosteriorInversion}: Bayesian posterior of one input on a grid,
 *       nuisance inputs marginalised by Monte Carlo.</li>
 *   <li>{@link org.tectomelt.studies.SamplingInversion}: one root (Brent) per Monte Carlo draw of
 *       the observation and the nuisance inputs.</li>
 * </ul>
 */
package org.tectomelt.studies;
