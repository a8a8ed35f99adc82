package dev.tend.bench;

import dev.tend.engine.LedgerKind;
import dev.tend.store.LedgerDraft;
import dev.tend.store.Store;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Random;

/**
 * A SQLite store holding a ledger of N entries (invented: a 2,000-cluster Larkspur fleet, about
 * 100,000 entries per night), written through the store's own ledger writer
 * ({@code StoreTx.appendLedger}: RFC 8785 text, SHA-256 chain, head row), so that
 * {@code tend audit verify} passes on it. Building 10,000,000 entries takes minutes, so the
 * file is kept in a cache folder under a name that carries N and {@link #FORMAT}; raise
 * FORMAT when what is written changes, and the next run builds a new file.
 *
 * <p>What one hour holds (12,500 entries, one every 288 ms of processing time): transitions,
 * verdicts (mostly holds), receipts of transition requests, and runs that start, call
 * executors, and end about 4 minutes later; one run in 200 stops for a person and stays open;
 * the brake engages for an hour twice a week; loops are stopped and some cleared.
 */
final class LargeLedger {
    /** The layout of what {@link #build} writes; part of the cache file's name. */
    static final int FORMAT = 1;
    /** Processing time between two entries: 12,500 an hour, 100,000 in a night of 8 hours. */
    static final Duration STEP = Duration.ofMillis(288);
    static final Instant START = Instant.parse("2027-01-04T00:00:00Z");
    static final String[] PLAYBOOKS = {"replace-silent-node", "restart-stopped-process", "rebalance-replica-lag"};
    private static final String[] AREAS = {"fares", "dispatch", "routes", "tickets", "telemetry", "signals", "depots", "timetable"};
    private static final String[] SIGNALS = {"heartbeat", "process-down", "replica-lag", "disk-full", "cert-expiry"};
    private static final int CLUSTERS = 2000;
    private static final int BATCH = 20_000;

    private final Random random = new Random(20270104);
    private final ArrayDeque<Pending> pending = new ArrayDeque<>();
    private long runs;
    private long written;
    private Instant at = START;
    private boolean braked;

    /** A run's entry still to be written, at or after {@code due}. */
    private record Pending(Instant due, LedgerKind kind, Map<String, Object> fields) {
    }

    private LargeLedger() {
    }

    /** The cached store of {@code entries} entries in {@code cacheDir}, built first when it is missing. */
    static Path cached(Path cacheDir, long entries) throws IOException {
        Files.createDirectories(cacheDir);
        Path file = cacheDir.resolve(String.format(Locale.ROOT, "ledger-%d-format%d.db", entries, FORMAT));
        if (Files.exists(file)) {
            System.out.printf(Locale.ROOT, "ledger store: %s (cached; delete it to build again)%n", file);
            return file;
        }
        Path building = cacheDir.resolve(file.getFileName() + ".building");
        Files.deleteIfExists(building);
        Files.deleteIfExists(Path.of(building + "-wal"));
        Files.deleteIfExists(Path.of(building + "-shm"));
        long t0 = System.nanoTime();
        try (Store store = Store.openSqlite(building)) {
            new LargeLedger().build(store, entries);
        }
        Files.move(building, file, StandardCopyOption.ATOMIC_MOVE);
        System.out.printf(Locale.ROOT, "ledger store: built %,d entries in %.0f s: %s (%,d MB)%n", entries,
                (System.nanoTime() - t0) / 1e9, file, Files.size(file) >> 20);
        return file;
    }

    /** The end of the last whole night (06:00 UTC) in a ledger of {@code entries} entries. */
    static Instant lastNightEnd(long entries) {
        Instant last = START.plus(STEP.multipliedBy(entries));
        Instant six = last.truncatedTo(java.time.temporal.ChronoUnit.DAYS).plus(Duration.ofHours(6));
        return six.isAfter(last) ? six.minus(Duration.ofDays(1)) : six;
    }

    private void build(Store store, long entries) {
        List<LedgerDraft> batch = new ArrayList<>(BATCH);
        long report = Math.max(1, entries / 10);
        while (written < entries) {
            batch.add(next());
            written++;
            if (batch.size() == BATCH || written == entries) {
                List<LedgerDraft> drafts = List.copyOf(batch);
                store.useTransaction(tx -> tx.appendLedger(drafts));
                batch.clear();
            }
            if (written % report == 0) System.out.printf(Locale.ROOT, "  %,d entries written%n", written);
        }
    }

