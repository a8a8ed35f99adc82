package dev.tend.shared.wire;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import dev.tend.shared.TopologyChange;
import dev.tend.shared.TopologyEvent;

import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Turns the fields of one line into a health transition, a topology event or a recording
 * header, checking each field in the order they are written. The first problem found
 * rejects the line. Optional fields that are null count as absent.
 */
final class LineDecoder {
    private static final int ABSENT = -1;

    private LineDecoder() {
    }

    static HealthTransition transition(JsonLine l) throws LineRejected {
        Instant at = time(l, "at", true);
        Id cluster = id(l, "cluster", "fares-3", true);
        Id node = id(l, "node", "n2", false);
        Id signal = id(l, "signal", "storage-full", true);
        int s = required(l, "state");
        SignalState state = switch (l.value(s) instanceof String v ? v : "") {
            case "breach" -> SignalState.BREACH;
            case "silent" -> SignalState.SILENT;
            case "clear" -> SignalState.CLEAR;
            default -> throw rejected(l, s, "field 'state' must be breach, silent or clear, got " + WireText.got(l.value(s)));
        };
        Map<String, Object> detail = object(l, "detail", "{\"used_pct\":97.5}");
        return new HealthTransition(at, cluster, node, signal, state, detail, extra(l, LineDecoder::isTransitionField));
    }

    static TopologyEvent topology(JsonLine l) throws LineRejected {
        Instant at = time(l, "at", true);
        Id cluster = id(l, "cluster", "fares-3", true);
        if (absent(l, l.indexOf("node"))) {
            throw new LineRejected(0, "node", "missing field 'node': a topology event names the node that joined, left or changed");
        }
        Id node = id(l, "node", "n4", true);
        int t = required(l, "topology");
        TopologyChange change = switch (l.value(t) instanceof String v ? v : "") {
            case "joined" -> TopologyChange.JOINED;
            case "left" -> TopologyChange.LEFT;
            case "changed" -> TopologyChange.CHANGED;
            default -> throw rejected(l, t, "field 'topology' must be joined, left or changed, got " + WireText.got(l.value(t)));
        };
        Map<String, Object> attrs = object(l, "attrs", "{\"zone\":\"z-b\"}");
        return new TopologyEvent(at, cluster, node, change, attrs, extra(l, LineDecoder::isTopologyField));
    }

    static RecordingHeader header(JsonLine l) throws LineRejected {
        int r = l.indexOf("recording");
        if (!(l.value(r) instanceof String name) || name.isBlank()) {
            throw rejected(l, r, "field 'recording' must be the recording's name, a non-empty string, got " + WireText.got(l.value(r)));
        }
        if (name.length() > RecordingHeader.MAX_NAME) {
            throw rejected(l, r, "field 'recording': the name is at most " + RecordingHeader.MAX_NAME
                    + " characters, got " + name.length());
        }
        String path = null;
        Map<String, Object> inline = null;
        int fleet = l.indexOf("fleet");
        if (!absent(l, fleet)) {
            if (l.value(fleet) instanceof String p && !p.isBlank()) {
                path = p;
            } else if (l.value(fleet) instanceof Map<?, ?>) {
                inline = asObject(l.value(fleet));
            } else {
                throw rejected(l, fleet, "field 'fleet' must be a fleet file's path (a string) or the fleet inline (an object), got "
                        + WireText.got(l.value(fleet)));
            }
        }
        Instant from = time(l, "from", false);
        Instant until = time(l, "until", false);
        if (from != null && until != null && until.isBefore(from)) {
            throw rejected(l, l.indexOf("until"), "field 'until': " + Rfc3339.format(until) + " is before 'from' ("
                    + Rfc3339.format(from) + ")");
        }
        int d = l.indexOf("description");
        String description = null;
        if (!absent(l, d)) {
            if (!(l.value(d) instanceof String text)) {
                throw rejected(l, d, "field 'description' must be a string, got " + WireText.got(l.value(d)));
            }
            description = text;
        }
        return new RecordingHeader(name, path, inline, from, until, description, extra(l, RecordingHeader.FIELDS::contains));
    }

    private static boolean isTransitionField(String name) {
        return switch (name) {
            case "at", "cluster", "node", "signal", "state", "detail" -> true;
            default -> false;
        };
    }

    private static boolean isTopologyField(String name) {
        return switch (name) {
            case "at", "cluster", "node", "topology", "attrs" -> true;
            default -> false;
        };
    }

    private static Instant time(JsonLine l, String name, boolean required) throws LineRejected {
        int i = required ? required(l, name) : l.indexOf(name);
        if (!required && absent(l, i)) return null;
        if (!(l.value(i) instanceof String text)) {
            throw rejected(l, i, "field '" + name + "' must be an RFC 3339 time with a zone (like " + Rfc3339.EXAMPLE
                    + "), got " + WireText.got(l.value(i)));
        }
        try {
            return Rfc3339.parse(text);
        } catch (IllegalArgumentException e) {
            throw rejected(l, i, "field '" + name + "': " + e.getMessage());
        }
    }

    private static Id id(JsonLine l, String name, String example, boolean required) throws LineRejected {
        int i = required ? required(l, name) : l.indexOf(name);
        if (!required && absent(l, i)) return null;
        if (!(l.value(i) instanceof String text)) {
            throw rejected(l, i, "field '" + name + "' must be an id (a string like " + example + "), got " + WireText.got(l.value(i)));
        }
        if (!Id.isValid(text)) throw rejected(l, i, "field '" + name + "': " + Id.describeInvalid(text));
        return new Id(text);
    }

    private static Map<String, Object> object(JsonLine l, String name, String example) throws LineRejected {
        int i = l.indexOf(name);
        if (absent(l, i)) return Map.of();
        if (!(l.value(i) instanceof Map<?, ?>)) {
            throw rejected(l, i, "field '" + name + "' must be an object (like " + example + "), got " + WireText.got(l.value(i)));
        }
        return asObject(l.value(i));
    }

    /** Every field that {@code known} does not claim, in line order. */
    private static Map<String, Object> extra(JsonLine l, java.util.function.Predicate<String> known) {
        Map<String, Object> extra = null;
        for (int i = 0; i < l.size(); i++) {
            if (known.test(l.name(i))) continue;
            if (extra == null) extra = new LinkedHashMap<>();
            extra.put(l.name(i), l.value(i));
        }
        return extra == null ? Map.of() : extra;
    }

    private static int required(JsonLine l, String name) throws LineRejected {
        int i = l.indexOf(name);
        if (i == ABSENT) throw new LineRejected(0, name, "missing field '" + name + "'");
        return i;
    }

    private static boolean absent(JsonLine l, int i) {
        return i == ABSENT || l.value(i) == null;
    }

    @SuppressWarnings("unchecked")
    private static Map<String, Object> asObject(Object v) {
        // JsonLine builds every object as a Map with String keys
        return (Map<String, Object>) v;
    }

    private static LineRejected rejected(JsonLine l, int i, String message) {
        return new LineRejected(l.column(i), l.name(i), message);
    }
}
