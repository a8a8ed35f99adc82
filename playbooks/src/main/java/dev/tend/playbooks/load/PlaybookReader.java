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
import dev.tend.shared.yaml.RenamedKeys;
import dev.tend.shared.yaml.YList;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;

import java.time.DateTimeException;
import java.time.DayOfWeek;
import java.time.Duration;
import java.time.LocalTime;
import java.time.ZoneId;
import java.util.ArrayList;
import java.util.EnumSet;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/** Reads one playbook document into a {@link Playbook}, recording every problem in {@link Fields}. */
final class PlaybookReader {
    private static final List<String> TOP = List.of("playbook", "version", "description", "mode", "trigger", "unless",
            "limits", "window", "approval", "steps", "on-failure", "on-stand-down");
    private static final List<String> TRIGGER = List.of("signal", "state", "scope", "confirm-for", "clusters");
    private static final List<String> UNLESS = List.of("signal", "on");
    private static final List<String> WINDOW = List.of("days", "from", "until", "zone");
    private static final List<String> APPROVAL = List.of("clusters", "expires-after");
    private static final RenamedKeys RENAMED_TOP = RenamedKeys.of("when", "trigger");
    private static final RenamedKeys RENAMED_WINDOW = RenamedKeys.none()
            .withMessage("allow", "'allow' (a cron expression) is now 'days', 'from' and 'until': write the window as"
                    + " window: { days: [mon-fri], from: \"01:00\", until: \"05:00\", zone: Europe/Berlin }")
            .withMessage("length", "'length' is now 'until', the wall-clock time the window closes"
                    + " (an until before from spans midnight)");
    private static final RenamedKeys RENAMED_APPROVAL = RenamedKeys.of("when", "clusters");

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
        Read.allowOnly(f, m, "a playbook", TOP, RENAMED_TOP);
        if (!m.has("playbook")) {
            f.add(m, "playbook", "a playbook needs 'playbook: <id>'; every .yaml or .yml file in a playbook directory"
                    + " except actions.yaml, tend.yaml and fleet.yaml is read as a playbook");
        }
        Id id = Read.value(f, m, "playbook", "a playbook", "playbook", false, Id::of);
        Position at = m.get("playbook").map(Read::position).orElse(Read.position(m));
        Integer version = Read.integer(f, m, "version", "a playbook", "version", false, 1, 1_000_000);
        String description = Read.value(f, m, "description", "a playbook", "description", false, v -> v);
        Mode mode = Read.value(f, m, "mode", "a playbook", "mode", false, Mode::parse);
        Trigger trigger = f.node(m, "trigger", "a playbook", !RENAMED_TOP.writtenIn(m, "when")).map(this::trigger).orElse(null);
        List<MaskRule> unless = m.get("unless").map(this::unless).orElse(List.of());
        Limits limits = m.get("limits").map(n -> {
            positions.put("limits", Read.position(n));
            return LimitsReader.read(f, n, "limits", positions);
        }).orElse(Limits.none());
        ChangeWindow window = m.get("window").map(this::window).orElse(null);
        ApprovalPolicy approval = m.get("approval").map(this::approval).orElse(null);
        StepReader steps = new StepReader(f, actions, trigger == null ? scopeAsWritten(m) : trigger.scope(), positions);
        List<Step> main = f.node(m, "steps", "a playbook", true).map(n -> steps.read(n, "steps")).orElse(List.of());
        if (m.get("steps").orElse(null) instanceof YList l && l.items().isEmpty()) {
            f.add(l, "steps", "steps is empty; a playbook needs at least one step");
        }
        List<Step> onFailure = m.get("on-failure").map(n -> steps.read(n, "on-failure")).orElse(List.of());
        List<Step> onStandDown = m.get("on-stand-down").map(n -> steps.read(n, "on-stand-down")).orElse(List.of());
        if (f.hasProblems()) return null;
        try {
            return new Playbook(id, version == null ? 1 : version, description, mode == null ? Mode.LIVE : mode, trigger, unless,
                    limits, window, approval, main, onFailure, f.source(), contentHash, at.line(), at.column(), positions,
                    onStandDown);
        } catch (IllegalArgumentException e) {
            f.add(m, "", e.getMessage());
            return null;
        }
    }

    private Trigger trigger(YNode node) {
        positions.put("trigger", Read.position(node));
        YMap m = f.asMap(node, "trigger");
        if (m == null) return null;
        Read.allowOnly(f, m, "trigger", TRIGGER);
        Id signal = Read.value(f, m, "signal", "trigger", "trigger.signal", true, Id::of);
        SignalState state = Read.value(f, m, "state", "trigger", "trigger.state", true, PlaybookReader::problemState);
        Scope scope = Read.value(f, m, "scope", "trigger", "trigger.scope", true, Scope::parse);
        Duration confirmFor = Read.duration(f, m, "confirm-for", "trigger", "trigger.confirm-for", false);
        TagSelector clusters = m.get("clusters").map(n -> {
            positions.put("trigger.clusters", Read.position(n));
            return Read.selector(f, n, "trigger.clusters");
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

    /** The scope as written, for checks on steps when the rest of {@code trigger} has problems. */
    private static Scope scopeAsWritten(YMap m) {
        Optional<YNode> trigger = m.get("trigger");
        if (trigger.isEmpty() || !(trigger.get() instanceof YMap w)) return null;
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
        Read.allowOnly(f, m, "window", WINDOW, RENAMED_WINDOW);
        if (RENAMED_WINDOW.writtenIn(m, "allow") || RENAMED_WINDOW.writtenIn(m, "length")) return null;
        Set<DayOfWeek> days = EnumSet.noneOf(DayOfWeek.class);
        for (Set<DayOfWeek> some : f.values(m, "days", "window", ChangeWindow::parseDays)) days.addAll(some);
        if (m.get("days").orElse(null) instanceof YList l && l.items().isEmpty()) {
            f.add(l, "days", "window.days is empty; name at least one day, such as [mon-fri], or leave days out for every day");
        }
        LocalTime from = Read.value(f, m, "from", "window", "window.from", true, ChangeWindow::parseClock);
        LocalTime until = Read.value(f, m, "until", "window", "window.until", true, ChangeWindow::parseClock);
        ZoneId zone = Read.value(f, m, "zone", "window", "window.zone", true, PlaybookReader::zone);
        if (from != null && from.equals(until)) {
            f.add(m.get("until").get(), "until", "window.until must differ from window.from: a window needs a length;"
                    + " an until before from spans midnight");
            return null;
        }
        if (from == null || until == null || zone == null || (m.has("days") && days.isEmpty())) return null;
        return new ChangeWindow(m.has("days") ? days : ChangeWindow.everyDay(), from, until, zone);
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
        Read.allowOnly(f, m, "approval", APPROVAL, RENAMED_APPROVAL);
        TagSelector clusters = f.node(m, "clusters", "approval", !RENAMED_APPROVAL.writtenIn(m, "when"))
                .map(n -> Read.selector(f, n, "approval.clusters")).orElse(null);
        Duration expires = Read.positiveDuration(f, m, "expires-after", "approval", "approval.expires-after", false);
        if (clusters == null) return null;
        return new ApprovalPolicy(clusters, expires);
    }
}
