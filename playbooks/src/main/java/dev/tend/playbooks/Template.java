package dev.tend.playbooks;

import java.util.ArrayList;
import java.util.Collection;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.TreeSet;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Text with {@code {name}} placeholders, such as a page message or one argument of a
 * command. Only a brace pair around a word is a placeholder; other braces are literal.
 * Immutable.
 */
public record Template(String text) {
    /** Placeholders a page message may use. */
    public static final Set<String> MESSAGE_PLACEHOLDERS = Set.of("cluster", "node", "run", "step", "playbook");
    /** Placeholders a channel's webhook body, command argument or mail subject may use: the page's fields. */
    public static final Set<String> PAGE_PLACEHOLDERS = Set.of("id", "channel", "at", "kind", "cluster", "node", "run",
            "playbook", "message", "link");
    /** Placeholders a command argument, an HTTP URL or an HTTP body value may use. */
    public static final Set<String> ACTION_PLACEHOLDERS = Set.of("cluster", "node", "run", "key", "step", "attempt");

    private static final Pattern PLACEHOLDER = Pattern.compile("\\{([A-Za-z][A-Za-z0-9_-]*)}");

    public Template {
        Objects.requireNonNull(text, "template text");
    }

    /**
     * A template whose placeholders are all in {@code allowed}; throws
     * {@link IllegalArgumentException} naming the unknown ones and the allowed ones.
     */
    public static Template parse(String text, Collection<String> allowed) {
        Template t = new Template(text);
        List<String> unknown = new ArrayList<>();
        for (String p : t.placeholders()) if (!allowed.contains(p)) unknown.add("{" + p + "}");
        if (!unknown.isEmpty()) {
            List<String> known = new ArrayList<>();
            for (String a : new TreeSet<>(allowed)) known.add("{" + a + "}");
            throw new IllegalArgumentException((unknown.size() == 1 ? "unknown placeholder " : "unknown placeholders ")
                    + String.join(", ", unknown) + " in '" + text + "'; the placeholders here are " + String.join(" ", known));
        }
        return t;
    }

    /** The placeholder names used, in order of first use. */
    public Set<String> placeholders() {
        Set<String> names = new LinkedHashSet<>();
        Matcher m = PLACEHOLDER.matcher(text);
        while (m.find()) names.add(m.group(1));
        return names;
    }

    public boolean uses(String placeholder) {
        return placeholders().contains(placeholder);
    }

    /**
     * The text with every placeholder replaced by its value. Throws
     * {@link IllegalArgumentException} when {@code values} has no value for a placeholder used.
     */
    public String render(Map<String, String> values) {
        Matcher m = PLACEHOLDER.matcher(text);
        StringBuilder sb = new StringBuilder(text.length() + 32);
        while (m.find()) {
            String v = values.get(m.group(1));
            if (v == null) throw new IllegalArgumentException("no value for {" + m.group(1) + "} in '" + text + "'");
            m.appendReplacement(sb, Matcher.quoteReplacement(v));
        }
        m.appendTail(sb);
        return sb.toString();
    }

    @Override
    public String toString() {
        return text;
    }
}
