package dev.tend.playbooks.lint;

import dev.tend.playbooks.ActionDef;
import dev.tend.playbooks.ActionStep;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.Position;
import dev.tend.playbooks.Step;
import dev.tend.shared.Id;
import dev.tend.shared.fleet.Fleet;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Objects;
import java.util.Set;
import java.util.TreeSet;

/**
 * Static checks of a loaded playbook set, optionally against a fleet. The checks and their
 * codes:
 * <ul>
 *   <li>{@code overlap}: two live playbooks can match the same transition (same signal, state
 *       and scope, and cluster selectors that both match a cluster of the fleet, or that some
 *       tags could both satisfy when no fleet is given). Shadow playbooks are left out: they
 *       never execute, and running one beside a live one is what shadow mode is for.</li>
 *   <li>{@code no-timeout}: an action step with no timeout, whose action defines none either.</li>
 *   <li>{@code no-executor}: a step's action is of a kind no configured executor runs.</li>
 *   <li>{@code unsafe-limits} (fleet only): impaired-fraction lets more nodes of a cluster be
 *       impaired than its quorum or replication bears; one finding per playbook.</li>
 *   <li>{@code unmatched} (fleet only, warning): the cluster selector matches no cluster.</li>
 *   <li>{@code undeclared-signal}: a trigger or mask signal outside tend.yaml's {@code signals:};
 *       {@code signal-typo} (warning, without {@code signals:}): a trigger signal named nowhere
 *       else and one edit from one that is ({@link SignalCheck}).</li>
 * </ul>
 * Findings are sorted by file, line, column, code, playbook and message. Stateless.
 */
public final class Lint {
    public static final String OVERLAP = "overlap";
    public static final String NO_TIMEOUT = "no-timeout";
    public static final String NO_EXECUTOR = "no-executor";
    public static final String UNSAFE_LIMITS = "unsafe-limits";
    public static final String UNMATCHED = "unmatched";
    public static final String UNDECLARED_SIGNAL = "undeclared-signal";
    public static final String SIGNAL_TYPO = "signal-typo";

    private Lint() {
    }

    /** Checks {@code set}; {@code fleetOrNull} enables the fleet checks. */
    public static List<Finding> check(PlaybookSet set, Fleet fleetOrNull, Set<String> executorKinds) {
        Objects.requireNonNull(set, "set");
        Objects.requireNonNull(executorKinds, "executorKinds");
        List<Finding> out = new ArrayList<>(OverlapCheck.check(set.playbooks(), fleetOrNull));
        SignalCheck.check(set, out);
        for (Playbook p : set.playbooks()) {
            steps(set, p, executorKinds, out);
            if (fleetOrNull != null) FleetCheck.check(set, p, fleetOrNull, out);
        }
        out.sort(null);
        return List.copyOf(out);
    }

    static Finding finding(Severity severity, String code, Playbook p, Position at, String message) {
        return new Finding(severity, code, p.source(), at.line(), at.column(), p.id().value(), message);
    }

    private static void steps(PlaybookSet set, Playbook p, Set<String> kinds, List<Finding> out) {
        Set<Id> reported = new HashSet<>();
        for (Step s : p.allSteps()) {
            if (!(s instanceof ActionStep step)) continue;
            ActionDef def = set.actions().get(step.action()).orElseThrow();
            Position at = p.position((p.steps().contains(s) ? "steps." : p.onStandDown().contains(s) ? "on-stand-down." : "on-failure.")
                    + s.id());
            if (step.timeout() == null && def.timeout() == null) {
                out.add(finding(Severity.ERROR, NO_TIMEOUT, p, at, "step '" + s.id() + "' has no timeout and its action '"
                        + def.id() + "' defines none, so a hung " + def.kind() + " action would hold the run forever;"
                        + " set timeout on the step or on the action"));
            }
            if (!kinds.contains(def.kind()) && reported.add(def.id())) {
                out.add(finding(Severity.ERROR, NO_EXECUTOR, p, at, "step '" + s.id() + "' runs action '" + def.id() + "' of kind "
                        + def.kind() + ", but no " + def.kind() + " executor is configured"
                        + (kinds.isEmpty() ? "" : "; the configured executors are: " + String.join(", ", new TreeSet<>(kinds)))));
            }
        }
    }
}
