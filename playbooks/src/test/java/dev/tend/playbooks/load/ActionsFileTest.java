package dev.tend.playbooks.load;

import dev.tend.playbooks.ActionDef;
import dev.tend.playbooks.Actions;
import dev.tend.playbooks.CommandAction;
import dev.tend.playbooks.HttpAction;
import dev.tend.playbooks.SimulatedAction;
import dev.tend.playbooks.TestDir;
import dev.tend.shared.Id;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Map;

import static dev.tend.playbooks.TestDir.column;
import static org.assertj.core.api.Assertions.assertThat;

/** actions.yaml: command (argument list), http and simulated actions, and their mistakes. */
class ActionsFileTest {
    private static final Map<String, String> RUN = Map.of("cluster", "fares-3", "node", "n2", "run", "r-17",
            "key", "r-17/restart/1", "step", "restart", "attempt", "1");

    private static List<Problem> problems(String text) {
        return TestDir.problems(() -> PlaybookLoader.parseActions("actions.yaml", text));
    }

    @Test
    void commandIsAnArgumentListWithPlaceholdersInsideArguments() {
        Actions actions = PlaybookLoader.parseActions("actions.yaml", """
                actions:
                  restart-process:
                    command: [/opt/larkspur/bin/restart, --cluster, "{cluster}", "--target={node}", --key, "{key}"]
                    timeout: 5m
                    idempotent: true
                """);
        CommandAction c = (CommandAction) actions.get(Id.of("restart-process")).orElseThrow();

        assertThat(c.kind()).isEqualTo("command");
        assertThat(c.render(RUN)).containsExactly("/opt/larkspur/bin/restart", "--cluster", "fares-3", "--target=n2", "--key", "r-17/restart/1");
        assertThat(c.timeout()).isEqualTo(Duration.ofMinutes(5));
        assertThat(c.idempotent()).isTrue();
        assertThat(c.outputLimit()).isEqualTo(CommandAction.DEFAULT_OUTPUT_LIMIT).isEqualTo(4096);
        assertThat(c.uses("node")).isTrue();
        assertThat(actions.source()).isEqualTo("actions.yaml");
        assertThat(actions.contentHash()).hasSize(64);
    }

    @Test
    void commandAsOneStringIsRejectedWithTheReason() {
        String text = """
                actions:
                  restart-process:
                    command: "/opt/larkspur/bin/restart --node {node}"
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly("actions.yaml:3:14: action restart-process.command"
                + " must be a list of arguments such as [restart-node, --node, \"{node}\"], not one string: tend never runs a shell,"
                + " so a string would have to be split on guessed quotes and spaces, and a placeholder's value could turn into"
                + " several arguments");
    }

    @Test
    void placeholderAsTheProgramIsRejected() {
        String text = """
                actions:
                  run-anything:
                    command: ["{step}", --now]
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly(
                "actions.yaml:3:15: action run-anything.command: the program (first item) must be fixed text, not '{step}'");
    }

    @Test
    void unknownPlaceholderInAnArgumentIsRejected() {
        String text = """
                actions:
                  restart-process:
                    command: [restart, "{zone}"]
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly("actions.yaml:3:24: action restart-process.command[1]:"
                + " unknown placeholder {zone} in '{zone}'; the placeholders here are {attempt} {cluster} {key} {node} {run} {step}");
    }

    @Test
    void unquotedPlaceholderArgumentIsExplained() {
        String text = """
                actions:
                  restart-process:
                    command: [restart, {node}]
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly("actions.yaml:3:24: action restart-process.command[1]:"
                + " write the placeholder in quotes, \"{node}\": unquoted, YAML reads {node} as a mapping");
    }

    @Test
    void httpActionDefaultsToPostAndFillsPlaceholdersInTheBody() {
        Actions actions = PlaybookLoader.parseActions("actions.yaml", """
                actions:
                  rotate-certificate:
                    http:
                      url: https://certs.larkspur.example/v1/clusters/{cluster}/rotations
                      body: { run: "{run}", attempt: "{attempt}", urgent: true, batch: 3, share: 0.5, note: "fixed" }
                      timeout: 2m
                      retries: 2
                """);
        HttpAction h = (HttpAction) actions.get(Id.of("rotate-certificate")).orElseThrow();

        assertThat(h.kind()).isEqualTo("http");
        assertThat(h.method()).isEqualTo("POST");
        assertThat(h.url().render(RUN)).isEqualTo("https://certs.larkspur.example/v1/clusters/fares-3/rotations");
        assertThat(h.renderBody(RUN)).containsExactly(Map.entry("run", "r-17"), Map.entry("attempt", "1"), Map.entry("urgent", true),
                Map.entry("batch", 3L), Map.entry("share", 0.5), Map.entry("note", "fixed"));
        assertThat(h.timeout()).isEqualTo(Duration.ofMinutes(2));
        assertThat(h.retries()).isEqualTo(2);
        assertThat(h.uses("cluster")).isTrue();
        assertThat(h.uses("node")).isFalse();
    }

