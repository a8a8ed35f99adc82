package dev.tend.playbooks.load;

import dev.tend.playbooks.ActionDef;
import dev.tend.playbooks.CommandAction;
import dev.tend.playbooks.HttpAction;
import dev.tend.playbooks.HttpClientSettings;
import dev.tend.playbooks.SimulatedAction;
import dev.tend.playbooks.Template;
import dev.tend.shared.Id;
import dev.tend.shared.yaml.Fields;
import dev.tend.shared.yaml.YList;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;
import dev.tend.shared.yaml.YScalar;

import java.net.URI;
import java.net.URISyntaxException;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;

/** Reads {@code actions.yaml}. Records every problem; keeps the ids of broken actions as declared. */
final class ActionsReader {
    private static final List<String> TOP = List.of("actions");
    private static final List<String> KINDS = List.of("command", "http", "simulated");
    private static final List<String> COMMAND_KEYS = List.of("command", "timeout", "idempotent", "output-limit", "description");
    private static final List<String> HTTP_ACTION_KEYS = List.of("http", "description");
    private static final List<String> SIMULATED_ACTION_KEYS = List.of("simulated", "description");
    private static final List<String> HTTP_KEYS = List.of("url", "method", "body", "timeout", "retries", "headers",
            "bearer-token-file", "ca-bundle", "client-cert", "client-key");
    private static final List<String> SIMULATED_KEYS = List.of("duration", "success", "clears");
    private static final List<String> RANGE_KEYS = List.of("min", "max");

    private final Fields f;

    private ActionsReader(Fields f) {
        this.f = f;
    }

    /** Parsed actions (the ones without problems) and every declared id. */
    record Result(Map<Id, ActionDef> actions, Set<Id> declared) {
    }

    static Result read(Fields f, YNode root) {
        return new ActionsReader(f).actions(root);
    }

    private Result actions(YNode root) {
        Map<Id, ActionDef> out = new TreeMap<>();
        Set<Id> declared = new java.util.TreeSet<>();
        YMap top = f.asMap(root, "actions.yaml");
        if (top == null) return new Result(out, declared);
        Read.allowOnly(f, top, "actions.yaml", TOP);
        YMap list = f.node(top, "actions", "actions.yaml", true).map(n -> f.asMap(n, "actions")).orElse(null);
        if (list == null) return new Result(out, declared);
        for (YMap.Entry e : list.entries()) {
            String name = e.key().value();
            if (!Id.isValid(name)) {
                f.add(e.key(), name, "action name: " + Id.describeInvalid(name));
                continue;
            }
            Id id = Id.of(name);
            declared.add(id);
            ActionDef def = action(id, e.value());
            if (def != null) out.put(id, def);
        }
        return new Result(out, declared);
    }

    private ActionDef action(Id id, YNode node) {
        String where = "action " + id;
        YMap m = f.asMap(node, where);
        if (m == null) return null;
        List<String> kinds = new ArrayList<>();
        for (String k : KINDS) if (m.has(k)) kinds.add(k);
        if (kinds.size() != 1) {
            Read.allowOnly(f, m, where, List.of("command", "http", "simulated", "timeout", "idempotent", "output-limit", "description"));
            f.add(m, "", kinds.isEmpty()
                    ? where + " needs exactly one of 'command', 'http' or 'simulated'"
                    : where + " has both '" + kinds.get(0) + "' and '" + kinds.get(1) + "'; an action is exactly one of command, http or simulated");
            return null;
        }
        int before = f.problems().size();
        try {
            return switch (kinds.get(0)) {
                case "command" -> command(id, m, where, before);
                case "http" -> http(id, m, where, before);
                default -> simulated(id, m, where, before);
            };
        } catch (IllegalArgumentException e) {
            // the readers check every rule first; this only keeps a missed rule from escaping unlocated
            f.add(m, "", e.getMessage());
            return null;
        }
    }

