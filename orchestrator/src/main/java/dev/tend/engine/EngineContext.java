package dev.tend.engine;

import dev.tend.engine.guard.GuardContext;
import dev.tend.engine.run.RunProcess;
import dev.tend.playbooks.EffectiveLimits;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.RateLimit;
import dev.tend.playbooks.TendConfig;
import dev.tend.shared.Id;
import dev.tend.shared.Target;
import dev.tend.shared.fleet.FleetHealthView;
import dev.tend.shared.fleet.NodeSpec;

import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/**
 * The engine's state as guards read it: the health view, active runs, run history,
 * exclusions, the brake and start budgets. Mutated only by the engine, on its thread.
 */
final class EngineContext implements GuardContext {
    final FleetHealthView health;
    final TendConfig config;
    final FleetBrake brake;
    final RateBudgets budgets;
    final Map<String, RunProcess> active = new LinkedHashMap<>();
    final Map<Candidate.Key, List<Instant>> starts = new HashMap<>();
    final Set<Candidate.Key> loopStopped = new HashSet<>();
    final Map<Target, Exclusion> exclusions = new LinkedHashMap<>();
    private final Map<Id, EffectiveLimits> limits = new HashMap<>();
    private final Map<Id, String> budgetNames = new HashMap<>();
    Instant now = Instant.EPOCH;
    Instant eventTime = Instant.EPOCH;

    EngineContext(FleetHealthView health, TendConfig config, FleetBrake brake) {
        this.health = health;
        this.config = config;
        this.brake = brake;
        this.budgets = new RateBudgets(() -> now);
    }

    @Override public Instant now() { return now; }
    @Override public Instant eventTime() { return eventTime; }
    @Override public FleetHealthView health() { return health; }
    @Override public TendConfig config() { return config; }
    @Override public BrakeState brake() { return brake.state(); }

    @Override
    public EffectiveLimits limits(Playbook p) {
        EffectiveLimits l = limits.get(p.id()); // asked by most guards at every evaluation: no lambda made each time
        if (l == null) {
            l = config.effectiveLimits(p);
            limits.put(p.id(), l);
        }
        return l;
    }

    @Override
    public Optional<Exclusion> exclusionOf(Target t) {
        Exclusion node = t.node() == null ? null : exclusions.get(t);
        if (node != null && node.isActiveAt(now)) return Optional.of(node);
        Exclusion cluster = exclusions.get(Target.cluster(t.cluster()));
        if (cluster != null && cluster.isActiveAt(now)) return Optional.of(cluster);
        return Optional.empty();
    }

    @Override
    public int activeRunsOnCluster(Id cluster) {
        int n = 0;
        for (RunProcess r : active.values()) if (r.target().cluster().equals(cluster)) n++;
        return n;
    }

    @Override
    public int activeRunsInZone(String zone) {
        int n = 0;
        for (RunProcess r : active.values()) {
            if (r.target().node() == null) continue;
            String z = health.topology().cluster(r.target().cluster()).flatMap(s -> s.node(r.target().node()))
                    .map(NodeSpec::zone).orElse(null);
            if (zone.equals(z)) n++;
        }
        return n;
    }

    @Override
    public int activeRunsInFleet() {
        return active.size();
    }

    @Override
    public Set<Id> nodesUnderRemediation(Id cluster) {
        Set<Id> out = null; // asked by three guards per evaluation: most often none, and then no set is made
        for (RunProcess r : active.values()) {
            if (r.target().cluster().equals(cluster) && r.target().node() != null) {
                if (out == null) out = new HashSet<>();
                out.add(r.target().node());
            }
        }
        return out == null ? Set.of() : out;
    }

    @Override
    public int clusterScopeRunsOn(Id cluster) {
        int n = 0;
        for (RunProcess r : active.values()) if (r.target().cluster().equals(cluster) && r.target().node() == null) n++;
        return n;
    }

    @Override
    public List<Instant> startsOf(Id playbook, Target target) {
        return starts.getOrDefault(new Candidate.Key(playbook, target), List.of());
    }

    @Override
    public boolean isLoopStopped(Id playbook, Target target) {
        return loopStopped.contains(new Candidate.Key(playbook, target));
    }

    @Override
    public RateCheck rateCheck(Playbook p) {
        RateLimit own = limits(p).rate();
        Instant next = budgets.nextPermit(budgetName(p), own);
        if (next.isAfter(now)) return new RateCheck(false, next, "playbook " + p.id() + " (" + own + ")");
        RateLimit fleet = config.rate();
        if (fleet != null) {
            Instant f = budgets.nextPermit("fleet", fleet);
            if (f.isAfter(now)) return new RateCheck(false, f, "fleet-wide (" + fleet + ")");
        }
        return new RateCheck(true, now, null);
    }

    /** The name of a playbook's own start budget, made once per playbook (asked at every evaluation). */
    private String budgetName(Playbook p) {
        return budgetNames.computeIfAbsent(p.id(), id -> "playbook " + id);
    }

    /** Takes the permits for a start that passed every guard. */
    void consumePermits(Playbook p) {
        budgets.acquire(budgetName(p), limits(p).rate());
        if (config.rate() != null) budgets.acquire("fleet", config.rate());
    }

    void recordStart(Candidate.Key key) {
        starts.computeIfAbsent(key, k -> new ArrayList<>()).add(now);
    }
}
