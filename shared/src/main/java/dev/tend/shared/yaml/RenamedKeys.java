package dev.tend.shared.yaml;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;

/**
 * Keys that tend once read under another name, each with the sentence that names its
 * replacement ({@code 'when' is now 'trigger'}). A loader reports an old key as a located
 * problem with that sentence and never reads its value, so no old name is silently accepted
 * and nobody is left guessing what to write instead. Immutable.
 */
public final class RenamedKeys {
    private static final RenamedKeys NONE = new RenamedKeys(Map.of());

    private final Map<String, String> messages;

    private RenamedKeys(Map<String, String> messages) {
        this.messages = Map.copyOf(messages);
    }

    public static RenamedKeys none() {
        return NONE;
    }

    /** One old key, whose new name is {@code newKey}: the message is {@code 'old' is now 'new'}. */
    public static RenamedKeys of(String oldKey, String newKey) {
        return none().with(oldKey, newKey);
    }

    /** A copy that also knows {@code oldKey}, with the message {@code 'old' is now 'new'}. */
    public RenamedKeys with(String oldKey, String newKey) {
        return withMessage(oldKey, "'" + oldKey + "' is now '" + newKey + "'");
    }

    /** A copy that also knows {@code oldKey}, with a message of its own (for a key replaced by several). */
    public RenamedKeys withMessage(String oldKey, String message) {
        Objects.requireNonNull(oldKey, "oldKey");
        Objects.requireNonNull(message, "message");
        Map<String, String> m = new LinkedHashMap<>(messages);
        m.put(oldKey, message);
        return new RenamedKeys(m);
    }

    /** The message for {@code key} when it is an old name. */
    public Optional<String> messageFor(String key) {
        return Optional.ofNullable(messages.get(key));
    }

    /** True when {@code map} holds {@code oldKey} as an old name (so a missing new key is not reported again). */
    public boolean writtenIn(YMap map, String oldKey) {
        return messages.containsKey(oldKey) && map.has(oldKey);
    }
}
