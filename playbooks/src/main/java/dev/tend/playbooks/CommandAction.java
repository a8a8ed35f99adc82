package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * Runs a program with an argument list, never through a shell. The first item is the
 * program and is fixed text; later items may contain placeholders, each replaced by a value
 * that matched the id pattern, so a value can never become more than one argument.
 *
 * @param timeout     limit for one attempt, or null
 * @param idempotent  true when the program itself de-duplicates by {@code {key}}, so asking
 *                    again after a crash is safe
 * @param outputLimit bytes of standard output and error kept for the ledger, 1 to 1 MiB
 */
public record CommandAction(Id id, List<Template> argv, Duration timeout, boolean idempotent, int outputLimit)
        implements ActionDef {
    public static final int DEFAULT_OUTPUT_LIMIT = 4096;
    public static final int MAX_OUTPUT_LIMIT = 1 << 20;

    public CommandAction {
        Objects.requireNonNull(id, "action id");
        argv = List.copyOf(argv);
        if (argv.isEmpty()) throw new IllegalArgumentException("action " + id + " command must name a program");
        if (!argv.get(0).placeholders().isEmpty()) {
            throw new IllegalArgumentException("action " + id + " command: the program (first item) must be fixed text, not a placeholder");
        }
        for (Template t : argv) {
            for (String p : t.placeholders()) {
                if (!Template.ACTION_PLACEHOLDERS.contains(p)) {
                    throw new IllegalArgumentException("action " + id + " command uses unknown placeholder {" + p + "}");
                }
            }
        }
        if (timeout != null && (timeout.isNegative() || timeout.isZero())) {
            throw new IllegalArgumentException("action " + id + " timeout must be longer than zero, got " + timeout);
        }
        if (outputLimit < 1 || outputLimit > MAX_OUTPUT_LIMIT) {
            throw new IllegalArgumentException("action " + id + " output-limit must be between 1 and " + MAX_OUTPUT_LIMIT
                    + " bytes, got " + outputLimit);
        }
    }

    @Override
    public String kind() {
        return "command";
    }

    @Override
    public boolean uses(String placeholder) {
        for (Template t : argv) if (t.uses(placeholder)) return true;
        return false;
    }

    /** The argument list with placeholders filled in; throws {@link IllegalArgumentException} when a value is missing. */
    public List<String> render(Map<String, String> values) {
        List<String> out = new ArrayList<>(argv.size());
        for (Template t : argv) out.add(t.render(values));
        return List.copyOf(out);
    }
}
