/**
 * The melting engine: pure computation in SI units (K, Pa, m, s, kg), immutable values, no
 * knowledge of HTTP or JSON. Each published model is one small class named after its method.
 */
package org.tectomelt.engine;
