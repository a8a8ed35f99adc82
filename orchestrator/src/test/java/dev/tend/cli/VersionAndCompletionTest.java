package dev.tend.cli;

import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

class VersionAndCompletionTest {
    @Test
    void versionNamesTheCommitTheBuildWasMadeFrom() {
        CliRun r = CliRun.of("--version");

        assertThat(r.exit()).isZero();
        // a git object name is hex (git's abbreviated SHA-1 or SHA-256; from memory: at least 7 digits)
        assertThat(r.out()).matches("(?s)tend \\S+ \\(commit [0-9a-f]{7,}.*\\)\\n");
    }

    @Test
    void bashCompletionKnowsEveryCommandAndItsOptions() {
        CliRun r = CliRun.of("completion", "bash");

        assertThat(r.exit()).as(r.err()).isZero();
        assertThat(r.out()).contains("complete -F").contains("abort").contains("handover").contains("--reason").contains("--since");
    }

    @Test
    void zshCompletionLoadsBashCompatibilityFirst() {
        CliRun r = CliRun.of("completion", "zsh");

        assertThat(r.exit()).as(r.err()).isZero();
        assertThat(r.out()).startsWith("autoload -U +X compinit && compinit\nautoload -U +X bashcompinit && bashcompinit\n")
                .contains("complete -F");
    }
}
