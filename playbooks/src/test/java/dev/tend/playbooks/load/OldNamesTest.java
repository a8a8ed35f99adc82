package dev.tend.playbooks.load;

import dev.tend.playbooks.TestDir;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Every key tend once read under another name is refused where it is written, with a
 * sentence naming the new one; none is read silently. (The fleet file's old replication key
 * is tested in the shared module's FleetFileTest.)
 */
class OldNamesTest {
    @TempDir
    Path tmp;
    TestDir dir;

    @BeforeEach
    void actions() {
        dir = new TestDir(tmp);
        dir.write("actions.yaml", TestDir.ACTIONS);
    }

    private List<String> problems(String name, String text) {
        dir.write(name, text);
        return TestDir.problems(() -> PlaybookLoader.load(tmp)).stream().map(Problem::toString).toList();
    }

    private static final String STEPS = """
            steps:
              - { id: drain, action: drain-node, timeout: 10m }
            """;

    @Test
    void topLevelWhenIsNowTrigger() {
        List<String> problems = problems("replace-silent-node.yaml", """
                # Replace a node that stopped reporting.
                playbook: replace-silent-node
                version: 1
                mode: live
                when:
                  signal: heartbeat
                  state: silent
                  scope: node
                """ + STEPS);
        assertThat(problems).containsExactly(dir.source("replace-silent-node.yaml") + ":5:1: 'when' is now 'trigger'");
    }

    @Test
    void approvalWhenIsNowClusters() {
        List<String> problems = problems("p.yaml", """
                playbook: p
                trigger: { signal: heartbeat, state: silent, scope: node }
                approval: { when: { tier: [critical] }, expires-after: 30m }
                """ + STEPS);
        assertThat(problems).containsExactly(dir.source("p.yaml") + ":3:13: 'when' is now 'clusters'");
    }

    @Test
    void notifyStepIsNowPage() {
        List<String> problems = problems("p.yaml", """
                playbook: p
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                on-failure:
                  - { notify: oncall, message: "draining {node} failed" }
                """);
        assertThat(problems).containsExactly(dir.source("p.yaml") + ":6:7: 'notify' is now 'page'");
    }

    @Test
    void keepInSyncIsNowKeepReplicasInPlaybookLimitsAndInTendYamlDefaults() {
        dir.write("tend.yaml", "defaults:\n  keep-in-sync: false\n");
        List<String> problems = problems("p.yaml", """
                playbook: p
                trigger: { signal: heartbeat, state: silent, scope: node }
                limits: { keep-in-sync: true }
                """ + STEPS);
        assertThat(problems).containsExactly(
                dir.source("tend.yaml") + ":2:3: 'keep-in-sync' is now 'keep-replicas'",
                dir.source("p.yaml") + ":3:11: 'keep-in-sync' is now 'keep-replicas'");
    }

    @Test
    void brakeNotifyIsNowPage() {
        dir.write("tend.yaml", "brake:\n  engage-at: { clusters: 20 }\n  notify: oncall\n");
        List<String> problems = problems("p.yaml", "playbook: p\ntrigger: { signal: heartbeat, state: silent, scope: node }\n"
                + STEPS);
        assertThat(problems).containsExactly(dir.source("tend.yaml") + ":3:3: 'notify' is now 'page'");
    }

    @Test
    void cronWindowNamesTheNewShape() {
        List<String> problems = problems("p.yaml", """
                playbook: p
                trigger: { signal: heartbeat, state: silent, scope: node }
                window: { allow: "0 0 1 ? * MON-FRI", zone: Europe/Berlin, length: 4h }
                """ + STEPS);
        assertThat(problems).containsExactly(
                dir.source("p.yaml") + ":3:11: 'allow' (a cron expression) is now 'days', 'from' and 'until': write the window"
                        + " as window: { days: [mon-fri], from: \"01:00\", until: \"05:00\", zone: Europe/Berlin }",
                dir.source("p.yaml") + ":3:60: 'length' is now 'until', the wall-clock time the window closes"
                        + " (an until before from spans midnight)");
    }
}