    private ActionDef command(Id id, YMap m, String where, int before) {
        Read.allowOnly(f, m, where, COMMAND_KEYS);
        YNode cmd = m.get("command").get();
        Duration timeout = Read.positiveDuration(f, m, "timeout", where, where + ".timeout", false);
        Boolean idempotent = Read.bool(f, m, "idempotent", where, where + ".idempotent");
        Integer limit = Read.integer(f, m, "output-limit", where, where + ".output-limit", false, 1, CommandAction.MAX_OUTPUT_LIMIT);
        if (cmd instanceof YScalar s && !s.plainNull()) {
            f.add(cmd, "command", where + ".command must be a list of arguments such as [restart-node, --node, \"{node}\"], not one"
                    + " string: tend never runs a shell, so a string would have to be split on guessed quotes and spaces,"
                    + " and a placeholder's value could turn into several arguments");
            return null;
        }
        YList list = f.asList(cmd, where + ".command");
        if (list == null) return null;
        if (list.items().isEmpty()) {
            f.add(list, "command", where + ".command is empty; its first item is the program to run");
            return null;
        }
        List<Template> argv = new ArrayList<>();
        for (int i = 0; i < list.items().size(); i++) {
            YNode item = list.items().get(i);
            Template t = Read.template(f, item, where + ".command[" + i + "]", Template.ACTION_PLACEHOLDERS);
            if (t == null) continue;
            if (i == 0 && !t.placeholders().isEmpty()) {
                f.add(item, "command", where + ".command: the program (first item) must be fixed text, not '" + t + "'");
                continue;
            }
            argv.add(t);
        }
        if (f.problems().size() > before) return null;
        return new CommandAction(id, argv, timeout, idempotent != null && idempotent,
                limit == null ? CommandAction.DEFAULT_OUTPUT_LIMIT : limit);
    }

    private ActionDef http(Id id, YMap m, String where, int before) {
        Read.allowOnly(f, m, where, HTTP_ACTION_KEYS);
        String label = where + ".http";
        YMap h = f.asMap(m.get("http").get(), label);
        if (h == null) return null;
        Read.allowOnly(f, h, label, HTTP_KEYS);
        Template url = f.node(h, "url", label, true).map(n -> Read.template(f, n, label + ".url", Template.ACTION_PLACEHOLDERS)).orElse(null);
        if (url != null) checkUrl(h.get("url").get(), label + ".url", url);
        String method = Read.value(f, h, "method", label, label + ".method", false, v -> {
            String up = v.toUpperCase(Locale.ROOT);
            if (!HttpAction.METHODS.contains(up)) throw new IllegalArgumentException("must be one of DELETE, GET, PATCH, POST, PUT, got '" + v + "'");
            return up;
        });
        Map<String, Object> body = h.get("body").map(n -> JsonBodyReader.read(f, n, label + ".body", Template.ACTION_PLACEHOLDERS))
                .orElse(Map.of());
        HttpClientSettings client = HttpClientReader.read(f, h, label);
        Duration timeout = Read.positiveDuration(f, h, "timeout", label, label + ".timeout", false);
        Integer retries = Read.integer(f, h, "retries", label, label + ".retries", false, 0, 10);
        if (f.problems().size() > before) return null;
        return new HttpAction(id, url, method, body, timeout, retries == null ? 0 : retries, client);
    }

    private void checkUrl(YNode at, String label, Template url) {
        Map<String, String> sample = new HashMap<>();
        for (String p : Template.ACTION_PLACEHOLDERS) sample.put(p, "x");
        try {
            URI u = new URI(url.render(sample));
            if (!"http".equals(u.getScheme()) && !"https".equals(u.getScheme()) || u.getHost() == null) {
                f.add(at, "url", label + " must be an absolute http:// or https:// URL with a host, got '" + url + "'");
            }
        } catch (URISyntaxException e) {
            f.add(at, "url", label + " is not a URL: " + e.getMessage());
        }
    }

    private ActionDef simulated(Id id, YMap m, String where, int before) {
        Read.allowOnly(f, m, where, SIMULATED_ACTION_KEYS);
        String label = where + ".simulated";
        YMap s = f.asMap(m.get("simulated").get(), label);
        if (s == null) return null;
        Read.allowOnly(f, s, label, SIMULATED_KEYS);
        Duration min = null;
        Duration max = null;
        YNode d = f.node(s, "duration", label, true).orElse(null);
        if (d instanceof YMap range) {
            Read.allowOnly(f, range, label + ".duration", RANGE_KEYS);
            min = Read.duration(f, range, "min", label + ".duration", label + ".duration.min", true);
            max = Read.duration(f, range, "max", label + ".duration", label + ".duration.max", true);
            if (min != null && max != null && max.compareTo(min) < 0) {
                f.add(range, "duration", label + ".duration: max (" + range.get("max").map(x -> ((YScalar) x).value()).orElse("")
                        + ") is shorter than min (" + range.get("min").map(x -> ((YScalar) x).value()).orElse("") + ")");
                return null;
            }
        } else if (d != null) {
            min = Read.duration(f, s, "duration", label, label + ".duration", true);
            max = min;
        }
        Double success = Read.probability(f, s, "success", label, label + ".success");
        List<Id> clears = f.values(s, "clears", label, Id::of);
        if (f.problems().size() > before) return null;
        return new SimulatedAction(id, min, max, success == null ? 1.0 : success, clears);
    }
}
