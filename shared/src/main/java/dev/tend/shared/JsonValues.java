package dev.tend.shared;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Deep, unmodifiable copies of JSON-shaped values (maps with string keys, lists, strings,
 * numbers, booleans, null), so that records holding free-form fields stay immutable.
 */
public final class JsonValues {
    private JsonValues() {
    }

    public static Map<String, Object> freeze(Map<String, ?> map) {
        if (map.isEmpty()) return Map.of();
        Map<String, Object> copy = new LinkedHashMap<>();
        for (Map.Entry<String, ?> e : map.entrySet()) {
            copy.put(e.getKey(), freezeValue(e.getValue()));
        }
        return Collections.unmodifiableMap(copy);
    }

    @SuppressWarnings("unchecked")
    public static Object freezeValue(Object v) {
        if (v instanceof Map<?, ?> m) return freeze((Map<String, ?>) m);
        if (v instanceof List<?> l) {
            List<Object> copy = new ArrayList<>(l.size());
            for (Object o : l) copy.add(freezeValue(o));
            return Collections.unmodifiableList(copy);
        }
        if (v == null || v instanceof String || v instanceof Number || v instanceof Boolean) return v;
        throw new IllegalArgumentException("not a JSON value: " + v.getClass().getName());
    }
}
