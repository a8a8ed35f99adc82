package dev.tend.store.internal;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.shared.json.CanonicalJson;
import dev.tend.store.LedgerEntry;
import dev.tend.store.LedgerVerification;
import org.jdbi.v3.core.Handle;
import org.jdbi.v3.core.result.ResultIterator;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.stream.IntStream;

/**
 * Walks the ledger in seq order, one row at a time, and stops at the first entry that does
 * not verify. Rows are read as raw columns, not as {@link LedgerEntry}, because a tampered
 * row need not be a valid entry.
 */
final class LedgerVerifier {
    private static final ObjectMapper JSON = new ObjectMapper();
    /** Rows read before their own checks are spread over the cores. */
    private static final int CHUNK = 4096;

    private record Raw(long seq, long atNs, String kind, String cluster, String playbook, String run, String entry,
                       String prevHash, String hash) {
        String describe() {
            return "entry " + seq + " (" + kind + " at " + LedgerChain.formatAt(Times.fromNanos(atNs)) + ")";
        }
    }

    private final Handle handle;
    private long entries;
    private long lastSeq;
    private String lastHash = LedgerEntry.GENESIS_HASH;
    private long first = 1;

    LedgerVerifier(Handle handle) {
        this.handle = handle;
    }

    LedgerVerification verify() {
        return verifyFrom(1);
    }

    /** Checks the entries from {@code fromSeq} on; the entry before it only against its own text (see StoreReader). */
    LedgerVerification verifyFrom(long fromSeq) {
        if (fromSeq > 1) {
            Optional<Raw> before = handle.createQuery("SELECT " + Rows.LEDGER_COLUMNS + " FROM ledger WHERE seq = :seq")
                    .bind("seq", fromSeq - 1)
                    .map((rs, ctx) -> raw(rs))
                    .findOne();
            if (before.isPresent()) {
                Raw b = before.get();
                if (!LedgerChain.hash(b.prevHash(), b.entry()).equals(b.hash())) {
                    return broken(b.seq(), b.describe() + " was changed after it was written: its hash does not match its content");
                }
                lastSeq = b.seq();
                lastHash = b.hash();
            } else {
                return broken(fromSeq - 1, "entry " + (fromSeq - 1) + " is missing; it was deleted after it was written");
            }
        }
        first = Math.max(1, fromSeq);
        try (ResultIterator<Raw> rows = handle.createQuery("SELECT " + Rows.LEDGER_COLUMNS + " FROM ledger WHERE seq >= :from ORDER BY seq")
                .bind("from", first)
                .setFetchSize(JdbiReader.FETCH_SIZE)
                .map((rs, ctx) -> raw(rs))
                .iterator()) {
            List<Raw> chunk = new ArrayList<>(CHUNK);
            while (rows.hasNext()) {
                chunk.add(rows.next());
                if (chunk.size() == CHUNK || !rows.hasNext()) {
                    LedgerVerification broken = checkChunk(chunk);
                    if (broken != null) return broken;
                    chunk.clear();
                }
            }
        }
        return checkHead();
    }

    /**
     * Checks a run of rows in seq order. What each row says about itself (its hash, its text,
     * its columns) does not depend on the others and is checked on all cores; the seq order and
     * the chain links are then walked in order, so the first entry at fault and the sentence
     * about it are those of a walk one entry at a time.
     */
    private LedgerVerification checkChunk(List<Raw> chunk) {
        Content[] content = new Content[chunk.size()];
        IntStream.range(0, content.length).parallel().forEach(i -> content[i] = content(chunk.get(i)));
        for (int i = 0; i < content.length; i++) {
            LedgerVerification broken = check(chunk.get(i), content[i]);
            if (broken != null) return broken;
            entries++;
            lastSeq = chunk.get(i).seq();
            lastHash = chunk.get(i).hash();
        }
        return null;
    }

    /** What a row says about itself: the first fault before the chain link is looked at, and after it. */
    private record Content(String before, String after) {
    }

    private static Content content(Raw row) {
        if (!LedgerChain.hash(row.prevHash(), row.entry()).equals(row.hash())) {
            return new Content(row.describe() + " was changed after it was written: its hash does not match its content", null);
        }
        JsonNode text;
        try {
            text = JSON.readTree(row.entry());
        } catch (JsonProcessingException e) {
            return new Content(row.describe() + " was changed after it was written: its text is not JSON", null);
        }
        if (text == null || !text.isObject() || !CanonicalJson.serialize(text).equals(row.entry())) {
            return new Content(row.describe() + " was changed after it was written: its text is not canonical JSON (RFC 8785)", null);
        }
        JsonNode seq = text.get("seq");
        if (seq == null || !seq.isIntegralNumber() || seq.longValue() != row.seq()) {
            return new Content(row.describe() + " is out of place: its text says it is entry " + seq
                    + "; entries were reordered or renumbered after they were written", null);
        }
        String column = disagreeingColumn(row, text);
        return new Content(null, column == null ? null
                : row.describe() + " was changed after it was written: its " + column + " column disagrees with its text");
    }

