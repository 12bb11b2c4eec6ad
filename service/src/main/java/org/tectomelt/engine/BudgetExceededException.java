package org.tectomelt.engine;

import java.time.Duration;

/**
 * Thrown by {@link Deadline#check()} when a computation has used up its wall-clock budget. The
 * work is abandoned; the HTTP layer answers 503 {@code /problems/over-budget}. Engine code lets it
 * propagate (catching it would keep a thread busy that the server has already given up on).
 */
public final class BudgetExceededException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final transient Duration budget;

    /** @param budget the budget that was spent */
    public BudgetExceededException(Duration budget) {
        super("The computation did not finish within its wall-clock budget of " + describe(budget)
                + " and was abandoned");
        this.budget = budget;
    }

    /**
     * @param budget  the budget the computation had
     * @param message why it was abandoned before the budget was spent (the server is stopping)
     */
    public BudgetExceededException(Duration budget, String message) {
        super(message);
        this.budget = budget;
    }

    /** The budget that was spent. */
    public Duration budget() {
        return budget;
    }

    private static String describe(Duration d) {
        long ms = d.toMillis();
        return ms % 1000 == 0 ? (ms / 1000) + " s" : ms + " ms";
    }
}
