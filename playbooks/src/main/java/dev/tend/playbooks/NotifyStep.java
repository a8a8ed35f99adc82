package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.util.Objects;

/** Sends {@code message}, its placeholders filled in, to the notification channel {@code channel}. */
public record NotifyStep(Id id, Id channel, Template message) implements Step {
    public NotifyStep {
        Objects.requireNonNull(id, "step id");
        Objects.requireNonNull(channel, "step " + id + " notify");
        Objects.requireNonNull(message, "step " + id + " message");
        for (String p : message.placeholders()) {
            if (!Template.MESSAGE_PLACEHOLDERS.contains(p)) {
                throw new IllegalArgumentException("step " + id + " message uses unknown placeholder {" + p + "}");
            }
        }
    }

    @Override
    public String kind() {
        return "notify";
    }
}
