package dev.tend.store.internal;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.ObjectReader;
import dev.tend.shared.Futures;
import dev.tend.shared.json.CanonicalJson;
import dev.tend.shared.json.CanonicalReader;
import dev.tend.store.LedgerEntry;
import dev.tend.store.LedgerVerification;
import org.jdbi.v3.core.Handle;
import org.jdbi.v3.core.result.ResultIterator;

import java.nio.charset.StandardCharsets;
import dev.tend.shared.time.InstantText;
import java.security.DigestException;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Semaphore;
import java.util.concurrent.ThreadFactory;
import java.util.stream.IntStream;

/**
 * Walks the ledger in seq order and names the first entry that does not verify. Rows are read
 * as raw columns, not as {@link LedgerEntry}, because a tampered row need not be a valid entry.
 * A walk may hand every row it reads, with its text parsed, to a {@link Sink} (the handover
 * tallies the period it verifies in the same walk); it then reads on to the newest entry
 * after a fault, so that the sink sees every row. The sink is called on one thread, not the caller's.
 */
final class LedgerVerifier {
    private static final ObjectMapper JSON = new ObjectMapper();
    /** Made once: {@code ObjectMapper.readTree} looks the tree's type up on every call. */
    private static final ObjectReader READER = JSON.readerFor(JsonNode.class);
    /** Rows read before their own checks are spread over the cores. */
    private static final int CHUNK = 4096;
    /** Chunks read ahead of the walk at most (the memory of a walk over millions of entries stays bounded). */
    private static final int IN_FLIGHT = 4;
    private static final ThreadFactory WALKER = task -> {
        Thread t = new Thread(task, "tend-ledger-walk");
        t.setDaemon(true);
        return t;
    };
    private static final ThreadLocal<MessageDigest> SHA256 = ThreadLocal.withInitial(() -> {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java platform must provide SHA-256", e);
        }
    });
    /** Each thread's digest of a row, so that hashing one allocates nothing. */
    private static final ThreadLocal<byte[]> DIGEST = ThreadLocal.withInitial(() -> new byte[32]);
    /** Each thread's text of a row's time, compared with the entry's "at" without a string. */
    private static final ThreadLocal<char[]> AT = ThreadLocal.withInitial(() -> new char[InstantText.MAX]);
    private static final byte[] HEX = "0123456789abcdef".getBytes(StandardCharsets.US_ASCII);
    private static final byte[] GENESIS = LedgerEntry.GENESIS_HASH.getBytes(StandardCharsets.US_ASCII);

    /**
     * Receives every row a walk reads, in seq order, with its kind column as text and its text
     * parsed (null when not a JSON object).
     */
    interface Sink {
        void row(RawLedgerRow row, String kind, JsonNode fields);
    }

    private final Handle handle;
    private long entries;
    private long lastSeq;
    private byte[] lastHash = GENESIS;
    private long first = 1;
    private LedgerVerification broken;
    /** Set by the walk when the rows after it need not be read. */
    private volatile boolean stopped;

    LedgerVerifier(Handle handle) {
        this.handle = handle;
    }

    LedgerVerification verify() {
        return verifyFrom(1);
    }

    /** Checks the entries from {@code fromSeq} on; the entry before it only against its own text (see StoreReader). */
    LedgerVerification verifyFrom(long fromSeq) {
        return verifyFrom(fromSeq, null);
    }

    /**
     * Checks the entries from {@code fromSeq} on and, when {@code sink} is not null, hands it
     * every row read. This thread reads the rows; what each says about itself is checked on the
     * other cores, a chunk at a time, and the chain is walked in order (and the sink called) on a
     * thread of its own while the next chunks are read.
     */
    LedgerVerification verifyFrom(long fromSeq, Sink sink) {
        if (fromSeq > 1) {
            Optional<RawLedgerRow> before = handle.createQuery("SELECT " + Rows.LEDGER_COLUMNS + " FROM ledger WHERE seq = :seq")
                    .bind("seq", fromSeq - 1)
                    .map((rs, ctx) -> RawLedgerRow.of(rs))
                    .findOne();
            if (before.isPresent()) {
                RawLedgerRow b = before.get();
                if (!hashMatches(b)) {
                    broken = broken(b.seq(), b.describe() + " was changed after it was written: its hash does not match its content");
                }
                lastSeq = b.seq();
                lastHash = b.hash();
            } else {
                broken = broken(fromSeq - 1, "entry " + (fromSeq - 1) + " is missing; it was deleted after it was written");
            }
            if (broken != null && sink == null) return broken;
        }
        first = Math.max(1, fromSeq);
        // this thread only reads rows; each chunk's own checks run on the pool, and the walk (and the sink) on one
        // thread of its own, chunk after chunk in seq order; at most IN_FLIGHT chunks are read ahead of the walk
        ExecutorService walker = Executors.newSingleThreadExecutor(WALKER);
        Semaphore room = new Semaphore(IN_FLIGHT);
        CompletableFuture<Boolean> walked = CompletableFuture.completedFuture(true);
        try (ResultIterator<RawLedgerRow> rows = handle.createQuery("SELECT " + Rows.LEDGER_COLUMNS + " FROM ledger WHERE seq >= :from ORDER BY seq")
                .bind("from", first)
                .setFetchSize(JdbiReader.FETCH_SIZE)
                .map((rs, ctx) -> RawLedgerRow.of(rs))
                .iterator()) {
            List<RawLedgerRow> chunk = new ArrayList<>(CHUNK);
            while (rows.hasNext()) {
                chunk.add(rows.next());
                if (chunk.size() == CHUNK || !rows.hasNext()) {
                    acquire(room);
                    if (stopped) break; // the walk stopped (a fault, and no sink to read on for) or failed: read no further
                    List<RawLedgerRow> rowsToCheck = chunk;
                    CompletableFuture<Content[]> checking = CompletableFuture.supplyAsync(() -> contents(rowsToCheck));
                    walked = walked.thenCombineAsync(checking, (going, content) -> going && walk(rowsToCheck, content, sink), walker);
                    walked.whenComplete((going, failure) -> {
                        if (failure != null || !going) stopped = true;
                        room.release();
                    });
                    chunk = new ArrayList<>(CHUNK);
                }
            }
            if (!Futures.joined(walked)) return broken;
        } finally {
            walker.shutdown();
        }
        return broken != null ? broken : checkHead();
    }

    private static void acquire(Semaphore room) {
        try {
            room.acquire();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while verifying the ledger", e);
        }
    }

    private static Content[] contents(List<RawLedgerRow> chunk) {
        Content[] content = new Content[chunk.size()];
        IntStream.range(0, content.length).parallel().forEach(i -> content[i] = content(chunk.get(i)));
        return content;
    }

    /**
     * Walks a run of checked rows in seq order: what each row says about itself was checked on
     * all cores; the seq order and the chain links are walked here, so the first entry at fault
     * and the sentence about it are those of a walk one entry at a time. Returns false when the
     * walk can stop (a fault, and no sink to read on for).
     */
    private boolean walk(List<RawLedgerRow> chunk, Content[] content, Sink sink) {
        for (int i = 0; i < content.length; i++) {
            RawLedgerRow row = chunk.get(i);
            if (broken == null) {
                broken = check(row, content[i]);
                if (broken == null) {
                    entries++;
                    lastSeq = row.seq();
                    lastHash = row.hash();
                } else if (sink == null) {
                    return false;
                }
            }
            if (sink != null) sink.row(row, content[i].kind(), content[i].fields());
        }
        return true;
    }

    /**
     * What a row says about itself: the first fault before the chain link is looked at, and
     * after it; its kind column as text; its parsed text.
     */
    private record Content(String before, String after, String kind, JsonNode fields) {
        Content(String before, String after, RawLedgerRow row, JsonNode fields) {
            this(before, after, kindOf(row, fields), fields);
        }
    }

    /** The row's kind column as text: the text's own kind string when the two agree (as they do unless tampered with). */
    private static String kindOf(RawLedgerRow row, JsonNode fields) {
        JsonNode kind = fields == null ? null : fields.get("kind");
        if (kind != null && kind.isTextual() && RawLedgerRow.same(row.kindBytes(), kind.textValue())) return kind.textValue();
        return row.kind();
    }

    private static Content content(RawLedgerRow row) {
        boolean hashed = hashMatches(row);
        // the usual entry is read and found canonical in one pass; any other text is parsed and written again to tell
        JsonNode fields = CanonicalReader.readObject(row.entry());
        boolean canonical = fields != null;
        boolean json = true;
        if (!canonical) {
            String entry = row.entry() == null ? "" : new String(row.entry(), StandardCharsets.UTF_8);
            JsonNode text;
            try {
                text = READER.readTree(entry);
            } catch (JsonProcessingException e) {
                text = null;
                json = false;
            }
            fields = text != null && text.isObject() ? text : null;
            canonical = fields != null && CanonicalJson.serialize(fields).equals(entry);
        }
        if (!hashed) {
            return new Content(row.describe() + " was changed after it was written: its hash does not match its content", null, row, fields);
        }
        if (!json) {
            return new Content(row.describe() + " was changed after it was written: its text is not JSON", null, row, null);
        }
        if (!canonical) {
            return new Content(row.describe() + " was changed after it was written: its text is not canonical JSON (RFC 8785)", null,
                    row, fields);
        }
        JsonNode seq = fields.get("seq");
        if (seq == null || !seq.isIntegralNumber() || seq.longValue() != row.seq()) {
            return new Content(row.describe() + " is out of place: its text says it is entry " + seq
                    + "; entries were reordered or renumbered after they were written", null, row, fields);
        }
        String column = disagreeingColumn(row, fields);
        return new Content(null, column == null ? null
                : row.describe() + " was changed after it was written: its " + column + " column disagrees with its text", row, fields);
    }

    /** The text of an entry (its bytes as stored) parsed, or null when it is not a JSON object. */
    static JsonNode fields(byte[] entry) {
        JsonNode read = CanonicalReader.readObject(entry);
        return read != null || entry == null ? read : fields(new String(entry, StandardCharsets.UTF_8));
    }

    /** The text of an entry parsed, or null when it is not a JSON object. */
    static JsonNode fields(String entry) {
        try {
            JsonNode text = READER.readTree(entry);
            return text != null && text.isObject() ? text : null;
        } catch (JsonProcessingException e) {
            return null;
        }
    }

    /**
     * SHA-256 of prev_hash and text, as lowercase hex, equals the row's hash ({@link LedgerChain#hash}, without the
     * strings): the columns' bytes are hashed as stored (a prev_hash that is not ASCII as the UTF-8 of its text, as
     * {@code ResultSet.getString} would give it), and the digest is compared with the hash column digit by digit.
     */
    private static boolean hashMatches(RawLedgerRow row) {
        byte[] prev = row.prevHash();
        if (prev == null || row.entry() == null) return false;
        MessageDigest md = SHA256.get();
        md.reset();
        md.update(RawLedgerRow.ascii(prev) ? prev : RawLedgerRow.text(prev).getBytes(StandardCharsets.UTF_8));
        md.update(row.entry());
        byte[] d = DIGEST.get();
        try {
            md.digest(d, 0, d.length);
        } catch (DigestException e) {
            throw new IllegalStateException("SHA-256 gives 32 bytes", e);
        }
        byte[] hash = row.hash();
        // a hash column that is not ASCII has no lowercase hex digit where one is expected (its bytes are negative)
        if (hash == null || hash.length != 2 * d.length) return false;
        for (int i = 0; i < d.length; i++) {
            if (hash[2 * i] != HEX[(d[i] >> 4) & 0xf] || hash[2 * i + 1] != HEX[d[i] & 0xf]) return false;
        }
        return true;
    }

    private LedgerVerification check(RawLedgerRow row, Content content) {
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
        if (!Arrays.equals(row.prevHash(), lastHash)) {
            String link = row.seq() == 1 ? "does not start the chain: its prev_hash is not 64 zeros"
                    : "does not follow entry " + lastSeq + ": its prev_hash is not that entry's hash";
            return broken(row.seq(), row.describe() + " " + link + "; entries were reordered, or one was replaced");
        }
        if (content.after() != null) return broken(row.seq(), content.after());
        return null;
    }

    /** The first indexed column whose value is not the one in the entry text, or null. */
    private static String disagreeingColumn(RawLedgerRow row, JsonNode text) {
        if (!atAgrees(row.atNs(), textOf(text, "at"))) return "at";
        if (!RawLedgerRow.same(row.kindBytes(), textOf(text, "kind"))) return "kind";
        if (!RawLedgerRow.same(row.clusterBytes(), textOf(text, "cluster"))) return "cluster";
        if (!RawLedgerRow.same(row.playbookBytes(), textOf(text, "playbook"))) return "playbook";
        if (!RawLedgerRow.same(row.runBytes(), textOf(text, "run"))) return "run";
        return null;
    }

    /** {@code LedgerChain.formatAt(at_ns).equals(at)}, the time written into this thread's buffer instead of a string. */
    private static boolean atAgrees(long atNs, String at) {
        if (at == null) return false;
        java.time.Instant t = Times.fromNanos(atNs);
        char[] out = AT.get();
        int n = InstantText.write(t, out);
        if (n < 0) return LedgerChain.formatAt(t).equals(at);
        if (n != at.length()) return false;
        for (int i = 0; i < n; i++) if (out[i] != at.charAt(i)) return false;
        return true;
    }

    /** The text of a field; null when absent or null; a marker that equals no column when not text. */
    private static String textOf(JsonNode text, String field) {
        JsonNode v = text.get(field);
        if (v == null || v.isNull()) return null;
        return v.isTextual() ? v.textValue() : "\u0000not text: " + v;
    }

    private LedgerVerification checkHead() {
        record Head(long seq, String hash) {
        }
        Optional<Head> head = handle.createQuery("SELECT seq, hash FROM ledger_head WHERE id = 1")
                .map((rs, ctx) -> new Head(rs.getLong(1), rs.getString(2)))
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
        if (!RawLedgerRow.same(lastHash, headHash)) {
            String which = lastSeq == 0 ? "the ledger is empty but its head records hash " + headHash
                    : "entry " + lastSeq + " has hash " + lastHashText() + " but the ledger head records " + headHash;
            return broken(Math.max(1, lastSeq), which + "; the entry or the head row was changed after it was written");
        }
        String what = first == 1 ? (entries == 0 ? "the ledger is empty" : "all " + entries + " entries verify")
                : entries == 0 ? "no entry follows entry " + lastSeq
                : "entries " + first + " to " + lastSeq + " verify (the " + (first - 1) + " before them were not read)";
        return new LedgerVerification(true, entries, lastHashText(), 0,
                first == 1 && entries == 0 ? what : what + "; the head hash is " + lastHashText());
    }

    private String lastHashText() {
        return RawLedgerRow.text(lastHash);
    }

    private LedgerVerification broken(long seq, String reason) {
        return new LedgerVerification(false, entries, lastHashText(), seq, reason);
    }
}
