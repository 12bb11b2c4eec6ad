package org.tectomelt.operations;

import java.util.List;

/**
 * A request that breaks a rule (of the spec, or one the operation states: a rule across fields, a
 * limit of the chosen model, a server cap). Every violation is reported at once; the HTTP skin
 * answers 400 {@code /problems/validation} listing them.
 */
public final class OperationException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final transient List<Violation> violations;

    /** @param violations at least one */
    public OperationException(List<Violation> violations) {
        super(violations.size() == 1 ? violations.get(0).field() + ": " + violations.get(0).message()
                : violations.size() + " fields are invalid");
        if (violations.isEmpty()) {
            throw new IllegalArgumentException("no violation");
        }
        this.violations = List.copyOf(violations);
    }

    /** One violation. */
    public OperationException(String field, String message) {
        this(List.of(new Violation(field, message)));
    }

    /** The violations, in the order found. */
    public List<Violation> violations() {
        return violations;
    }
}
