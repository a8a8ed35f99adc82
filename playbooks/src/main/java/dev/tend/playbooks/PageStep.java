package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.util.Objects;

/** Pages {@code channel} (a rota such as {@code oncall}) with {@code message}, its placeholders filled in. */
public record PageStep(Id id, Id channel, Template message) implements Step {
    public PageStep {
        Objects.requireNonNull(id, "step id");
        Objects.requireNonNull(channel, "step " + id + " page");
        Objects.requireNonNull(message, "step " + id + " message");
        for (String p : message.placeholders()) {
            if (!Template.MESSAGE_PLACEHOLDERS.contains(p)) {
                throw new IllegalArgumentException("step " + id + " message uses unknown placeholder {" + p + "}");
            }
        }
    }

    @Override
    public String kind() {
        return "page";
    }
}
