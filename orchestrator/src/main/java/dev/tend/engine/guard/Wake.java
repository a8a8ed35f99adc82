package dev.tend.engine.guard;

/** What can change a guard's objection, so that a held candidate is looked at again only then. */
public enum Wake {
    /** A processing-time instant ({@link Objection#retryAt()}). */
    TIME,
    /** An event-time instant ({@link Objection#retryAtEventTime()}): when event time reaches it. */
    EVENT_TIME,
    /** Anything on the same cluster: a transition, a run starting or ending. */
    CLUSTER,
    /** Anything fleet-wide: a run ending anywhere, the brake changing. */
    FLEET,
    /** Only a person: removing an exclusion, clearing a loop, answering an approval. */
    HUMAN
}
