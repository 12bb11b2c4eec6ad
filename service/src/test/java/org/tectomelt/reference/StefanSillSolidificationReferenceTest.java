package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.special.Erf;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.crust.ConductivityLaw;
import org.tectomelt.engine.crust.InitialState;
import org.tectomelt.engine.crust.MeltingIntervals;
import org.tectomelt.engine.crust.Rock;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.crust.SillResult;

/**
 * The sill model against the Stefan solution for the solidification of a sheet of magma at its
 * melting temperature Tm intruded into country rock at T0, with equal thermal properties
 * (Turcotte, D.L. &amp; Schubert, G. (2014) Geodynamics, 3rd ed., Cambridge University Press,
 * doi:10.1017/CBO9780511843877, the section on solidification of a dike or sill in chapter 4;
 * Wangen, M. (2010) Physical Principles of Sedimentary Basin Analysis, Cambridge University Press,
 * §6.17, doi:10.1017/CBO9780511711824; REFERENCES §3.1):
 * <pre>
 *   λ e^(λ²) (1 + erf λ) = c (Tm − T0) / (L √π)
 *   solidification time  t_s = b² / (4 κ λ²),  b the half-thickness
 *   contact temperature  Tc = T0 + (Tm − T0) / (1 + erf λ)   while the magma freezes
 * </pre>
 * The solution holds exactly until the two solidification fronts meet in the middle (the magma
 * at Tm carries no heat flux), so the finite sheet solidifies at exactly t_s.
 */
class StefanSillSolidificationReferenceTest {

    private static final double L = 320_000;
    private static final double C = 1200;
    private static final double RHO = 2800;
    private static final double KAPPA = 0.5e-6;
    private static final double TM = 1473.15;
    private static final double T0 = TM - 1000;
    private static final double DAY = 86_400;

    /** λ from the transcendental equation, solved with Commons Math (Brent, erf). */
    static double lambda(double c, double dT, double latent) {
        double rhs = c * dT / (latent * Math.sqrt(Math.PI));
        return new BrentSolver(1e-14).solve(200, x -> x * Math.exp(x * x) * (1 + Erf.erf(x)) - rhs, 1e-6, 5);
    }

    /** The textbook 2 m dike (b = 1 m), κ = 0.5e-6 m²/s, in the model on a uniform grid of {@code dz}. */
    private static SillResult dike(double dz) {
        return dike(dz, 20, 42, SillModel.GridPlan.UNIFORM);
    }

    /**
     * The same dike on a graded grid: {@code dz} at the contacts, growing 10 % per cell to 4 m (a range of
     * 200 in cell size) in a column of 80 half-thicknesses.
     */
    private static SillResult gradedDike(double dz) {
        return dike(dz, 38, 80, new SillModel.GridPlan(1.1, 4.0));
    }

    /** The dike with its top {@code top} and the column {@code column} half-thicknesses deep. */
    private static SillResult dike(double dz, double top, double column, SillModel.GridPlan plan) {
        double b = 1.0;
        double k = KAPPA * RHO * C;
        double ts = b * b / (4 * KAPPA * Math.pow(lambda(C, 1000, L), 2));
        Rock country = new Rock(RHO, C, L, ConductivityLaw.constant(k), null);
        Rock magma = new Rock(RHO, C, L, ConductivityLaw.constant(k), MeltingIntervals.linear(TM, TM));
        return SillModel.run(new SillModel.Setup(country, magma, new InitialState.Uniform(T0),
                SillModel.Intrusions.single(2 * b, top * b, TM), column * b, dz, 1.2 * ts, ts / 20, List.of(), dz,
                SillModel.Numerics.DEFAULT, null, Double.POSITIVE_INFINITY, plan));
    }

    @Test
    void onAGradedGridTheDikeSolidifiesAtTheStefanTimeAndTheContactHoldsItsTemperature() {
        double lambda = lambda(C, 1000, L);
        double ts = 1.0 / (4 * KAPPA * lambda * lambda);
        SillResult r = gradedDike(0.02);
        // the verification: spacing varying by a factor of at least 100 across the column
        assertTrue(r.numerics().largestCell() / r.numerics().smallestCell() >= 100,
                r.numerics().smallestCell() + " to " + r.numerics().largestCell());
        // same tolerances as on the uniform grid: 2 % of b²/(4κλ²), 1 % of Tm − T0 at the contact
        assertEquals(ts, r.summary().solidificationTime(), 0.02 * ts);
        assertStefanContact(r);
        // grid convergence within 1 %, as on the uniform grid
        double coarse = gradedDike(0.04).summary().solidificationTime();
        assertEquals(r.summary().solidificationTime(), coarse, 0.01 * r.summary().solidificationTime());
        assertTrue(r.summary().energyErrorFraction() < 1e-10);
    }

    @Test
    void lambdaAndTheTextbookDikeMatchTheWorkedValues() {
        // REFERENCES §3.1 [calc]: L = 320 kJ/kg, c = 1.2 kJ/kg/K, Tm − T0 = 1000 K → λ = 0.7305 (printed to 4 decimals)
        double lambda = lambda(C, 1000, L);
        assertEquals(0.7305, lambda, 5e-5);
        // Turcotte & Schubert's worked example, from memory (REFERENCES §3.1 [mem]): a 2 m dike with
        // κ = 0.5e-6 m²/s solidifies in about 10.8 days (printed to 0.1 day)
        double ts = 1.0 / (4 * KAPPA * lambda * lambda);
        assertEquals(10.8, ts / DAY, 0.05);
    }

    @Test
    void theDikeSolidifiesAtTheStefanTimeWithinTwoPercent() {
        double lambda = lambda(C, 1000, L);
        double ts = 1.0 / (4 * KAPPA * lambda * lambda);
        SillResult r = dike(0.02);
        // issue criterion: within 2 % of b²/(4κλ²)
        assertEquals(ts, r.summary().solidificationTime(), 0.02 * ts);
    }

    @Test
    void theContactStaysAtTheStefanContactTemperatureWhileTheMagmaFreezes() {
        assertStefanContact(dike(0.02));
    }

    /** The contact holds Tc = T0 + (Tm − T0)/(1 + erf λ) from 0.1 to 0.9 of the solidification time. */
    private static void assertStefanContact(SillResult r) {
        double lambda = lambda(C, 1000, L);
        double ts = 1.0 / (4 * KAPPA * lambda * lambda);
        double tc = T0 + (TM - T0) / (1 + Erf.erf(lambda));
        int checked = 0;
        for (SillResult.Sample s : r.series()) {
            if (s.time() >= 0.1 * ts && s.time() <= 0.9 * ts) {
                // tolerance 1 % of Tm − T0: the enthalpy method resolves the front to within a cell
                assertEquals(tc, s.contactTemperature(), 0.01 * (TM - T0), "at t/ts = " + s.time() / ts);
                checked++;
            }
        }
        assertTrue(checked >= 10, "checked " + checked + " samples");
    }

    @Test
    void halvingTheCellSizeChangesTheSolidificationTimeByLessThanOnePercent() {
        double coarse = dike(0.04).summary().solidificationTime();
        double fine = dike(0.02).summary().solidificationTime();
        // issue criterion: grid convergence within 1 %
        assertEquals(fine, coarse, 0.01 * fine);
    }
}
