package dev.tend.shared.yaml;

import dev.tend.shared.Id;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.NearestName;
import dev.tend.shared.Problem;
import dev.tend.shared.time.Durations;

import java.time.Duration;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.TreeSet;
import java.util.function.Function;

/**
 * Reads typed fields out of a located YAML tree and collects every problem instead of
 * stopping at the first, so that a loader can report them all at once. Each getter returns
 * null (or an empty value) when the field is absent or wrong, after recording why.
 * Not thread-safe: one instance per document.
 */
public final class Fields {
    private final String source;
    private final List<Problem> problems = new ArrayList<>();

    public Fields(String source) {
        this.source = source;
    }

    public String source() {
        return source;
    }

    public void add(YNode at, String field, String message) {
        problems.add(Problem.at(source, at == null ? 0 : at.line(), at == null ? 0 : at.column(), field, message));
    }

    public void addAll(Collection<Problem> more) {
        problems.addAll(more);
    }

    public List<Problem> problems() {
        return List.copyOf(problems);
    }

    public boolean hasProblems() {
        return !problems.isEmpty();
    }

    /** Throws an {@link InvalidInputException} with every problem recorded, if any. */
    public void throwIfAny() {
        if (!problems.isEmpty()) throw new InvalidInputException(problems);
    }

    /** {@code node} as a mapping, or null after recording a problem. */
    public YMap asMap(YNode node, String field) {
        if (node instanceof YMap m) return m;
        add(node, field, field + " must be a mapping (key: value), got " + kindOf(node));
        return null;
    }

    /** {@code node} as a list, or null after recording a problem. */
    public YList asList(YNode node, String field) {
        if (node instanceof YList l) return l;
        add(node, field, field + " must be a list, got " + kindOf(node));
        return null;
    }

    /** Records every key of {@code map} not in {@code allowed}, naming what is allowed. */
    public void allowOnly(YMap map, String where, Collection<String> allowed) {
        allowOnly(map, where, allowed, RenamedKeys.none());
    }

    /**
     * Like {@link #allowOnly(YMap, String, Collection)}, and reports each old name of
     * {@code renamed} with the sentence that names its replacement.
     */
    public void allowOnly(YMap map, String where, Collection<String> allowed, RenamedKeys renamed) {
        for (YMap.Entry e : map.entries()) {
            if (reportedAsRenamed(e, renamed)) continue;
            if (!allowed.contains(e.key().value())) {
                add(e.key(), e.key().value(), "unknown key '" + e.key().value() + "' in " + where
                        + nearestKey(e.key().value(), allowed).map(n -> " (did you mean '" + n + "'?)").orElse("")
                        + "; expected one of: " + String.join(", ", new TreeSet<>(allowed)));
            }
        }
    }

    /**
     * The allowed key nearest to {@code key}: itself written with dashes and in lower case
     * ({@code confirm_for}, {@code Confirm-For}), else one within two edits
     * ({@link NearestName}); empty when none is near. Every file tend reads suggests keys this way.
     */
    public static Optional<String> nearestKey(String key, Collection<String> allowed) {
        String normal = key.toLowerCase(Locale.ROOT).replace('_', '-').replace(' ', '-');
        if (allowed.contains(normal)) return Optional.of(normal);
        return NearestName.among(normal, allowed, 2);
    }

    /** Reports {@code e}'s key when it is an old name of {@code renamed}; true if it was. */
    public boolean reportedAsRenamed(YMap.Entry e, RenamedKeys renamed) {
        Optional<String> message = renamed.messageFor(e.key().value());
        message.ifPresent(m -> add(e.key(), e.key().value(), m));
        return message.isPresent();
    }

    public Optional<YNode> node(YMap map, String key, String where, boolean required) {
        Optional<YNode> n = map.get(key);
        if (n.isEmpty() && required) add(map, key, where + " needs '" + key + "'");
        return n;
    }

    /** A scalar's text, or null. */
    public String string(YMap map, String key, String where, boolean required) {
        Optional<YNode> n = node(map, key, where, required);
        if (n.isEmpty()) return null;
        if (n.get() instanceof YScalar s && !s.plainNull()) return s.value();
        add(n.get(), key, where + "." + key + " must be a value, got " + kindOf(n.get()));
        return null;
    }

    /** Parses a scalar with {@code parser}; an {@link IllegalArgumentException} becomes a located problem. */
    public <T> T parsed(YMap map, String key, String where, boolean required, Function<String, T> parser) {
        Optional<YNode> n = node(map, key, where, required);
        return n.isEmpty() ? null : parsedNode(n.get(), where + "." + key, parser);
    }

    public <T> T parsedNode(YNode node, String field, Function<String, T> parser) {
        if (!(node instanceof YScalar s) || s.plainNull()) {
            add(node, field, field + " must be a value, got " + kindOf(node));
            return null;
        }
        try {
            return parser.apply(s.value());
        } catch (IllegalArgumentException | java.time.DateTimeException e) {
            add(node, field, field + ": " + e.getMessage());
            return null;
        }
    }

    public Id id(YMap map, String key, String where, boolean required) {
        return parsed(map, key, where, required, Id::of);
    }

    public Duration duration(YMap map, String key, String where, boolean required) {
        return parsed(map, key, where, required, Durations::parse);
    }

    public Integer integer(YMap map, String key, String where, boolean required, int min, int max) {
        return parsed(map, key, where, required, v -> {
            int i;
            try {
                i = Integer.parseInt(v);
            } catch (NumberFormatException e) {
                throw new IllegalArgumentException("must be a whole number, got '" + v + "'");
            }
            if (i < min || i > max) throw new IllegalArgumentException("must be between " + min + " and " + max + ", got " + i);
            return i;
        });
    }

    public Double decimal(YMap map, String key, String where, boolean required, double min, double max) {
        return parsed(map, key, where, required, v -> {
            double d;
            try {
                d = Double.parseDouble(v);
            } catch (NumberFormatException e) {
                throw new IllegalArgumentException("must be a number, got '" + v + "'");
            }
            if (!(d >= min && d <= max)) throw new IllegalArgumentException("must be between " + min + " and " + max + ", got " + v);
            return d;
        });
    }

    public Boolean bool(YMap map, String key, String where, boolean required) {
        return parsed(map, key, where, required, v -> switch (v) {
            case "true", "yes", "on" -> Boolean.TRUE;
            case "false", "no", "off" -> Boolean.FALSE;
            default -> throw new IllegalArgumentException("must be true or false, got '" + v + "'");
        });
    }

    /** What {@code node} is, for "got ..." in messages: "nothing" for an empty or null value, else its kind. */
    public static String kindOf(YNode node) {
        return node instanceof YScalar s && s.plainNull() ? "nothing" : node.kind();
    }

    /** A list of values, each parsed; a single value is accepted as a one-item list. */
    public <T> List<T> values(YMap map, String key, String where, Function<String, T> parser) {
        Optional<YNode> n = map.get(key);
        if (n.isEmpty()) return List.of();
        List<T> out = new ArrayList<>();
        if (n.get() instanceof YList l) {
            for (YNode item : l.items()) {
                T t = parsedNode(item, where + "." + key, parser);
                if (t != null) out.add(t);
            }
        } else {
            T t = parsedNode(n.get(), where + "." + key, parser);
            if (t != null) out.add(t);
        }
        return List.copyOf(out);
    }
}
