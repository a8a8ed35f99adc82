package dev.tend.playbooks;

import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalState;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Which playbooks a transition matches: signal, state, scope and the cluster's tags. */
class PlaybookSetMatchTest {
    private static final Instant AT = Instant.parse("2027-03-14T02:17:00Z");
    private static final Map<String, String> CRITICAL_PAYMENTS = Map.of("tier", "critical", "team", "payments");
    private static final Map<String, String> BULK_TELEMETRY = Map.of("tier", "bulk", "team", "vehicle-data");

    @TempDir
    Path tmp;

    private PlaybookSet set() {
        TestDir dir = new TestDir(tmp);
        dir.write("actions.yaml", TestDir.ACTIONS);
        // file names sort differently from the ids, to show the order is by file name
        dir.write("a-critical.yaml", playbook("zz-critical-silent", "heartbeat", "silent", "node", "{ tier: critical }"));
        dir.write("b-any.yaml", playbook("aa-any-silent", "heartbeat", "silent", "node", "{}"));
        dir.write("c-payments-or-fares.yaml", playbook("payments-standard-or-critical", "heartbeat", "silent", "node",
                "{ team: payments, tier: [standard, critical] }"));
        dir.write("d-cluster.yaml", playbook("cluster-breach", "cert-expiry", "breach", "cluster", "{}"));
        return PlaybookLoader.load(tmp);
    }

    private static String playbook(String id, String signal, String state, String scope, String clusters) {
        return "playbook: " + id + "\n"
                + "trigger: { signal: " + signal + ", state: " + state + ", scope: " + scope + ", clusters: " + clusters + " }\n"
                + "steps:\n  - { id: drain, action: drain-node, timeout: 1m }\n";
    }

    private static List<String> ids(List<Playbook> playbooks) {
        return playbooks.stream().map(p -> p.id().value()).toList();
    }

    @Test
    void nodeTransitionMatchesEveryPlaybookWhoseSelectorTheTagsSatisfyInFileNameOrder() {
        HealthTransition t = HealthTransition.of(AT, "fares-3", "n2", "heartbeat", SignalState.SILENT);

        assertThat(ids(set().match(t, CRITICAL_PAYMENTS)))
                .containsExactly("zz-critical-silent", "aa-any-silent", "payments-standard-or-critical");
    }

    @Test
    void selectorLeavesOutClustersWithOtherTagValues() {
        HealthTransition t = HealthTransition.of(AT, "telemetry-40", "n1", "heartbeat", SignalState.SILENT);

        assertThat(ids(set().match(t, BULK_TELEMETRY))).containsExactly("aa-any-silent");
    }

    @Test
    void clusterWithoutTheTagDoesNotMatchASelectorNamingIt() {
        HealthTransition t = HealthTransition.of(AT, "fares-9", "n1", "heartbeat", SignalState.SILENT);

        assertThat(ids(set().match(t, Map.of("tier", "critical")))).containsExactly("zz-critical-silent", "aa-any-silent");
    }

    @Test
    void otherStateOrSignalMatchesNothing() {
        PlaybookSet set = set();

        assertThat(set.match(HealthTransition.of(AT, "fares-3", "n2", "heartbeat", SignalState.BREACH), CRITICAL_PAYMENTS)).isEmpty();
        assertThat(set.match(HealthTransition.of(AT, "fares-3", "n2", "heartbeat", SignalState.CLEAR), CRITICAL_PAYMENTS)).isEmpty();
        assertThat(set.match(HealthTransition.of(AT, "fares-3", "n2", "storage-full", SignalState.SILENT), CRITICAL_PAYMENTS)).isEmpty();
    }

    @Test
    void nodeScopeNeedsANodeAndClusterScopeNeedsNone() {
        PlaybookSet set = set();

        assertThat(set.match(HealthTransition.of(AT, "fares-3", null, "heartbeat", SignalState.SILENT), CRITICAL_PAYMENTS)).isEmpty();
        assertThat(ids(set.match(HealthTransition.of(AT, "fares-3", null, "cert-expiry", SignalState.BREACH), CRITICAL_PAYMENTS)))
                .containsExactly("cluster-breach");
        assertThat(set.match(HealthTransition.of(AT, "fares-3", "n1", "cert-expiry", SignalState.BREACH), CRITICAL_PAYMENTS)).isEmpty();
    }

    @Test
    void setRejectsTwoPlaybooksWithOneIdAndStepsNamingUndefinedActions() {
        PlaybookSet set = set();
        Playbook p = set.playbooks().get(0);

        assertThatThrownBy(() -> PlaybookSet.of(List.of(p, p), set.actions(), set.config()))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("playbook zz-critical-silent is defined in both " + p.source() + " and " + p.source());
        assertThatThrownBy(() -> PlaybookSet.of(List.of(p), Actions.empty(), set.config()))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("playbook zz-critical-silent step drain names undefined action drain-node");
    }
}
