package dev.tend.shared.fleet;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;
import dev.tend.shared.SignalState;
import dev.tend.shared.TopologyChange;
import dev.tend.shared.TopologyEvent;

import java.time.Duration;
import java.time.Instant;
import java.util.Collections;
import java.util.HashMap;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;

/**
 * The live fleet health view: the topology plus, per (cluster, node, signal), the latest
 * state in event time. Events are ordered by {@code at} per key; an event older than the
 * one applied for its key changes nothing and is counted as late. Counts of unhealthy
 * clusters and impaired nodes are kept up to date as events arrive, so a guard asks them
 * in constant time.
 *
 * <p>Not thread-safe: the engine owns one and applies events on one thread.
 */
public final class FleetHealthView {
    /** How many recent state changes are kept per signal for flapping detection. */
    private static final int CHANGE_HISTORY = 32;

    private Fleet topology;
    /**
     * Raised at every change of which clusters and nodes {@link #topology} holds (not at a
     * change of a node's zone or attributes, which leaves every answer as it was): what a slot's
     * remembered answer of {@link #isInTopology} is checked against (a number, not the fleet
     * itself, so that no slot keeps an old topology alive: a fleet of 25,000 clusters is megabytes).
     */
    private long topologyVersion;
    /** One mutable slot per signal: a single map lookup per event. */
    private final Map<SignalKey, SignalSlot> signals = new HashMap<>(1 << 16);
    /** The slots' memos for {@link #memo}, remade for the slots events reached since the last. */
    private final SignalMemos memos = new SignalMemos();
    /** The last slot looked up or made, and its key ({@link #slot}). */
    private SignalKey lastKey;
    private SignalSlot lastSlot;
    /**
     * Slots by number, for keys of {@link #numbering} (the first numbering the view is handed): a
     * cache of {@link #signals}, filled as numbered keys are met (a slot stays its key's for the
     * view's life, so no entry goes stale). Keys of another numbering are looked up in the map.
     */
    private SignalNumbering numbering;
    private SignalSlot[] numbered = new SignalSlot[0];
    /** {@link #clusterSpec}'s answers by id instance (a reader's ids are canonical), at most 65,536; forgotten when the topology changes. */
    private final Map<Id, Optional<ClusterSpec>> specs = new java.util.IdentityHashMap<>();
    private final Map<dev.tend.shared.Target, Instant> topologyAppliedAt = new HashMap<>();
    /** Clusters with at least one active problem signal (node or cluster level), with their counts. */
    private final Map<Id, Problems> problems = new HashMap<>();
    /** Problems of clusters healthy again, empty, to be used again rather than made anew. */
    private final java.util.ArrayDeque<Problems> spare = new java.util.ArrayDeque<>();
    private static final int MAX_SPARE = 64;
    private long lateEvents;
    private long appliedEvents;

    public FleetHealthView(Fleet topology) {
        this.topology = topology;
    }

    public Fleet topology() {
        return topology;
    }

    /**
     * The cluster {@code id} of the topology, or null: {@code topology().cluster(id).orElse(null)},
     * the last answer remembered (the guards of one evaluation ask about the same cluster five
     * times or more) until the topology changes.
     */
    public ClusterSpec clusterSpec(Id id) {
        Optional<ClusterSpec> spec = specs.get(id); // the fleet's map compared each reader's id with its own, text by text
        if (spec == null) {
            if (specs.size() >= 1 << 16) specs.clear(); // ids that are not canonical: each instance would stay
            specs.put(id, spec = topology.cluster(id));
        }
        return spec.orElse(null);
    }

    /** Applies a transition and says what it did. */
    public ApplyOutcome apply(HealthTransition t) {
        return apply(t, t.key(), null);
    }

    /**
     * As {@link #apply(HealthTransition)}, with the transition's key numbered by its reader
     * ({@code key.key()} equal to {@code t.key()}): the signal's slot is found by its number.
     */
    public ApplyOutcome apply(HealthTransition t, SignalNumbering.Numbered key) {
        return apply(t, key.key(), key);
    }

