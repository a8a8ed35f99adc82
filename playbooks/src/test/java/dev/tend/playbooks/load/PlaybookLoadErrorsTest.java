package dev.tend.playbooks.load;

import dev.tend.playbooks.TestDir;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.util.List;

import static dev.tend.playbooks.TestDir.column;
import static org.assertj.core.api.Assertions.assertThat;

/** Each kind of mistake in a playbook's structure (keys, steps, types, placeholders, files) is reported with file, line, column and a sentence. */
class PlaybookLoadErrorsTest extends PlaybookErrorsFixture {
    @Test
    void unknownKeyNamesTheAllowedKeysAndTheNearestOne() {
        String text = """
                playbook: p1
                trigger:
                  signal: heartbeat
                  state: silent
                  scope: node
                  confirm_for: 5m
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 6, 3, "unknown key 'confirm_for' in trigger (did you mean 'confirm-for'?);"
                + " the keys allowed here are: clusters, confirm-for, scope, signal, state");
    }

    @Test
    void unknownTopLevelKeyWithoutNearMissListsTheKeys() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                owner: payments
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 3, 1, "unknown key 'owner' in a playbook; the keys allowed here are:"
                + " approval, description, limits, mode, on-failure, on-stand-down, playbook, steps, trigger, unless, version, window");
    }

    @Test
    void stepNamingAnUndefinedActionListsTheDefinedOnes() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-nod, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 4, column(text, 4, "drain-nod"), "steps[drain] names action 'drain-nod',"
                + " which is not defined; the defined actions are: drain-node, replace-node");
    }

    @Test
    void stepNamingAnActionWithoutActionsFileSaysThereIsNone(@TempDir Path empty) {
        TestDir bare = new TestDir(empty);
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        bare.write("p1.yaml", text);
        List<Problem> problems = TestDir.problems(() -> PlaybookLoader.load(empty));
        assertThat(problems).extracting(Problem::message).containsExactly("steps[drain] names action 'drain-node', which is not"
                + " defined; there is no actions.yaml in the playbook directory, so no action is defined");
    }

    @Test
    void duplicateStepIdSaysWhereTheFirstIs() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                  - { id: settle, wait-healthy: [heartbeat], within: 5m }
                on-failure:
                  - { id: drain, page: oncall, message: "drain of {node} failed" }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 7, column(text, 7, "drain"), "step id 'drain' is used twice; the first is"
                + " at line 4, column 11 (step ids must be unique across steps and on-failure)");
    }

    @Test
    void aWaitLongerThanTheStoreCanHoldIsLocatedAtCheckTime() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                  - { id: settle, wait-healthy: [heartbeat], within: 100000d }
                """;
        List<Problem> problems = load("p1.yaml", text);
        assertThat(problems).hasSize(1);
        assertThat(problems.get(0).line()).isEqualTo(5);
        assertThat(problems.get(0).column()).isEqualTo(column(text, 5, "100000d"));
        assertThat(problems.get(0).message()).contains("at most 3650d");
    }

