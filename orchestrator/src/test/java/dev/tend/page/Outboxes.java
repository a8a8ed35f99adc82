package dev.tend.page;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.playbooks.Paging;
import dev.tend.playbooks.TendConfig;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.store.LedgerEntry;
import dev.tend.store.LedgerFilter;
import dev.tend.store.PageRow;
import dev.tend.store.Store;

import java.io.UncheckedIOException;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.function.BooleanSupplier;

/** Helpers for outbox tests: pages put in a real store as the driver does, ledger reads, waiting. */
final class Outboxes {
    private static final ObjectMapper JSON = new ObjectMapper();

    private Outboxes() {
    }

    /** The paging of a tend.yaml text. */
    static Paging paging(String tendYaml) {
        TendConfig c = PlaybookLoader.parseConfig("tend.yaml", tendYaml);
        return c.paging();
    }

    /** Ledgers a page and puts it in the outbox in one transaction, as the driver does after the engine decided it. */
    static void enqueue(Store store, String id, String channel, String kind, String cluster, String message) {
        Instant at = Instant.now();
        Map<String, Object> f = new LinkedHashMap<>();
        f.put("id", id);
        f.put("channel", channel);
        f.put("at", at.toString());
        f.put("kind", kind);
        f.put("message", message);
        f.put("cluster", cluster);
        try {
            String payload = JSON.writeValueAsString(f);
            Map<String, Object> entry = new LinkedHashMap<>(f);
            entry.remove("at");
            entry.put("page_kind", entry.remove("kind"));
            store.useTransaction(tx -> {
                tx.appendLedger(at, "notification", entry);
                tx.enqueuePage(PageRow.pending(id, channel, at, payload));
            });
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new UncheckedIOException(e);
        }
    }

    static List<JsonNode> ledger(Store store, String kind) {
        List<JsonNode> out = new ArrayList<>();
        store.read(r -> {
            r.forEachLedger(LedgerFilter.all(), (LedgerEntry e) -> {
                if (e.kind().equals(kind)) {
                    try {
                        out.add(JSON.readTree(e.entry()));
                    } catch (com.fasterxml.jackson.core.JsonProcessingException x) {
                        throw new UncheckedIOException(x);
                    }
                }
            });
            return null;
        });
        return out;
    }

    static PageRow row(Store store, String id) {
        return store.read(r -> r.page(id)).orElseThrow();
    }

    static void await(String what, Duration limit, BooleanSupplier done) throws InterruptedException {
        long end = System.nanoTime() + limit.toNanos();
        while (!done.getAsBoolean()) {
            if (System.nanoTime() > end) throw new AssertionError("waited " + limit + " for " + what);
            Thread.sleep(20);
        }
    }
}
