/** Conversions between the API's geoscience units and SI. */
package org.tectomelt.engine.units;