    private ApplyOutcome apply(HealthTransition t, SignalKey key, SignalNumbering.Numbered numberedKey) {
        SignalSlot slot = numberedKey == null ? slot(key) : slot(numberedKey);
        Instant at = t.at();
        if (slot != null && slot.isBeforeLast(at)) {
            lateEvents++;
            return ApplyOutcome.LATE;
        }
        appliedEvents++;
        boolean fresh = slot == null;
        if (fresh) {
            slot = new SignalSlot(CHANGE_HISTORY);
            signals.put(key, slot);
            memos.added(key, slot);
            if (numberedKey != null) remember(numberedKey, slot);
            lastKey = key;
            lastSlot = slot;
        } else {
            memos.touched(slot);
        }
        if (!fresh && slot.state == t.state()) {
            slot.lastAt(at);
            return ApplyOutcome.REPEATED;
        }
        if (fresh && t.state() == SignalState.CLEAR) {
            slot.state = SignalState.CLEAR;
            slot.since = at;
            slot.lastAt(at);
            return ApplyOutcome.REPEATED;
        }
        boolean wasProblem = !fresh && slot.isProblem();
        slot.state = t.state();
        slot.since = at;
        slot.lastAt(at);
        slot.changed(at);
        if (t.state().isProblem() && !wasProblem) count(key, slot, +1);
        if (!t.state().isProblem() && wasProblem) count(key, slot, -1);
        return t.state().isProblem() ? ApplyOutcome.OPENED : ApplyOutcome.CLEARED;
    }

    /** Applies a topology event (joined, left, changed) in event-time order per node. */
    public ApplyOutcome apply(TopologyEvent e) {
        dev.tend.shared.Target key = dev.tend.shared.Target.node(e.cluster(), e.node());
        Instant applied = topologyAppliedAt.get(key);
        if (applied != null && e.at().isBefore(applied)) {
            lateEvents++;
            return ApplyOutcome.LATE;
        }
        appliedEvents++;
        topologyAppliedAt.put(key, e.at());
        boolean clusterBefore = topology.contains(e.cluster(), null);
        boolean nodeBefore = topology.contains(e.cluster(), e.node());
        ClusterSpec cluster = topology.cluster(e.cluster())
                .orElse(new ClusterSpec(e.cluster(), Map.of(), null, false, java.util.List.of()));
        if (e.change() == TopologyChange.LEFT) {
            cluster = cluster.withoutNode(e.node());
        } else {
            NodeSpec node = cluster.node(e.node()).orElse(new NodeSpec(e.node(), null, Map.of()));
            if (e.zone() != null) node = node.withZone(e.zone());
            cluster = cluster.withNode(node);
        }
        topology = topology.withCluster(cluster);
        specs.clear();
        // an answer of isInTopology depends only on whether the cluster and the node are there
        if (clusterBefore != topology.contains(e.cluster(), null) || nodeBefore != topology.contains(e.cluster(), e.node())) {
            topologyVersion++;
        }
        return ApplyOutcome.TOPOLOGY;
    }

    /** Active problem signals of one cluster: in all, at cluster level, and per node. */
    private static final class Problems {
        int total;
        int clusterLevel;
        final Map<Id, Integer> perNode = new HashMap<>(4);
        /** The active signals with their slots: a cluster's are listed without the fleet's map. */
        final Map<SignalKey, SignalSlot> active = new HashMap<>(4);
    }

    // one lookup per change instead of seven: every state change of every signal comes here
    private void count(SignalKey key, SignalSlot slot, int delta) {
        Problems p = problems.get(key.cluster());
        if (p == null) {
            p = spare.isEmpty() ? new Problems() : spare.pop();
            problems.put(key.cluster(), p);
        }
        p.total += delta;
        if (delta > 0) p.active.put(key, slot);
        else p.active.remove(key);
        if (key.node() == null) {
            p.clusterLevel += delta;
        } else if (p.perNode.merge(key.node(), delta, Integer::sum) == 0) {
            p.perNode.remove(key.node());
        }
        if (p.total == 0) {
            // its maps are empty again: kept for the next cluster that turns unhealthy (clusters come and go all day)
            problems.remove(key.cluster());
            if (spare.size() < MAX_SPARE) spare.push(p);
        }
    }

