package dev.tend.shared.fleet;

import dev.tend.shared.SignalKey;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;

/**
 * The {@link FleetHealthView}'s signals as a snapshot takes them ({@link HealthMemo#signals}):
 * each signal's memo is kept by its number, and a take remakes only those of the signals an
 * event reached since the last take. A snapshot of 56,000 signals after 50,000 events costs the
 * signals those events touched and one copy of an array, rather than a walk through every slot
 * of the view's map.
 *
 * <p>Nothing is kept until the first take (a replay never takes one): that take numbers the
 * signals in the order of the view's map, and later signals are numbered as the view meets
 * them. A view restored from a memo numbers its signals in the memo's order from the start, so
 * that it lists them as the view it was taken from does.
 *
 * <p>Not thread-safe: the view's. The memos are immutable and may be handed to another thread.
 */
final class SignalMemos {
    private boolean tracking;
    private HealthMemo.Signal[] memos = new HealthMemo.Signal[0];
    private int count;
    /** Slots made or reached by an event since the last {@link #take}, each once. */
    private final List<SignalSlot> touched = new ArrayList<>();

    /** Keeps the memos from now on, numbering the slots as {@link #added} meets them. */
    void track() {
        tracking = true;
    }

    /** {@code slot}, new in the view under {@code key}. */
    void added(SignalKey key, SignalSlot slot) {
        slot.key = key;
        if (tracking) number(slot);
    }

    /** An event reached {@code slot} (it may have changed). */
    void touched(SignalSlot slot) {
        if (!tracking || slot.touched) return;
        slot.touched = true;
        touched.add(slot);
    }

    /** Every signal's memo as the slots of {@code all} (the view's map) stand now, in their numbers' order. */
    List<HealthMemo.Signal> take(Map<SignalKey, SignalSlot> all) {
        if (!tracking) {
            tracking = true;
            for (SignalSlot s : all.values()) number(s);
        }
        for (SignalSlot s : touched) {
            memos[s.number] = s.memo();
            s.touched = false;
        }
        touched.clear();
        return Arrays.asList(Arrays.copyOf(memos, count));
    }

    private void number(SignalSlot slot) {
        if (count == memos.length) memos = Arrays.copyOf(memos, Math.max(1024, count * 2));
        slot.number = count++;
        slot.touched = true;
        touched.add(slot);
    }
}
