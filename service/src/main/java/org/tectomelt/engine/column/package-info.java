/**
 * Isentropic decompression melting columns: where rising mantle meets its solidus, how far it
 * melts on the way up and how much melt and crust that makes. SI units (Pa, K, m, mass fractions).
 */
package org.tectomelt.engine.column;
