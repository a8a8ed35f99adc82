package dev.tend.engine;

import dev.tend.shared.Target;
import dev.tend.shared.time.InstantText;

import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/** Collects the effects of handling one input, in order. Not thread-safe; one per input. */
public final class Effects {
    /** Made at the first effect: most inputs of a file have none, and under C1 an empty list is still an allocation. */
    private List<Effect> out = List.of();
    private final Instant now;
    private final Set<LedgerKind> kept;

    public Effects(Instant now) {
        this(now, null);
    }

    /** Effects that carry ledger entries of the kinds {@code kept} only (null: of every kind). */
    Effects(Instant now, Set<LedgerKind> kept) {
        this.now = now;
        this.kept = kept;
    }

    public Instant now() {
        return now;
    }

    public void add(Effect e) {
        writable().add(e);
    }

    private List<Effect> writable() {
        if (!(out instanceof ArrayList)) out = new ArrayList<>(4);
        return out;
    }

    /** True when these effects carry ledger entries of {@code kind}: a caller may skip making an entry's values otherwise. */
    boolean keeps(LedgerKind kind) {
        return kept == null || kept.contains(kind);
    }

    /** A ledger entry; {@code kv} alternates keys and values; null values are left out. */
    public void ledger(LedgerKind kind, Object... kv) {
        if (kept != null && !kept.contains(kind)) return;
        writable().add(new Effect.Ledger(kind, fields(kv)));
    }

    /**
     * The entry's fields as the immutable map {@link Effect.Ledger} keeps (built at once, rather
     * than in a map it then copies: an input of a replay ledgers once or more).
     */
    static Map<String, Object> fields(Object... kv) {
        Object[] p = new Object[kv.length & ~1];
        int n = 0;
        for (int i = 0; i + 1 < kv.length; i += 2) {
            if (kv[i + 1] == null) continue;
            p[n++] = kv[i];
            p[n++] = normalise(kv[i + 1]);
        }
        return switch (n / 2) {
            case 0 -> Map.of();
            case 1 -> Map.of(k(p, 0), p[1]);
            case 2 -> Map.of(k(p, 0), p[1], k(p, 2), p[3]);
            case 3 -> Map.of(k(p, 0), p[1], k(p, 2), p[3], k(p, 4), p[5]);
            case 4 -> Map.of(k(p, 0), p[1], k(p, 2), p[3], k(p, 4), p[5], k(p, 6), p[7]);
            case 5 -> Map.of(k(p, 0), p[1], k(p, 2), p[3], k(p, 4), p[5], k(p, 6), p[7], k(p, 8), p[9]);
            case 6 -> Map.of(k(p, 0), p[1], k(p, 2), p[3], k(p, 4), p[5], k(p, 6), p[7], k(p, 8), p[9], k(p, 10), p[11]);
            case 7 -> Map.of(k(p, 0), p[1], k(p, 2), p[3], k(p, 4), p[5], k(p, 6), p[7], k(p, 8), p[9], k(p, 10), p[11],
                    k(p, 12), p[13]);
            case 8 -> Map.of(k(p, 0), p[1], k(p, 2), p[3], k(p, 4), p[5], k(p, 6), p[7], k(p, 8), p[9], k(p, 10), p[11],
                    k(p, 12), p[13], k(p, 14), p[15]);
            case 9 -> Map.of(k(p, 0), p[1], k(p, 2), p[3], k(p, 4), p[5], k(p, 6), p[7], k(p, 8), p[9], k(p, 10), p[11],
                    k(p, 12), p[13], k(p, 14), p[15], k(p, 16), p[17]);
            case 10 -> Map.of(k(p, 0), p[1], k(p, 2), p[3], k(p, 4), p[5], k(p, 6), p[7], k(p, 8), p[9], k(p, 10), p[11],
                    k(p, 12), p[13], k(p, 14), p[15], k(p, 16), p[17], k(p, 18), p[19]);
            default -> {
                Map<String, Object> m = new LinkedHashMap<>();
                for (int i = 0; i < n; i += 2) m.put(k(p, i), p[i + 1]);
                yield Map.copyOf(m);
            }
        };
    }

    private static String k(Object[] pairs, int i) {
        return (String) pairs[i];
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
        writable().add(new Effect.ArmTimer(key.wire(), due));
    }

    public void cancel(TimerKey key) {
        writable().add(new Effect.CancelTimer(key.wire()));
    }

    public List<Effect> list() {
        return out;
    }
}
