package dev.tend.executor;

import dev.tend.playbooks.SimulatedAction;
import dev.tend.shared.json.Sha256;

import java.time.Duration;
import java.util.SplittableRandom;

/**
 * The outcome of a simulated action, a pure function of the seed and the idempotency key:
 * asking again by key gives the same answer, and the same seed gives the same replay.
 *
 * @param duration how long the action takes, between its min and max duration
 * @param success  whether it succeeds, with the action's success probability
 */
public record SimulatedOutcome(Duration duration, boolean success) {
    public static SimulatedOutcome of(long seed, String key, SimulatedAction action) {
        String h = Sha256.hex(seed + "/" + key);
        SplittableRandom random = new SplittableRandom(Long.parseUnsignedLong(h.substring(0, 16), 16));
        long min = action.minDuration().toMillis();
        long max = action.maxDuration().toMillis();
        long ms = max > min ? min + random.nextLong(max - min + 1) : min;
        boolean ok = random.nextDouble() < action.success();
        return new SimulatedOutcome(Duration.ofMillis(ms), ok);
    }
}
