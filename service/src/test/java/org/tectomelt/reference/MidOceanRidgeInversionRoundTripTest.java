package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.settings.MidOceanRidge;
import org.tectomelt.engine.units.Units;
import org.tectomelt.studies.FieldRange;
import org.tectomelt.studies.Observation;
import org.tectomelt.studies.PosteriorInversion;
import org.tectomelt.studies.SamplingInversion;
import org.tectomelt.studies.StudyModel;
import org.tectomelt.studies.UncertainInputs;

/**
 * Inversion round trip on the mid-ocean-ridge crust (McKenzie &amp; Bickle 1988 column with the
 * Katz et al. 2003 dry peridotite, REFERENCES §2.1, §2.5): compute the crust at a chosen potential
 * temperature, then invert that crust back to the potential temperature.
 *
 * <p>Sources: with a precise observation both methods must return the temperature it came from;
 * for f locally linear, f ≈ a + bθ, and an observation with sd σ the posterior is normal with
 * sd σ/|b| away from the bounds (REFERENCES §5, [calc identity]), and so is the spread of the
 * sampled roots (θ = (y − a)/b with y ~ normal). The crust is near-linear in Tp over ±15 K
 * around 1350 °C (checked below), so 10 % is ample for the curvature left.
 */
class MidOceanRidgeInversionRoundTripTest {

    private static final double TP_C = 1350;
    private static final double RATE_MM_PER_YR = 60;
    private static double crustKm(double tpC) {
        return Units.mToKm(new MidOceanRidge(Katz2003Peridotite.fertile(), Units.celsiusToKelvin(tpC), 0.0,
                Units.mmPerYrToMPerS(RATE_MM_PER_YR)).solve().crustalThickness());
    }

    private static final StudyModel RIDGE = in -> Map.of("crustalThicknessKm", crustKm(in.get("potentialTemperatureC")));
    private static final FieldRange TP_RANGE = FieldRange.closed(1000, 1800);

    @Test
    void aPreciseObservationSamplesBackToItsPotentialTemperatureWithin0_1K() {
        double crust = crustKm(TP_C);
        SamplingInversion.Result r = SamplingInversion.run(RIDGE, new SamplingInversion.Setup(
                "potentialTemperatureC", "°C", TP_RANGE, 1250, 1450, "crustalThicknessKm",
                new Observation(crust, 1e-5), UncertainInputs.none(), 20, 1, 16), StudyWorkers.two(),
                Deadline.none());
        assertEquals(20, r.solved());
        assertEquals(TP_C, r.summary().mean(), 0.1, "round trip within 0.1 K");
        assertTrue(r.summary().sd() < 0.01, "a 10 m crust sd leaves under 0.01 K of spread, got " + r.summary().sd());
    }

    @Test
    void aPreciseObservationHasItsPosteriorModeAtThatPotentialTemperatureWithin0_1K() {
        double crust = crustKm(TP_C);
        PosteriorInversion.Result r = PosteriorInversion.run(RIDGE, new PosteriorInversion.Setup(
                "potentialTemperatureC", TP_RANGE, 1251, 1451, 101, Map.of("crustalThicknessKm",
                new Observation(crust, 1e-3)), UncertainInputs.none(), 1, 1), StudyWorkers.two(), Deadline.none());
        assertNotNull(r.estimate());
        assertEquals(TP_C, r.estimate().mode(), 0.1, "mode within 0.1 K (the grid spacing is 2 K)");
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("narrower than two grid spacings")),
                "says the posterior is narrower than the grid: " + r.warnings());
    }

    @Test
    void posteriorAndSampledSdAreSigmaOverTheSlopeWithinTenPercent() {
        double slope = (crustKm(TP_C + 10) - crustKm(TP_C - 10)) / 20; // km per K
        double slopeNear = (crustKm(TP_C + 1) - crustKm(TP_C - 1)) / 2;
        assertEquals(slope, slopeNear, 0.03 * Math.abs(slope), "near-linear: the slope over ±10 K and ±1 K agree");
        double sigma = 0.3; // km
        double expected = sigma / Math.abs(slope);
        Observation obs = new Observation(crustKm(TP_C), sigma);

        PosteriorInversion.Result post = PosteriorInversion.run(RIDGE, new PosteriorInversion.Setup(
                "potentialTemperatureC", TP_RANGE, 1300, 1400, 201, Map.of("crustalThicknessKm", obs),
                UncertainInputs.none(), 1, 1), StudyWorkers.two(), Deadline.none());
        assertEquals(expected, post.estimate().sd(), 0.10 * expected, "posterior sd ≈ σ/|d crust/d Tp|");
        assertEquals(TP_C, post.estimate().mean(), 0.1 * expected, "posterior centred on the true Tp");
        assertTrue(post.massAtMin() < 1e-4 && post.massAtMax() < 1e-4, "the bounds are far in the tails");

        SamplingInversion.Result sampled = SamplingInversion.run(RIDGE, new SamplingInversion.Setup(
                "potentialTemperatureC", "°C", TP_RANGE, 1250, 1450, "crustalThicknessKm", obs,
                UncertainInputs.none(), 1000, 3, 16), StudyWorkers.two(), Deadline.none());
        assertEquals(1000, sampled.solved());
        // three standard errors of a sd from 1000 normal draws: 3/√(2·999) ≈ 6.7 % (REFERENCES §5), inside 10 %
        assertEquals(expected, sampled.summary().sd(), 0.10 * expected, "sampled roots' sd ≈ σ/|d crust/d Tp|");
    }
}