    private static Raw raw(java.sql.ResultSet rs) throws java.sql.SQLException {
        return new Raw(rs.getLong(1), rs.getLong(2), rs.getString(3), rs.getString(4), rs.getString(5), rs.getString(6),
                rs.getString(7), rs.getString(8), rs.getString(9));
    }

    private LedgerVerification check(Raw row, Content content) {
        long expected = lastSeq + 1;
        if (row.seq() != expected) {
            if (row.seq() < expected) {
                return broken(Math.max(1, row.seq()), "the ledger holds an entry numbered " + row.seq()
                        + ", but entries are numbered from 1: the row was changed after it was written");
            }
            String where = expected == 1 ? "the ledger starts at entry " + row.seq()
                    : "after entry " + lastSeq + " comes entry " + row.seq();
            return broken(expected, "entry " + expected + " is missing: " + where + "; it was deleted after it was written");
        }
        if (content.before() != null) return broken(row.seq(), content.before());
        if (!row.prevHash().equals(lastHash)) {
            String link = row.seq() == 1 ? "does not start the chain: its prev_hash is not 64 zeros"
                    : "does not follow entry " + lastSeq + ": its prev_hash is not that entry's hash";
            return broken(row.seq(), row.describe() + " " + link + "; entries were reordered, or one was replaced");
        }
        if (content.after() != null) return broken(row.seq(), content.after());
        return null;
    }

    /** The first indexed column whose value is not the one in the entry text, or null. */
    private static String disagreeingColumn(Raw row, JsonNode text) {
        if (!Objects.equals(LedgerChain.formatAt(Times.fromNanos(row.atNs())), textOf(text, "at"))) return "at";
        if (!Objects.equals(row.kind(), textOf(text, "kind"))) return "kind";
        if (!Objects.equals(row.cluster(), textOf(text, "cluster"))) return "cluster";
        if (!Objects.equals(row.playbook(), textOf(text, "playbook"))) return "playbook";
        if (!Objects.equals(row.run(), textOf(text, "run"))) return "run";
        return null;
    }

    /** The text of a field; null when absent or null; a marker that equals no column when not text. */
    private static String textOf(JsonNode text, String field) {
        JsonNode v = text.get(field);
        if (v == null || v.isNull()) return null;
        return v.isTextual() ? v.textValue() : "\u0000not text: " + v;
    }

    private LedgerVerification checkHead() {
        Optional<Raw> head = handle.createQuery("SELECT seq, hash FROM ledger_head WHERE id = 1")
                .map((rs, ctx) -> new Raw(rs.getLong(1), 0, null, null, null, null, null, null, rs.getString(2)))
                .findOne();
        if (head.isEmpty()) {
            return broken(Math.max(1, lastSeq), "the ledger_head row is missing, so the newest entries cannot be checked; "
                    + "restore the store from a backup");
        }
        long headSeq = head.get().seq();
        String headHash = head.get().hash();
        if (headSeq > lastSeq) {
            return broken(lastSeq + 1, "entry " + (lastSeq + 1) + " is missing: the ledger head records " + headSeq
                    + " entries but the ledger ends at entry " + lastSeq + "; the newest entries were deleted after they were written");
        }
        if (headSeq < lastSeq) {
            return broken(headSeq + 1, "entry " + (headSeq + 1) + " is not covered by the ledger head: the head records "
                    + headSeq + " entries but the ledger goes on to entry " + lastSeq + "; the head row was changed or entries were added "
                    + "behind the store's back");
        }
        if (!lastHash.equals(headHash)) {
            String which = lastSeq == 0 ? "the ledger is empty but its head records hash " + headHash
                    : "entry " + lastSeq + " has hash " + lastHash + " but the ledger head records " + headHash;
            return broken(Math.max(1, lastSeq), which + "; the entry or the head row was changed after it was written");
        }
        String what = first == 1 ? (entries == 0 ? "the ledger is empty" : "all " + entries + " entries verify")
                : entries == 0 ? "no entry follows entry " + lastSeq
                : "entries " + first + " to " + lastSeq + " verify (the " + (first - 1) + " before them were not read)";
        return new LedgerVerification(true, entries, lastHash, 0, first == 1 && entries == 0 ? what : what + "; the head hash is " + lastHash);
    }

    private LedgerVerification broken(long seq, String reason) {
        return new LedgerVerification(false, entries, lastHash, seq, reason);
    }
}
