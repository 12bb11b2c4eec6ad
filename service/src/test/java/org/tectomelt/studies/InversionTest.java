package org.tectomelt.studies;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.EngineException;

/**
 * Both inversions on relations with known answers: a linear f = a + bθ, whose posterior is normal
 * with sd σ/|b| (REFERENCES §5 [calc identity]), and with a Gaussian nuisance a ~ normal(a0, τ)
 * sd √(σ² + τ²)/|b| (the variances of independent normals add [calc identity]); a parabola
 * reached twice; a maximum below the target; an observation out of reach at a bound.
 */
class InversionTest {

    private static final FieldRange THETA = FieldRange.closed(0, 20);
    private static final Map<String, FieldRange> NUISANCE_RANGES = Map.of("a", FieldRange.closed(-100, 100));

    private static StudyModel linear() {
        return in -> Map.of("y", in.getOrDefault("a", 2.0) + 0.5 * in.get("theta"));
    }

    private static PosteriorInversion.Result posterior(StudyModel m, double y, double sd, UncertainInputs nuisance,
                                                       int draws) {
        return PosteriorInversion.run(m, new PosteriorInversion.Setup("theta", THETA, 5, 15, 201,
                Map.of("y", new Observation(y, sd)), nuisance, draws, 8), Workers.serial(), Deadline.none());
    }

    private static SamplingInversion.Result sampling(StudyModel m, double y, double sd, UncertainInputs nuisance,
                                                     int n) {
        return SamplingInversion.run(m, new SamplingInversion.Setup("theta", "1", THETA, 5, 15, "y",
                new Observation(y, sd), nuisance, n, 8, 16), Workers.serial(), Deadline.none());
    }

    @Test
    void linearPosteriorIsNormalWithSdSigmaOverSlope() {
        PosteriorInversion.Result r = posterior(linear(), 7, 0.1, UncertainInputs.none(), 1);
        assertEquals(10, r.estimate().mean(), 1e-6);
        assertEquals(0.2, r.estimate().sd(), 0.002, "σ/|b| = 0.1/0.5; grid spacing 0.05 resolves it to 1 %");
        assertEquals(10, r.estimate().mode(), 1e-9);
        assertEquals(10 - 0.994458 * 0.2, r.estimate().p16(), 0.004, "μ − z₀.₈₄ σ (normal table)");
        assertEquals(10 + 1.959964 * 0.2, r.estimate().p97_5(), 0.004, "μ + z₀.₉₇₅ σ (normal table)");
        assertEquals(201, r.density().size());
        assertTrue(r.massAtMin() < 1e-12 && r.massAtMax() < 1e-12);
        assertEquals(List.of(10.0), r.roots().get("y"));
        assertTrue(r.warnings().isEmpty(), r.warnings().toString());
    }

    @Test
    void aGaussianNuisanceWidensThePosteriorAsTheVariancesAdd() {
        UncertainInputs a = UncertainInputs.of(Map.of("a", new Distribution.Normal(2, 0.1)), NUISANCE_RANGES,
                "uncertainty.inputs.");
        PosteriorInversion.Result r = posterior(linear(), 7, 0.1, a, 4000);
        double expected = Math.sqrt(0.1 * 0.1 + 0.1 * 0.1) / 0.5;
        // 4000 draws: the mixture's sd is itself Monte Carlo; 3 % is about three of its standard errors
        assertEquals(expected, r.estimate().sd(), 0.03 * expected);
        assertEquals(10, r.estimate().mean(), 0.03);
        SamplingInversion.Result s = sampling(linear(), 7, 0.1, a, 4000);
        assertEquals(4000, s.solved());
        assertEquals(expected, s.summary().sd(), 3 * expected / Math.sqrt(2 * 3999.0));
        assertEquals(10, s.summary().mean(), 3 * expected / Math.sqrt(4000));
    }

