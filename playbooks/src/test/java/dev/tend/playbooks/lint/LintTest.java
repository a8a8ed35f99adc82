package dev.tend.playbooks.lint;

import dev.tend.playbooks.TestDir;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.util.List;
import java.util.Set;

import static dev.tend.playbooks.TestDir.column;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.tuple;

class LintTest {
    private static final Set<String> ALL = Set.of("command", "http", "simulated");

    @TempDir
    Path tmp;
    TestDir dir;

    @BeforeEach
    void actions() {
        dir = new TestDir(tmp);
        dir.write("actions.yaml", """
                actions:
                  drain-node: { simulated: { duration: 2m } }
                  replace-node: { command: [/opt/larkspur/bin/replace, "{node}"], timeout: 30m }
                  page: { http: { url: "https://pager.larkspur.example/v1/pages" } }
                """);
    }

    private static String playbook(String id, String when, String extra) {
        return "playbook: " + id + "\ntrigger: " + when + "\n" + extra
                + (extra.contains("steps:") ? "" : "steps:\n  - { id: drain, action: drain-node, timeout: 10m }\n");
    }

    private List<Finding> lint(Fleet fleet) {
        return Lint.check(PlaybookLoader.load(tmp), fleet, ALL);
    }

    private static Fleet fleet(String clusters) {
        return FleetFile.parse("fleet.yaml", "fleet: test\nclusters:\n" + clusters);
    }

    private static String cluster(String id, String tags, String extra, int nodes) {
        StringBuilder sb = new StringBuilder("  - id: " + id + "\n    tags: " + tags + "\n" + extra + "    nodes:\n");
        for (int i = 1; i <= nodes; i++) sb.append("      - { id: n").append(i).append(", zone: z-").append((char) ('a' + (i - 1) % 3)).append(" }\n");
        return sb.toString();
    }

    private static final String NODE_SILENT = "{ signal: heartbeat, state: silent, scope: node }";

    @Test
    void fractionThatCostsAQuorumEnsembleItsMajorityIsFlaggedOncePerPlaybook() {
        String text = playbook("loose", NODE_SILENT, "limits:\n  impaired-fraction: 0.67\n");
        dir.write("loose.yaml", text);
        Fleet fleet = fleet(cluster("fares-3", "{ tier: critical }", "    quorum: true\n", 3)
                + cluster("fares-4", "{ tier: critical }", "    quorum: true\n", 3)
                + cluster("coord-1", "{ tier: critical }", "    quorum: true\n", 3)
                + cluster("coord-2", "{ tier: critical }", "    quorum: true\n", 5));

        // a majority quorum of n nodes tolerates floor((n-1)/2) failures: Lamport, "Paxos Made Simple", 2001.
        // 0.67 of 3 allows 2 > 1; 0.67 of 5 allows 3 > 2: four clusters, one finding naming the first by id
        assertThat(lint(fleet)).containsExactly(new Finding(Severity.ERROR, "unsafe-limits", dir.source("loose.yaml"), 4, 3, "loose",
                "impaired-fraction 0.67 allows 2 of 3 nodes of coord-1 impaired at once (and 3 more clusters);"
                        + " a majority quorum of 3 tolerates 1"));
    }

    @Test
    void fractionAllowingTwoOfAReplicationFactorThreeMinHealthyTwoClusterIsFlagged() {
        dir.write("loose.yaml", playbook("loose", NODE_SILENT, "limits: { impaired-fraction: 0.5 }\n"));
        Fleet fleet = fleet(cluster("tickets-1", "{ tier: standard }", "    replication: { factor: 3, min-healthy: 2 }\n", 4));

        // quorum-based replication (Gifford, "Weighted Voting for Replicated Data", SOSP 1979): of 3 copies at least 2
        // must stay healthy, so at most 3 - 2 = 1 copy may be impaired at once
        List<Finding> findings = lint(fleet);
        assertThat(findings).extracting(Finding::code, Finding::message).containsExactly(tuple(
                "unsafe-limits", "impaired-fraction 0.5 allows 2 of 4 nodes of tickets-1 impaired at once;"
                        + " replication factor 3 with min-healthy 2 tolerates 1"));
    }