    @Test
    void duplicatePlaybookIdAcrossFilesNamesTheFirstFile() {
        String body = """
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        dir.write("a.yaml", "playbook: same\n" + body);
        List<Problem> problems = load("b.yaml", "playbook: same\n" + body);
        assertOnly(problems, "b.yaml", 1, 11, "playbook id 'same' is already used by " + dir.source("a.yaml")
                + ":1:11; playbook ids must be unique in a directory");
    }

    @Test
    void missingRequiredKeyIsReportedAtItsMapping() {
        String text = """
                playbook: p1
                trigger:
                  signal: heartbeat
                  scope: node
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 3, 3, "trigger needs 'state'");
    }

    @Test
    void missingStepsIsReportedAtThePlaybook() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 1, 1, "a playbook needs 'steps'");
    }

    @Test
    void stepsGivenAsOneValueIsAWrongType() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps: drain
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 3, 8, "steps must be a list, got a value");
    }

    @Test
    void wordWhereANumberBelongsIsAWrongType() {
        String text = """
                playbook: p1
                version: three
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 2, 10, "version: must be a whole number, got 'three'");
    }

    @Test
    void listWhereAValueBelongsIsAWrongType() {
        String text = """
                playbook: p1
                trigger: { signal: [heartbeat], state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 2, column(text, 2, "[heartbeat]"), "trigger.signal must be a value, got a list");
    }

    @Test
    void clearStateIsRejectedWithTheReason() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: clear, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 2, column(text, 2, "clear"), "trigger.state: must be breach or silent:"
                + " a playbook reacts to a problem, and clear ends one");
    }

    @Test
    void unknownPlaceholderInMessageListsTheKnownOnes() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                on-failure:
                  - { page: oncall, message: "{nod} failed at {step}" }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 6, column(text, 6, "\"{nod}"), "on-failure[#1].message: unknown placeholder"
                + " {nod} in '{nod} failed at {step}'; the placeholders here are {cluster} {node} {playbook} {run} {step}");
    }

    @Test
    void nodePlaceholderInClusterScopePlaybookIsRejected() {
        String text = """
                playbook: p1
                trigger: { signal: cert-expiry, state: breach, scope: cluster }
                steps:
                  - { id: tell-owner, page: owners, message: "{node} of {cluster} needs a certificate" }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 4, column(text, 4, "\"{node}"), "steps[tell-owner].message uses {node},"
                + " but this playbook has cluster scope, so there is no node to fill in");
    }

    @Test
    void unquotedPlaceholderIsExplained() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - id: tell
                    page: oncall
                    message: {node}
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 6, 14, "steps[tell].message: write the placeholder in quotes, \"{node}\":"
                + " unquoted, YAML reads {node} as a mapping");
    }

    @Test
    void stepDoingTwoThingsIsRejected() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, page: oncall }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 4, 5, "steps[drain] has both 'action' and 'page'; a step does one"
                + " thing, so split it into two steps");
    }

    @Test
    void playbookWithThreeMistakesYieldsExactlyThreeLocatedProblems() {
        String text = """
                playbook: p1
                trigger:
                  signal: heartbeat
                  state: silent
                  scope: nodes
                limits:
                  cooldown: 6 hours
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                  - { id: drain, action: replace-node, timeout: 30m }
                """;
        List<Problem> problems = load("p1.yaml", text);
        assertThat(problems).extracting(Problem::toString).containsExactly(
                dir.source("p1.yaml") + ":5:10: trigger.scope: must be node or cluster, got 'nodes'",
                dir.source("p1.yaml") + ":7:13: limits.cooldown: a duration looks like 30s, 5m, 6h or 1d, got '6 hours'",
                dir.source("p1.yaml") + ":10:11: step id 'drain' is used twice; the first is at line 9, column 11"
                        + " (step ids must be unique across steps and on-failure)");
    }

    @Test
    void problemsOfAllFilesAreReportedTogetherInFileOrder() {
        dir.write("tend.yaml", "rate: lots\n");
        dir.write("a.yaml", "playbook: [a\n");
        List<Problem> problems = load("b.yaml", """
                playbook: b
                trigger: { signal: heartbeat, state: silent, scope: node, confirm-for: soon }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """);
        assertThat(problems).extracting(Problem::source)
                .containsExactly(dir.source("tend.yaml"), dir.source("a.yaml"), dir.source("b.yaml"));
        assertThat(problems.get(0).message()).startsWith("rate: a rate looks like 10/1h");
        assertThat(problems.get(1).message()).startsWith("this is not valid YAML:");
        assertThat(problems.get(2).message()).isEqualTo("trigger.confirm-for: a duration looks like 30s, 5m, 6h or 1d, got 'soon'");
    }

    @Test
    void otherYamlFileIsReadAsAPlaybookAndSaysSo() {
        List<Problem> problems = load("notes.yml", "owner: payments\n");
        assertThat(problems).extracting(Problem::message).contains("a playbook needs 'playbook: <id>'; every .yaml or .yml file"
                + " in a playbook directory except actions.yaml, tend.yaml and fleet.yaml is read as a playbook");
    }

    @Test
    void directoryWithoutPlaybooksIsRejected() {
        List<Problem> problems = TestDir.problems(() -> PlaybookLoader.load(tmp));
        assertThat(problems).extracting(Problem::toString).containsExactly(tmp + ": holds no playbook: no .yaml or .yml file"
                + " other than actions.yaml, tend.yaml and fleet.yaml");
    }
}
