package org.tectomelt.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.Test;

/** The list results build on first read (engine unit tests). */
class DeferredListTest {

    @Test
    void nothingIsBuiltUntilTheListIsReadAndThenOnlyOnce() {
        AtomicInteger builds = new AtomicInteger();
        List<String> l = DeferredList.of(() -> {
            builds.incrementAndGet();
            return List.of("a", "b");
        });
        assertEquals(0, builds.get());
        assertFalse(((DeferredList<String>) l).isBuilt());
        assertEquals(2, l.size());
        assertEquals("b", l.get(1));
        assertEquals(List.of("a", "b"), l);
        assertEquals(List.of("a", "b").hashCode(), l.hashCode());
        assertEquals(List.of("a", "b"), new ArrayList<>(l));
        assertEquals(1, builds.get());
        assertTrue(((DeferredList<String>) l).isBuilt());
    }

    @Test
    void itIsImmutableAndCopiesWhatItsBuilderGave() {
        List<String> source = new ArrayList<>(List.of("x"));
        List<String> l = DeferredList.of(() -> source);
        assertEquals(List.of("x"), l);
        source.add("y");
        assertEquals(List.of("x"), l);
        assertThrows(UnsupportedOperationException.class, () -> l.add("z"));
        assertThrows(UnsupportedOperationException.class, () -> l.set(0, "z"));
    }

    @Test
    void aRecordsDefensiveCopyKeepsItDeferredAndCopiesOtherLists() {
        AtomicInteger builds = new AtomicInteger();
        List<Integer> deferred = DeferredList.of(() -> {
            builds.incrementAndGet();
            return List.of(1);
        });
        assertSame(deferred, DeferredList.copyOf(deferred));
        assertEquals(0, builds.get());
        List<Integer> plain = new ArrayList<>(List.of(1, 2));
        List<Integer> copy = DeferredList.copyOf(plain);
        plain.add(3);
        assertEquals(List.of(1, 2), copy);
    }

    @Test
    void threadsReadingAtOnceSeeOneBuild() throws Exception {
        AtomicInteger builds = new AtomicInteger();
        List<Integer> l = DeferredList.of(() -> {
            builds.incrementAndGet();
            return List.of(7, 8, 9);
        });
        CountDownLatch go = new CountDownLatch(1);
        List<Thread> threads = new ArrayList<>();
        List<Integer> sums = java.util.Collections.synchronizedList(new ArrayList<>());
        for (int t = 0; t < 8; t++) {
            Thread th = new Thread(() -> {
                try {
                    go.await();
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
                sums.add(l.stream().mapToInt(Integer::intValue).sum());
            });
            th.start();
            threads.add(th);
        }
        go.countDown();
        for (Thread th : threads) {
            th.join();
        }
        assertEquals(1, builds.get());
        assertEquals(java.util.Collections.nCopies(8, 24), sums);
    }
}
