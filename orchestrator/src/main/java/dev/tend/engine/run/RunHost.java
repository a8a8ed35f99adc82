package dev.tend.engine.run;

import dev.tend.engine.Effects;
import dev.tend.playbooks.ActionDef;
import dev.tend.shared.Id;
import dev.tend.shared.Target;

import java.util.List;

/** What the run machine needs from the engine around it. */
public interface RunHost {
    ActionDef action(Id id);

    boolean isBrakeEngaged();

    /**
     * The run's gate: empty while the run is still needed (its trigger holds, no mask or
     * exclusion applies); else why it must stand down. {@code ignoreCleared} leaves out the
     * trigger check, for a step written {@code if-cleared: continue}.
     */
    java.util.Optional<StandDown> gate(RunProcess run, boolean ignoreCleared);
    /** The channel of tend's own pages (a run that needs a person). */
    String pageChannel();

    /** True when none of {@code signals} is in breach or silent on the target. */
    boolean allClear(Target target, List<Id> signals);

    /** Called once when a run reaches a terminal state, after its last ledger entry. */
    void runEnded(RunProcess run, Effects fx);
}