    /**
     * The slot of {@code key}, or null. The engine asks about the signal of the input at hand
     * several times (applied, in the topology, since when, still active when its candidate is
     * evaluated, how often it changed): the last slot found is remembered, so that only the
     * first asking looks in the map. A slot stays the key's for the view's life.
     */
    private SignalSlot slot(SignalKey key) {
        if (key.equals(lastKey)) return lastSlot;
        SignalSlot s = signals.get(key);
        if (s != null) {
            lastKey = key;
            lastSlot = s;
        }
        return s;
    }

    /** {@link #slot(SignalKey)} of a numbered key: by its number when the view knows it, else from the map (and then known). */
    private SignalSlot slot(SignalNumbering.Numbered n) {
        SignalKey key = n.key();
        if (key == lastKey) return lastSlot;
        int i = n.number();
        SignalSlot s = n.numbering() == numbering && i < numbered.length ? numbered[i] : null;
        if (s == null) {
            s = signals.get(key);
            if (s == null) return null;
            remember(n, s);
        }
        lastKey = key;
        lastSlot = s;
        return s;
    }

    private void remember(SignalNumbering.Numbered n, SignalSlot s) {
        if (numbering == null) numbering = n.numbering();
        else if (n.numbering() != numbering) return;
        int i = n.number();
        if (i >= numbered.length) numbered = java.util.Arrays.copyOf(numbered, Math.max(i + 1, Math.max(1024, numbered.length * 2)));
        numbered[i] = s;
    }

    public Optional<SignalStatus> status(SignalKey key) {
        SignalSlot s = slot(key);
        return s == null ? Optional.empty() : Optional.of(s.status());
    }

    /** True when {@code signal} on the node (or the cluster, node null) is in breach or silent. */
    public boolean isActive(Id cluster, Id node, Id signal) {
        // the active signals of unhealthy clusters, a few hundred small sets, rather than the map of every signal
        Problems p = problems.get(cluster);
        return p != null && p.active.containsKey(new SignalKey(cluster, node, signal));
    }

    /**
     * True when the signal's cluster, and its node unless null, are in the topology: what
     * {@link Fleet#contains} says, remembered with the signal until the topology changes (asked
     * for every transition; the signal's slot is at hand, the fleet's clusters and nodes are not).
     */
    public boolean isInTopology(SignalKey key) {
        SignalSlot s = slot(key);
        if (s == null) return topology.contains(key.cluster(), key.node());
        if (s.checkedVersion != topologyVersion) {
            s.inTopology = topology.contains(key.cluster(), key.node());
            s.checkedVersion = topologyVersion;
        }
        return s.inTopology;
    }

    /** The signals in breach or silent on a node (or on the cluster itself when node is null), by name. */
    public Map<Id, SignalStatus> activeSignals(Id cluster, Id node) {
        Map<Id, SignalStatus> out = new TreeMap<>();
        Problems p = problems.get(cluster);
        if (p == null) return out;
        p.active.forEach((k, slot) -> {
            if (java.util.Objects.equals(k.node(), node)) out.put(k.signal(), slot.status());
        });
        return out;
    }

    /** How many times the signal changed state at or after {@code since} (event time), up to the last 32. */
    public int changesSince(SignalKey key, Instant since) {
        SignalSlot slot = slot(key);
        return slot == null ? 0 : slot.changesSince(since);
    }

    public int changesWithin(SignalKey key, Instant now, Duration window) {
        return changesSince(key, now.minus(window));
    }

    public boolean isNodeImpaired(Id cluster, Id node) {
        Problems p = problems.get(cluster);
        return p != null && p.perNode.containsKey(node);
    }

    /** How many nodes of a cluster have at least one signal in breach or silent: {@code impairedNodes(cluster).size()}, without a copy. */
    public int impairedNodeCount(Id cluster) {
        Problems p = problems.get(cluster);
        return p == null ? 0 : p.perNode.size();
    }

    /** The nodes of a cluster with at least one signal in breach or silent. */
    public Set<Id> impairedNodes(Id cluster) {
        Problems p = problems.get(cluster);
        return p == null ? Set.of() : Collections.unmodifiableSet(new TreeSet<>(p.perNode.keySet()));
    }

