package dev.tend.shared.yaml;

/**
 * A node of a YAML (or JSON) document that remembers where it was written, so that every
 * problem can be reported as {@code FILE:LINE:COL}. Line and column are 1-based.
 */
public sealed interface YNode permits YMap, YList, YScalar {
    int line();

    int column();

    /** A short name of the node's kind for messages: "a mapping", "a list", "a value". */
    String kind();
}
