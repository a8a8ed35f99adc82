package dev.tend.runtime;

import dev.tend.engine.Effect;
import dev.tend.executor.Executor;
import dev.tend.shared.TendException;
import dev.tend.shared.time.Timers;

import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * Performs the side effects of committed inputs for the {@link Orchestrator}: executor calls
 * (whose results come back through the inbox), timers and notifications. Only committed
 * effects come here, so a crash never repeats one that was not on the record.
 */
final class EffectRunner {
    private final Map<String, Executor> executors;
    private final Timers timers;
    private final Notifier notifier;
    private final Inbox inbox;
    private final AtomicInteger callsInFlight = new AtomicInteger();

    EffectRunner(Map<String, Executor> executors, Timers timers, Notifier notifier, Inbox inbox) {
        this.executors = Map.copyOf(executors);
        this.timers = timers;
        this.notifier = notifier;
        this.inbox = inbox;
    }

    void perform(Effect e) {
        if (e instanceof Effect.CallExecutor c) dispatch(c);
        else if (e instanceof Effect.ArmTimer t) timers.arm(t.key(), t.due());
        else if (e instanceof Effect.CancelTimer t) timers.cancel(t.key());
        else if (e instanceof Effect.Notify n) notifier.send(n);
    }

    /**
     * Performs the effects of a committed batch, in order, except the timer operations a later
     * one of the batch replaces ({@code replaced}, see {@link TimerOps}): the timers end as
     * performing each would leave them, and one armed already due and cancelled later in the
     * batch no longer fires.
     */
    void performAll(List<Effect> effects, Set<Effect> replaced) {
        for (Effect e : effects) if (!replaced.contains(e)) perform(e);
    }

    /** Arms a timer again after a restart. */
    void arm(String key, java.time.Instant due) {
        timers.arm(key, due);
    }

    /** True when the executor of {@code call} can ask its target about it again by key. */
    boolean canAskAgain(Effect.CallExecutor call) {
        return executor(call.action().kind()).canAskAgain(call);
    }

    void dispatch(Effect.CallExecutor call) {
        callsInFlight.incrementAndGet();
        executor(call.action().kind()).execute(call, result -> {
            // an executor's thread: it only queues; the engine is read on the driver thread alone
            inbox.add(result);
            callsInFlight.decrementAndGet();
        });
    }

    /** True while some executor call has not answered. */
    boolean callsInFlight() {
        return callsInFlight.get() > 0;
    }

    private Executor executor(String kind) {
        Executor ex = executors.get(kind);
        if (ex == null) throw new TendException("no executor serves actions of kind '" + kind + "'; start tend with one");
        return ex;
    }
}
