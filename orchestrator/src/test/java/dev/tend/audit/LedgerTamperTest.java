package dev.tend.audit;

import dev.tend.shared.json.Sha256;
import dev.tend.store.LedgerEntry;
import dev.tend.store.LedgerFilter;
import dev.tend.store.Store;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.Statement;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Tampering with a ledger as someone who can write the store would: naive edits, rewrites
 * that recompute every hash and the head, cut tails, and checkpoints re-signed with another
 * key. Every one is found with the key or the anchor, and the first entry at fault is named.
 * Prints its figures.
 */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
class LedgerTamperTest {
    private static final int ENTRIES = 240;
    private static final int CHECKPOINT_EVERY = 12;
    private static final int PER_KIND = 60;

    @TempDir
    static Path dir;
    Path pristine;
    LedgerKey key;
    Anchor anchor;
    final List<Long> checkpoints = new ArrayList<>();

    @BeforeAll
    void writeALedgerWithCheckpoints() throws Exception {
        byte[] k = new byte[32];
        new Random(7).nextBytes(k);
        key = LedgerKey.of(k);
        pristine = dir.resolve("pristine.db");
        Instant t = Instant.parse("2027-03-14T02:00:00Z");
        try (Store store = Store.openSqlite(pristine)) {
            CheckpointWriter writer = new CheckpointWriter(store, key, CheckpointWriter.EVERY);
            for (int i = 1; i <= ENTRIES; i++) {
                Map<String, Object> f = new LinkedHashMap<>();
                f.put("cluster", "fares-" + (i % 9 + 1));
                f.put("note", "step " + i + " of the night shift");
                Instant at = t.plusSeconds(i);
                store.useTransaction(tx -> tx.appendLedger(at, "note", f));
                if (i % CHECKPOINT_EVERY == 0) writer.write(at);
            }
            writer.write(t.plusSeconds(ENTRIES + 1)); // at the stop: the ledger ends with a checkpoint
            store.read(r -> {
                r.forEachLedger(LedgerFilter.all(), e -> {
                    if (e.kind().equals(Checkpoint.KIND)) checkpoints.add(e.seq());
                });
                return null;
            });
            LedgerEntry head = store.read(r -> r.ledgerHead()).orElseThrow();
            anchor = new Anchor(head.seq(), head.hash());
            AnchorVerifier.Result clean = store.read(r -> AnchorVerifier.verify(r, key, anchor));
            assertThat(clean.ok()).as(clean.message()).isTrue();
        }
    }

    private record Row(long seq, String entry, String prevHash, String hash) {
    }

