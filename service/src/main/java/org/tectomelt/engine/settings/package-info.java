/**
 * Tectonic settings built from the thermal and melting models: flux melting in a subduction wedge
 * and its arc magma budget; decompression melting beneath a mid-ocean ridge, a hotspot and a
 * continental rift. SI units: Pa, K, m, s, kg, mass fractions.
 */
package org.tectomelt.engine.settings;
