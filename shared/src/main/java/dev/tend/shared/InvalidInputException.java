package dev.tend.shared;

import java.util.List;

/**
 * Input that tend cannot accept: a file, a request body or an option. Carries every
 * located problem found, not only the first, so a person can fix them all in one pass.
 */
public class InvalidInputException extends TendException {
    private final List<Problem> problems;

    public InvalidInputException(List<Problem> problems) {
        super(summarise(problems));
        if (problems.isEmpty()) {
            throw new IllegalArgumentException("an InvalidInputException needs at least one problem");
        }
        this.problems = List.copyOf(problems);
    }

    public InvalidInputException(Problem problem) {
        this(List.of(problem));
    }

    /** Every problem, in the order found. Never empty. */
    public List<Problem> problems() {
        return problems;
    }

    private static String summarise(List<Problem> problems) {
        StringBuilder sb = new StringBuilder();
        for (Problem p : problems) {
            if (sb.length() > 0) sb.append('\n');
            sb.append(p);
        }
        return sb.toString();
    }
}
