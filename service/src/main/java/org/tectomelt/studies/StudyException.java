package org.tectomelt.studies;

import java.util.List;
import java.util.stream.Collectors;

/**
 * A study cannot start as asked (a distribution leaving its field's range, a bad grid, an unknown
 * output): every problem at once, each naming its field. The skin maps it to a 400.
 */
public final class StudyException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final transient List<InputProblem> problems;

    /** @param problems at least one problem */
    public StudyException(List<InputProblem> problems) {
        super(problems.stream().map(p -> p.field() + ": " + p.message()).collect(Collectors.joining("; ")));
        if (problems.isEmpty()) {
            throw new IllegalArgumentException("a StudyException needs at least one problem");
        }
        this.problems = List.copyOf(problems);
    }

    /** A single problem. */
    public StudyException(String field, String message) {
        this(List.of(new InputProblem(field, message)));
    }

    /** The problems, in the order found. */
    public List<InputProblem> problems() {
        return problems;
    }

    /** Throws when {@code problems} is not empty. */
    static void throwIfAny(List<InputProblem> problems) {
        if (!problems.isEmpty()) {
            throw new StudyException(problems);
        }
    }
}
