package dev.tend.cli;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;

import static org.assertj.core.api.Assertions.assertThat;

class CheckCommandTest {
    @TempDir
    Path dir;

    @Test
    void bundledLibraryIsCleanAgainstTheDemoFleet() {
        Path lib = CliRun.root().resolve("playbooks/library");
        CliRun r = CliRun.of("check", lib.toString(), "--fleet", lib.resolve("fleet.yaml").toString());
        assertThat(r.exit()).as(r.err()).isZero();
        assertThat(r.out()).contains("loaded 4 playbooks").contains("fleet larkspur: 300 clusters").contains("no findings");
    }

    @Test
    void playbookWithThreeMistakesGivesThreeLocatedMessagesAndExitTwo() throws Exception {
        Files.writeString(dir.resolve("actions.yaml"), "actions:\n  drain-node: { simulated: { duration: 1m, success: 1.0 } }\n");
        Files.writeString(dir.resolve("broken.yaml"), """
                playbook: broken
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node, confirm-for: 5 minutes }
                limits: { rate: 10 per hour }
                steps:
                  - { id: drain, action: no-such-action, timeout: 10m }
                """);
        CliRun r = CliRun.of("check", dir.toString());
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        String[] located = Arrays.stream(r.err().split("\n")).filter(l -> l.matches(".*broken\\.yaml:\\d+:\\d+: .*")).toArray(String[]::new);
        assertThat(located).hasSize(3);
        assertThat(located[0]).contains("broken.yaml:3:").contains("5 minutes");
        assertThat(located[1]).contains("broken.yaml:4:").contains("10 per hour");
        assertThat(located[2]).contains("broken.yaml:6:").contains("no-such-action");
    }

    @Test
    void lintFindingsExitOneAndRenderAsJson() throws Exception {
        Files.writeString(dir.resolve("actions.yaml"), "actions:\n  drain-node: { simulated: { duration: 1m, success: 1.0 } }\n");
        Files.writeString(dir.resolve("no-timeout.yaml"), """
                playbook: no-timeout
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node }
                """);
        CliRun r = CliRun.of("check", dir.toString(), "--format", "json");
        assertThat(r.exit()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(r.out()).contains("\"code\"").contains("no-timeout");
    }

    @Test
    void missingDirectoryIsAUsageError() {
        CliRun r = CliRun.of("check", dir.resolve("nope").toString());
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err()).contains("not a directory");
    }
}
