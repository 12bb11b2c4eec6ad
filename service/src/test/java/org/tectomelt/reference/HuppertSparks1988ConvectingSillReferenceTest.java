package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.crust.ConductivityLaw;
import org.tectomelt.engine.crust.InitialState;
import org.tectomelt.engine.crust.MeltingIntervals;
import org.tectomelt.engine.crust.Rock;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.crust.SillResult;
import org.tectomelt.engine.melting.MeltCurve;

/**
 * The convecting sill against Huppert, H.E. &amp; Sparks, R.S.J. (1988) The generation of granitic
 * magmas by intrusion of basalt into continental crust. J. Petrology 29, 599–624,
 * doi:10.1093/petrology/29.3.599: a well-mixed, turbulently convecting basalt gives its roof the heat
 * flux q = λ k (g α / (κ ν))^(1/3) ΔT^(4/3) (λ = 0.1; the form and constant from memory), and such
 * sills heat and melt their roof far faster than conduction alone; sills 10–1500 m thick solidify in
 * 1–270 years with convection (REFERENCES §3.4 [pub]).
 */
class HuppertSparks1988ConvectingSillReferenceTest {

    private static final double C0 = 273.15;
    private static final double YR = 3.15576e7;
    /** A pelite-like curve (approximate values of REFERENCES §3.4, invented for the tests). */
    private static final MeltCurve PELITE = new MeltCurve(new double[] {C0 + 750, C0 + 800, C0 + 850, C0 + 900, C0 + 1000},
            new double[] {0, 0.05, 0.25, 0.45, 0.6});
    private static final Rock CRUST = new Rock(2750, 1050, 280_000, ConductivityLaw.constant(2.5), PELITE);
    private static final Rock BASALT = new Rock(2900, 1100, 400_000, ConductivityLaw.constant(2.5),
            MeltingIntervals.linear(C0 + 1000, C0 + 1200));

    private static SillModel.Setup sill(double thickness, double years, SillModel.Convection convection) {
        return new SillModel.Setup(CRUST, BASALT, new InitialState.Uniform(C0 + 450),
                SillModel.Intrusions.single(thickness, 10e3, C0 + 1230), 20e3,
                SillModel.resolvingSpacing(thickness), years * YR, years * YR / 400, List.of(), 100,
                SillModel.Numerics.DEFAULT, null, Double.POSITIVE_INFINITY, SillModel.GridPlan.GRADED, convection);
    }

    @Test
    void theFluxLawScalesAsTheFourThirdsPowerOfTheTemperatureDrop() {
        SillModel.Convection c = SillModel.Convection.withLockAt(0.5);
        double k = 2.5;
        double kappa = k / (2900 * 1100);
        // Huppert & Sparks (1988): q ∝ ΔT^(4/3) for a turbulently convecting layer
        assertEquals(Math.pow(2, 4.0 / 3.0), c.heatFlux(200, k, kappa, 2900) / c.heatFlux(100, k, kappa, 2900), 1e-12);
        // the flux factor λ k (g α ρ / (κ μ))^(1/3), computed by hand: 0.1 · 2.5 · (9.81 · 5e-5 · 2900 / (κ · 100))^(1/3)
        double byHand = 0.1 * 2.5 * Math.cbrt(9.81 * 5e-5 * 2900 / (kappa * 100));
        assertEquals(byHand, c.fluxFactor(k, kappa, 2900), 1e-12 * byHand);
        // a thousand-odd W/m² for 100 K: far above the ~0.1 W/m² of conduction through the crust
        assertTrue(c.heatFlux(100, k, kappa, 2900) > 1000);
    }

    @Test
    void theModelledRoofFluxFollowsTheFourThirdsLawWhileTheSillConvects() {
        SillModel.Convection c = SillModel.Convection.withLockAt(0.5);
        SillResult r = SillModel.run(sill(50, 5, c));
        assertNotNull(r.summary().lockUpTime(), "a 50 m sill locks within 5 yr");
        double k = 2.5;
        double factor = c.fluxFactor(k, k / (2900 * 1100), 2900);
        int checked = 0;
        double[] drops = new double[2];
        for (SillResult.Sample s : r.series()) {
            if (s.time() > 0 && s.time() < r.summary().lockUpTime()) {
                double drop = s.firstSillTemperature() - s.contactTemperature();
                // the roof flux the model carries is A ΔT^(4/3) with ΔT from the mixed interior to the roof
                assertEquals(factor * Math.pow(drop, 4.0 / 3.0), s.roofHeatFlux(), 1e-6 * s.roofHeatFlux(),
                        "at " + s.time() / YR + " yr");
                drops[checked == 0 ? 0 : 1] = drop;
                checked++;
            }
        }
        assertTrue(checked >= 10, "checked " + checked);
        assertTrue(drops[0] > 1.2 * drops[1], "the drop shrinks as the sill cools: " + drops[0] + " → " + drops[1]);
        assertTrue(r.summary().energyErrorFraction() < 1e-10, "energy " + r.summary().energyErrorFraction());
    }

    @Test
    void aConvectingSillMeltsMoreCrustSoonerThanAConductingOne() {
        SillResult conducting = SillModel.run(sill(50, 200, null));
        SillResult convecting = SillModel.run(sill(50, 200, SillModel.Convection.withLockAt(0.5)));
        SillResult.Summary a = conducting.summary();
        SillResult.Summary b = convecting.summary();
        assertNull(a.lockUpTime());
        assertNotNull(b.lockUpTime());
        assertTrue(b.timeToFirstCrustMelt() < a.timeToFirstCrustMelt(),
                "first melt " + b.timeToFirstCrustMelt() / YR + " vs " + a.timeToFirstCrustMelt() / YR + " yr");
        assertTrue(b.peakCrustMeltThickness() > a.peakCrustMeltThickness(),
                "peak melt " + b.peakCrustMeltThickness() + " vs " + a.peakCrustMeltThickness() + " m");
        // more melt at every early time, until the conducting sill catches up
        for (int i = 1; i < convecting.series().size(); i++) {
            SillResult.Sample sb = convecting.series().get(i);
            if (sb.time() <= b.lockUpTime()) {
                assertTrue(sb.crustMeltThickness() >= conducting.series().get(i).crustMeltThickness(),
                        "at " + sb.time() / YR + " yr");
            }
        }
        // Huppert & Sparks (1988): a convecting sill 10-1500 m thick solidifies in 1-270 yr [pub]; our 50 m
        // sill locks up (half crystallised) within that range
        assertTrue(b.lockUpTime() / YR >= 0.1 && b.lockUpTime() / YR <= 270, "lock-up " + b.lockUpTime() / YR + " yr");
        assertTrue(b.energyErrorFraction() < 1e-10);
    }

    @Test
    void theLockUpFractionMustLieStrictlyBetweenZeroAndOne() {
        assertThrows(EngineException.class, () -> SillModel.Convection.withLockAt(0));
        assertThrows(EngineException.class, () -> SillModel.Convection.withLockAt(1));
        assertThrows(EngineException.class, () -> SillModel.Convection.withLockAt(Double.NaN));
    }
}
