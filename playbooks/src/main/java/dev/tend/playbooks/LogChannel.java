package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.time.Duration;
import java.util.Objects;

/** Writes each page as one line to tend's log (standard error). Always delivered; reaches nobody else. */
public record LogChannel(Id name) implements ChannelDef {
    public LogChannel {
        Objects.requireNonNull(name, "channel name");
    }

    @Override
    public String kind() {
        return "log";
    }

    @Override
    public Duration giveUpAfter() {
        return DEFAULT_GIVE_UP_AFTER;
    }
}