    private LedgerDraft next() {
        at = at.plus(STEP);
        Pending p = pending.peekFirst();
        if (p != null && !p.due().isAfter(at)) {
            pending.removeFirst();
            return LedgerDraft.of(at, p.kind().wire(), p.kind().check(p.fields()));
        }
        long hourOfWeek = Duration.between(START, at).toHours() % (24 * 7);
        boolean brakeHour = hourOfWeek == 27 || hourOfWeek == 99;
        if (brakeHour != braked) {
            braked = brakeHour;
            return braked ? draft(LedgerKind.BRAKE_ENGAGED, "by", "automation", "reason", "12% of the fleet unhealthy",
                    "unhealthy_clusters", 240, "manual", false)
                    : draft(LedgerKind.BRAKE_RELEASED, "by", "automation", "reason", "below 3% for 5m",
                    "engaged_since", at.minus(Duration.ofHours(1)).toString());
        }
        String cluster = cluster();
        String node = "n" + (1 + random.nextInt(4));
        String playbook = PLAYBOOKS[random.nextInt(PLAYBOOKS.length)];
        int roll = random.nextInt(1000);
        if (roll < 3 && !braked) return startRun(cluster, node, playbook);
        if (roll < 4) return draft(LedgerKind.LOOP_STOPPED, "playbook", playbook, "cluster", cluster, "node", node);
        if (roll < 5) return draft(LedgerKind.LOOP_CLEARED, "playbook", playbook, "cluster", cluster, "node", node, "by", "olga",
                "from", "127.0.0.1", "was_stopped", random.nextBoolean());
        if (roll < 330) return draft(LedgerKind.TRANSITION, "cluster", cluster, "node", node, "signal", signal(),
                "state", random.nextInt(3) == 0 ? "breach" : "clear", "at_event", at.minusMillis(random.nextInt(5000)).toString());
        if (roll < 480) return draft(LedgerKind.TRANSITIONS_RECEIVED, "by", "health-pipeline", "from", "127.0.0.1",
                "accepted", 1 + random.nextInt(100), "rejected", 0);
        if (roll < 510) return draft(LedgerKind.VERDICT, "playbook", playbook, "cluster", cluster, "node", node, "verdict", "deny",
                "reasons", List.of(random.nextBoolean() ? "excluded" : "masked"), "signal", signal());
        return draft(LedgerKind.VERDICT, "playbook", playbook, "cluster", cluster, "node", node, "verdict", "hold",
                "reasons", braked ? List.of("fleet-brake") : List.of(random.nextInt(4) == 0 ? "rate-limit" : "unconfirmed"),
                "signal", signal(), "hold_until", at.plus(Duration.ofMinutes(5)).toString());
    }

    /** A run's start now, and its later entries queued: a call, its result, the end (or a stop for a person). */
    private LedgerDraft startRun(String cluster, String node, String playbook) {
        String run = String.format(Locale.ROOT, "r%07d", ++runs);
        Map<String, Object> call = fields("run", run, "playbook", playbook, "cluster", cluster, "node", node, "step", "act",
                "attempt", 1, "key", run + "/act/1", "action", "restart-node", "executor", "simulated", "timeout", "PT10M");
        pending.addLast(new Pending(at.plusSeconds(5), LedgerKind.EXECUTOR_CALL, call));
        pending.addLast(new Pending(at.plusSeconds(120), LedgerKind.EXECUTOR_RESULT, fields("run", run, "playbook", playbook,
                "cluster", cluster, "step", "act", "attempt", 1, "success", true, "message", "done")));
        if (runs % 200 == 0) {
            pending.addLast(new Pending(at.plusSeconds(240), LedgerKind.RUN_NEEDS_HUMAN, fields("run", run, "playbook", playbook,
                    "cluster", cluster, "step", "check", "attempt", 1, "reason", "the outcome of the call is unknown")));
        } else {
            pending.addLast(new Pending(at.plusSeconds(240), LedgerKind.RUN_ENDED, fields("run", run, "playbook", playbook,
                    "cluster", cluster, "node", node, "state", runs % 7 == 0 ? "failed" : "succeeded", "outcome", "done")));
        }
        return draft(LedgerKind.RUN_STARTED, "run", run, "playbook", playbook, "version", 1, "cluster", cluster, "node", node);
    }

    private String cluster() {
        int i = random.nextInt(CLUSTERS);
        return AREAS[i % AREAS.length] + "-" + (i / AREAS.length + 1);
    }

    private String signal() {
        return SIGNALS[random.nextInt(SIGNALS.length)];
    }

    private LedgerDraft draft(LedgerKind kind, Object... kv) {
        return LedgerDraft.of(at, kind.wire(), kind.check(fields(kv)));
    }

    private static Map<String, Object> fields(Object... kv) {
        Map<String, Object> m = new LinkedHashMap<>();
        for (int i = 0; i < kv.length; i += 2) m.put((String) kv[i], kv[i + 1]);
        return m;
    }
}
