package org.tectomelt.runs;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;

/** The gate background points pass before each point: it waits for requests in flight, bounded. */
class InteractiveLoadTest {

    @Test
    void withNothingInFlightAWorkerDoesNotWait() {
        InteractiveLoad load = new InteractiveLoad();
        assertEquals(0, load.yieldToInteractive());
        load.begin();
        load.end();
        assertEquals(0, load.inFlight());
        assertEquals(0, load.yieldToInteractive());
    }

    @Test
    void aWaitingWorkerGoesOnWhenTheLastRequestEnds() throws Exception {
        InteractiveLoad load = new InteractiveLoad();
        load.begin();
        load.begin();
        CompletableFuture<Long> waited = CompletableFuture.supplyAsync(load::yieldToInteractive);
        assertTrue(load.awaitWaiter(5_000), "the worker waits while requests are in flight");
        load.end();
        load.end();
        long nanos = waited.get(5, TimeUnit.SECONDS);
        assertTrue(nanos > 0, "it did wait");
        assertEquals(0, load.inFlight());
    }

    @Test
    void aWorkerWaitsAtMostTheBoundWhileARequestStaysInFlight() throws Exception {
        InteractiveLoad load = new InteractiveLoad();
        load.begin();
        long nanos = CompletableFuture.supplyAsync(load::yieldToInteractive).get(5, TimeUnit.SECONDS);
        assertTrue(nanos >= InteractiveLoad.MAX_YIELD_NANOS, "waited the whole bound: " + nanos);
        assertEquals(1, load.inFlight());
        load.end();
    }
}
