package org.tectomelt.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.concurrent.atomic.AtomicLong;
import org.junit.jupiter.api.Test;

/** The cooperative wall-clock budget, on a fake clock. */
class DeadlineTest {

    @Test
    void expiresExactlyWhenTheBudgetIsSpent() {
        AtomicLong now = new AtomicLong(1_000);
        Deadline d = Deadline.after(Duration.ofMillis(50), now::get);
        assertFalse(d.expired());
        d.check();
        assertEquals(Duration.ofMillis(50), d.remaining());
        now.addAndGet(49_999_999);
        assertFalse(d.expired());
        assertEquals(Duration.ofNanos(1), d.remaining());
        now.addAndGet(1);
        assertTrue(d.expired());
        assertEquals(Duration.ZERO, d.remaining());
        BudgetExceededException e = assertThrows(BudgetExceededException.class, d::check);
        assertEquals(Duration.ofMillis(50), e.budget());
        assertTrue(e.getMessage().contains("50 ms"), e.getMessage());
    }

    @Test
    void survivesAWrappingNanoClock() {
        AtomicLong now = new AtomicLong(Long.MAX_VALUE - 10);
        Deadline d = Deadline.after(Duration.ofNanos(100), now::get);
        now.addAndGet(50);   // wraps to negative
        assertFalse(d.expired());
        now.addAndGet(50);
        assertTrue(d.expired());
    }

    @Test
    void noneNeverExpires() {
        Deadline none = Deadline.none();
        none.check();
        assertFalse(none.expired());
        assertTrue(none.isUnlimited());
        assertEquals(Duration.ZERO, none.budget());
    }

    @Test
    void aLoopThatPollsIsAbandonedSoonAfterTheBudget() {
        AtomicLong now = new AtomicLong();
        Deadline d = Deadline.after(Duration.ofSeconds(1), now::get);
        int steps = 0;
        try {
            for (; steps < 1_000_000; steps++) {
                d.check();
                now.addAndGet(1_000_000);   // each step "takes" 1 ms
            }
        } catch (BudgetExceededException expected) {
            // abandoned
        }
        assertEquals(1_000, steps);
    }

    @Test
    void refusesANonPositiveBudget() {
        assertThrows(IllegalArgumentException.class, () -> Deadline.after(Duration.ZERO));
        assertThrows(IllegalArgumentException.class, () -> Deadline.after(Duration.ofMillis(-1)));
    }
}
