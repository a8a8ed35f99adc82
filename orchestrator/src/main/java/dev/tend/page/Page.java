package dev.tend.page;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Objects;

/**
 * One page as a channel delivers it: the fields the engine gave it (id, channel, at, kind,
 * message, and cluster, node, run, playbook where it is about one) plus {@code link}, the
 * console address that shows what it is about (absent when no console URL is configured).
 *
 * @param fields JSON values by name, in a stable order; id, channel, kind and message always present
 */
public record Page(Map<String, Object> fields) {
    public Page {
        Map<String, Object> f = new LinkedHashMap<>(fields);
        for (String k : new String[] {"id", "channel", "kind", "message"}) {
            Objects.requireNonNull(f.get(k), "page field " + k);
        }
        fields = Collections.unmodifiableMap(f);
    }

    public String id() {
        return (String) fields.get("id");
    }

    public String channel() {
        return (String) fields.get("channel");
    }

    public String kind() {
        return (String) fields.get("kind");
    }

    public String message() {
        return (String) fields.get("message");
    }

    /** The page's text fields as placeholder values ({id}, {message}, ...); a missing field is empty text. */
    public Map<String, String> placeholders() {
        Map<String, String> v = new LinkedHashMap<>();
        for (String k : dev.tend.playbooks.Template.PAGE_PLACEHOLDERS) {
            Object o = fields.get(k);
            v.put(k, o == null ? "" : String.valueOf(o));
        }
        return v;
    }

    /** The page with its console link, built from the console's base URL (ending in '/'); unchanged when the URL is null. */
    public Page withLink(String consoleUrl) {
        if (consoleUrl == null) return this;
        Map<String, Object> f = new LinkedHashMap<>(fields);
        Object run = fields.get("run");
        String kind = kind();
        String where;
        if (kind.startsWith("approval")) where = "#approvals";
        else if (run != null) where = "#runs?run=" + run;
        else where = "#fleet";
        f.put("link", consoleUrl + where);
        return new Page(f);
    }

    /** The page as plain text: the message, then one line per field. */
    public String toText() {
        StringBuilder b = new StringBuilder(message()).append("\n\n");
        for (Map.Entry<String, Object> e : fields.entrySet()) {
            if (e.getKey().equals("message") || e.getValue() == null) continue;
            b.append(e.getKey()).append(": ").append(e.getValue()).append('\n');
        }
        return b.toString();
    }
}
