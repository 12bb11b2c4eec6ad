/**
 * Trace elements in mantle melts: the closed forms of Shaw (1970) and Zou (1998), the mineralogy of
 * the melting mantle (spinel and garnet fields, melting reactions), the increment-by-increment
 * integration of batch, fractional and near-fractional melting along a decompression column, and
 * the pooling of the melts of a passive (triangular) or an active melting regime. Concentrations are
 * in the units of the source table (ppm by mass); melt fractions are mass fractions; SI elsewhere.
 */
package org.tectomelt.engine.composition;
