package dev.tend.api.view;

/** One rejected line of a request body: 1-based line and column (0: not known), the field, why. */
public record LineProblem(long line, int column, String field, String message) {
}
