package dev.tend.playbooks.load;

import dev.tend.playbooks.ApprovalPolicy;
import dev.tend.playbooks.ChangeWindow;
import dev.tend.playbooks.Limits;
import dev.tend.playbooks.MaskRule;
import dev.tend.playbooks.Mode;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.Position;
import dev.tend.playbooks.Scope;
import dev.tend.playbooks.Step;
import dev.tend.playbooks.TagSelector;
import dev.tend.playbooks.Trigger;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import dev.tend.shared.yaml.Fields;
import dev.tend.shared.yaml.YList;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;

import java.time.DateTimeException;
import java.time.Duration;
import java.time.ZoneId;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/** Reads one playbook document into a {@link Playbook}, recording every problem in {@link Fields}. */
final class PlaybookReader {
    private static final List<String> TOP = List.of("playbook", "version", "description", "mode", "when", "unless",
            "limits", "window", "approval", "steps", "on-failure", "on-stand-down");
    private static final List<String> WHEN = List.of("signal", "state", "scope", "confirm-for", "clusters");
    private static final List<String> UNLESS = List.of("signal", "on");
    private static final List<String> WINDOW = List.of("allow", "zone", "length");
    private static final List<String> APPROVAL = List.of("when", "expires-after");

    private final Fields f;
    private final ActionCatalog actions;
    private final Map<String, Position> positions = new HashMap<>();

    private PlaybookReader(Fields f, ActionCatalog actions) {
        this.f = f;
        this.actions = actions;
    }

    /** The playbook, or null when {@code f} has problems afterwards. */
    static Playbook read(Fields f, YNode root, String contentHash, ActionCatalog actions) {
        return new PlaybookReader(f, actions).playbook(root, contentHash);
    }

    private Playbook playbook(YNode root, String contentHash) {
        YMap m = f.asMap(root, "a playbook file");
        if (m == null) return null;
        Read.allowOnly(f, m, "a playbook", TOP);
        if (!m.has("playbook")) {
            f.add(m, "playbook", "a playbook needs 'playbook: <id>'; every .yaml or .yml file in a playbook directory"
                    + " except actions.yaml, tend.yaml and fleet.yaml is read as a playbook");
        }
        Id id = Read.value(f, m, "playbook", "a playbook", "playbook", false, Id::of);
        Position at = m.get("playbook").map(Read::position).orElse(Read.position(m));
        Integer version = Read.integer(f, m, "version", "a playbook", "version", false, 1, 1_000_000);
        String description = Read.value(f, m, "description", "a playbook", "description", false, v -> v);
        Mode mode = Read.value(f, m, "mode", "a playbook", "mode", false, Mode::parse);
        Trigger when = f.node(m, "when", "a playbook", true).map(this::when).orElse(null);
        List<MaskRule> unless = m.get("unless").map(this::unless).orElse(List.of());
        Limits limits = m.get("limits").map(n -> {
            positions.put("limits", Read.position(n));
            return LimitsReader.read(f, n, "limits", positions);
        }).orElse(Limits.none());
        ChangeWindow window = m.get("window").map(this::window).orElse(null);
        ApprovalPolicy approval = m.get("approval").map(this::approval).orElse(null);
        StepReader steps = new StepReader(f, actions, when == null ? scopeAsWritten(m) : when.scope(), positions);
        List<Step> main = f.node(m, "steps", "a playbook", true).map(n -> steps.read(n, "steps")).orElse(List.of());
        if (m.get("steps").orElse(null) instanceof YList l && l.items().isEmpty()) {
            f.add(l, "steps", "steps is empty; a playbook needs at least one step");
        }
        List<Step> onFailure = m.get("on-failure").map(n -> steps.read(n, "on-failure")).orElse(List.of());
        List<Step> onStandDown = m.get("on-stand-down").map(n -> steps.read(n, "on-stand-down")).orElse(List.of());
        if (f.hasProblems()) return null;
        try {
            return new Playbook(id, version == null ? 1 : version, description, mode == null ? Mode.LIVE : mode, when, unless,
                    limits, window, approval, main, onFailure, f.source(), contentHash, at.line(), at.column(), positions,
                    onStandDown);
        } catch (IllegalArgumentException e) {
            f.add(m, "", e.getMessage());
            return null;
        }
    }

