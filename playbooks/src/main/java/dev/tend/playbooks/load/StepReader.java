package dev.tend.playbooks.load;

import dev.tend.playbooks.ActionDef;
import dev.tend.playbooks.ActionStep;
import dev.tend.playbooks.PageStep;
import dev.tend.playbooks.Position;
import dev.tend.playbooks.Scope;
import dev.tend.playbooks.Step;
import dev.tend.playbooks.Template;
import dev.tend.playbooks.WaitHealthyStep;
import dev.tend.shared.Id;
import dev.tend.shared.yaml.Fields;
import dev.tend.shared.yaml.RenamedKeys;
import dev.tend.shared.yaml.YList;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;
import dev.tend.shared.yaml.YScalar;

import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/** Reads {@code steps:} and {@code on-failure:}. One instance per playbook, so step ids are checked across both. */
final class StepReader {
    private static final List<String> KINDS = List.of("action", "wait-healthy", "page");
    private static final List<String> ACTION_KEYS = List.of("id", "action", "timeout", "retries", "if-cleared");
    private static final List<String> WAIT_KEYS = List.of("id", "wait-healthy", "within");
    private static final List<String> PAGE_KEYS = List.of("id", "page", "message");
    private static final List<String> ALL_KEYS = List.of("id", "action", "timeout", "retries", "if-cleared", "wait-healthy", "within", "page", "message");
    private static final RenamedKeys RENAMED = RenamedKeys.of("notify", "page");

    private final Fields f;
    private final ActionCatalog actions;
    private final Scope scope;
    private final Map<String, Position> positions;
    private final Map<Id, YNode> seen = new HashMap<>();

    /** {@code scope} is null when the playbook's own scope could not be read. */
    StepReader(Fields f, ActionCatalog actions, Scope scope, Map<String, Position> positions) {
        this.f = f;
        this.actions = actions;
        this.scope = scope;
        this.positions = positions;
    }

    /**
     * {@code section} is {@code steps}, {@code on-failure} or {@code on-stand-down}; in on-failure a step
     * without id gets {@code on-failure-N}.
     */
    List<Step> read(YNode node, String section) {
        List<Step> out = new ArrayList<>();
        YList list = f.asList(node, section);
        if (list == null) return out;
        int n = 0;
        for (YNode item : list.items()) {
            n++;
            Step s = step(item, section, n);
            if (s != null) out.add(s);
        }
        return out;
    }

    private Step step(YNode item, String section, int n) {
        YMap m = f.asMap(item, section + " item " + n);
        if (m == null) return null;
        List<String> kinds = new ArrayList<>();
        for (String k : KINDS) if (m.has(k)) kinds.add(k);
        String label = label(m, section, n);
        Id id = stepId(m, section, n);
        if (kinds.isEmpty() && RENAMED.writtenIn(m, "notify")) {
            Read.allowOnly(f, m, label, ALL_KEYS, RENAMED);
            return null;
        }
        if (kinds.isEmpty()) {
            Read.allowOnly(f, m, label, ALL_KEYS);
            f.add(m, "", label + " does nothing: a step needs exactly one of 'action', 'wait-healthy' or 'page'");
            return null;
        }
        if (kinds.size() > 1) {
            f.add(m, kinds.get(1), label + " has both '" + kinds.get(0) + "' and '" + kinds.get(1)
                    + "'; a step does one thing, so split it into two steps");
            return null;
        }
        if (id != null) positions.put(section + "." + id.value(), Read.position(m));
        return switch (kinds.get(0)) {
            case "action" -> actionStep(m, id, label);
            case "wait-healthy" -> waitStep(m, id, label);
            default -> pageStep(m, id, label);
        };
    }

    /** {@code steps[drain]} when the id is written and valid, else {@code steps[#3]} (1-based). */
    private static String label(YMap m, String section, int n) {
        String id = m.get("id").orElse(null) instanceof YScalar s && Id.isValid(s.value()) ? s.value() : "#" + n;
        return section + "[" + id + "]";
    }

