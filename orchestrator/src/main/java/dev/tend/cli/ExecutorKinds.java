package dev.tend.cli;

import java.util.Set;

/** The action kinds this build has an executor for; lint flags actions of any other kind. */
final class ExecutorKinds {
    static final Set<String> AVAILABLE = Set.of("command", "http", "simulated");

    private ExecutorKinds() {
    }
}
