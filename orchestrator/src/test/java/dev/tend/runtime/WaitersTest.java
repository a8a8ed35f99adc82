package dev.tend.runtime;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalState;
import dev.tend.store.LedgerDraft;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;

import static org.assertj.core.api.Assertions.assertThat;

/** Inputs are told apart by identity: two alike are two callers, two receipts, two positions. */
class WaitersTest {
    static final Instant T = Instant.parse("2027-03-14T02:17:00Z");

    private static Input clear() {
        return new Input.Transition(HealthTransition.of(T, "fares-3", "n1", "disk-latency", SignalState.CLEAR));
    }

    private static LedgerDraft receipt(String by) {
        return new LedgerDraft(T, "transitions-received", Map.of("by", by, "from", "127.0.0.1", "accepted", 1, "rejected", 0));
    }

    @Test
    void twoEqualInputsAreAnsweredEachWithItsOwnEffectsAndReceipt() {
        Waiters w = new Waiters();
        Input first = clear(), second = clear();
        assertThat(first).isEqualTo(second);
        assertThat(w.hasReceipts()).isFalse();
        w.withReceipt(first, receipt("feed-a"));
        CompletableFuture<List<Effect>> a = w.await(first);
        w.withReceipt(second, receipt("feed-b"));
        CompletableFuture<List<Effect>> b = w.await(second);
        assertThat(w.hasReceipts()).isTrue();

        List<LedgerDraft> ledger = new ArrayList<>();
        Instant at = T.plusMillis(2);
        w.receiptInto(second, at, ledger);
        w.receiptInto(first, at, ledger);
        assertThat(ledger).extracting(d -> d.fields().get("by")).containsExactly("feed-b", "feed-a");
        assertThat(ledger).extracting(LedgerDraft::at).containsOnly(at);

        List<Effect> none = List.of();
        w.committed(List.of(second), List.of(none));
        assertThat(b).isCompletedWithValue(none);
        assertThat(a).isNotDone();
        w.failed(first, new IllegalStateException("refused"));
        assertThat(a).isCompletedExceptionally();
        assertThat(w.hasReceipts()).as("committed and refused inputs leave nothing behind").isFalse();
    }

    @Test
    void aStoppedDriverTellsEveryCallerStillWaitingAndKeepsNothing() {
        Waiters w = new Waiters();
        Input first = clear(), second = clear();
        w.withReceipt(first, receipt("feed-a"));
        CompletableFuture<List<Effect>> a = w.await(first);
        CompletableFuture<List<Effect>> b = w.await(second);
        w.failAll(new IllegalStateException("tend stopped"));
        assertThat(a).isCompletedExceptionally();
        assertThat(b).isCompletedExceptionally();
        assertThat(w.hasReceipts()).isFalse();
        assertThat(w.receiptOf(first)).as("a failed caller's receipt is not appended later").isNull();
    }

    @Test
    void aBatchReachesTheOffsetAfterTheLastEventOfEachPartition() {
        Waiters w = new Waiters();
        Input one = clear(), two = clear(), three = clear(), unread = clear();
        w.withPosition(one, new StreamPosition("larkspur-health", 0, 41));
        w.withPosition(two, new StreamPosition("larkspur-health", 0, 42));
        w.withPosition(three, new StreamPosition("larkspur-health", 3, 7));
        assertThat(w.position(unread)).isNull();
        assertThat(w.position(two)).isEqualTo(new StreamPosition("larkspur-health", 0, 42));
        assertThat(w.reached(List.of(one, two, three, unread))).containsOnly(
                Map.entry(new StreamPosition("larkspur-health", 0, 0), 43L),
                Map.entry(new StreamPosition("larkspur-health", 3, 0), 8L));

        w.committed(List.of(one, two, three, unread), List.of(List.of(), List.of(), List.of(), List.of()));
        assertThat(w.reached(List.of(one, two, three))).isEmpty();
        assertThat(w.position(one)).isNull();
    }

    @Test
    void onAnAnsweringExecutorACommittedBatchsCallersAreToldInOneTaskAndNeverOnTheCommittingThread() {
        Waiters w = new Waiters();
        List<Runnable> tasks = new ArrayList<>();
        w.answerOn(tasks::add);
        Input one = clear(), two = clear(), three = clear(), alone = clear();
        CompletableFuture<List<Effect>> a = w.await(one);
        CompletableFuture<List<Effect>> b = w.await(two);
        CompletableFuture<List<Effect>> c = w.await(alone);
        List<Effect> none = List.of();
        w.committed(List.of(one, three, two), List.of(none, none, none));
        assertThat(tasks).as("one task for the batch (three has no caller)").hasSize(1);
        assertThat(a).as("not told on the committing thread").isNotDone();
        assertThat(b).isNotDone();
        tasks.get(0).run();
        assertThat(a).isCompletedWithValue(none);
        assertThat(b).isCompletedWithValue(none);
        w.failAll(new IllegalStateException("tend stopped"));
        assertThat(c).isNotDone();
        assertThat(tasks).hasSize(2);
        tasks.get(1).run();
        assertThat(c).isCompletedExceptionally();
    }

    @Test
    void anAnsweringExecutorThatWasShutDownLeavesTheCommittingThreadToTellTheCallers() {
        Waiters w = new Waiters();
        java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newSingleThreadExecutor();
        pool.shutdown();
        w.answerOn(pool);
        Input one = clear();
        CompletableFuture<List<Effect>> a = w.await(one);
        w.failed(one, new IllegalStateException("refused"));
        assertThat(a).isCompletedExceptionally();
    }
}
