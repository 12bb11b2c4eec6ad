package org.tectomelt.engine;

import java.time.Duration;
import java.util.Objects;
import java.util.function.LongSupplier;

/**
 * A wall-clock budget for one computation, polled cooperatively by the engine's long loops.
 *
 * <p>The HTTP layer gives every heavy request one ({@code Heavy.deadline(ctx)}) and hands it to the
 * engine; a loop that may run long calls {@link #check()} once per outer iteration (a time step of a
 * thermal model, a pressure step of a melting column, a point of a batch) and lets the
 * {@link BudgetExceededException} propagate. Nothing is interrupted from outside: work stops at
 * the next poll after the budget has run out, so poll often enough that the gap between two polls
 * stays well under a second, and not in the innermost per-cell loop, where a clock read
 * (a few tens of nanoseconds) would show.
 *
 * <pre>{@code
 * for (int step = 0; step < steps; step++) {
 *     deadline.check();             // throws BudgetExceededException when the budget is spent
 *     solver.advance(dt);           // one implicit step over all cells
 * }
 * }</pre>
 *
 * Engine methods take a {@code Deadline} parameter and offer an overload without it that passes
 * {@link #none()}, so unit tests and benchmarks need not care. Instances are thread-safe; the
 * budget is fixed, and the only change a deadline can undergo is {@link #cancel()} (a stopping
 * server gives up the work it can no longer answer), after which it counts as expired.
 */
public final class Deadline {

    private static final Deadline NONE = new Deadline(Long.MAX_VALUE, 0, System::nanoTime, true);

    private final long budgetNanos;
    private final long endNanos;
    private final LongSupplier clock;
    private final boolean unlimited;
    private volatile boolean cancelled;

    private Deadline(long budgetNanos, long endNanos, LongSupplier clock, boolean unlimited) {
        this.budgetNanos = budgetNanos;
        this.endNanos = endNanos;
        this.clock = clock;
        this.unlimited = unlimited;
    }

    /** A deadline that never expires (engine tests, benchmarks, cheap routes). */
    public static Deadline none() {
        return NONE;
    }

    /** A deadline {@code budget} from now, on {@link System#nanoTime()}. */
    public static Deadline after(Duration budget) {
        return after(budget, System::nanoTime);
    }

    /**
     * A deadline {@code budget} from now on the given clock (tests pass a fake one).
     *
     * @param budget    wall-clock budget, positive
     * @param nanoClock monotonic clock in nanoseconds, like {@link System#nanoTime()}
     */
    public static Deadline after(Duration budget, LongSupplier nanoClock) {
        Objects.requireNonNull(nanoClock, "nanoClock");
        long nanos = budget.toNanos();
        if (nanos <= 0) {
            throw new IllegalArgumentException("budget must be positive, got " + budget);
        }
        return new Deadline(nanos, nanoClock.getAsLong() + nanos, nanoClock, false);
    }

    /** True once the budget is spent or the deadline was cancelled. */
    public boolean expired() {
        // difference, not comparison, so that a wrapping nanoTime stays correct
        return cancelled || (!unlimited && clock.getAsLong() - endNanos >= 0);
    }

    /**
     * Ends the budget now: the next {@link #check()} throws. A stopping server cancels the heavy
     * work whose answers it can no longer send. {@link #none()} cannot be cancelled.
     */
    public void cancel() {
        if (!unlimited) {
            cancelled = true;
        }
    }

    /** True after {@link #cancel()}. */
    public boolean cancelled() {
        return cancelled;
    }

    /**
     * Polls the deadline.
     *
     * @throws BudgetExceededException when the budget is spent
     */
    public void check() {
        if (cancelled) {
            throw new BudgetExceededException(Duration.ofNanos(budgetNanos),
                    "The computation was cancelled: the server is stopping");
        }
        if (expired()) {
            throw new BudgetExceededException(Duration.ofNanos(budgetNanos));
        }
    }

    /** Time left (zero once expired; a very long duration for {@link #none()}). */
    public Duration remaining() {
        if (unlimited) {
            return Duration.ofNanos(Long.MAX_VALUE);
        }
        return Duration.ofNanos(Math.max(0, endNanos - clock.getAsLong()));
    }

    /** The whole budget this deadline was made with ({@link Duration#ZERO} for {@link #none()}). */
    public Duration budget() {
        return unlimited ? Duration.ZERO : Duration.ofNanos(budgetNanos);
    }

    /** True for {@link #none()}. */
    public boolean isUnlimited() {
        return unlimited;
    }

    @Override
    public String toString() {
        return unlimited ? "Deadline[none]" : "Deadline[budget=" + budget() + ", remaining=" + remaining() + "]";
    }
}