    @Test
    void aRelationReachedTwiceIsStatedByBothMethods() {
        StudyModel parabola = in -> Map.of("y", Math.pow(in.get("theta") - 10, 2));
        PosteriorInversion.Result p = posterior(parabola, 4, 0.2, UncertainInputs.none(), 1);
        assertEquals(2, p.roots().get("y").size());
        assertEquals(8, p.roots().get("y").get(0), 0.01);
        assertEquals(12, p.roots().get("y").get(1), 0.01);
        assertTrue(p.warnings().stream().anyMatch(w -> w.contains("not monotonic")), p.warnings().toString());
        assertTrue(p.warnings().stream().anyMatch(w -> w.contains("2 separate peaks")), p.warnings().toString());
        SamplingInversion.Result s = sampling(parabola, 4, 0.2, UncertainInputs.none(), 200);
        assertEquals(200, s.severalRoots());
        assertEquals(0, s.solved());
        assertNull(s.summary());
        assertTrue(s.warnings().stream().anyMatch(w -> w.contains("not monotonic")), s.warnings().toString());
    }

    @Test
    void aMaximumBelowTheTargetIsStated() {
        StudyModel cap = in -> Map.of("y", 3 - Math.pow(in.get("theta") - 10, 2));
        PosteriorInversion.Result p = posterior(cap, 5, 0.2, UncertainInputs.none(), 1);
        assertTrue(p.roots().get("y").isEmpty());
        assertTrue(p.warnings().stream().anyMatch(w -> w.contains("above the largest value")), p.warnings().toString());
        SamplingInversion.Result s = sampling(cap, 5, 0.2, UncertainInputs.none(), 100);
        assertEquals(100, s.noRootAbove());
        assertTrue(s.warnings().stream().anyMatch(w -> w.contains("above the largest value")), s.warnings().toString());
    }

    @Test
    void anObservationOutOfReachPilesTheMassAtTheBound() {
        StudyModel identity = in -> Map.of("y", in.get("theta"));
        PosteriorInversion.Result p = posterior(identity, 15.5, 0.5, UncertainInputs.none(), 1);
        assertEquals(15, p.estimate().mode());
        assertTrue(p.massAtMax() > 0.01, "mass in the last cell: " + p.massAtMax());
        assertTrue(p.warnings().stream().anyMatch(w -> w.contains("at the bound 15")), p.warnings().toString());
        assertTrue(p.warnings().stream().anyMatch(w -> w.contains("not decayed at solve.max")), p.warnings().toString());
    }

    @Test
    void failuresAreCountedAndLeftOutOfTheLikelihood() {
        StudyModel partial = in -> {
            if (in.get("theta") > 14) {
                throw new EngineException("theta above 14 is outside the model");
            }
            return Map.of("y", in.get("theta"));
        };
        PosteriorInversion.Result p = posterior(partial, 10, 0.5, UncertainInputs.none(), 1);
        assertEquals(20, p.failed(), "grid points 14.05 ... 15 (j = 181 ... 200)");
        assertEquals(Map.of("theta above … is outside the model", 20), p.failureReasons());
        assertEquals(10, p.estimate().mean(), 1e-3);
        SamplingInversion.Result s = sampling(partial, 10, 0.5, UncertainInputs.none(), 50);
        assertEquals(50, s.failed(), "the scan meets the failure at 15 for every draw");
    }

    @Test
    void theSolvedFieldMayNotAlsoBeANuisanceAndTheGridMustStayInTheRange() {
        UncertainInputs theta = UncertainInputs.of(Map.of("theta", new Distribution.Uniform(5, 6)),
                Map.of("theta", THETA), "uncertainty.inputs.");
        StudyException e = assertThrows(StudyException.class, () -> PosteriorInversion.run(linear(),
                new PosteriorInversion.Setup("theta", THETA, -5, 15, 2, Map.of("y", new Observation(7, 0)), theta,
                        10, 1), Workers.serial(), Deadline.none()));
        List<String> fields = e.problems().stream().map(InputProblem::field).toList();
        assertEquals(List.of("solve.min", "solve.gridPoints", "observed.y.sd", "uncertainty.inputs.theta"), fields);
    }
}
