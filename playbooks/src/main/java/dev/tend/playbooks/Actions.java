package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.util.Collections;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeMap;

/**
 * The actions of {@code actions.yaml}, by id (sorted).
 *
 * @param source      the file they came from, or null when there was none
 * @param contentHash SHA-256 hex of the file's bytes, or null when there was none
 */
public record Actions(Map<Id, ActionDef> byId, String source, String contentHash) {
    private static final Actions EMPTY = new Actions(Map.of(), null, null);

    public Actions {
        Map<Id, ActionDef> copy = new TreeMap<>();
        for (Map.Entry<Id, ActionDef> e : byId.entrySet()) {
            if (!e.getKey().equals(e.getValue().id())) {
                throw new IllegalArgumentException("action " + e.getValue().id() + " is filed under id " + e.getKey());
            }
            copy.put(e.getKey(), e.getValue());
        }
        byId = Collections.unmodifiableMap(copy);
    }

    public static Actions empty() {
        return EMPTY;
    }

    public Optional<ActionDef> get(Id id) {
        return Optional.ofNullable(byId.get(id));
    }

    /** The defined action ids, sorted. */
    public Set<Id> ids() {
        return byId.keySet();
    }
}
