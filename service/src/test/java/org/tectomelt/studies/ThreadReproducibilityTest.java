package org.tectomelt.studies;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.settings.MidOceanRidge;
import org.tectomelt.engine.units.Units;

/**
 * The same seed gives bit-identical studies on 1, 2 and 4 threads (REFERENCES §5: each sample's
 * generator from (seed, index) alone), here on the mid-ocean-ridge crust with two uncertain inputs.
 */
class ThreadReproducibilityTest {

    private static final StudyModel RIDGE = in -> {
        MidOceanRidge.Result r = new MidOceanRidge(Katz2003Peridotite.fertile(),
                Units.celsiusToKelvin(in.get("potentialTemperatureC")), Units.wtPctToFraction(in.get("bulkWaterWtPct")),
                Units.mmPerYrToMPerS(50)).solve();
        return Map.of("crustalThicknessKm", Units.mToKm(r.crustalThickness()));
    };

    private static final UncertainInputs INPUTS = UncertainInputs.of(Map.of(
            "potentialTemperatureC", new Distribution.Normal(1350, 25),
            "bulkWaterWtPct", new Distribution.Uniform(0, 0.02)), Map.of(
            "potentialTemperatureC", FieldRange.closed(1000, 1800), "bulkWaterWtPct", FieldRange.closed(0, 5)),
            "uncertainty.inputs.");

    @Test
    void oneTwoAndFourThreadsGiveIdenticalResults() throws Exception {
        Object[] forward = new Object[3];
        Object[] posterior = new Object[3];
        Object[] sampled = new Object[3];
        int[] threads = {1, 2, 4};
        for (int t = 0; t < 3; t++) {
            ExecutorService pool = Executors.newFixedThreadPool(threads[t]);
            try {
                Workers w = Workers.on(pool, threads[t]);
                forward[t] = MonteCarlo.run(RIDGE, INPUTS, Map.of("crustalThicknessKm", "km"), 150, 42, w,
                        Deadline.none());
                UncertainInputs water = INPUTS.without("potentialTemperatureC");
                posterior[t] = PosteriorInversion.run(RIDGE, new PosteriorInversion.Setup("potentialTemperatureC",
                        FieldRange.closed(1000, 1800), 1300, 1400, 11, Map.of("crustalThicknessKm",
                        new Observation(7.1, 0.8)), water, 8, 42), w, Deadline.none());
                sampled[t] = SamplingInversion.run(RIDGE, new SamplingInversion.Setup("potentialTemperatureC", "°C",
                        FieldRange.closed(1000, 1800), 1250, 1450, "crustalThicknessKm", new Observation(7.1, 0.8),
                        water, 12, 42, 6), w, Deadline.none());
            } finally {
                pool.shutdownNow();
            }
        }
        for (int t = 1; t < 3; t++) {
            // records compare every double with Double.equals: bit for bit
            assertEquals(forward[0], forward[t], threads[t] + " threads, forward");
            assertEquals(posterior[0], posterior[t], threads[t] + " threads, posterior");
            assertEquals(sampled[0], sampled[t], threads[t] + " threads, sampling");
        }
        MonteCarlo.Result r = (MonteCarlo.Result) forward[0];
        assertEquals(150, r.summaries().get("crustalThicknessKm").n());
        assertEquals(42, r.seed());
    }

    @Test
    void blocksComputedApartAssembleToTheSameResultAsOneRun() {
        StudyModel model = in -> Map.of("y", Math.exp(in.get("potentialTemperatureC") / 1000)
                + in.get("bulkWaterWtPct"));
        Map<String, String> outputs = Map.of("y", "1");
        MonteCarlo.Result whole = MonteCarlo.run(model, INPUTS, outputs, 300, 5, Workers.serial(), Deadline.none());
        MonteCarlo.Result parts = MonteCarlo.summarise(5, outputs, java.util.List.of(
                MonteCarlo.evaluate(model, INPUTS, java.util.List.of("y"), 5, 200, 300, Workers.serial(), Deadline.none()),
                MonteCarlo.evaluate(model, INPUTS, java.util.List.of("y"), 5, 0, 120, Workers.serial(), Deadline.none()),
                MonteCarlo.evaluate(model, INPUTS, java.util.List.of("y"), 5, 120, 200, Workers.serial(),
                        Deadline.none())));
        assertEquals(whole, parts);

        UncertainInputs water = INPUTS.without("potentialTemperatureC");
        PosteriorInversion.Setup ps = new PosteriorInversion.Setup("potentialTemperatureC",
                FieldRange.closed(1000, 1800), 1300, 1400, 9, Map.of("y", new Observation(3.8, 0.05)), water, 20, 5);
        java.util.List<PosteriorInversion.GridPoint> points = new java.util.ArrayList<>();
        for (int j = 8; j >= 0; j--) {
            points.add(PosteriorInversion.evaluate(model, ps, j, Deadline.none()));
        }
        assertEquals(PosteriorInversion.run(model, ps, Workers.serial(), Deadline.none()),
                PosteriorInversion.assemble(ps, points));

        SamplingInversion.Setup ss = new SamplingInversion.Setup("potentialTemperatureC", "°C",
                FieldRange.closed(1000, 1800), 1250, 1450, "y", new Observation(3.8, 0.05), water, 50, 5, 8);
        assertEquals(SamplingInversion.run(model, ss, Workers.serial(), Deadline.none()),
                SamplingInversion.assemble(ss, java.util.List.of(
                        SamplingInversion.evaluate(model, ss, 30, 50, Workers.serial(), Deadline.none()),
                        SamplingInversion.evaluate(model, ss, 0, 30, Workers.serial(), Deadline.none()))));
    }
}
