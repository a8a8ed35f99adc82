package dev.tend.engine.guard;

import dev.tend.engine.BrakeState;
import dev.tend.engine.Exclusion;
import dev.tend.playbooks.EffectiveLimits;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.TendConfig;
import dev.tend.shared.Id;
import dev.tend.shared.Target;
import dev.tend.shared.fleet.FleetHealthView;

import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.Set;

/** What guards may read. Implemented by the engine over its state; read-only. */
public interface GuardContext {
    /** Processing time of the input being handled. */
    Instant now();

    /** Event time: how far the fleet's events have got. */
    Instant eventTime();

    FleetHealthView health();

    TendConfig config();

    EffectiveLimits limits(Playbook playbook);

    /** The exclusion covering the target (the node or its whole cluster) at processing time now. */
    Optional<Exclusion> exclusionOf(Target target);

    BrakeState brake();

    int activeRunsOnCluster(Id cluster);

    int activeRunsInZone(String zone);

    int activeRunsInFleet();

    /** Nodes of the cluster that active node-scope runs act on. */
    Set<Id> nodesUnderRemediation(Id cluster);

    /** Active cluster-scope runs on the cluster; each counts as one impaired node. */
    int clusterScopeRunsOn(Id cluster);

    /** Processing times at which runs of the playbook started on the target, oldest first. */
    List<Instant> startsOf(Id playbook, Target target);

    /** True after the loop guard stopped automation on the target, until a person clears it. */
    boolean isLoopStopped(Id playbook, Target target);

    /** When the playbook's and the fleet's start budgets next have a permit (now if they do). */
    RateCheck rateCheck(Playbook playbook);

    record RateCheck(boolean available, Instant nextPermit, String budget) {
    }
}
