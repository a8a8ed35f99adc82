package dev.tend.engine;

import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.TendConfig;
import dev.tend.shared.fleet.Fleet;

import java.util.Objects;

/** Everything an engine is built from: the policy, the starting topology and the event-time mode. */
public record EngineSetup(PlaybookSet playbooks, TendConfig config, Fleet fleet, BrakeThresholds brake,
                          EventTimeMode eventTime) {
    public EngineSetup {
        Objects.requireNonNull(playbooks, "playbooks");
        Objects.requireNonNull(config, "config");
        Objects.requireNonNull(fleet, "fleet");
        Objects.requireNonNull(brake, "brake");
        Objects.requireNonNull(eventTime, "eventTime");
    }
}