    @Test
    void worstClusterIsNamedWhenSeveralAreTooLoose() {
        dir.write("loose.yaml", playbook("loose", NODE_SILENT, "limits: { impaired-fraction: 0.5 }\n"));
        Fleet fleet = fleet(cluster("tickets-1", "{}", "    replication: { factor: 3, min-healthy: 2 }\n", 4)
                + cluster("tickets-2", "{}", "    replication: { factor: 3, min-healthy: 2 }\n", 6)
                + cluster("tickets-3", "{}", "    replication: { factor: 3, min-healthy: 1 }\n", 4));

        assertThat(lint(fleet)).extracting(Finding::message).containsExactly("impaired-fraction 0.5 allows 3 of 6 nodes of tickets-2"
                + " impaired at once (and 1 more cluster); replication factor 3 with min-healthy 2 tolerates 1");
    }

    @Test
    void fleetWideDefaultFractionIsFlaggedAsSuchAtThePlaybook() {
        dir.write("tend.yaml", "defaults: { impaired-fraction: 0.67 }\n");
        dir.write("p.yaml", playbook("p", NODE_SILENT, ""));
        Fleet fleet = fleet(cluster("coord-1", "{}", "    quorum: true\n", 3));

        assertThat(lint(fleet)).extracting(Finding::line, Finding::column, Finding::message).containsExactly(
                tuple(1, 11, "impaired-fraction 0.67 allows 2 of 3 nodes of coord-1 impaired at once;"
                        + " a majority quorum of 3 tolerates 1 (the value is the fleet-wide default; the playbook does not set it)"));
    }

    @Test
    void fractionTheClustersBearIsClean() {
        dir.write("p.yaml", playbook("p", NODE_SILENT, "limits: { impaired-fraction: 0.34 }\n"));
        Fleet fleet = fleet(cluster("coord-1", "{}", "    quorum: true\n", 5)
                + cluster("fares-1", "{}", "    replication: { factor: 3, min-healthy: 2 }\n", 5)
                + cluster("plain-1", "{}", "", 6));

        assertThat(lint(fleet)).isEmpty();
    }

    @Test
    void twoLivePlaybooksForTheSameTransitionOnOneClusterOverlap() {
        String second = playbook("b", "{ signal: heartbeat, state: silent, scope: node, clusters: { tier: [critical, standard] } }", "");
        dir.write("a.yaml", playbook("a", NODE_SILENT, ""));
        dir.write("b.yaml", second);
        Fleet fleet = fleet(cluster("fares-3", "{ tier: critical }", "", 3) + cluster("fares-4", "{ tier: critical }", "", 3)
                + cluster("telemetry-1", "{ tier: bulk }", "", 3));

        assertThat(lint(fleet)).containsExactly(new Finding(Severity.ERROR, "overlap", dir.source("b.yaml"), 2, 10, "b",
                "playbooks 'a' (" + dir.source("a.yaml") + ":2) and 'b' can both match the same transition: heartbeat silent at node"
                        + " scope on 2 clusters, e.g. fares-3; make their cluster selectors disjoint, or put one of them in shadow mode"));
        assertThat(column(second, 2, "{")).isEqualTo(10);
    }

    @Test
    void withoutAFleetSelectorsThatSomeTagsSatisfyOverlap() {
        dir.write("a.yaml", playbook("a", "{ signal: heartbeat, state: silent, scope: node, clusters: { team: payments } }", ""));
        dir.write("b.yaml", playbook("b", "{ signal: heartbeat, state: silent, scope: node, clusters: { tier: critical } }", ""));

        assertThat(lint(null)).extracting(Finding::code, Finding::message).containsExactly(tuple("overlap",
                "playbooks 'a' (" + dir.source("a.yaml") + ":2) and 'b' can both match the same transition: heartbeat silent at node"
                        + " scope on any cluster whose tags match both {team: [payments]} and {tier: [critical]}; make their cluster"
                        + " selectors disjoint, or put one of them in shadow mode"));
    }

    @Test
    void disjointSelectorsOtherScopesAndShadowPlaybooksDoNotOverlap() {
        dir.write("a.yaml", playbook("a", "{ signal: heartbeat, state: silent, scope: node, clusters: { tier: critical } }", ""));
        dir.write("b.yaml", playbook("b", "{ signal: heartbeat, state: silent, scope: node, clusters: { tier: [standard, bulk] } }", ""));
        dir.write("c.yaml", playbook("c", "{ signal: heartbeat, state: silent, scope: cluster }", ""));
        dir.write("d.yaml", playbook("d", NODE_SILENT, "mode: shadow\n"));
        dir.write("e.yaml", playbook("e", "{ signal: heartbeat, state: breach, scope: node }", ""));

        assertThat(lint(null)).isEmpty();
    }

