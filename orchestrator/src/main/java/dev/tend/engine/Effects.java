package dev.tend.engine;

import dev.tend.shared.Target;
import dev.tend.shared.time.InstantText;

import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/** Collects the effects of handling one input, in order. Not thread-safe; one per input. */
public final class Effects {
    private final List<Effect> out = new ArrayList<>();
    private final Instant now;

    public Effects(Instant now) {
        this.now = now;
    }

    public Instant now() {
        return now;
    }

    public void add(Effect e) {
        out.add(e);
    }

    /** A ledger entry; {@code kv} alternates keys and values; null values are left out. */
    public void ledger(LedgerKind kind, Object... kv) {
        Map<String, Object> fields = new LinkedHashMap<>();
        for (int i = 0; i + 1 < kv.length; i += 2) {
            if (kv[i + 1] != null) fields.put((String) kv[i], normalise(kv[i + 1]));
        }
        out.add(new Effect.Ledger(kind, fields));
    }

    public static Object normalise(Object v) {
        if (v instanceof Instant i) return InstantText.of(i);
        if (v instanceof Target t) return t.toString();
        if (v instanceof dev.tend.shared.Id id) return id.value();
        if (v instanceof Enum<?> e) return e.toString();
        if (v instanceof List<?> l) {
            List<Object> c = new ArrayList<>();
            for (Object o : l) c.add(normalise(o));
            return c;
        }
        return v;
    }

    public void arm(TimerKey key, Instant due) {
        out.add(new Effect.ArmTimer(key.wire(), due));
    }

    public void cancel(TimerKey key) {
        out.add(new Effect.CancelTimer(key.wire()));
    }

    public List<Effect> list() {
        return out;
    }
}
