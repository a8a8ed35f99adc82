package dev.tend.playbooks.load;

import dev.tend.playbooks.Template;
import dev.tend.shared.yaml.Fields;
import dev.tend.shared.yaml.YList;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;
import dev.tend.shared.yaml.YScalar;

import java.util.ArrayList;
import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.regex.Pattern;

/**
 * Reads a YAML mapping as a JSON object body whose string values may hold placeholders
 * (an http action's body, a webhook's body): unquoted numbers and booleans keep their
 * JSON type, every string is checked as a template.
 */
final class JsonBodyReader {
    private static final Pattern INTEGER = Pattern.compile("-?\\d{1,18}");
    private static final Pattern DECIMAL = Pattern.compile("-?\\d+\\.\\d+([eE][-+]?\\d+)?");

    private final Fields f;
    private final Collection<String> placeholders;

    private JsonBodyReader(Fields f, Collection<String> placeholders) {
        this.f = f;
        this.placeholders = placeholders;
    }

    /** The body, or null when {@code node} is not a mapping (a problem is recorded). */
    static Map<String, Object> read(Fields f, YNode node, String label, Collection<String> placeholders) {
        YMap b = f.asMap(node, label);
        return b == null ? null : new JsonBodyReader(f, placeholders).jsonMap(b, label);
    }

    private Map<String, Object> jsonMap(YMap m, String label) {
        Map<String, Object> out = new LinkedHashMap<>();
        for (YMap.Entry e : m.entries()) out.put(e.key().value(), json(e.value(), label + "." + e.key().value()));
        return out;
    }

    private Object json(YNode n, String label) {
        if (n instanceof YScalar s) {
            if (s.quoted()) return checked(s, label);
            if (s.plainNull()) return null;
            String v = s.value();
            if (v.equals("true") || v.equals("false")) return Boolean.valueOf(v);
            if (INTEGER.matcher(v).matches()) return Long.valueOf(v);
            if (DECIMAL.matcher(v).matches()) return Double.valueOf(v);
            return checked(s, label);
        }
        if (n instanceof YList l) {
            List<Object> out = new ArrayList<>();
            for (int i = 0; i < l.items().size(); i++) out.add(json(l.items().get(i), label + "[" + i + "]"));
            return out;
        }
        YMap m = (YMap) n;
        if (m.entries().size() == 1 && m.entries().get(0).value() instanceof YScalar v && v.plainNull()) {
            Read.template(f, m, label, placeholders); // reports the unquoted placeholder
            return null;
        }
        return jsonMap(m, label);
    }

    private String checked(YScalar s, String label) {
        Template t = Read.template(f, s, label, placeholders);
        return t == null ? null : t.text();
    }
}
