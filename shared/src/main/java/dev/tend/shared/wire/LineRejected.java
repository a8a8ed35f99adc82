package dev.tend.shared.wire;

/**
 * Why a line was rejected, raised while taking it apart and turned into a
 * {@link dev.tend.shared.Problem} by the reader, which knows the source and line number.
 * Carries no stack trace: it is an expected outcome for bad input, not a fault.
 */
final class LineRejected extends Exception {
    final int column;
    final String field;

    LineRejected(int column, String field, String message) {
        super(message, null, false, false);
        this.column = Math.max(column, 0);
        this.field = field;
    }
}
