package dev.tend.shared.yaml;

/**
 * One step of a YAML or JSON document read as a stream: the start or end of a mapping or
 * a list, a scalar, or an alias, with where it was written (1-based). {@code anchor} names
 * a node that an alias may refer to later; {@code value} is a scalar's text or an alias's
 * anchor name.
 */
record NodeEvent(Type type, String value, boolean quoted, boolean plainNull, String anchor, int line, int column) {
    enum Type { MAP_START, MAP_END, LIST_START, LIST_END, SCALAR, ALIAS, END }

    static NodeEvent of(Type type, String anchor, int line, int column) {
        return new NodeEvent(type, null, false, false, anchor, line, column);
    }
}
