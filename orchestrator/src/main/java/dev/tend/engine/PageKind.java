package dev.tend.engine;

/** What a page is about: the {@code kind} of an {@link Effect.Notify} and of its ledger entry. */
public final class PageKind {
    /** The fleet brake engaged (one page per episode, with the count). */
    public static final String BRAKE = "brake";
    /** A signal flaps; its playbook holds. */
    public static final String FLAPPING = "flapping";
    /** A playbook keeps remediating the same target; automation stopped there. */
    public static final String LOOP = "loop";
    /** A playbook's own page step (often in on-failure). */
    public static final String PLAYBOOK = "playbook";
    /** A page step of a playbook's {@code on-stand-down}: the run found itself no longer needed (or no longer allowed) and stood down. */
    public static final String STOOD_DOWN = "stood-down";
    /** A run stopped for a person. */
    public static final String NEEDS_HUMAN = "needs-human";
    /** A run waits for an approval. */
    public static final String APPROVAL_REQUESTED = "approval-requested";
    /** An approval is about to lapse unanswered. */
    public static final String APPROVAL_LAPSING = "approval-lapsing";
    /** A test page sent by an operator ({@code tend page test}). */
    public static final String TEST = "test";

    private PageKind() {
    }
}
