package dev.tend.shared.wire;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import dev.tend.shared.TopologyChange;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.wire.JsonLine.Field;

import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Set;

/**
 * Turns the fields of one line into a health transition, a topology event or a recording
 * header, checking each field in the order they are written. The first problem found
 * rejects the line. Optional fields that are null count as absent.
 */
final class LineDecoder {
    private static final Set<String> TRANSITION = Set.of("at", "cluster", "node", "signal", "state", "detail");
    private static final Set<String> TOPOLOGY = Set.of("at", "cluster", "node", "topology", "attrs");

    private LineDecoder() {
    }

    static HealthTransition transition(Map<String, Field> f) throws LineRejected {
        Instant at = time(f, "at", true);
        Id cluster = id(f, "cluster", "fares-3", true);
        Id node = id(f, "node", "n2", false);
        Id signal = id(f, "signal", "storage-full", true);
        Field s = required(f, "state");
        SignalState state = switch (s.value() instanceof String v ? v : "") {
            case "breach" -> SignalState.BREACH;
            case "silent" -> SignalState.SILENT;
            case "clear" -> SignalState.CLEAR;
            default -> throw rejected(s, "field 'state' must be breach, silent or clear, got " + WireText.got(s.value()));
        };
        Map<String, Object> detail = object(f, "detail", "{\"used_pct\":97.5}");
        return new HealthTransition(at, cluster, node, signal, state, detail, extra(f, TRANSITION));
    }

    static TopologyEvent topology(Map<String, Field> f) throws LineRejected {
        Instant at = time(f, "at", true);
        Id cluster = id(f, "cluster", "fares-3", true);
        if (absent(f.get("node"))) {
            throw new LineRejected(0, "node", "missing field 'node': a topology event names the node that joined, left or changed");
        }
        Id node = id(f, "node", "n4", true);
        Field t = required(f, "topology");
        TopologyChange change = switch (t.value() instanceof String v ? v : "") {
            case "joined" -> TopologyChange.JOINED;
            case "left" -> TopologyChange.LEFT;
            case "changed" -> TopologyChange.CHANGED;
            default -> throw rejected(t, "field 'topology' must be joined, left or changed, got " + WireText.got(t.value()));
        };
        Map<String, Object> attrs = object(f, "attrs", "{\"zone\":\"z-b\"}");
        return new TopologyEvent(at, cluster, node, change, attrs, extra(f, TOPOLOGY));
    }

    static RecordingHeader header(Map<String, Field> f) throws LineRejected {
        Field r = f.get("recording");
        if (!(r.value() instanceof String name) || name.isBlank()) {
            throw rejected(r, "field 'recording' must be the recording's name, a non-empty string, got " + WireText.got(r.value()));
        }
        if (name.length() > RecordingHeader.MAX_NAME) {
            throw rejected(r, "field 'recording': the name is at most " + RecordingHeader.MAX_NAME
                    + " characters, got " + name.length());
        }
        String path = null;
        Map<String, Object> inline = null;
        Field fleet = f.get("fleet");
        if (!absent(fleet)) {
            if (fleet.value() instanceof String p && !p.isBlank()) {
                path = p;
            } else if (fleet.value() instanceof Map<?, ?>) {
                inline = asObject(fleet.value());
            } else {
                throw rejected(fleet, "field 'fleet' must be a fleet file's path (a string) or the fleet inline (an object), got "
                        + WireText.got(fleet.value()));
            }
        }
        Instant from = time(f, "from", false);
        Instant until = time(f, "until", false);
        if (from != null && until != null && until.isBefore(from)) {
            throw rejected(f.get("until"), "field 'until': " + Rfc3339.format(until) + " is before 'from' (" + Rfc3339.format(from) + ")");
        }
        Field d = f.get("description");
        String description = null;
        if (!absent(d)) {
            if (!(d.value() instanceof String text)) {
                throw rejected(d, "field 'description' must be a string, got " + WireText.got(d.value()));
            }
            description = text;
        }
        return new RecordingHeader(name, path, inline, from, until, description, extra(f, RecordingHeader.FIELDS));
    }

    private static Instant time(Map<String, Field> f, String name, boolean required) throws LineRejected {
        Field x = required ? required(f, name) : f.get(name);
        if (!required && absent(x)) return null;
        if (!(x.value() instanceof String text)) {
            throw rejected(x, "field '" + name + "' must be an RFC 3339 time with a zone (like " + Rfc3339.EXAMPLE
                    + "), got " + WireText.got(x.value()));
        }
        try {
            return Rfc3339.parse(text);
        } catch (IllegalArgumentException e) {
            throw rejected(x, "field '" + name + "': " + e.getMessage());
        }
    }

    private static Id id(Map<String, Field> f, String name, String example, boolean required) throws LineRejected {
        Field x = required ? required(f, name) : f.get(name);
        if (!required && absent(x)) return null;
        if (!(x.value() instanceof String text)) {
            throw rejected(x, "field '" + name + "' must be an id (a string like " + example + "), got " + WireText.got(x.value()));
        }
        if (!Id.isValid(text)) throw rejected(x, "field '" + name + "': " + Id.describeInvalid(text));
        return new Id(text);
    }

    private static Map<String, Object> object(Map<String, Field> f, String name, String example) throws LineRejected {
        Field x = f.get(name);
        if (absent(x)) return Map.of();
        if (!(x.value() instanceof Map<?, ?>)) {
            throw rejected(x, "field '" + name + "' must be an object (like " + example + "), got " + WireText.got(x.value()));
        }
        return asObject(x.value());
    }

    /** Every field not in {@code known}, in line order. */
    private static Map<String, Object> extra(Map<String, Field> f, Set<String> known) {
        if (f.size() <= known.size() && known.containsAll(f.keySet())) return Map.of();
        Map<String, Object> extra = new LinkedHashMap<>();
        for (Field x : f.values()) {
            if (!known.contains(x.name())) extra.put(x.name(), x.value());
        }
        return extra;
    }

    private static Field required(Map<String, Field> f, String name) throws LineRejected {
        Field x = f.get(name);
        if (x == null) throw new LineRejected(0, name, "missing field '" + name + "'");
        return x;
    }

    private static boolean absent(Field x) {
        return x == null || x.value() == null;
    }

    @SuppressWarnings("unchecked")
    private static Map<String, Object> asObject(Object v) {
        // JsonLine builds every object as a Map with String keys
        return (Map<String, Object>) v;
    }

    private static LineRejected rejected(Field at, String message) {
        return new LineRejected(at.column(), at.name(), message);
    }
}
