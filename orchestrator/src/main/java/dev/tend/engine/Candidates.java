package dev.tend.engine;

import dev.tend.engine.guard.Decision;
import dev.tend.engine.guard.Wake;
import dev.tend.shared.Id;

import java.time.Instant;
import java.util.ArrayList;
import java.util.Collection;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;

/**
 * Candidates that are held, denied or awaiting approval, indexed by what can change their
 * verdict: their cluster, anything fleet-wide, a person, or an event-time instant (time-based
 * holds use timers). Iteration orders are sorted, so the engine stays deterministic.
 */
final class Candidates {
    /** A candidate, its last verdict (null before the first), and its key's text {@code name} (made once per candidate, not at every use). */
    record Entry(Candidate candidate, Decision decision, String name) {
    }

    private final Map<Candidate.Key, Entry> entries = new HashMap<>();
    private final Map<Id, Set<String>> byCluster = new HashMap<>();
    private final Set<String> fleetWide = new TreeSet<>();
    private final TreeMap<Instant, Set<String>> eventAgenda = new TreeMap<>();
    /** Holds until a processing-time instant (a rate permit, a cooldown's end ...): looked at together when due. */
    private final TreeMap<Instant, Set<String>> timeAgenda = new TreeMap<>();
    private final Map<String, Candidate.Key> byName = new HashMap<>();
    private final Map<dev.tend.shared.SignalKey, Set<String>> byTrigger = new HashMap<>();

    Entry get(Candidate.Key key) {
        return entries.get(key);
    }

    Candidate.Key byName(String name) {
        return byName.get(name);
    }

    Collection<Entry> all() {
        List<Entry> out = new ArrayList<>(entries.values());
        out.sort((a, b) -> a.candidate().key().toString().compareTo(b.candidate().key().toString()));
        return out;
    }

    int size() {
        return entries.size();
    }

    /** Puts {@code c} with its verdict, replacing the candidate of its key; returns its name ({@link Candidate.Key#toString()}). */
    String put(Candidate c, Decision d) {
        Candidate.Key key = c.key();
        Entry old = entries.get(key);
        String name = old != null ? old.name() : key.toString();
        unindex(old, key);
        entries.put(key, new Entry(c, d, name));
        byName.put(name, key);
        byTrigger.computeIfAbsent(c.trigger(), k -> new TreeSet<>()).add(name);
        if (d == null) return name;
        if (d.wakesOn(Wake.CLUSTER) || d.wakesOn(Wake.HUMAN)) {
            byCluster.computeIfAbsent(c.target().cluster(), k -> new TreeSet<>()).add(name);
        }
        if (d.wakesOn(Wake.FLEET)) fleetWide.add(name);
        Instant et = d.retryAtEventTime();
        if (et != null) eventAgenda.computeIfAbsent(et, k -> new TreeSet<>()).add(name);
        if (d.wakesOn(Wake.TIME) && d.retryAt() != null) timeAgenda.computeIfAbsent(d.retryAt(), k -> new TreeSet<>()).add(name);
        return name;
    }

    /** The name of the candidate {@code key}: {@link Candidate.Key#toString()}, kept with the candidate while there is one. */
    String name(Candidate.Key key) {
        Entry e = entries.get(key);
        return e != null ? e.name() : key.toString();
    }

    void remove(Candidate.Key key) {
        Entry e = entries.remove(key);
        unindex(e, key);
        String name = e != null ? e.name() : key.toString();
        byName.remove(name);
        if (e != null) {
            Set<String> t = byTrigger.get(e.candidate().trigger());
            if (t != null) {
                t.remove(name);
                if (t.isEmpty()) byTrigger.remove(e.candidate().trigger());
            }
        }
    }

    /** Takes the entry {@code e} of {@code key} (null: none) out of the indexes its verdict put it in. */
    private void unindex(Entry e, Candidate.Key key) {
        if (e == null || e.decision() == null) return;
        String name = e.name();
        Set<String> s = byCluster.get(key.target().cluster());
        if (s != null) {
            s.remove(name);
            if (s.isEmpty()) byCluster.remove(key.target().cluster());
        }
        fleetWide.remove(name);
        unindex(eventAgenda, e.decision().retryAtEventTime(), name);
        unindex(timeAgenda, e.decision().retryAt(), name);
    }

    private static void unindex(TreeMap<Instant, Set<String>> agenda, Instant at, String name) {
        if (at == null) return;
        Set<String> a = agenda.get(at);
        if (a != null) {
            a.remove(name);
            if (a.isEmpty()) agenda.remove(at);
        }
    }

    /** The event-time agenda as it stands, soonest first: for a snapshot. */
    List<EngineState.AgendaSlot> eventAgenda() {
        return slots(eventAgenda);
    }

    /** The processing-time agenda as it stands, soonest first: for a snapshot. */
    List<EngineState.AgendaSlot> timeAgenda() {
        return slots(timeAgenda);
    }

    private static List<EngineState.AgendaSlot> slots(TreeMap<Instant, Set<String>> agenda) {
        List<EngineState.AgendaSlot> out = new ArrayList<>(agenda.size());
        agenda.forEach((at, names) -> out.add(new EngineState.AgendaSlot(at, List.copyOf(names))));
        return out;
    }

    /**
     * Replaces both agendas (after every entry was {@link #put} back): an entry's slot is gone
     * from its agenda once the instant passed, although its decision still names the instant,
     * so the agendas cannot be rebuilt from the entries.
     */
    void restoreAgendas(List<EngineState.AgendaSlot> byEventTime, List<EngineState.AgendaSlot> byTime) {
        eventAgenda.clear();
        for (EngineState.AgendaSlot s : byEventTime) eventAgenda.put(s.at(), new TreeSet<>(s.candidates()));
        timeAgenda.clear();
        for (EngineState.AgendaSlot s : byTime) timeAgenda.put(s.at(), new TreeSet<>(s.candidates()));
    }

    /** Candidates to look at again because something on the cluster changed. */
    List<String> onCluster(Id cluster) {
        Set<String> s = byCluster.get(cluster);
        return s == null ? List.of() : new ArrayList<>(s);
    }

    List<String> fleetWide() {
        return new ArrayList<>(fleetWide);
    }

    /** Candidates whose event-time objection may be gone now that event time reached {@code t}. */
    List<String> dueByEventTime(Instant t) {
        return due(eventAgenda, t);
    }

    /**
     * Candidates held until a processing-time instant at or before {@code t}: when one such
     * hold's timer fires, all that are due are looked at together, so that those that
     * become startable together start in the order their problems began.
     */
    List<String> dueByTime(Instant t) {
        return due(timeAgenda, t);
    }

    private static List<String> due(TreeMap<Instant, Set<String>> agenda, Instant t) {
        // asked at every event: most of the time nothing is due, and no list is made for that
        if (agenda.isEmpty() || agenda.firstKey().isAfter(t)) return List.of();
        List<String> out = new ArrayList<>();
        while (!agenda.isEmpty() && !agenda.firstKey().isAfter(t)) out.addAll(agenda.pollFirstEntry().getValue());
        return out;
    }

    /** Candidates triggered by the given signal key. */
    List<Candidate.Key> triggeredBy(dev.tend.shared.SignalKey trigger) {
        Set<String> names = byTrigger.get(trigger);
        if (names == null) return List.of();
        List<Candidate.Key> out = new ArrayList<>(names.size());
        for (String n : names) out.add(byName.get(n));
        return out;
    }
}