    public boolean isUnhealthy(Id cluster) {
        return problems.containsKey(cluster);
    }

    public ClusterHealth health(Id cluster) {
        Problems p = problems.get(cluster);
        if (p == null) return ClusterHealth.HEALTHY;
        if (p.clusterLevel > 0) return ClusterHealth.UNHEALTHY;
        int impaired = p.perNode.size();
        int tolerated = topology.cluster(cluster).map(ClusterSpec::safeImpaired).orElse(Integer.MAX_VALUE);
        return impaired > tolerated ? ClusterHealth.UNHEALTHY : ClusterHealth.IMPAIRED;
    }

    /** Clusters with any signal in breach or silent, on a node or the cluster itself. */
    public int unhealthyClusterCount() {
        return problems.size();
    }

    public Set<Id> unhealthyClusters() {
        return Collections.unmodifiableSet(new TreeSet<>(problems.keySet()));
    }

    /** The fraction of the topology's clusters that are unhealthy (0 for an empty fleet). */
    public double unhealthyFraction() {
        int size = Math.max(topology.size(), problems.size());
        return size == 0 ? 0 : (double) problems.size() / size;
    }

    /** Impaired nodes per zone across the fleet; nodes without a known zone count under "unknown". */
    public Map<String, Integer> impairedPerZone() {
        Map<String, Integer> out = new TreeMap<>();
        for (Map.Entry<Id, Problems> c : problems.entrySet()) {
            Optional<ClusterSpec> spec = topology.cluster(c.getKey());
            for (Id node : c.getValue().perNode.keySet()) {
                String zone = spec.flatMap(s -> s.node(node)).map(NodeSpec::zone).orElse(null);
                out.merge(zone == null ? "unknown" : zone, 1, Integer::sum);
            }
        }
        return out;
    }

    /** How many signals the view knows (each one an event reached, or a snapshot held): what a snapshot writes. */
    public int signalCount() {
        return signals.size();
    }

    /** This view as plain values, for a snapshot; {@link #restore} reverses it. */
    public HealthMemo memo() {
        java.util.List<HealthMemo.Signal> out = memos.take(signals);
        java.util.List<HealthMemo.TopologyMark> marks = new java.util.ArrayList<>();
        java.util.Set<Id> touched = new java.util.HashSet<>();
        for (Map.Entry<dev.tend.shared.Target, Instant> e : topologyAppliedAt.entrySet()) {
            marks.add(new HealthMemo.TopologyMark(e.getKey(), e.getValue()));
            touched.add(e.getKey().cluster());
        }
        java.util.List<ClusterSpec> changed = new java.util.ArrayList<>();
        for (ClusterSpec c : topology.clusters()) if (touched.contains(c.id())) changed.add(c);
        return new HealthMemo(out, marks, changed, lateEvents, appliedEvents);
    }

    /**
     * The view of {@code memo} over {@code start}, the topology it began from (the fleet
     * file): topology events' changes are laid over it again, in fleet order.
     */
    public static FleetHealthView restore(Fleet start, HealthMemo memo) {
        Fleet topology = start;
        for (ClusterSpec c : memo.changedClusters()) topology = topology.withCluster(c);
        FleetHealthView v = new FleetHealthView(topology);
        v.memos.track(); // the memo's order, kept
        for (HealthMemo.Signal s : memo.signals()) {
            SignalSlot slot = new SignalSlot(CHANGE_HISTORY);
            slot.state = s.state();
            slot.since = s.since();
            slot.lastAt(s.lastAt());
            for (Instant c : s.changes()) slot.changed(c);
            v.signals.put(s.key(), slot);
            v.memos.added(s.key(), slot);
            if (s.state().isProblem()) v.count(s.key(), slot, +1);
        }
        for (HealthMemo.TopologyMark m : memo.topologyApplied()) v.topologyAppliedAt.put(m.node(), m.at());
        v.lateEvents = memo.lateEvents();
        v.appliedEvents = memo.appliedEvents();
        return v;
    }

    /** Events that arrived older than the one already applied for their key. */
    public long lateEvents() {
        return lateEvents;
    }

    public long appliedEvents() {
        return appliedEvents;
    }
}
