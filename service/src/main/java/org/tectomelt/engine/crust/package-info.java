/**
 * Crustal heating by mafic intrusions: the no-loss energy budget ({@link org.tectomelt.engine.crust.HeatBudget})
 * and the transient 1-D sill model ({@link org.tectomelt.engine.crust.SillModel}), an implicit enthalpy
 * solver for conduction with latent heat. SI throughout: K, m, s, kg/m³, J/kg, W/m/K, W/m³.
 */
package org.tectomelt.engine.crust;
