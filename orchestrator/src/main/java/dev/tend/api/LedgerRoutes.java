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
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.List;

/**
 * {@code GET /api/v1/ledger}: the filters of {@code tend audit} (since, until as RFC 3339;
 * cluster, playbook, kind, run) and limit (default 500, at most 10000). Answers the newest
 * {@code limit} matching entries, oldest first, each the entry's fields plus its hash:
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
        ctx.json(store.read(rd -> {
            ArrayDeque<LedgerEntry> newest = new ArrayDeque<>(Math.min(limit, 1024));
            boolean[] truncated = {false};
            rd.forEachLedger(f, e -> {
                if (newest.size() == limit) {
                    newest.removeFirst();
                    truncated[0] = true;
                }
                newest.addLast(e);
            });
            List<ObjectNode> entries = new ArrayList<>(newest.size());
            for (LedgerEntry e : newest) entries.add(node(e));
            LedgerEntry head = rd.ledgerHead().orElse(null);
            return new LedgerPage(entries, truncated[0], head == null ? 0 : head.seq(),
                    head == null ? LedgerEntry.GENESIS_HASH : head.hash());
        }));
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
