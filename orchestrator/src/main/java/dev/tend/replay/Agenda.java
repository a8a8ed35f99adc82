package dev.tend.replay;

import dev.tend.engine.Input;

import java.time.Instant;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.TreeSet;

/**
 * What is due in virtual time: the engine's timers and the answers of simulated executor
 * calls. {@link #next(Instant)} hands them out in time order; at the same instant, executor
 * answers come before timer firings (an action that finishes exactly when its step times out
 * finished in time), and within each kind they come in the order they were scheduled (a
 * timer armed again goes to the back). So a replay is deterministic.
 *
 * <p>Not thread-safe: the replay driver owns one.
 */
final class Agenda {
    /** An executor's answer, and the signals its action clears on the target (fed as clear transitions). */
    record Answer(Input.ExecutorResult result, List<dev.tend.shared.Id> clears, dev.tend.shared.Target target,
                  String action) {
    }

    /** One thing due: a timer (key set) or an answer (answer set). */
    record Item(Instant due, int order, long seq, String timerKey, Answer answer) {
        boolean isTimer() {
            return timerKey != null;
        }
    }

    private static final int ANSWER = 0;
    private static final int TIMER = 1;

    private final TreeSet<Item> due = new TreeSet<>(Comparator.comparing(Item::due).thenComparingInt(Item::order)
            .thenComparingLong(Item::seq));
    private final Map<String, Item> timers = new HashMap<>();
    private long seq;
    /** The earliest due time, or null when it must be looked up again: most events find nothing due. */
    private Instant earliest;

    /** Arms {@code key} at {@code at}; arming an armed key moves it. */
    void arm(String key, Instant at) {
        Objects.requireNonNull(key, "key");
        cancel(key);
        Item item = new Item(at, TIMER, seq++, key, null);
        timers.put(key, item);
        add(item);
    }

    void cancel(String key) {
        Item old = timers.remove(key);
        if (old != null) {
            due.remove(old);
            if (old.due().equals(earliest)) earliest = null;
        }
    }

    void answer(Answer answer, Instant at) {
        add(new Item(at, ANSWER, seq++, null, answer));
    }

    private void add(Item item) {
        boolean wasEmpty = due.isEmpty();
        due.add(item);
        if (wasEmpty || earliest != null && item.due().isBefore(earliest)) earliest = item.due();
    }

    /** Takes the first item due at or before {@code t}, or returns null when there is none. */
    Item next(Instant t) {
        if (due.isEmpty()) return null;
        if (earliest != null && earliest.isAfter(t)) return null;
        Item first = due.first();
        earliest = first.due();
        if (first.due().isAfter(t)) return null;
        due.pollFirst();
        earliest = null;
        if (first.isTimer()) timers.remove(first.timerKey());
        return first;
    }

    int size() {
        return due.size();
    }
}
