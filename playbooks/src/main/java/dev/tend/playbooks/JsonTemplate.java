package dev.tend.playbooks;

import dev.tend.shared.JsonValues;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A JSON object whose string values may hold {@code {name}} placeholders (an HTTP action's
 * body, a webhook's body). Placeholders are filled in as text inside JSON strings, so a
 * value can never change the document's structure. Immutable.
 *
 * @param body maps, lists, strings, numbers, booleans and null; empty means no body
 */
public record JsonTemplate(Map<String, Object> body) {
    public JsonTemplate {
        body = body == null ? Map.of() : JsonValues.freeze(body);
    }

    public boolean isEmpty() {
        return body.isEmpty();
    }

    public boolean uses(String placeholder) {
        return usesIn(body, placeholder);
    }

    /** The body with placeholders in string values filled in. */
    public Map<String, Object> render(Map<String, String> values) {
        @SuppressWarnings("unchecked")
        Map<String, Object> out = (Map<String, Object>) render(body, values);
        return out;
    }

    private static Object render(Object v, Map<String, String> values) {
        if (v instanceof String s) return new Template(s).render(values);
        if (v instanceof Map<?, ?> m) {
            Map<String, Object> out = new LinkedHashMap<>();
            for (Map.Entry<?, ?> e : m.entrySet()) out.put((String) e.getKey(), render(e.getValue(), values));
            return Collections.unmodifiableMap(out);
        }
        if (v instanceof List<?> l) {
            List<Object> out = new ArrayList<>();
            for (Object o : l) out.add(render(o, values));
            return Collections.unmodifiableList(out);
        }
        return v;
    }

    private static boolean usesIn(Object v, String placeholder) {
        if (v instanceof String s) return new Template(s).uses(placeholder);
        if (v instanceof Map<?, ?> m) {
            for (Object o : m.values()) if (usesIn(o, placeholder)) return true;
        }
        if (v instanceof List<?> l) {
            for (Object o : l) if (usesIn(o, placeholder)) return true;
        }
        return false;
    }
}
