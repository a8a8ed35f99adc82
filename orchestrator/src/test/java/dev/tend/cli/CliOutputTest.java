package dev.tend.cli;

import dev.tend.store.Store;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.Arrays;
import java.util.List;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/** What the store-reading commands print, on the ledger of one ingested silent node. */
class CliOutputTest {
    @TempDir
    static Path dir;

    static String db;

    @BeforeAll
    static void ingestASilentNode() {
        Path root = CliRun.root();
        db = dir.resolve("tend.db").toString();
        Path input = dir.resolve("unrecovered.jsonl");
        try {
            // the node never recovers by itself, so the run goes through every step (drain, replace, settle)
            List<String> lines = Files.readAllLines(root.resolve("examples/silent-node.jsonl"));
            Files.write(input, lines.subList(0, lines.size() - 1));
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
        CliRun ingest = CliRun.of("ingest", input.toString(),
                "--playbooks", root.resolve("playbooks/library").toString(),
                "--fleet", root.resolve("playbooks/library/fleet.yaml").toString(), "--db", db, "--speedup", "600");
        assertThat(ingest.exit()).as(ingest.err()).isZero();
    }

    private static Stream<String> lines(String text, String containing) {
        return Arrays.stream(text.split("\n")).filter(l -> l.contains(containing));
    }

    @Test
    void auditShowsTheNodeOfEntriesThatNameOnlyTheirRun() {
        CliRun audit = CliRun.of("audit", "--db", db);

        assertThat(audit.exit()).as(audit.err()).isZero();
        assertThat(lines(audit.out(), " executor-result ")).isNotEmpty().allMatch(l -> l.contains(" fares-17/n2 "));
        assertThat(lines(audit.out(), " step-finished ")).isNotEmpty().allMatch(l -> l.contains(" fares-17/n2 "));
    }

    @Test
    void auditShowsTheLoadedPolicyInWordsNotJson() {
        String line = lines(CliRun.of("audit", "--db", db, "--kind", "policy-loaded").out(), "policy-loaded").findFirst().orElseThrow();

        assertThat(line).contains("4 playbooks: move-leadership-off-lagging-node v1 sha256:")
                .contains("replace-silent-node v1 sha256:").contains("; fleet of 300 clusters").doesNotContain("{").doesNotContain("\"");
        // a SHA-256 is 64 hex digits (FIPS 180-4); the line shows 12 of each
        assertThat(line).containsPattern("sha256:[0-9a-f]{12}[ ,;]").doesNotContainPattern("[0-9a-f]{13}");
    }

    @Test
    void auditTimesHaveOneWidth() {
        CliRun audit = CliRun.of("audit", "--db", db);

        assertThat(audit.out().split("\n")).allMatch(l -> l.matches("\\s*\\d+ \\d{4}-\\d\\d-\\d\\dT\\d\\d:\\d\\d:\\d\\d\\.\\d{3}Z .*"));
    }

    @Test
    void anUnknownAuditKindIsAMistakeWithTheNearestKind() {
        CliRun typo = CliRun.of("audit", "--db", db, "--kind", "verdikt");
        CliRun knownButAbsent = CliRun.of("audit", "--db", db, "--kind", "run-paused");

        assertThat(typo.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(typo.err()).contains("--kind: no ledger entry kind 'verdikt' (did you mean 'verdict'?)");
        assertThat(typo.out()).isEmpty();
        assertThat(knownButAbsent.exit()).as(knownButAbsent.err()).isZero();
        assertThat(knownButAbsent.out()).isEmpty();
    }

    @Test
    void runsPrintTimesToTheSecond() {
        CliRun runs = CliRun.of("runs", "--db", db);

        assertThat(runs.out()).containsPattern(" \\d{4}-\\d\\d-\\d\\dT\\d\\d:\\d\\d:\\d\\dZ ").doesNotContainPattern(":\\d\\d\\.\\d+Z");
    }

    @Test
    void handoverUntilNowReachesALedgerThatRunsAheadOfTheClock() {
        try (Store store = Store.openSqlite(Path.of(db))) {
            Instant head = store.read(r -> r.ledgerHead().orElseThrow().at());
            Clock anHourBehind = Clock.fixed(head.minus(Duration.ofHours(1)), ZoneOffset.UTC);
            Clock anHourAhead = Clock.fixed(head.plus(Duration.ofHours(1)), ZoneOffset.UTC);

            Instant behind = store.read(r -> HandoverCommand.endOfNow(r, anHourBehind));
            Instant ahead = store.read(r -> HandoverCommand.endOfNow(r, anHourAhead));

            assertThat(behind).isAfter(head);
            assertThat(ahead).isEqualTo(anHourAhead.instant());
        }
    }

    @Test
    void checkPrintsItsSummaryOnce(@TempDir Path lib) throws Exception {
        Path library = CliRun.root().resolve("playbooks/library");
        try (Stream<Path> files = Files.list(library)) {
            for (Path f : files.toList()) Files.copy(f, lib.resolve(f.getFileName()));
        }
        Path silent = lib.resolve("replace-silent-node.yaml");
        Files.writeString(silent, Files.readString(silent).replace("action: drain-node,   timeout: 10m }", "action: drain-node }"));

        CliRun r = CliRun.of("check", lib.toString());

        assertThat(r.exit()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(lines(r.out(), "replace-silent-node.yaml:32:")).hasSize(1);
        assertThat(Arrays.stream(r.out().split("\n")).filter(l -> l.matches("(\\d+|no) findings?.*"))).hasSize(1);
        assertThat(r.out()).endsWith("[no-timeout]\n1 finding (1 error, 0 warnings)\n");
    }
}
