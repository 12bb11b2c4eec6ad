/**
 * Studies on the operations: a run's {@code uncertainty}, {@code solve} and {@code observed} parts
 * read and checked against the spec ({@link org.tectomelt.runs.study.StudyRequest}), and an operation
 * seen as a {@link org.tectomelt.studies.StudyModel} through the one invocation path of every
 * generic caller ({@link org.tectomelt.runs.study.OperationModel}). The numerics live in
 * {@code org.tectomelt.studies}, which knows no JSON.
 */
package org.tectomelt.runs.study;
