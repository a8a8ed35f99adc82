package dev.tend.engine;

import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.util.List;
import java.util.Map;

import static dev.tend.engine.EngineHarness.cluster;
import static dev.tend.engine.EngineHarness.fleet;
import static dev.tend.engine.EngineHarness.replacePlaybook;
import static dev.tend.shared.SignalState.CLEAR;
import static dev.tend.shared.SignalState.SILENT;
import static org.assertj.core.api.Assertions.assertThat;

/** The pages the engine decides: approvals asked and about to lapse, and the brake's one page with what it covers folded in. */
class EnginePagesTest {
    private static List<Effect.Notify> pages(EngineHarness h) {
        return h.effects.stream().filter(e -> e instanceof Effect.Notify).map(e -> (Effect.Notify) e).toList();
    }

    @Test
    void anApprovalIsPagedWhenAskedAndAgainBeforeItLapses() {
        String pb = replacePlaybook("0s", "keep-replicas: false")
                .replace("steps:", "approval: { clusters: { tier: [critical] }, expires-after: 30m }\nsteps:");
        EngineHarness h = new EngineHarness(fleet(cluster("fares-3", "critical", 3, null)), """
                pages:
                  approval-reminder: 10m
                """, pb);
        h.at(0, "fares-3", "n2", "heartbeat", SILENT);
        assertThat(pages(h)).singleElement().satisfies(n -> {
            assertThat(n.kind()).isEqualTo(PageKind.APPROVAL_REQUESTED);
            assertThat(n.channel()).isEqualTo("oncall");
            assertThat(n.fields()).containsEntry("cluster", "fares-3").containsEntry("node", "n2")
                    .containsEntry("playbook", "replace-silent-node").containsEntry("expires_at", "2027-03-14T02:30:00Z");
            assertThat(n.id()).isEqualTo(n.fields().get("run") + "/approval");
        });
        h.advance(Duration.ofMinutes(19));
        assertThat(pages(h)).hasSize(1);
        h.advance(Duration.ofMinutes(1));
        assertThat(pages(h)).hasSize(2).last().satisfies(n -> {
            assertThat(n.kind()).isEqualTo(PageKind.APPROVAL_LAPSING);
            assertThat(n.message()).endsWith("it lapses at 2027-03-14T02:30:00Z");
        });
        h.advance(Duration.ofMinutes(15));
        assertThat(h.ledger("approval-lapsed")).hasSize(1);
        assertThat(pages(h)).as("no reminder after the lapse").hasSize(2);
    }

    @Test
    void anAnsweredApprovalIsNotReminded() {
        String pb = replacePlaybook("0s", "keep-replicas: false")
                .replace("steps:", "approval: { clusters: { tier: [critical] }, expires-after: 30m }\nsteps:");
        EngineHarness h = new EngineHarness(fleet(cluster("fares-3", "critical", 3, null)), null, pb);
        h.at(0, "fares-3", "n2", "heartbeat", SILENT);
        String run = (String) pages(h).get(0).fields().get("run");
        h.send(new Input.Reject(run, "the owner replaces it by hand", "anna", "127.0.0.1"));
        h.advance(Duration.ofMinutes(40));
        assertThat(pages(h)).extracting(Effect.Notify::kind).containsExactly(PageKind.APPROVAL_REQUESTED);
    }

    @Test
    void theBrakesPageWaitsToCarryTheEventsSizeAndFoldsTheFlappingPagesItCovers() {
        StringBuilder clusters = new StringBuilder();
        for (int i = 1; i <= 10; i++) clusters.append(cluster("dispatch-" + i, "standard", 3, null));
        EngineHarness h = new EngineHarness(fleet(clusters.toString()), """
                brake:
                  engage-at: { clusters: 3 }
                  release-below: { clusters: 1 }
                pages:
                  brake-gather: 1m
                """, replacePlaybook("2m", "flapping: 3/10m, keep-replicas: false"));
        for (int i = 1; i <= 6; i++) h.at(i, "dispatch-" + i, "n1", "heartbeat", SILENT);
        assertThat(pages(h)).as("the page gathers first").isEmpty();
        // a flapping signal while the brake holds: covered by the brake's page
        for (int i = 0; i < 8; i++) h.at(10 + i * 5L, "dispatch-7", "n2", "heartbeat", i % 2 == 0 ? SILENT : CLEAR);
        h.advance(Duration.ofMinutes(2));

        assertThat(pages(h)).singleElement().satisfies(n -> {
            assertThat(n.id()).isEqualTo("brake/1");
            assertThat(n.kind()).isEqualTo(PageKind.BRAKE);
            assertThat(n.fields()).containsEntry("unhealthy_clusters", 7).containsEntry("folded_pages", 1);
            assertThat(n.message()).isEqualTo("fleet brake engaged: 7 clusters unhealthy (70.0% of the fleet); automatic remediation"
                    + " is on hold fleet-wide; 1 other page folded into this one");
        });
        List<Map<String, Object>> folded = h.ledger("page-folded");
        assertThat(folded).singleElement().satisfies(f -> {
            assertThat(f).containsEntry("into", "brake/1").containsEntry("page_kind", PageKind.FLAPPING).containsEntry("cluster", "dispatch-7");
            assertThat((String) f.get("id")).startsWith("flapping/");
        });
    }
}
