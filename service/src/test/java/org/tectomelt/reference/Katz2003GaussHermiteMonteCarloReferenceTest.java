package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;
import java.util.function.DoubleUnaryOperator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.units.Units;
import org.tectomelt.studies.Distribution;
import org.tectomelt.studies.FieldRange;
import org.tectomelt.studies.MonteCarlo;
import org.tectomelt.studies.StudyModel;
import org.tectomelt.studies.Summary;
import org.tectomelt.studies.UncertainInputs;

/**
 * Forward Monte Carlo through a non-linear model against quadrature: the Katz et al. (2003) dry
 * melt fraction at 1 GPa with an uncertain temperature.
 *
 * <p>Sources: Gauss–Hermite quadrature, ∫ e^(−x²) g(x) dx ≈ Σ w_i g(x_i) (Abramowitz &amp; Stegun
 * 1964, Handbook of Mathematical Functions, 25.4.46, nodes and weights of Table 25.10), so that
 * E[F(T)] = (1/√π) Σ w_i F(μ + √2 σ x_i) for T ~ normal(μ, σ) (REFERENCES §5). Nodes and weights
 * come from Commons Math's {@code GaussIntegratorFactory.hermite}, checked first against the
 * closed forms of the two- and three-point rules [calc]. The melting law is Katz, Spiegelman &amp;
 * Langmuir (2003), G-cubed 4(9) 1073, doi:10.1029/2002GC000433, REFERENCES §2.1. The tolerance
 * is three Monte Carlo standard errors (REFERENCES §5).
 */
class Katz2003GaussHermiteMonteCarloReferenceTest {

    private static final double P_PA = 1e9;
    private static final Katz2003Peridotite KATZ = Katz2003Peridotite.fertile();
    private static final int N = 200_000;
    private static double meltFraction(double temperatureC) {
        return KATZ.meltFraction(P_PA, Units.celsiusToKelvin(temperatureC), 0.0);
    }

    /** E[g(T)] for T ~ normal(mu, sigma) by n-point Gauss–Hermite (A&amp;S 25.4.46). */
    private static double gaussHermite(int n, double mu, double sigma, DoubleUnaryOperator g) {
        GaussIntegrator rule = new GaussIntegratorFactory().hermite(n);
        return rule.integrate(x -> g.applyAsDouble(mu + Math.sqrt(2) * sigma * x)) / Math.sqrt(Math.PI);
    }

    @Test
    void hermiteRulesMatchTheirClosedForms() {
        // Table 25.10 (A&S 1964): n = 2: ±1/√2 with weights √π/2; n = 3: 0 with 2√π/3, ±√(3/2) with √π/6
        GaussIntegrator two = new GaussIntegratorFactory().hermite(2);
        assertEquals(1 / Math.sqrt(2), Math.abs(two.getPoint(0)), 1e-14);
        assertEquals(Math.sqrt(Math.PI) / 2, two.getWeight(0), 1e-14);
        GaussIntegrator three = new GaussIntegratorFactory().hermite(3);
        for (int i = 0; i < 3; i++) {
            double x = three.getPoint(i);
            if (Math.abs(x) < 1e-12) {
                assertEquals(2 * Math.sqrt(Math.PI) / 3, three.getWeight(i), 1e-14);
            } else {
                assertEquals(Math.sqrt(1.5), Math.abs(x), 1e-14);
                assertEquals(Math.sqrt(Math.PI) / 6, three.getWeight(i), 1e-14);
            }
        }
    }

    @Test
    void monteCarloMeanMeltFractionAgreesWithGaussHermiteWithinThreeStandardErrors() {
        double mu = 1300; // °C; at 1 GPa: solidus 1213.5 °C, cpx out at 1362.8 °C (REFERENCES §2.1 [calc])
        double sigma = 10; // ±4σ stays between them, where F = ((T − Ts)/(Tl − Ts))^1.5 is smooth
        double quadrature = gaussHermite(20, mu, sigma, Katz2003GaussHermiteMonteCarloReferenceTest::meltFraction);
        double finer = gaussHermite(40, mu, sigma, Katz2003GaussHermiteMonteCarloReferenceTest::meltFraction);
        assertEquals(finer, quadrature, 1e-10, "the 20-point rule has converged");

        StudyModel model = in -> Map.of("meltFraction", meltFraction(in.get("temperatureC")));
        UncertainInputs inputs = UncertainInputs.of(Map.of("temperatureC", new Distribution.Normal(mu, sigma)),
                Map.of("temperatureC", FieldRange.closed(-273.15, 3000)), "uncertainty.inputs.");
        MonteCarlo.Result r = MonteCarlo.run(model, inputs, Map.of("meltFraction", "1"), N, 7,
                StudyWorkers.two(), Deadline.none());
        Summary s = r.summaries().get("meltFraction");
        double se = s.sd() / Math.sqrt(N);
        assertEquals(quadrature, s.mean(), 3 * se, "Monte Carlo mean within 3 standard errors of Gauss–Hermite");
        // the mean differs from F(μ) (Jensen): the check is not trivially satisfied by a linear model
        assertTrue(Math.abs(quadrature - meltFraction(mu)) > 10 * se,
                "curvature of F shifts the mean by more than 10 standard errors");
        // the median of a monotonic function of T is the function of T's median [calc identity];
        // SE of the median √(p(1−p)/n)/f with f = φ(0)/(σ F'(μ)) (REFERENCES §5)
        double slope = (meltFraction(mu + 0.01) - meltFraction(mu - 0.01)) / 0.02;
        double density = 1 / (Math.sqrt(2 * Math.PI) * sigma * slope);
        assertEquals(meltFraction(mu), s.p50(), 3 * Math.sqrt(0.25 / N) / density, "median within 3 standard errors");
    }
}
