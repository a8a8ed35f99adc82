package dev.tend.api;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.tend.api.auth.Role;
import dev.tend.shared.TendException;
import dev.tend.store.LedgerEntry;
import dev.tend.store.LedgerFilter;
import dev.tend.store.Store;
import io.javalin.http.Context;
import io.javalin.router.JavalinDefaultRouting;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

/**
 * {@code GET /api/v1/ledger}: the filters of {@code tend audit} (since, until as RFC 3339;
 * cluster, playbook, kind, run), limit (default 500, at most 10000) and before (a seq: only
 * older entries, for the next page). Answers the newest {@code limit} matching entries, oldest
 * first, each the entry's fields plus its hash; {@code truncated} when older ones match too:
 * {@code {"entries":[...],"truncated":bool,"head_seq":n,"head_hash":"..."}}.
 */
final class LedgerRoutes {
    private final Store store;

    LedgerRoutes(Store store) {
        this.store = store;
    }

    /** One page of the ledger. */
    record LedgerPage(List<ObjectNode> entries, boolean truncated, long headSeq, String headHash) {
    }

    void mount(JavalinDefaultRouting r) {
        r.get("/api/v1/ledger", this::query, Role.VIEWER);
    }

    private void query(Context ctx) {
        Instant since = Requests.time(ctx, "since");
        Instant until = Requests.time(ctx, "until");
        if (since != null && until != null && until.isBefore(since)) {
            throw Requests.invalid("until", "until (" + until + ") must not be before since (" + since + ")");
        }
        LedgerFilter f = LedgerFilter.all().withSince(since).withUntil(until)
                .withCluster(Requests.idParam(ctx, "cluster")).withPlaybook(Requests.idParam(ctx, "playbook"))
                .withKind(kind(ctx)).withRun(Requests.idParam(ctx, "run"));
        int limit = Requests.limit(ctx, 500, 10_000);
        long before = before(ctx);
        ctx.json(store.read(rd -> {
            // one more than the page, newest first: whether older matching entries remain
            List<LedgerEntry> newest = rd.newestLedger(f, before, limit + 1);
            boolean truncated = newest.size() > limit;
            List<ObjectNode> entries = new ArrayList<>(Math.min(newest.size(), limit));
            for (int i = Math.min(newest.size(), limit) - 1; i >= 0; i--) entries.add(node(newest.get(i)));
            LedgerEntry head = rd.ledgerHead().orElse(null);
            return new LedgerPage(entries, truncated, head == null ? 0 : head.seq(),
                    head == null ? LedgerEntry.GENESIS_HASH : head.hash());
        }));
    }

    /** {@code before}: only entries with a lower seq (the next older page starts below the first seq of this one). */
    private static long before(Context ctx) {
        String v = ctx.queryParam("before");
        if (v == null || v.isEmpty()) return Long.MAX_VALUE;
        try {
            long n = Long.parseLong(v);
            if (n >= 1) return n;
        } catch (NumberFormatException ignored) {
            // answered below
        }
        throw Requests.invalid("before", "before must be an entry's seq (a whole number, 1 or more), got '" + v + "'");
    }

    private static String kind(Context ctx) {
        String k = ctx.queryParam("kind");
        if (k == null || k.isEmpty()) return null;
        if (!k.matches("[a-z][a-z-]{0,63}")) throw Requests.invalid("kind", "kind must look like verdict or run-started, got '" + k + "'");
        return k;
    }

    private static ObjectNode node(LedgerEntry e) {
        try {
            ObjectNode n = (ObjectNode) ApiJson.MAPPER.readTree(e.entry());
            n.put("hash", e.hash());
            return n;
        } catch (JsonProcessingException | ClassCastException x) {
            throw new TendException("ledger entry " + e.seq() + " is not a JSON object; run `tend audit verify`", x);
        }
    }
}
