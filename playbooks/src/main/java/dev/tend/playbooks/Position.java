package dev.tend.playbooks;

/** Where something was written in its file: 1-based line and column, 0 when not known. */
public record Position(int line, int column) {
    public static final Position UNKNOWN = new Position(0, 0);

    public Position {
        if (line < 0 || column < 0) {
            throw new IllegalArgumentException("position line and column must be >= 0, got " + line + ":" + column);
        }
    }

    @Override
    public String toString() {
        return line + ":" + column;
    }
}
