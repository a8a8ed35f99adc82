package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.time.Duration;

/**
 * Where pages go: a channel defined once in tend.yaml ({@code channels:}) and named by
 * playbooks and by the fleet-wide policies. A page is delivered at least once: the outbox
 * tries again until the receiver accepts it or {@link #giveUpAfter()} has passed since it
 * was ledgered.
 */
public sealed interface ChannelDef permits WebhookChannel, EmailChannel, CommandChannel, LogChannel {
    /** The default for {@link #giveUpAfter()}. */
    Duration DEFAULT_GIVE_UP_AFTER = Duration.ofHours(24);

    Id name();

    /** webhook, email, command or log. */
    String kind();

    /** How long after its page was ledgered delivery is given up (ledgered as failed). */
    Duration giveUpAfter();

    static void checkGiveUp(Id name, Duration giveUpAfter) {
        if (giveUpAfter == null || giveUpAfter.isNegative() || giveUpAfter.isZero()) {
            throw new IllegalArgumentException("channel " + name + " give-up-after must be longer than zero, got " + giveUpAfter);
        }
    }
}