    /** A fresh copy of the ledger, tampered by {@code tamper}, then verified. */
    private AnchorVerifier.Result tampered(String name, Tamper tamper, LedgerKey withKey, Anchor withAnchor) throws Exception {
        Path copy = dir.resolve(name + ".db");
        Files.copy(pristine, copy, StandardCopyOption.REPLACE_EXISTING);
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + copy)) {
            c.setAutoCommit(false);
            tamper.apply(c);
            c.commit();
        }
        try (Store store = Store.openSqlite(copy)) {
            return store.read(r -> AnchorVerifier.verify(r, withKey, withAnchor));
        } finally {
            Files.deleteIfExists(copy);
        }
    }

    @FunctionalInterface
    private interface Tamper {
        void apply(Connection c) throws Exception;
    }

    private static List<Row> rows(Connection c) throws Exception {
        List<Row> out = new ArrayList<>();
        try (Statement s = c.createStatement(); ResultSet r = s.executeQuery("SELECT seq, entry, prev_hash, hash FROM ledger ORDER BY seq")) {
            while (r.next()) out.add(new Row(r.getLong(1), r.getString(2), r.getString(3), r.getString(4)));
        }
        return out;
    }

    /** Rewrites every hash from entry {@code from} on, as an informed forger would, and moves the head along. */
    private static void rechain(Connection c, long from) throws Exception {
        List<Row> rows = rows(c);
        String prev = from == 1 ? LedgerEntry.GENESIS_HASH : rows.get((int) from - 2).hash();
        try (PreparedStatement up = c.prepareStatement("UPDATE ledger SET prev_hash = ?, hash = ? WHERE seq = ?")) {
            for (Row r : rows) {
                if (r.seq() < from) continue;
                String h = Sha256.hexOf(prev, r.entry());
                up.setString(1, prev);
                up.setString(2, h);
                up.setLong(3, r.seq());
                up.executeUpdate();
                prev = h;
            }
        }
        long last = rows.isEmpty() ? 0 : rows.get(rows.size() - 1).seq();
        try (PreparedStatement head = c.prepareStatement("UPDATE ledger_head SET seq = ?, hash = ? WHERE id = 1")) {
            head.setLong(1, last);
            head.setString(2, prev);
            head.executeUpdate();
        }
    }

    private static void editNote(Connection c, long seq) throws Exception {
        try (PreparedStatement p = c.prepareStatement("UPDATE ledger SET entry = replace(entry, 'night shift', 'day shift!') WHERE seq = ?")) {
            p.setLong(1, seq);
            assertThat(p.executeUpdate()).isEqualTo(1);
        }
    }

    private long noteSeq(Random rnd) {
        long seq;
        do {
            seq = 1 + rnd.nextInt((int) anchor.seq() - 1);
        } while (checkpoints.contains(seq));
        return seq;
    }

    /** The last checkpoint before {@code seq}, or 0. */
    private long checkpointBefore(long seq) {
        long c = 0;
        for (long s : checkpoints) if (s < seq) c = s;
        return c;
    }

    @Test
    void everyTamperingIsFoundWithTheKeyOrTheAnchorNamingTheFirstEntryAtFault() throws Exception {
        Random rnd = new Random(42);
        LedgerKey other = LedgerKey.of("a different key of the same length.".getBytes());
        int tried = 0, found = 0, informed = 0, cut = 0, swapped = 0, naive = 0;
        List<String> missed = new ArrayList<>();
        for (int i = 0; i < PER_KIND; i++) {
            long k = noteSeq(rnd);
            // 1. a naive edit: the hash chain alone names the entry
            AnchorVerifier.Result a = tampered("naive", c -> editNote(c, k), null, null);
            tried++;
            naive++;
            if (!a.ok() && a.firstAtFault() == k) found++; else missed.add("naive edit of " + k + ": " + a.message());

            // 2. an informed rewrite: every later hash and the head recomputed; the key finds it from the last good checkpoint
            AnchorVerifier.Result b = tampered("informed", c -> {
                editNote(c, k);
                rechain(c, k);
            }, key, null);
            tried++;
            informed++;
            if (!b.ok() && b.firstAtFault() == checkpointBefore(k) + 1 && b.firstAtFault() <= k) found++;
            else missed.add("informed rewrite of " + k + ": " + b.message());

            // 3. the same rewrite found by the anchor alone
            AnchorVerifier.Result c3 = tampered("anchored", c -> {
                editNote(c, k);
                rechain(c, k);
            }, null, anchor);
            tried++;
            informed++;
            if (!c3.ok() && c3.firstAtFault() <= k) found++; else missed.add("anchored rewrite of " + k + ": " + c3.message());

            // 4. the tail cut after entry k and the head moved back: the anchor names the first entry missing
            AnchorVerifier.Result d = tampered("cut", c -> {
                try (PreparedStatement p = c.prepareStatement("DELETE FROM ledger WHERE seq > ?")) {
                    p.setLong(1, k);
                    p.executeUpdate();
                }
                rechain(c, k);
            }, key, anchor);
            tried++;
            cut++;
            if (!d.ok() && d.firstAtFault() == k + 1) found++; else missed.add("cut after " + k + ": " + d.message());

            // 5. a rewrite whose checkpoints were re-signed with the forger's own key
            AnchorVerifier.Result e = tampered("swapped", c -> {
                editNote(c, k);
                resign(c, other);
            }, key, null);
            tried++;
            swapped++;
            if (!e.ok() && e.firstAtFault() == 1 && e.message().contains("was made with key " + other.id())) found++;
            else missed.add("swapped key after editing " + k + ": " + e.message());
        }
        System.out.printf("ledger tampering: %d tried (%d naive edits, %d informed rewrites, %d cut tails, %d re-signed"
                + " with another key), %d found with the first entry at fault, %d missed%n", tried, naive, informed, cut, swapped,
                found, missed.size());
        assertThat(missed).isEmpty();
        assertThat(tried).isGreaterThanOrEqualTo(300);
    }

    /** Recomputes every hash and re-signs every checkpoint with {@code forger}, as one holding another key would. */
    private static void resign(Connection c, LedgerKey forger) throws Exception {
        List<Row> rows = rows(c);
        String prev = LedgerEntry.GENESIS_HASH;
        try (PreparedStatement up = c.prepareStatement("UPDATE ledger SET entry = ?, prev_hash = ?, hash = ? WHERE seq = ?")) {
            for (Row r : rows) {
                String entry = r.entry();
                if (entry.contains("\"kind\":\"checkpoint\"")) {
                    Checkpoint old = Checkpoint.parse(entry);
                    Checkpoint forged = Checkpoint.make(forger, r.seq() - 1, prev);
                    entry = entry.replace(old.coversHash(), forged.coversHash()).replace(old.hmac(), forged.hmac())
                            .replace(old.keyId(), forged.keyId());
                }
                String h = Sha256.hexOf(prev, entry);
                up.setString(1, entry);
                up.setString(2, prev);
                up.setString(3, h);
                up.setLong(4, r.seq());
                up.executeUpdate();
                prev = h;
            }
        }
        try (PreparedStatement head = c.prepareStatement("UPDATE ledger_head SET seq = ?, hash = ? WHERE id = 1")) {
            head.setLong(1, rows.get(rows.size() - 1).seq());
            head.setString(2, prev);
            head.executeUpdate();
        }
    }
}
