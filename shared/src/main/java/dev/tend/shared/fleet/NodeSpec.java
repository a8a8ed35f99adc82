package dev.tend.shared.fleet;

import dev.tend.shared.Id;

import java.util.Map;
import java.util.Objects;

/** A node of the topology: its id, zone (may be null when unknown) and tags. */
public record NodeSpec(Id id, String zone, Map<String, String> tags) {
    public NodeSpec {
        Objects.requireNonNull(id, "id");
        tags = tags == null ? Map.of() : Map.copyOf(tags);
    }

    public NodeSpec withZone(String newZone) {
        return new NodeSpec(id, newZone, tags);
    }
}
