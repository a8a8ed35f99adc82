package dev.tend.shared.wire;

import dev.tend.shared.JsonValues;

import java.time.Instant;
import java.util.Map;
import java.util.Objects;
import java.util.Set;

/**
 * The optional first line of a recording:
 * {@code {"recording":"<name>","fleet":"<path or inline>","from":"...","until":"...","description":"..."}}.
 *
 * <p>On the wire {@code fleet} is either a string, the path of a fleet file (relative paths
 * are relative to the recording's folder, for whoever resolves them), or an object, the
 * fleet file itself inline (the same keys as the YAML fleet file). The record keeps the two
 * apart: {@code fleet} holds a path, {@code inlineFleet} an inline fleet; at most one is set.
 *
 * @param name        the recording's name, not blank, at most 256 characters
 * @param fleet       the fleet file's path, or null
 * @param inlineFleet the fleet inline as JSON values, or null; unmodifiable
 * @param from        when the recorded period starts, or null
 * @param until       when it ends, or null; not before {@code from}
 * @param description free text, or null
 * @param extra       unknown fields, kept and ignored; unmodifiable, never null, and never
 *                    holding a header field's name
 */
public record RecordingHeader(String name, String fleet, Map<String, Object> inlineFleet, Instant from,
                              Instant until, String description, Map<String, Object> extra) {
    /** The fields of a header line; {@code recording} marks a line as a header. */
    public static final Set<String> FIELDS = Set.of("recording", "fleet", "from", "until", "description");

    static final int MAX_NAME = 256;

    public RecordingHeader {
        Objects.requireNonNull(name, "recording");
        if (name.isBlank()) throw new IllegalArgumentException("recording (the name) must not be blank");
        if (name.length() > MAX_NAME) {
            throw new IllegalArgumentException("recording (the name) is at most " + MAX_NAME + " characters, got " + name.length());
        }
        if (fleet != null && fleet.isBlank()) throw new IllegalArgumentException("fleet (a path) must not be blank");
        if (fleet != null && inlineFleet != null) {
            throw new IllegalArgumentException("a recording header names its fleet once: a path or inline, not both");
        }
        if (from != null && until != null && until.isBefore(from)) {
            throw new IllegalArgumentException("until (" + Rfc3339.format(until) + ") is before from (" + Rfc3339.format(from) + ")");
        }
        inlineFleet = inlineFleet == null ? null : JsonValues.freeze(inlineFleet);
        extra = extra == null ? Map.of() : JsonValues.freeze(extra);
        for (String key : extra.keySet()) {
            if (FIELDS.contains(key)) throw new IllegalArgumentException("extra must not hold '" + key + "', a header field");
        }
    }

    /** A header with only a name. */
    public static RecordingHeader of(String name) {
        return new RecordingHeader(name, null, null, null, null, null, Map.of());
    }

    /** A copy naming the fleet file by path (and no inline fleet). */
    public RecordingHeader withFleet(String path) {
        return new RecordingHeader(name, path, null, from, until, description, extra);
    }

    /** A copy carrying the fleet inline (and no path). */
    public RecordingHeader withInlineFleet(Map<String, ?> fleetFile) {
        return new RecordingHeader(name, null, JsonValues.freeze(fleetFile), from, until, description, extra);
    }

    /** A copy with the recorded period; either end may be null. */
    public RecordingHeader withPeriod(Instant newFrom, Instant newUntil) {
        return new RecordingHeader(name, fleet, inlineFleet, newFrom, newUntil, description, extra);
    }

    public RecordingHeader withDescription(String text) {
        return new RecordingHeader(name, fleet, inlineFleet, from, until, text, extra);
    }

    /** True when the fleet comes inline rather than as a path. */
    public boolean hasInlineFleet() {
        return inlineFleet != null;
    }
}