    @Test
    void actionStepWithoutAnyTimeoutIsFlagged() {
        String text = playbook("p", NODE_SILENT, """
                steps:
                  - { id: drain, action: drain-node }
                  - { id: replace, action: replace-node }
                  - { id: drain-again, action: drain-node, timeout: 5m }
                """);
        dir.write("p.yaml", text);

        assertThat(lint(null)).containsExactly(new Finding(Severity.ERROR, "no-timeout", dir.source("p.yaml"), 4, 5, "p",
                "step 'drain' has no timeout and its action 'drain-node' defines none, so a hung simulated action would hold the run"
                        + " forever; set timeout on the step or on the action"));
    }

    @Test
    void actionOfAKindWithoutExecutorIsFlaggedOncePerPlaybook() {
        dir.write("p.yaml", playbook("p", NODE_SILENT, """
                steps:
                  - { id: replace, action: replace-node }
                  - { id: replace-again, action: replace-node }
                on-failure:
                  - { id: page-owner, action: page, timeout: 1m }
                """));

        List<Finding> findings = Lint.check(PlaybookLoader.load(tmp), null, Set.of("simulated"));

        assertThat(findings).extracting(Finding::code, Finding::line, Finding::message).containsExactly(
                tuple("no-executor", 4, "step 'replace' runs action 'replace-node' of kind command,"
                        + " but no command executor is configured; the configured executors are: simulated"),
                tuple("no-executor", 7, "step 'page-owner' runs action 'page' of kind http, but no"
                        + " http executor is configured; the configured executors are: simulated"));
    }

    @Test
    void selectorMatchingNoClusterOfTheFleetIsAWarningThatNamesTheFleetsValues() {
        String text = playbook("p", "{ signal: heartbeat, state: silent, scope: node, clusters: { tier: gold, tem: x } }", "");
        dir.write("p.yaml", text);
        Fleet fleet = fleet(cluster("fares-3", "{ tier: critical }", "", 3) + cluster("telemetry-1", "{ tier: bulk }", "", 3));

        assertThat(lint(fleet)).containsExactly(new Finding(Severity.WARNING, "unmatched", dir.source("p.yaml"), 2,
                column(text, 2, "{ tier: gold"), "p",
                "the cluster selector {tem: [x], tier: [gold]} matches none of the 2 clusters of fleet test; no cluster has the"
                        + " tag 'tem'; the fleet's values of 'tier' are: bulk, critical"));
    }

    @Test
    void findingsAreSortedByFileThenLine() {
        dir.write("b.yaml", playbook("b", NODE_SILENT, "steps:\n  - { id: drain, action: drain-node }\n"));
        dir.write("a.yaml", playbook("a", NODE_SILENT, "mode: shadow\nsteps:\n  - { id: x, action: drain-node }\n  - { id: y, action: drain-node }\n"));

        assertThat(lint(null)).extracting(f -> f.file().substring(f.file().length() - 6) + ":" + f.line())
                .containsExactly("a.yaml:5", "a.yaml:6", "b.yaml:4");
    }

    @Test
    void findingsRenderAsTextAndJson() {
        dir.write("p.yaml", playbook("p", NODE_SILENT, "steps:\n  - { id: drain, action: drain-node }\n"));
        List<Finding> findings = lint(null);

        assertThat(FindingsFormat.text(findings)).isEqualTo(dir.source("p.yaml") + ":4:5: error: step 'drain' has no timeout and its"
                + " action 'drain-node' defines none, so a hung simulated action would hold the run forever; set timeout on the step or on"
                + " the action [no-timeout]\n1 finding (1 error, 0 warnings)\n");
        assertThat(FindingsFormat.text(List.of())).isEqualTo("no findings\n");
        String json = FindingsFormat.json(findings);
        assertThat(json).contains("\"code\" : \"no-timeout\"", "\"severity\" : \"error\"", "\"line\" : 4", "\"column\" : 5",
                "\"playbook\" : \"p\"");
        assertThat(json.indexOf("\"code\"")).isLessThan(json.indexOf("\"severity\""));
        assertThat(FindingsFormat.json(List.of()).strip()).isEqualTo("[ ]");
    }

    @Test
    void findingRejectsMalformedCodes() {
        assertThatThrownBy(() -> new Finding(Severity.ERROR, "No Timeout", "f", 1, 1, "p", "m"))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("a finding code is lower-case words joined by '-', got 'No Timeout'");
    }
}
