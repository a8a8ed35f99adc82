package dev.tend.runtime;

import dev.tend.engine.Effect;

import java.util.Collections;
import java.util.HashMap;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * The timer operations of a batch's effects that a later one of the same batch replaces: of
 * the arms and cancels of one key, only the last decides whether and when it is armed once
 * the batch is acted on. The commit does not write the others to the timers table, nor does
 * the driver hand them to the scheduler: a 1,000,000-line ingest armed 33,000 timers (of
 * 8,000 keys) and cancelled 24,000, most within the batch that armed them, each a row written
 * and deleted and a rescheduling of the Quartz scheduler that woke its thread
 * (DEVELOPERS.md, "Ingest"). What is left is what performing them one by one would leave.
 */
final class TimerOps {
    private TimerOps() {
    }

    /** The replaced arms and cancels among {@code effects} (in the order they were decided), by identity. */
    static Set<Effect> superseded(List<Effect> effects) {
        Map<String, Effect> last = new HashMap<>();
        Set<Effect> replaced = Collections.newSetFromMap(new IdentityHashMap<>());
        for (Effect e : effects) {
            String key = key(e);
            if (key == null) continue;
            Effect before = last.put(key, e);
            if (before != null) replaced.add(before);
        }
        return replaced;
    }

    private static String key(Effect e) {
        if (e instanceof Effect.ArmTimer t) return t.key();
        if (e instanceof Effect.CancelTimer t) return t.key();
        return null;
    }
}
