package dev.tend.engine;

import java.util.Objects;

/**
 * The engine's answer to an operator command ({@link Input.Command}), given once with its
 * effects ({@link Effect.Answered}): done, refused with the reason, or not found. The API maps
 * it to an HTTP status in one place ({@code dev.tend.api.CommandAnswers}), and the CLI maps
 * that status to an exit code in one place ({@code dev.tend.cli.ExitCodes#forFailure}).
 */
public sealed interface CommandAnswer {
    /** The command was carried out. */
    record Done() implements CommandAnswer {
    }

    /** The engine would not carry it out; {@code reason} is a sentence for the person who asked. */
    record Refused(Refusal why, String reason) implements CommandAnswer {
        public Refused {
            Objects.requireNonNull(why, "why");
            Objects.requireNonNull(reason, "reason");
        }
    }

    /** What the command names does not exist (no such run, no approval asked, no exclusion). */
    record NotFound(String reason) implements CommandAnswer {
        public NotFound {
            Objects.requireNonNull(reason, "reason");
        }
    }

    /** Why a command was refused. */
    enum Refusal {
        /** An exclusion of a cluster outside the topology (a mistake in the request, most often a typo). */
        UNKNOWN_CLUSTER,
        /** An exclusion of a node outside its cluster's topology. */
        UNKNOWN_NODE,
        /** The command's values cannot make what it asks for (an exclusion that would end before it starts). */
        INVALID,
        /** The approval was decided already, lapsed or was withdrawn. */
        NOT_PENDING,
        /** Whoever requested a run cannot approve it. */
        TWO_PERSON_RULE,
        /** A release of a brake that is not engaged. */
        NOT_ENGAGED,
        /** An abort of a run that already ended. */
        ENDED
    }

    static CommandAnswer done() {
        return new Done();
    }
}
