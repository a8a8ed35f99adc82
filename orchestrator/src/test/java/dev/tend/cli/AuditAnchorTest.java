package dev.tend.cli;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.Statement;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

/** The ledger keyed and anchored from the command line (DESIGN.md section 6). */
class AuditAnchorTest {
    private static final Path ROOT = CliRun.root();

    @TempDir
    Path dir;

    private Path key(String name, int seed, String perms) throws Exception {
        byte[] k = new byte[32];
        new Random(seed).nextBytes(k);
        Path f = dir.resolve(name);
        Files.write(f, k);
        Files.setPosixFilePermissions(f, PosixFilePermissions.fromString(perms));
        return f;
    }

    private CliRun ingest(String db, Path key) {
        return CliRun.of("ingest", ROOT.resolve("examples/silent-node.jsonl").toString(),
                "--playbooks", ROOT.resolve("playbooks/library").toString(),
                "--fleet", ROOT.resolve("playbooks/library/fleet.yaml").toString(), "--db", db, "--speedup", "600",
                "--ledger-key", key.toString());
    }

    @Test
    void aKeyedLedgerVerifiesWithItsKeyAndAnchorAndNotWithAnotherKey() throws Exception {
        Path key = key("ledger.key", 1, "rw-------");
        String db = dir.resolve("tend.db").toString();
        CliRun run = ingest(db, key);
        assertThat(run.exit()).as(run.err()).isZero();

        CliRun verify = CliRun.of("audit", "verify", "--db", db, "--ledger-key", key.toString());
        assertThat(verify.exit()).as(verify.out()).isZero();
        assertThat(verify.out()).contains("ledger ok").contains("hold under key");
        CliRun anchor = CliRun.of("audit", "anchor", "--db", db);
        assertThat(anchor.exit()).isZero();
        String a = anchor.out().strip();
        assertThat(a).matches("\\d+:[0-9a-f]{64}");
        assertThat(CliRun.of("audit", "verify", "--db", db, "--anchor", a).exit()).isZero();

        CliRun swapped = CliRun.of("audit", "verify", "--db", db, "--ledger-key", key("other.key", 2, "r--------").toString());
        assertThat(swapped.exit()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(swapped.out()).startsWith("ledger broken at entry 1: ").contains("not with the key given");
    }

    @Test
    void aRewriteThatRecomputesEveryHashIsFoundByTheKey() throws Exception {
        Path key = key("ledger.key", 3, "rw-------");
        String db = dir.resolve("tend.db").toString();
        assertThat(ingest(db, key).exit()).isZero();
        String anchor = CliRun.of("audit", "anchor", "--db", db).out().strip();
        // rewrite entry 5, then every hash after it and the head
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db); Statement s = c.createStatement()) {
            s.executeUpdate("UPDATE ledger SET entry = replace(entry, 'fares-17', 'fares-71'),"
                    + " cluster = replace(cluster, 'fares-17', 'fares-71') WHERE seq = 5");
        }
        LedgerRewrite.rechain(Path.of(db), 5);
        assertThat(CliRun.of("audit", "verify", "--db", db).exit()).as("the chain alone is fooled").isZero();
        CliRun withKey = CliRun.of("audit", "verify", "--db", db, "--ledger-key", key.toString());
        assertThat(withKey.exit()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(withKey.out()).startsWith("ledger broken at entry ").contains("rewritten");
        long first = Long.parseLong(withKey.out().substring("ledger broken at entry ".length(), withKey.out().indexOf(':')));
        assertThat(first).as("the first entry no checkpoint vouches for, at or before the edit").isBetween(1L, 5L);
        CliRun withAnchor = CliRun.of("audit", "verify", "--db", db, "--anchor", anchor);
        assertThat(withAnchor.exit()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(withAnchor.out()).contains("does not have the anchored hash");
    }

    @Test
    void aKeyOthersMayReadIsRefusedInOneSentence() throws Exception {
        Path key = key("open.key", 4, "rw-r--r--");
        CliRun r = ingest(dir.resolve("t.db").toString(), key);
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err().strip()).isEqualTo(key + ": the ledger key may be read by others than its owner (rw-r--r--); run chmod 600 " + key);
    }
}
