package dev.tend.handover;

import dev.tend.shared.fleet.BrakePeriod;
import dev.tend.engine.Input;
import dev.tend.shared.SignalState;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;

import static dev.tend.handover.NightShift.SINCE;
import static dev.tend.handover.NightShift.at;
import static org.assertj.core.api.Assertions.assertThat;

/** Decisions the scripted night does not make: an approval granted, a brake hold that starts once released, shadow mode. */
class HandoverDecisionsTest {
    private static final String SHADOW = """
            playbook: rebalance-under-replicated
            version: 2
            mode: shadow
            trigger: { signal: under-replicated, state: breach, scope: cluster, confirm-for: 0s }
            steps:
              - { id: rebalance, action: restart-process, timeout: 5m }
            """;

    @TempDir
    Path dir;

    @Test
    void anApprovedRunShowsWhoApprovedAndRunsToItsEnd() throws Exception {
        try (NightShift n = new NightShift(dir.resolve("tend.db"), SINCE)) {
            n.silent("fares-9", "n1");
            n.advance(Duration.ofMinutes(10));
            n.command(new Input.Approve(n.runOn("fares-9"), "ben", "cli"));
            n.advance(Duration.ofMinutes(30));

            HandoverReport r = n.report(SINCE, at("23:00"));

            assertThat(r.approvals()).singleElement().satisfies(a -> {
                assertThat(a.state()).isEqualTo("approved");
                assertThat(a.decidedBy()).isEqualTo("ben");
                assertThat(a.decidedAt()).isEqualTo(at("22:10"));
            });
            assertThat(r.pendingApprovals()).isEmpty();
            assertThat(r.totals()).isEqualTo(new RunCounts(1, 1, 0, 0, 0, 0, 0, 0));
            assertThat(r.runs()).singleElement().satisfies(x -> {
                assertThat(x.createdAt()).isEqualTo(SINCE);
                assertThat(x.startedAt()).isEqualTo(at("22:10"));
                assertThat(x.state()).isEqualTo("succeeded");
            });
            // before the approval arrived, the run waited for it
            assertThat(n.report(SINCE, at("22:05")).runs()).singleElement()
                    .satisfies(x -> assertThat(x.state()).isEqualTo("awaiting-approval"));
        }
    }

    @Test
    void aCandidateHeldByTheBrakeCountsAsHeldAndStartsOnceItIsReleased() throws Exception {
        try (NightShift n = new NightShift(dir.resolve("tend.db"), SINCE)) {
            n.engageBrake("ana", "dispatch zone z-b flapping");
            n.advance(Duration.ofMinutes(5));
            n.silent("fares-5", "n3");
            n.advance(Duration.ofMinutes(20));
            n.releaseBrake("ana", "z-b steady again");
            n.advance(Duration.ofMinutes(30));

            HandoverReport r = n.report(SINCE, at("23:00"));

            assertThat(r.totals()).isEqualTo(new RunCounts(1, 1, 0, 0, 0, 1, 0, 0));
            assertThat(r.byReason()).containsExactly(new ReasonCount("fleet-brake", 1, 0));
            assertThat(r.brakePeriods()).containsExactly(new BrakePeriod(SINCE, "ana", "dispatch zone z-b flapping", at("22:25"),
                    "ana", "z-b steady again"));
            assertThat(r.runs()).singleElement().satisfies(x -> assertThat(x.startedAt()).isEqualTo(at("22:25")));
            assertThat(r.needsAttention()).isFalse();
        }
    }

    @Test
    void aTargetStoppedAsALoopNeedsAttentionUntilAPersonClearsIt() throws Exception {
        try (NightShift n = new NightShift(dir.resolve("tend.db"), SINCE)) {
            // the built-in limits allow 3 runs per target in 24h and one per hour (cooldown): the fourth is a loop
            for (int i = 0; i < 4; i++) {
                n.silent("fares-2", "n2");
                n.advance(Duration.ofMinutes(90));
            }
            Instant stopped = SINCE.plus(Duration.ofMinutes(270));

            HandoverReport r = n.report(SINCE, at("06:00"));

            assertThat(r.totals()).isEqualTo(new RunCounts(3, 3, 0, 0, 0, 0, 1, 0));
            assertThat(r.byReason()).containsExactly(new ReasonCount("loop", 0, 1));
            assertThat(r.loopsStopped()).containsExactly(new LoopStop("replace-silent-node", "fares-2", "n2", stopped));
            assertThat(r.needsAttention()).isTrue();
            assertThat(HandoverText.render(r)).contains("  ! loop stopped      replace-silent-node  fares-2/n2  since " + stopped);

            n.command(new Input.ClearLoop(dev.tend.shared.Id.of("replace-silent-node"),
                    dev.tend.shared.Target.node(dev.tend.shared.Id.of("fares-2"), dev.tend.shared.Id.of("n2")), "ana", "cli"));
            n.advance(Duration.ofMinutes(10));
            assertThat(n.report(SINCE, at("06:00")).loopsStopped()).isEmpty();
        }
    }

    @Test
    void aShadowRunIsCountedAsShadowedNotStarted() throws Exception {
        try (NightShift n = new NightShift(dir.resolve("tend.db"), SINCE, SHADOW)) {
            n.signal("fares-8", null, "under-replicated", SignalState.BREACH);
            n.advance(Duration.ofMinutes(5));

            HandoverReport r = n.report(SINCE, at("23:00"));

            assertThat(r.byPlaybook().get("rebalance-under-replicated")).isEqualTo(new RunCounts(0, 0, 0, 0, 1, 0, 0, 0));
            assertThat(r.runs()).singleElement().satisfies(x -> {
                assertThat(x.target()).isEqualTo("fares-8");
                assertThat(x.state()).isEqualTo("shadowed");
                assertThat(x.startedAt()).isNull();
                assertThat(x.actions()).isEmpty();
            });
            assertThat(r.nodesRemediated()).isEmpty();
            assertThat(HandoverHtml.render(r)).contains("<rect class=\"run shadowed\"");
        }
    }
}