    @Test
    void httpUrlMustBeAbsolute() {
        String text = """
                actions:
                  rotate-certificate:
                    http: { url: /v1/rotations, method: put }
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly("actions.yaml:3:18: action rotate-certificate.http.url"
                + " must be an absolute http:// or https:// URL with a host, got '/v1/rotations'");
    }

    @Test
    void simulatedActionTakesAFixedDurationOrARange() {
        Actions actions = PlaybookLoader.parseActions("actions.yaml", TestDir.ACTIONS);
        SimulatedAction fixed = (SimulatedAction) actions.get(Id.of("drain-node")).orElseThrow();
        SimulatedAction range = (SimulatedAction) actions.get(Id.of("replace-node")).orElseThrow();

        assertThat(fixed.kind()).isEqualTo("simulated");
        assertThat(fixed.minDuration()).isEqualTo(fixed.maxDuration()).isEqualTo(Duration.ofMinutes(2));
        assertThat(fixed.success()).isEqualTo(1.0);
        assertThat(fixed.clears()).isEmpty();
        assertThat(fixed.timeout()).isNull();
        assertThat(range.minDuration()).isEqualTo(Duration.ofMinutes(5));
        assertThat(range.maxDuration()).isEqualTo(Duration.ofMinutes(15));
        assertThat(range.success()).isEqualTo(0.9);
        assertThat(range.clears()).containsExactly(Id.of("heartbeat"));
    }

    @Test
    void simulatedSuccessMustBeAProbability() {
        String text = """
                actions:
                  drain-node:
                    simulated: { duration: 1m, success: 1.5 }
                """;
        assertThat(problems(text)).extracting(Problem::toString)
                .containsExactly("actions.yaml:3:41: action drain-node.simulated.success: must be a probability from 0 to 1, got 1.5");
    }

    @Test
    void actionMustBeExactlyOneKind() {
        String text = """
                actions:
                  drain-node:
                    simulated: { duration: 1m }
                    command: [drain]
                  replace-node:
                    timeout: 5m
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly(
                "actions.yaml:3:5: action drain-node has both 'command' and 'simulated'; an action is exactly one of command, http or simulated",
                "actions.yaml:6:5: action replace-node needs exactly one of 'command', 'http' or 'simulated'");
    }

    @Test
    void keyOfAnotherKindIsUnknownHere() {
        String text = """
                actions:
                  drain-node:
                    simulated: { duration: 1m }
                    timeout: 5m
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly("actions.yaml:4:5: unknown key 'timeout' in action"
                + " drain-node; the keys allowed here are: description, simulated");
    }

    @Test
    void clusterScopePlaybookCannotRunAnActionThatNeedsANode(@TempDir Path tmp) {
        TestDir dir = new TestDir(tmp);
        dir.write("actions.yaml", """
                actions:
                  restart-process:
                    command: [restart, --node, "{node}"]
                    timeout: 1m
                """);
        String text = """
                playbook: p1
                trigger: { signal: cert-expiry, state: breach, scope: cluster }
                steps:
                  - { id: restart, action: restart-process }
                """;
        dir.write("p1.yaml", text);
        assertThat(TestDir.problems(() -> PlaybookLoader.load(tmp))).extracting(Problem::toString).containsExactly(
                dir.source("p1.yaml") + ":4:" + column(text, 4, "restart-process") + ": steps[restart] runs action 'restart-process',"
                        + " which uses {node}, but this playbook has cluster scope, so there is no node to fill in");
    }

    @Test
    void brokenActionIsNotAlsoReportedAsUndefinedByItsSteps(@TempDir Path tmp) {
        TestDir dir = new TestDir(tmp);
        dir.write("actions.yaml", """
                actions:
                  drain-node:
                    command: "drain --all"
                """);
        dir.write("p1.yaml", """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 1m }
                """);
        assertThat(TestDir.problems(() -> PlaybookLoader.load(tmp))).extracting(Problem::source)
                .containsExactly(dir.source("actions.yaml"));
    }

    @Test
    void everyActionKindNamesItsExecutor() {
        Actions actions = PlaybookLoader.parseActions("actions.yaml", """
                actions:
                  a: { command: [true-program], timeout: 1s }
                  b: { http: { url: "http://localhost:8080/x" } }
                  c: { simulated: { duration: 0s } }
                """);
        assertThat(actions.byId().values()).extracting(ActionDef::kind).containsExactly("command", "http", "simulated");
    }
}
