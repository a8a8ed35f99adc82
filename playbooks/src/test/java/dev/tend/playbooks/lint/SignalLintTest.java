package dev.tend.playbooks.lint;

import dev.tend.playbooks.TestDir;
import dev.tend.playbooks.load.PlaybookLoader;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.util.List;
import java.util.Set;

import static org.assertj.core.api.Assertions.assertThat;

/** tend check and signal names: undeclared trigger and mask signals, and trigger typos. */
class SignalLintTest {
    @TempDir
    Path tmp;
    TestDir dir;

    @BeforeEach
    void actions() {
        dir = new TestDir(tmp);
        dir.write("actions.yaml", """
                actions:
                  move-leadership: { simulated: { duration: 2m, clears: [replica-lag] } }
                """);
    }

    private static String playbook(String id, String signal, String mask) {
        return "playbook: " + id + "\ntrigger: { signal: " + signal + ", state: breach, scope: node }\n"
                + (mask == null ? "" : "unless:\n  - { signal: " + mask + ", on: node }\n")
                + "steps:\n  - { id: move, action: move-leadership, timeout: 5m }\n";
    }

    private List<Finding> lint() {
        return Lint.check(PlaybookLoader.load(tmp), null, Set.of("simulated"));
    }

    @Test
    void aTriggerOrMaskOnAnUndeclaredSignalIsAnError() {
        dir.write("tend.yaml", "signals: [replica-lag, heartbeat, storage-full]\n");
        dir.write("lag.yaml", playbook("move-off-lagging", "replica-lagg", "storage-ful"));
        List<Finding> f = lint().stream().filter(x -> x.code().equals(Lint.UNDECLARED_SIGNAL)).toList();
        assertThat(f).extracting(Finding::severity).containsOnly(Severity.ERROR);
        assertThat(f).extracting(Finding::message).containsExactlyInAnyOrder(
                "playbook triggers on signal 'replica-lagg', which tend.yaml does not declare (did you mean 'replica-lag'?);"
                        + " lines with it are refused, so it can never match",
                "playbook masks on signal 'storage-ful', which tend.yaml does not declare (did you mean 'storage-full'?);"
                        + " lines with it are refused, so it can never mask");
        assertThat(f).allSatisfy(x -> assertThat(x.line()).isPositive());
    }

    @Test
    void withoutADeclarationATriggerOneEditFromANamedSignalIsAWarning() {
        dir.write("lag.yaml", playbook("move-off-lagging", "replica-lagg", null));
        dir.write("other.yaml", playbook("watch-lag", "heartbeat", null));
        assertThat(lint()).filteredOn(x -> x.code().equals(Lint.SIGNAL_TYPO)).singleElement().satisfies(x -> {
            assertThat(x.severity()).isEqualTo(Severity.WARNING);
            assertThat(x.playbook()).isEqualTo("move-off-lagging");
            assertThat(x.message()).startsWith("trigger signal 'replica-lagg' is named nowhere else, and is one edit away from 'replica-lag'");
        });
    }

    @Test
    void aCorrectlySpelledTriggerIsNotFlagged() {
        dir.write("lag.yaml", playbook("move-off-lagging", "replica-lag", null));
        dir.write("beat.yaml", playbook("heartbeats", "heartbeat", null));
        assertThat(lint()).noneMatch(x -> x.code().equals(Lint.SIGNAL_TYPO) || x.code().equals(Lint.UNDECLARED_SIGNAL));
    }

    @Test
    void theBundledLibraryDeclaresEverySignalItTriggersOrMasksOn() {
        Path library = Path.of("library").toAbsolutePath();
        assertThat(Lint.check(PlaybookLoader.load(library), null, Set.of("simulated")))
                .noneMatch(x -> x.code().equals(Lint.UNDECLARED_SIGNAL) || x.code().equals(Lint.SIGNAL_TYPO));
        assertThat(PlaybookLoader.load(library).config().declaresSignals()).isTrue();
    }
}
