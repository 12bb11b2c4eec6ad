package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.crust.ConductivityLaw;
import org.tectomelt.engine.crust.InitialState;
import org.tectomelt.engine.crust.Rock;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.crust.SillResult;

/**
 * The sill model against the contact of two half-spaces at different temperatures without latent
 * heat (Carslaw, H.S. &amp; Jaeger, J.C. (1959) Conduction of Heat in Solids, 2nd ed., Oxford
 * University Press, §2.15; REFERENCES §3.2): the contact jumps at once to the effusivity-weighted
 * mean and stays there,
 * <pre>
 *   Tc = (e1 T1 + e2 T2) / (e1 + e2),   e = √(k ρ c)
 * </pre>
 * as long as the heated zones are thin against the bodies (the far field undisturbed). A 2 km thick
 * non-melting intrusion with properties unlike the country rock's stands in for the two half-spaces.
 */
class CarslawJaegerContactReferenceTest {

    private static final double YR = 3.15576e7;
    private static final double T1 = 1373.15;
    private static final double T2 = 473.15;

    /** Tc = (e1 T1 + e2 T2) / (e1 + e2) for the two rocks below. */
    private static double effusivityWeightedMean() {
        double e1 = Math.sqrt(2.2 * 2950 * 1200);
        double e2 = Math.sqrt(3.1 * 2650 * 900);
        return (e1 * T1 + e2 * T2) / (e1 + e2);
    }

    /** The 2 km non-melting intrusion at 2 km in a 6 km column, 1000 years, on the given grid. */
    private static SillResult contact(double dz, SillModel.GridPlan plan) {
        Rock hot = new Rock(2950, 1200, 0, ConductivityLaw.constant(2.2), null);
        Rock cold = new Rock(2650, 900, 0, ConductivityLaw.constant(3.1), null);
        return SillModel.run(new SillModel.Setup(cold, hot, new InitialState.Uniform(T2),
                SillModel.Intrusions.single(2000, 2000, T1), 6000, dz, 1000 * YR, 100 * YR,
                List.of(1000 * YR), dz, SillModel.Numerics.DEFAULT, null, Double.POSITIVE_INFINITY, plan));
    }

    @Test
    void theContactTemperatureIsTheEffusivityWeightedMeanWithinOnePercent() {
        assertContactAndFarField(contact(2, SillModel.GridPlan.UNIFORM), 3000, 3000 + 1);
    }

    @Test
    void onAGradedGridTheContactIsTheEffusivityWeightedMeanWithinOnePercent() {
        // 1 m cells at the contacts growing 10 % per cell to 250 m: a range of 250
        SillResult r = contact(1, SillModel.GridPlan.GRADED);
        org.junit.jupiter.api.Assertions.assertTrue(r.numerics().largestCell() / r.numerics().smallestCell() >= 100);
        // the same checks (the graded profile samples the intrusion's interior more sparsely)
        assertContactAndFarField(r, 2800, 3200);
    }

    /** The contact at the mean from 50 years on; far field and intrusion interior (between the depths) unchanged. */
    private static void assertContactAndFarField(SillResult r, double interiorFrom, double interiorTo) {
        double expected = effusivityWeightedMean();
        for (SillResult.Sample s : r.series()) {
            if (s.time() >= 50 * YR) {
                // issue criterion: within 1 %, taken here of the temperature difference T1 − T2 (stricter
                // than 1 % of the value)
                assertEquals(expected, s.contactTemperature(), 0.01 * (T1 - T2), "at " + s.time() / YR + " yr");
            }
        }
        // the far field is undisturbed: 1.5 km from either contact after 1000 years, where √(κt) ≈ 0.2 km
        SillResult.Profile p = r.profiles().get(0);
        for (int i = 0; i < p.depth().length; i++) {
            double z = p.depth()[i];
            if (z < 500 || z > 5500) {
                assertEquals(T2, p.temperature()[i], 0.1, "country rock at " + z + " m");
            } else if (z > interiorFrom && z < interiorTo) {
                assertEquals(T1, p.temperature()[i], 0.1, "intrusion interior at " + z + " m");
            }
        }
    }
}