    private Trigger when(YNode node) {
        positions.put("when", Read.position(node));
        YMap m = f.asMap(node, "when");
        if (m == null) return null;
        Read.allowOnly(f, m, "when", WHEN);
        Id signal = Read.value(f, m, "signal", "when", "when.signal", true, Id::of);
        SignalState state = Read.value(f, m, "state", "when", "when.state", true, PlaybookReader::problemState);
        Scope scope = Read.value(f, m, "scope", "when", "when.scope", true, Scope::parse);
        Duration confirmFor = Read.duration(f, m, "confirm-for", "when", "when.confirm-for", false);
        TagSelector clusters = m.get("clusters").map(n -> {
            positions.put("when.clusters", Read.position(n));
            return Read.selector(f, n, "when.clusters");
        }).orElse(TagSelector.all());
        if (signal == null || state == null || scope == null || clusters == null) return null;
        return new Trigger(signal, state, scope, confirmFor, clusters);
    }

    private static SignalState problemState(String v) {
        SignalState s = SignalState.parse(v);
        if (s == SignalState.CLEAR) {
            throw new IllegalArgumentException("must be breach or silent: a playbook reacts to a problem, and clear ends one");
        }
        return s;
    }

    /** The scope as written, for checks on steps when the rest of {@code when} has problems. */
    private static Scope scopeAsWritten(YMap m) {
        Optional<YNode> when = m.get("when");
        if (when.isEmpty() || !(when.get() instanceof YMap w)) return null;
        Optional<YNode> scope = w.get("scope");
        if (scope.isEmpty() || !(scope.get() instanceof dev.tend.shared.yaml.YScalar s)) return null;
        try {
            return Scope.parse(s.value());
        } catch (IllegalArgumentException e) {
            return null;
        }
    }

    private List<MaskRule> unless(YNode node) {
        positions.put("unless", Read.position(node));
        List<MaskRule> out = new ArrayList<>();
        YList list = f.asList(node, "unless");
        if (list == null) return out;
        for (YNode item : list.items()) {
            YMap m = f.asMap(item, "unless item");
            if (m == null) continue;
            Read.allowOnly(f, m, "an unless item", UNLESS);
            Id signal = Read.value(f, m, "signal", "an unless item", "unless.signal", true, Id::of);
            Scope on = Read.value(f, m, "on", "an unless item", "unless.on", true, Scope::parse);
            if (signal != null && on != null) out.add(new MaskRule(signal, on));
        }
        return out;
    }

    private ChangeWindow window(YNode node) {
        positions.put("window", Read.position(node));
        YMap m = f.asMap(node, "window");
        if (m == null) return null;
        Read.allowOnly(f, m, "window", WINDOW);
        String cron = Read.value(f, m, "allow", "window", "window.allow", true, v -> {
            ChangeWindow.validateCron(v);
            return v;
        });
        ZoneId zone = Read.value(f, m, "zone", "window", "window.zone", true, PlaybookReader::zone);
        Duration length = Read.positiveDuration(f, m, "length", "window", "window.length", true);
        if (cron == null || zone == null || length == null) return null;
        return ChangeWindow.of(cron, zone, length);
    }

    static ZoneId zone(String v) {
        try {
            return ZoneId.of(v);
        } catch (DateTimeException e) {
            throw new IllegalArgumentException("unknown time zone '" + v + "'; use a name from the tz database such as"
                    + " Europe/Berlin, America/New_York or UTC");
        }
    }

    private ApprovalPolicy approval(YNode node) {
        positions.put("approval", Read.position(node));
        YMap m = f.asMap(node, "approval");
        if (m == null) return null;
        Read.allowOnly(f, m, "approval", APPROVAL);
        TagSelector when = f.node(m, "when", "approval", true).map(n -> Read.selector(f, n, "approval.when")).orElse(null);
        Duration expires = Read.positiveDuration(f, m, "expires-after", "approval", "approval.expires-after", false);
        if (when == null) return null;
        return new ApprovalPolicy(when, expires);
    }
}
