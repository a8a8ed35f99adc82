package dev.tend.runtime;

import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.core.io.SerializedString;
import com.fasterxml.jackson.databind.JsonSerializer;
import com.fasterxml.jackson.databind.SerializerProvider;
import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;
import dev.tend.shared.fleet.HealthMemo;
import dev.tend.shared.fleet.InstantList;
import dev.tend.shared.time.InstantText;

import java.io.IOException;
import java.time.Instant;

/**
 * Writes one signal of a snapshot's health view, the bulk of every snapshot (one per
 * signal of the fleet: 56,000 for 2,000 clusters, with about 400,000 instants), as exactly
 * the JSON that {@link SnapshotCodec}'s record mapping writes for it ({@code key} with
 * {@code cluster}, {@code node} and {@code signal}, then {@code state}, {@code since},
 * {@code lastAt} and {@code changes}), without looking each component up by reflection and
 * without a string per instant (nor an instant per change, when they come as an {@link InstantList}). Reading goes through the record mapping as before.
 */
final class SignalMemoWriter extends JsonSerializer<HealthMemo.Signal> {
    private static final SerializedString KEY = new SerializedString("key");
    private static final SerializedString CLUSTER = new SerializedString("cluster");
    private static final SerializedString NODE = new SerializedString("node");
    private static final SerializedString SIGNAL = new SerializedString("signal");
    private static final SerializedString STATE = new SerializedString("state");
    private static final SerializedString SINCE = new SerializedString("since");
    private static final SerializedString LAST_AT = new SerializedString("lastAt");
    private static final SerializedString CHANGES = new SerializedString("changes");

    @Override
    public void serialize(HealthMemo.Signal s, JsonGenerator g, SerializerProvider p) throws IOException {
        char[] text = new char[InstantText.MAX];
        g.writeStartObject();
        SignalKey k = s.key();
        g.writeFieldName(KEY);
        g.writeStartObject();
        id(g, CLUSTER, k.cluster());
        id(g, NODE, k.node());
        id(g, SIGNAL, k.signal());
        g.writeEndObject();
        g.writeFieldName(STATE);
        if (s.state() == null) g.writeNull();
        else g.writeString(s.state().name());
        g.writeFieldName(SINCE);
        instant(g, s.since(), text);
        g.writeFieldName(LAST_AT);
        instant(g, s.lastAt(), text);
        g.writeFieldName(CHANGES);
        g.writeStartArray();
        if (s.changes() instanceof InstantList list) {
            for (int i = 0; i < list.size(); i++) {
                int n = InstantText.write(list.epochSecond(i), list.nano(i), text);
                if (n < 0) g.writeString(InstantText.of(list.get(i)));
                else g.writeString(text, 0, n);
            }
        } else {
            for (Instant t : s.changes()) instant(g, t, text);
        }
        g.writeEndArray();
        g.writeEndObject();
    }

    private static void id(JsonGenerator g, SerializedString name, Id id) throws IOException {
        g.writeFieldName(name);
        if (id == null) g.writeNull();
        else g.writeString(id.value());
    }

    /** {@link InstantText#of}'s text of {@code t}, written from {@code text} without a string. */
    private static void instant(JsonGenerator g, Instant t, char[] text) throws IOException {
        if (t == null) {
            g.writeNull();
            return;
        }
        int n = InstantText.write(t, text);
        if (n < 0) g.writeString(InstantText.of(t));
        else g.writeString(text, 0, n);
    }
}
