package dev.tend.api;

import dev.tend.engine.CommandAnswer;
import dev.tend.engine.Effect;
import dev.tend.shared.TendException;

import java.util.List;

/**
 * The one place an engine's {@link CommandAnswer} becomes an HTTP answer: done goes on to the
 * route's body; not found is 404 ({@link NotFoundException}); a refusal is 409
 * ({@link RefusedException}) with the engine's reason, except a request that names a cluster or
 * node outside the topology or values that cannot make an exclusion, which is the caller's
 * mistake: 400 naming the field. {@link ApiErrors} turns the exceptions into bodies.
 */
final class CommandAnswers {
    private CommandAnswers() {
    }

    /** The answer among {@code effects} (the engine gives exactly one per command). */
    static CommandAnswer of(List<Effect> effects) {
        for (Effect e : effects) if (e instanceof Effect.Answered a) return a.answer();
        throw new TendException("the engine gave no answer to an operator command");
    }

    /** Returns when the command in {@code effects} was done; else throws what the API answers. */
    static void requireDone(List<Effect> effects) {
        CommandAnswer answer = of(effects);
        if (answer instanceof CommandAnswer.NotFound n) throw new NotFoundException(n.reason());
        if (answer instanceof CommandAnswer.Refused r) {
            throw switch (r.why()) {
                case UNKNOWN_CLUSTER -> Requests.invalid("cluster", r.reason());
                case UNKNOWN_NODE -> Requests.invalid("node", r.reason());
                case INVALID -> Requests.invalid("exclusion", r.reason());
                case NOT_PENDING, TWO_PERSON_RULE, NOT_ENGAGED, ENDED -> new RefusedException(r.reason());
            };
        }
    }
}
