package dev.tend.cli;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

/** tend page test CHANNEL, and tend check on channel names. */
class PageCommandTest {
    @TempDir
    Path dir;

    private void writePolicy(String channelsYaml, String pageStepChannel) throws Exception {
        Files.writeString(dir.resolve("actions.yaml"), "actions:\n  drain-node: { simulated: { duration: 1m, success: 1.0 } }\n");
        Files.writeString(dir.resolve("tend.yaml"), channelsYaml);
        Files.writeString(dir.resolve("drain.yaml"), """
                playbook: drain
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                on-failure:
                  - { id: tell, page: %s, message: "draining {node} failed" }
                """.formatted(pageStepChannel));
    }

    @Test
    void aTestPageGoesThroughTheChannelAndTheAnswerIsPrinted() throws Exception {
        Path mark = dir.resolve("marks");
        Files.createDirectories(mark);
        writePolicy("""
                channels:
                  oncall:
                    command: [/usr/bin/touch, "%s/page-{kind}"]
                """.formatted(mark), "oncall");
        CliRun r = CliRun.of("page", "test", "oncall", "--playbooks", dir.toString());
        assertThat(r.exit()).as(r.err()).isZero();
        assertThat(r.out()).matches("page test/\\d+ through oncall \\(command\\): accepted: exit 0\\n");
        assertThat(mark.resolve("page-test")).exists();
    }

    @Test
    void aChannelThatDoesNotAnswerExitsOneWithTheAnswer() throws Exception {
        writePolicy("""
                channels:
                  oncall:
                    command: [/bin/false]
                """, "oncall");
        CliRun r = CliRun.of("page", "test", "oncall", "--playbooks", dir.toString());
        assertThat(r.exit()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(r.out()).contains("through oncall (command): retry: exit 1");
    }

    @Test
    void anUnknownChannelIsAUsageErrorWithTheNearestName() throws Exception {
        writePolicy("channels:\n  oncall:\n    log: {}\n", "oncall");
        CliRun r = CliRun.of("page", "test", "on-call", "--playbooks", dir.toString());
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err()).contains("unknown channel 'on-call' (did you mean 'oncall'?)");
    }

    @Test
    void checkReportsAPageStepNamingAnUnknownChannelAtItsLine() throws Exception {
        writePolicy("channels:\n  oncall:\n    log: {}\n", "oncal");
        CliRun r = CliRun.of("check", dir.toString());
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err()).contains("drain.yaml:7:5: step tell: unknown channel 'oncal' (did you mean 'oncall'?)");
    }
}
