package dev.tend.serve;

import dev.tend.api.DriverUnavailableException;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicLong;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * The answers of events handed over without a waiting request thread keep the rules a waiting
 * thread applied: answered once committed, failed after the timeout or at once when the driver
 * is found stopped. Time is a hand-set nano clock; {@link PendingAnswers#sweep} is called here
 * instead of every 200 ms.
 */
class PendingAnswersTest {
    private final AtomicLong nanos = new AtomicLong(1_000);
    private final AtomicBoolean running = new AtomicBoolean(true);
    /** What the sweep hands over to tell the callers; run by the test when it says so. */
    private final List<Runnable> told = new java.util.ArrayList<>();
    private final PendingAnswers answers = new PendingAnswers(running::get, Duration.ofSeconds(30), nanos::get, told::add);

    /** A sweep, and what it handed over run. */
    private void sweep() {
        answers.sweep();
        told.forEach(Runnable::run);
        told.clear();
    }

    @Test
    void anAnswerCompletesWhenItsEventsAreCommittedAndIsThenForgotten() {
        CompletableFuture<List<String>> commit = new CompletableFuture<>();
        CompletableFuture<Void> answer = answers.track(commit, 3);
        assertThat(answer).isNotDone();
        commit.complete(List.of());
        assertThat(answer).isCompleted();
        sweep();
        assertThat(answers.size()).isZero();
    }

    @Test
    void anAnswerWhoseCommitDoesNotComeWithinTheTimeoutFailsSayingItMayStillBeApplied() {
        CompletableFuture<Void> first = answers.track(new CompletableFuture<>(), 1);
        nanos.addAndGet(Duration.ofSeconds(10).toNanos());
        CompletableFuture<Void> second = answers.track(new CompletableFuture<>(), 2);
        nanos.addAndGet(Duration.ofSeconds(20).toNanos() + 1); // 30 s and 1 ns after the first, 20 s after the second
        sweep();
        assertThatThrownBy(first::join).isInstanceOf(CompletionException.class)
                .cause().isInstanceOf(DriverUnavailableException.class)
                .hasMessageContaining("did not commit 1 event(s) within 30s")
                .hasMessageContaining("it may still apply it: look in the ledger");
        assertThat(second).isNotDone();
        assertThat(answers.size()).isEqualTo(1);
    }

    @Test
    void everyAnswerFailsAtOnceWhenTheDriverIsFoundStopped() {
        CompletableFuture<Void> a = answers.track(new CompletableFuture<>(), 1);
        CompletableFuture<Void> b = answers.track(new CompletableFuture<>(), 4);
        running.set(false);
        answers.sweep();
        assertThat(a).as("told on the answering executor, not by the sweep itself").isNotDone();
        told.forEach(Runnable::run);
        for (CompletableFuture<Void> f : List.of(a, b)) {
            assertThatThrownBy(f::join).cause().isInstanceOf(DriverUnavailableException.class)
                    .hasMessageContaining("stopped before committing");
        }
        assertThat(answers.size()).isZero();
    }

    @Test
    void aRefusedInputIsAnsweredAsRefusedAndAnyOtherFailureAsUnavailableNamingTheEvents() {
        InvalidInputException refused = new InvalidInputException(Problem.at("request", 1, 1, "cluster", "not in the fleet"));
        CompletableFuture<List<String>> one = new CompletableFuture<>();
        CompletableFuture<List<String>> two = new CompletableFuture<>();
        CompletableFuture<Void> a = answers.track(one, 1);
        CompletableFuture<Void> b = answers.track(two, 5);
        one.completeExceptionally(refused);
        two.completeExceptionally(new IllegalStateException("disk full"));
        assertThatThrownBy(a::join).cause().isSameAs(refused);
        assertThatThrownBy(b::join).cause().isInstanceOf(DriverUnavailableException.class)
                .hasMessage("the orchestrator could not commit 5 event(s): disk full");
    }

    @Test
    void anAnswerWhoseEventsWereCommittedBeforeItWasTrackedIsNotKept() {
        CompletableFuture<Void> answer = answers.track(CompletableFuture.completedFuture(List.of()), 1);
        assertThat(answer).isCompleted();
        assertThat(answers.size()).isZero();
    }
}
