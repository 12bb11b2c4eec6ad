/** Thermal structure of the lithosphere and mantle: pressure with depth, geotherms, adiabats. */
package org.tectomelt.engine.thermal;
