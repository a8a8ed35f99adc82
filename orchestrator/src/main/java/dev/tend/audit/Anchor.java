package dev.tend.audit;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;

/**
 * A head of the ledger kept outside tend ({@code seq:hash}, as {@code tend audit anchor}
 * prints it): a later verification checks that entry {@code seq} still has that hash.
 */
public record Anchor(long seq, String hash) {
    public Anchor {
        if (seq < 1) throw new IllegalArgumentException("an anchor's seq is 1 or more, got " + seq);
        if (!hash.matches("[0-9a-f]{64}")) throw new IllegalArgumentException("an anchor's hash is 64 lowercase hex digits");
    }

    /** Reads {@code seq:hash}; {@code option} names it in the problem. */
    public static Anchor parse(String option, String text) {
        int colon = text.indexOf(':');
        try {
            if (colon > 0) return new Anchor(Long.parseLong(text.substring(0, colon)), text.substring(colon + 1));
        } catch (IllegalArgumentException e) {
            // answered below
        }
        throw new InvalidInputException(Problem.at(option, 0, 0, option.replaceFirst("^--", ""), "'" + text
                + "' is not an anchor: it looks like 1234:<64 hex digits>, as tend audit anchor prints it"));
    }

    @Override
    public String toString() {
        return seq + ":" + hash;
    }
}
