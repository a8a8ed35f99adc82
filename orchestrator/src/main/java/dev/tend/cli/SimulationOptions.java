package dev.tend.cli;

import picocli.CommandLine.Option;

/**
 * {@code --speedup} and {@code --seed} of the simulated executor, as {@code tend serve} and
 * {@code tend ingest} take them (a playbook set whose actions are simulated runs the same way
 * under both). {@code tend demo} declares its own: its speed-up accelerates the whole demo
 * (time and actions), with another default and limit.
 */
final class SimulationOptions {
    @Option(names = "--speedup", defaultValue = "1", paramLabel = "N",
            description = "run simulated actions N times faster than their durations (default: ${DEFAULT-VALUE})")
    double speedup;

    @Option(names = "--seed", defaultValue = "1", paramLabel = "N", description = "seed of simulated outcomes (default: ${DEFAULT-VALUE})")
    long seed;
}
