package org.tectomelt.studies;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.HashMap;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.BudgetExceededException;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.EngineException;

/** Forward Monte Carlo bookkeeping: nothing is dropped silently. */
class MonteCarloTest {

    private static final Map<String, FieldRange> RANGES = Map.of("x", FieldRange.closed(0, 100), "y",
            FieldRange.closed(-10, 10));

    private static UncertainInputs inputs(Map<String, Distribution> d) {
        return UncertainInputs.of(d, RANGES, "uncertainty.inputs.");
    }

    @Test
    void failedSamplesAreCountedWithTheirReasonsAndAbsentOutputsCounted() {
        StudyModel model = in -> {
            double x = in.get("x");
            if (x > 80) {
                throw new EngineException("x above 80 cannot be computed");
            }
            Map<String, Double> out = new HashMap<>();
            out.put("twiceX", 2 * x);
            out.put("onsetKm", x > 50 ? x - 50 : null); // absent below 50, like an onset without melting
            return out;
        };
        MonteCarlo.Result r = MonteCarlo.run(model, inputs(Map.of("x", new Distribution.Uniform(0, 100))),
                Map.of("twiceX", "1", "onsetKm", "km"), 10_000, 3, Workers.serial(), Deadline.none());
        int failedByHand = 0;
        int absentByHand = 0;
        for (int i = 0; i < 10_000; i++) {
            double x = inputs(Map.of("x", new Distribution.Uniform(0, 100))).draw(3, i).values().get("x");
            failedByHand += x > 80 ? 1 : 0;
            absentByHand += x <= 50 ? 1 : 0;
        }
        assertEquals(failedByHand, r.failed());
        assertEquals(Map.of("x above … cannot be computed", failedByHand), r.failureReasons());
        assertEquals(10_000 - failedByHand, r.summaries().get("twiceX").n());
        assertEquals(absentByHand, r.absent().get("onsetKm"));
        assertEquals(10_000 - failedByHand - absentByHand, r.summaries().get("onsetKm").n());
        assertTrue(r.summaries().get("twiceX").max() <= 160);
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("failed")), r.warnings().toString());
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("onsetKm is absent")), r.warnings().toString());
    }

    @Test
    void aRareDrawOutsideTheRangeIsCountedNotClippedOrComputed() {
        // mean ± 4 sd = [-8, 8] fits in [-10, 10]; ±5 sd does not: about 5.7e-7 of draws leave it, so with 4 sd
        // admitted the test widens sd until a few leave: sd 2.4 → ±4.17 sd, P(outside) ≈ 3e-5
        Distribution d = new Distribution.Normal(0, 2.4);
        int n = 200_000;
        int[] computed = {0};
        StudyModel model = in -> {
            double y = in.get("y");
            assertTrue(y >= -10 && y <= 10, "never computed outside the range: " + y);
            synchronized (computed) {
                computed[0]++;
            }
            return Map.of("y", y);
        };
        MonteCarlo.Result r = MonteCarlo.run(model, inputs(Map.of("y", d)), Map.of("y", "1"), n, 99,
                Workers.serial(), Deadline.none());
        int outsideByHand = 0;
        for (int i = 0; i < n; i++) {
            double y = inputs(Map.of("y", d)).draw(99, i).values().get("y");
            outsideByHand += Math.abs(y) > 10 ? 1 : 0;
        }
        assertTrue(outsideByHand > 0, "the seed gives at least one draw outside (expected about 6)");
        assertEquals(outsideByHand, r.outOfRange().get("y"));
        assertEquals(n - outsideByHand, r.evaluated());
        assertEquals(n - outsideByHand, computed[0]);
        assertTrue(r.summaries().get("y").max() <= 10 && r.summaries().get("y").min() >= -10);
        assertTrue(r.warnings().get(0).contains("left their field's range"), r.warnings().toString());
    }

    @Test
    void aDistributionForAnUnknownOrBadFieldIsRefusedNamingEveryField() {
        StudyException e = assertThrows(StudyException.class, () -> inputs(Map.of(
                "z", new Distribution.Normal(0, 1), "x", new Distribution.Normal(50, 20))));
        assertEquals(2, e.problems().size());
        assertTrue(e.problems().stream().anyMatch(p -> p.field().equals("uncertainty.inputs.z")
                && p.message().contains("x, y")), e.problems().toString());
        assertTrue(e.problems().stream().anyMatch(p -> p.field().equals("uncertainty.inputs.x")
                && p.message().contains("truncatedNormal")), e.problems().toString());
    }

    @Test
    void aFaultInTheModelEndsTheStudyInsteadOfCountingAsAFailure() {
        StudyModel buggy = in -> {
            throw new IllegalStateException("a bug");
        };
        assertThrows(IllegalStateException.class, () -> MonteCarlo.run(buggy,
                inputs(Map.of("x", new Distribution.Uniform(0, 1))), Map.of("o", "1"), 10, 1, Workers.serial(),
                Deadline.none()));
        StudyModel fine = in -> Map.of("o", 1.0);
        // a clock that jumps 2 s per read: the 1 s budget is spent at the first poll
        Deadline expired = Deadline.after(java.time.Duration.ofSeconds(1), new java.util.function.LongSupplier() {
            private long t;

            @Override
            public long getAsLong() {
                return t += 2_000_000_000L;
            }
        });
        assertThrows(BudgetExceededException.class, () -> MonteCarlo.run(fine,
                inputs(Map.of("x", new Distribution.Uniform(0, 1))), Map.of("o", "1"), 10, 1, Workers.serial(),
                expired));
    }
}
