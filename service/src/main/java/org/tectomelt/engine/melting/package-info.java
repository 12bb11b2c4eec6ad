/**
 * Melting models: lithologies with their solidus, liquidus and melt-fraction laws, dry and
 * hydrous. Pressures in Pa, temperatures in K, water as mass fractions.
 */
package org.tectomelt.engine.melting;
