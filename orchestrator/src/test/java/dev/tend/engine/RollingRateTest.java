package dev.tend.engine;

import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;

import static dev.tend.engine.EngineHarness.T0;
import static dev.tend.engine.EngineHarness.cluster;
import static dev.tend.engine.EngineHarness.fleet;
import static dev.tend.shared.SignalState.BREACH;
import static org.assertj.core.api.Assertions.assertThat;

/** {@code rate: N/W} is a rolling window: at most N starts in any interval of length W (DESIGN.md section 4). */
class RollingRateTest {
    private static final String TEND = """
            defaults: { fleet: 100, per-zone: 100, cooldown: 0s }
            rate: 1000/1h
            brake: { engage-at: { clusters: 1000 }, release-below: { clusters: 500 } }
            """;

    static String restart(String rate) {
        return """
                playbook: restart-stopped-process
                version: 1
                trigger: { signal: process-down, state: breach, scope: node }
                limits: { rate: %s }
                steps:
                  - { id: restart, action: restart-process, timeout: 5m }
                """.formatted(rate);
    }

    static String clusters(int n) {
        StringBuilder sb = new StringBuilder();
        for (int i = 1; i <= n; i++) sb.append(cluster("fares-" + i, "standard", 3, null));
        return fleet(sb.toString());
    }

    /** The start times of the engine's runs, in order. */
    static List<Instant> starts(EngineHarness h) {
        List<Instant> out = new ArrayList<>();
        for (RunSnapshot r : h.engine.runs()) if (r.startedAt() != null) out.add(r.startedAt());
        out.sort(null);
        return out;
    }

    /** True when no interval [t, t + window) holds more than {@code count} of {@code starts} (sorted). */
    static boolean atMostInAnyWindow(List<Instant> starts, int count, Duration window) {
        for (int i = 0; i + count < starts.size(); i++) {
            if (Duration.between(starts.get(i), starts.get(i + count)).compareTo(window) < 0) return false;
        }
        return true;
    }

    @Test
    void twelveProblemsFiveMinutesApartUnderThreePerHourNeverStartMoreThanThreeInAnyRollingHour() {
        EngineHarness h = new EngineHarness(clusters(12), TEND, restart("3/1h"));
        for (int s = 0; s <= 5 * 3600; s += 30) {
            if (s % 300 == 0 && s / 300 < 12) h.at(s, "fares-" + (s / 300 + 1), "n1", "process-down", BREACH);
            else h.advanceTo(T0.plusSeconds(s));
            h.answerCalls(true);
        }
        List<Instant> starts = starts(h);
        assertThat(starts).hasSize(12);
        assertThat(atMostInAnyWindow(starts, 3, Duration.ofHours(1))).as("starts %s", starts).isTrue();
        // a fixed-period budget would have let three more start at the top of the next period; the
        // rolling window frees one permit an hour after each start, oldest problem first
        List<Long> minutes = starts.stream().map(t -> Duration.between(T0, t).toMinutes()).toList();
        assertThat(minutes).containsExactly(0L, 5L, 10L, 60L, 65L, 70L, 120L, 125L, 130L, 180L, 185L, 190L);
        assertThat(h.engine.runs()).extracting(r -> r.target().cluster().value())
                .containsExactly("fares-1", "fares-2", "fares-3", "fares-4", "fares-5", "fares-6", "fares-7", "fares-8",
                        "fares-9", "fares-10", "fares-11", "fares-12");
    }

    @Test
    void heldCandidatesThatBecomeStartableTogetherStartOldestProblemFirst() {
        EngineHarness h = new EngineHarness(clusters(4), TEND, restart("1/1h"));
        h.at(0, "fares-1", "n1", "process-down", BREACH);
        h.answerCalls(true);
        // three problems wait for the one permit; they arrive newest problem last, but in reverse cluster order
        h.at(600, "fares-4", "n1", "process-down", BREACH);
        h.at(1200, "fares-3", "n1", "process-down", BREACH);
        h.at(1800, "fares-2", "n1", "process-down", BREACH);
        h.advance(Duration.ofMinutes(31));
        h.answerCalls(true);
        assertThat(h.engine.runs()).extracting(r -> r.target().cluster().value()).containsExactly("fares-1", "fares-4");
    }

    @Test
    void randomProblemSequencesNeverStartMoreThanNInAnyWindowOfLengthW() {
        Random random = new Random(20261202L);
        for (int round = 0; round < 40; round++) {
            int count = 1 + random.nextInt(4);
            Duration window = Duration.ofMinutes(10 + random.nextInt(110));
            EngineHarness h = new EngineHarness(clusters(15), TEND, restart(count + "/" + window.toMinutes() + "m"));
            int s = 0;
            for (int i = 0; i < 30; i++) {
                s += random.nextInt(900);
                h.at(s, "fares-" + (1 + random.nextInt(15)), "n" + (1 + random.nextInt(3)), "process-down", BREACH);
                h.answerCalls(true);
            }
            for (int k = 0; k < 40; k++) {
                h.advance(Duration.ofMinutes(10));
                h.answerCalls(true);
            }
            List<Instant> starts = starts(h);
            assertThat(starts).as("round %d", round).isNotEmpty();
            assertThat(atMostInAnyWindow(starts, count, window)).as("round %d: %d/%s, starts %s", round, count, window, starts).isTrue();
        }
    }
}
