package dev.tend.shared.yaml;

/**
 * A document read one {@link NodeEvent} at a time; syntax errors are thrown as located
 * {@link dev.tend.shared.InvalidInputException}s. After the document's last node,
 * {@link #next()} returns an event of type END.
 */
interface NodeEvents extends AutoCloseable {
    NodeEvent next();

    @Override
    void close();
}