    private Id stepId(YMap m, String section, int n) {
        boolean generated = section.equals("on-failure") && !m.has("id");
        Id id = generated ? Id.of("on-failure-" + n) : Read.value(f, m, "id", section + " item " + n, section + " item " + n + " id", true, Id::of);
        if (id == null) return null;
        YNode at = generated ? m : m.get("id").orElse(m);
        YNode first = seen.putIfAbsent(id, at);
        if (first != null) {
            f.add(at, "id", "step id '" + id + "' is used twice; the first is at line " + first.line() + ", column "
                    + first.column() + " (step ids must be unique across steps and on-failure)");
            return null;
        }
        return id;
    }

    private Step actionStep(YMap m, Id id, String label) {
        Read.allowOnly(f, m, label, ACTION_KEYS);
        Id action = Read.value(f, m, "action", label, label + ".action", true, Id::of);
        Duration timeout = Read.positiveDuration(f, m, "timeout", label, label + ".timeout", false);
        Integer retries = Read.integer(f, m, "retries", label, label + ".retries", false, 0, ActionStep.MAX_RETRIES);
        Boolean continueIfCleared = Read.value(f, m, "if-cleared", label, label + ".if-cleared", false, StepReader::ifCleared);
        if (action != null) {
            YNode at = m.get("action").orElse(m);
            if (!actions.isDeclared(action)) {
                f.add(at, "action", label + " names action '" + action + "', which is not defined; " + actions.describeDefined());
                return null;
            }
            ActionDef def = actions.get(action).orElse(null);
            if (def != null && scope == Scope.CLUSTER && def.uses("node")) {
                f.add(at, "action", label + " runs action '" + action + "', which uses {node}, but this playbook has cluster scope,"
                        + " so there is no node to fill in");
                return null;
            }
        }
        if (id == null || action == null) return null;
        return new ActionStep(id, action, timeout, retries == null ? 0 : retries, Boolean.TRUE.equals(continueIfCleared));
    }

    /** {@code if-cleared: continue | stand-down}: whether the step runs once the run's trigger has cleared. */
    private static Boolean ifCleared(String v) {
        return switch (v.strip()) {
            case "continue" -> true;
            case "stand-down" -> false;
            default -> throw new IllegalArgumentException("if-cleared must be continue (run this step even when the problem"
                    + " went away) or stand-down (the default), got '" + v + "'");
        };
    }

    private Step waitStep(YMap m, Id id, String label) {
        Read.allowOnly(f, m, label, WAIT_KEYS);
        List<Id> signals = f.values(m, "wait-healthy", label, Id::of);
        if (signals.isEmpty() && m.get("wait-healthy").get() instanceof YList) {
            f.add(m.get("wait-healthy").get(), "wait-healthy", label + ".wait-healthy must name at least one signal");
        }
        Duration within = Read.positiveDuration(f, m, "within", label, label + ".within", true);
        if (id == null || signals.isEmpty() || within == null) return null;
        return new WaitHealthyStep(id, signals, within);
    }

    private Step pageStep(YMap m, Id id, String label) {
        Read.allowOnly(f, m, label, PAGE_KEYS, RENAMED);
        Id channel = Read.value(f, m, "page", label, label + ".page", true, Id::of);
        Template message = f.node(m, "message", label, true)
                .map(n -> Read.template(f, n, label + ".message", Template.MESSAGE_PLACEHOLDERS)).orElse(null);
        if (message != null && scope == Scope.CLUSTER && message.uses("node")) {
            f.add(m.get("message").get(), "message", label + ".message uses {node}, but this playbook has cluster scope,"
                    + " so there is no node to fill in");
            return null;
        }
        if (id == null || channel == null || message == null) return null;
        return new PageStep(id, channel, message);
    }
}
