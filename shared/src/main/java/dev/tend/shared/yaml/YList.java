package dev.tend.shared.yaml;

import java.util.List;

/** A sequence. Items are unmodifiable. */
public record YList(List<YNode> items, int line, int column) implements YNode {
    public YList {
        items = List.copyOf(items);
    }

    @Override
    public String kind() {
        return "a list";
    }
}
