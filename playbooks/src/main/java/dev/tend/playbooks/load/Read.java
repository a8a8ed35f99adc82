package dev.tend.playbooks.load;

import dev.tend.playbooks.Position;
import dev.tend.playbooks.TagSelector;
import dev.tend.playbooks.Template;
import dev.tend.shared.time.Durations;
import dev.tend.shared.yaml.Fields;
import dev.tend.shared.yaml.RenamedKeys;
import dev.tend.shared.yaml.YList;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;
import dev.tend.shared.yaml.YScalar;

import java.time.Duration;
import java.util.ArrayList;
import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.TreeSet;
import java.util.function.Function;

/** Typed, located reads shared by the playbook, actions and tend.yaml readers. Stateless. */
final class Read {
    private Read() {
    }

    static Position position(YNode n) {
        return new Position(n.line(), n.column());
    }

    /** Like {@link Fields#allowOnly}, and suggests the nearest allowed key for a near miss. */
    static void allowOnly(Fields f, YMap map, String where, Collection<String> allowed) {
        allowOnly(f, map, where, allowed, RenamedKeys.none());
    }

    /** Like {@link #allowOnly(Fields, YMap, String, Collection)}; an old name of {@code renamed} is reported with its new name. */
    static void allowOnly(Fields f, YMap map, String where, Collection<String> allowed, RenamedKeys renamed) {
        for (YMap.Entry e : map.entries()) {
            String key = e.key().value();
            if (allowed.contains(key) || f.reportedAsRenamed(e, renamed)) continue;
            String near = nearest(key, allowed);
            f.add(e.key(), key, "unknown key '" + key + "' in " + where + (near == null ? "" : " (did you mean '" + near + "'?)")
                    + "; the keys allowed here are: " + String.join(", ", new TreeSet<>(allowed)));
        }
    }

    /** The allowed value nearest to {@code key} ({@link Fields#nearestKey}), or null. */
    static String nearest(String key, Collection<String> allowed) {
        return Fields.nearestKey(key, allowed).orElse(null);
    }

    /** Parses {@code map.key} with {@code parser}, naming it {@code label} in problems. */
    static <T> T value(Fields f, YMap map, String key, String where, String label, boolean required, Function<String, T> parser) {
        Optional<YNode> n = f.node(map, key, where, required);
        return n.isEmpty() ? null : f.parsedNode(n.get(), label, parser);
    }

    /** A duration that must be longer than zero. */
    static Duration positiveDuration(Fields f, YMap map, String key, String where, String label, boolean required) {
        return value(f, map, key, where, label, required, v -> {
            Duration d = Durations.parse(v);
            if (d.isZero()) throw new IllegalArgumentException("must be longer than zero, got '" + v + "'");
            return d;
        });
    }

    /** A duration of zero or more. */
    static Duration duration(Fields f, YMap map, String key, String where, String label, boolean required) {
        return value(f, map, key, where, label, required, Durations::parse);
    }

    static Integer integer(Fields f, YMap map, String key, String where, String label, boolean required, int min, int max) {
        return value(f, map, key, where, label, required, v -> {
            int i;
            try {
                i = Integer.parseInt(v.strip());
            } catch (NumberFormatException e) {
                throw new IllegalArgumentException("must be a whole number, got '" + v + "'");
            }
            if (i < min || i > max) throw new IllegalArgumentException("must be between " + min + " and " + max + ", got " + i);
            return i;
        });
    }

    /** A fraction more than 0 and at most 1, written as a decimal. */
    static Double fraction(Fields f, YMap map, String key, String where, String label, boolean required) {
        return value(f, map, key, where, label, required, Read::parseFraction);
    }

    static double parseFraction(String v) {
        if (v.strip().endsWith("%")) {
            throw new IllegalArgumentException("write a fraction as a decimal such as 0.34, not a percentage ('" + v + "')");
        }
        double d;
        try {
            d = Double.parseDouble(v.strip());
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("must be a decimal fraction such as 0.34, got '" + v + "'");
        }
        if (!(d > 0 && d <= 1)) throw new IllegalArgumentException("must be more than 0 and at most 1, got " + v);
        return d;
    }

    /** A probability from 0 to 1 inclusive. */
    static Double probability(Fields f, YMap map, String key, String where, String label) {
        return value(f, map, key, where, label, false, v -> {
            double d;
            try {
                d = Double.parseDouble(v.strip());
            } catch (NumberFormatException e) {
                throw new IllegalArgumentException("must be a probability from 0 to 1 such as 0.95, got '" + v + "'");
            }
            if (!(d >= 0 && d <= 1)) throw new IllegalArgumentException("must be a probability from 0 to 1, got " + v);
            return d;
        });
    }

    static Boolean bool(Fields f, YMap map, String key, String where, String label) {
        return value(f, map, key, where, label, false, v -> switch (v) {
            case "true", "yes", "on" -> Boolean.TRUE;
            case "false", "no", "off" -> Boolean.FALSE;
            default -> throw new IllegalArgumentException("must be true or false, got '" + v + "'");
        });
    }

    /** A tag selector: a mapping of tag name to one value or a list of values. Null after a problem. */
    static TagSelector selector(Fields f, YNode node, String label) {
        YMap m = f.asMap(node, label);
        if (m == null) return null;
        Map<String, List<String>> allowed = new LinkedHashMap<>();
        boolean ok = true;
        for (YMap.Entry e : m.entries()) {
            String tag = e.key().value();
            List<String> values = new ArrayList<>();
            if (e.value() instanceof YScalar s && !s.plainNull()) {
                values.add(s.value());
            } else if (e.value() instanceof YList l) {
                for (YNode item : l.items()) {
                    if (item instanceof YScalar s && !s.plainNull()) {
                        values.add(s.value());
                    } else {
                        f.add(item, tag, label + "." + tag + ": each allowed value must be a single value, got " + kind(item));
                        ok = false;
                    }
                }
                if (l.items().isEmpty()) {
                    f.add(l, tag, label + "." + tag + " lists no value, so it would match no cluster; remove the tag to match any value");
                    ok = false;
                }
            } else {
                f.add(e.value(), tag, label + "." + tag + " must be a value or a list of values, got " + kind(e.value()));
                ok = false;
            }
            allowed.put(tag, values);
        }
        return ok ? TagSelector.of(allowed) : null;
    }

    /**
     * A template with placeholders from {@code allowed}. Recognises the unquoted
     * {@code {cluster}} that YAML reads as a mapping and says to quote it.
     */
    static Template template(Fields f, YNode node, String label, Collection<String> allowed) {
        if (node instanceof YMap m && m.entries().size() == 1 && m.entries().get(0).value() instanceof YScalar v && v.plainNull()) {
            String name = m.entries().get(0).key().value();
            f.add(node, label, label + ": write the placeholder in quotes, \"{" + name + "}\": unquoted, YAML reads {"
                    + name + "} as a mapping");
            return null;
        }
        return f.parsedNode(node, label, v -> Template.parse(v, allowed));
    }

    static String kind(YNode n) {
        return n instanceof YScalar s && s.plainNull() ? "nothing" : n.kind();
    }
}
