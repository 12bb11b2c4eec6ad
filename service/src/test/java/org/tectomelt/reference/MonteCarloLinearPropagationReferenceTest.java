package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.units.Units;
import org.tectomelt.studies.Distribution;
import org.tectomelt.studies.FieldRange;
import org.tectomelt.studies.MonteCarlo;
import org.tectomelt.studies.StudyModel;
import org.tectomelt.studies.Summary;
import org.tectomelt.studies.UncertainInputs;

/**
 * Forward Monte Carlo through a linear relation against its closed form: lithostatic pressure
 * P = ρ g z (Turcotte &amp; Schubert 2014, §2.2) at 100 km with an uncertain mantle density.
 *
 * <p>Sources: for a + bX with X ~ normal(μ, σ): mean a + bμ, sd |b|σ, and for X ~ uniform(a, b):
 * mean (a + b)/2, sd (b − a)/√12 (REFERENCES §5, common practice). Tolerances are three Monte
 * Carlo standard errors (REFERENCES §5): sd/√n for the mean, sd/√(2(n − 1)) for the sd of a normal
 * output (common practice), √(p(1 − p)/n)/f(x_p) for a percentile; never a tolerance tuned to a seed.
 */
class MonteCarloLinearPropagationReferenceTest {

    private static final double DEPTH_M = 100e3;
    private static final int N = 20_000;
    /** Pressure (GPa) at 100 km in a mantle-only column of the given density (kg/m³). */
    private static final StudyModel PRESSURE = in -> Map.of("pressureGPa", Units.paToGpa(
            new LithostaticColumn(0, LithostaticColumn.CRUST_DENSITY, in.get("mantleDensityKgPerM3"),
                    LithostaticColumn.G).pressureAt(DEPTH_M)));

    private static Summary run(Distribution density) {
        UncertainInputs inputs = UncertainInputs.of(Map.of("mantleDensityKgPerM3", density),
                Map.of("mantleDensityKgPerM3", FieldRange.closed(2000, 4500)), "uncertainty.inputs.");
        MonteCarlo.Result r = MonteCarlo.run(PRESSURE, inputs, Map.of("pressureGPa", "GPa"), N, 42,
                StudyWorkers.two(), Deadline.none());
        assertEquals(N, r.evaluated(), "no draw leaves [2000, 4500] kg/m³ at mean ± 4 sd");
        assertEquals(0, r.failed());
        return r.summaries().get("pressureGPa");
    }

    @Test
    void normalDensityGivesTheClosedFormMeanSdAndPercentiles() {
        double mu = 3300;
        double sigma = 50;
        Summary s = run(new Distribution.Normal(mu, sigma));
        double b = LithostaticColumn.G * DEPTH_M / 1e9; // GPa per kg/m³
        double mean = b * mu;  // a + bμ with a = 0
        double sd = b * sigma; // |b|σ
        assertEquals(N, s.n());
        assertEquals(mean, s.mean(), 3 * sd / Math.sqrt(N), "mean within 3 standard errors");
        assertEquals(sd, s.sd(), 3 * sd / Math.sqrt(2.0 * (N - 1)), "sd within 3 standard errors");
        // percentiles of a normal output: μ + z_p σ, z_0.16 = −0.994458, z_0.5 = 0 (standard normal table)
        double z84 = 0.994458;
        double f84 = Math.exp(-0.5 * z84 * z84) / (Math.sqrt(2 * Math.PI) * sd);
        double f50 = 1 / (Math.sqrt(2 * Math.PI) * sd);
        double se84 = Math.sqrt(0.16 * 0.84 / N) / f84;
        double se50 = Math.sqrt(0.25 / N) / f50;
        assertEquals(mean, s.p50(), 3 * se50, "median within 3 standard errors");
        assertEquals(mean - z84 * sd, s.p16(), 3 * se84, "16th percentile within 3 standard errors");
        assertEquals(mean + z84 * sd, s.p84(), 3 * se84, "84th percentile within 3 standard errors");
        assertEquals(3.2373, mean, 1e-4, "REFERENCES §1.1: 3300 kg/m³ × 9.81 m/s² × 100 km = 3.2373 GPa [calc]");
    }

    @Test
    void uniformDensityGivesTheClosedFormMeanAndSd() {
        Summary s = run(new Distribution.Uniform(3200, 3400));
        double b = LithostaticColumn.G * DEPTH_M / 1e9;
        double mean = b * (3200 + 3400) / 2;        // (a + b)/2
        double sd = b * (3400 - 3200) / Math.sqrt(12); // (b − a)/√12
        assertEquals(mean, s.mean(), 3 * sd / Math.sqrt(N), "mean within 3 standard errors");
        // the sd of a uniform sample: Var(s²) = (μ4 − σ⁴(n−3)/(n−1))/n with μ4 = 9σ⁴/5 (common practice)
        double seSd = sd * Math.sqrt((9.0 / 5 - (N - 3.0) / (N - 1)) / N) / 2;
        assertEquals(sd, s.sd(), 3 * seSd, "sd within 3 standard errors");
        assertEquals(b * 3200, s.min(), b * 200 * 10.0 / N, "smallest draw within a few 1/n of the lower end");
        assertEquals(b * 3400, s.max(), b * 200 * 10.0 / N, "largest draw within a few 1/n of the upper end");
    }
}
