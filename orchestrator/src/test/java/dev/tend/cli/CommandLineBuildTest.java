package dev.tend.cli;

import org.junit.jupiter.api.Test;
import picocli.CommandLine;

import static org.assertj.core.api.Assertions.assertThat;

class CommandLineBuildTest {
    private static final String[] ALL = {"check", "ingest", "serve", "runs", "audit", "handover", "approvals", "approve",
            "reject", "abort", "exclude", "brake", "replay", "record", "demo", "journal", "page", "completion"};

    @Test
    void aNamedCommandIsTheOnlyOneBuilt() {
        CommandLine cli = TendMain.commandLine(new String[]{"ingest", "events.jsonl", "--db", "x.db"});

        assertThat(cli.getSubcommands()).containsOnlyKeys("ingest");
        assertThat(cli.getSubcommands().get("ingest").getSubcommands()).isEmpty();
    }

    @Test
    void aCommandKeepsItsOwnSubcommands() {
        CommandLine cli = TendMain.commandLine(new String[]{"audit", "verify"});

        assertThat(cli.getSubcommands()).containsOnlyKeys("audit");
        assertThat(cli.getSubcommands().get("audit").getSubcommands()).containsKeys("verify", "anchor");
    }

    @Test
    void helpVersionAMisspeltCommandAndCompletionSeeEveryCommandInTheHelpsOrder() {
        for (String[] args : new String[][]{{}, {"--help"}, {"--version"}, {"ingst"}, {"completion", "bash"}}) {
            CommandLine cli = TendMain.commandLine(args);

            assertThat(cli.getSubcommands().keySet()).as(String.join(" ", args)).containsExactly(ALL);
        }
    }

    @Test
    void aMisspeltCommandIsAUsageErrorThatSuggestsTheRightOne() {
        CliRun r = CliRun.of("ingst", "x.jsonl");

        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err()).contains("ingest");
    }

    @Test
    void theHelpListsEveryCommand() {
        CliRun r = CliRun.of("--help");

        assertThat(r.exit()).isZero();
        for (String name : ALL) assertThat(r.out()).contains("  " + name + " ");
    }
}
