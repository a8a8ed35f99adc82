package dev.tend.runtime;

import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.TimeUnit;

import static org.assertj.core.api.Assertions.assertThat;

/** Quartz timers in wall time, with due times a few hundred milliseconds away. */
class QuartzTimersTest {
    record Fired(String key, Instant at) {
    }

    private final BlockingQueue<Fired> fired = new LinkedBlockingQueue<>();
    private final QuartzTimers timers = new QuartzTimers(key -> fired.add(new Fired(key, Instant.now())));

    @AfterEach
    void close() {
        timers.close();
    }

    @Test
    void firesAtItsDueTimeNotBefore() throws Exception {
        Instant due = Instant.now().plusMillis(400);
        timers.arm("step:r000001:drain:1", due);

        Fired f = fired.poll(5, TimeUnit.SECONDS);

        assertThat(f).isNotNull();
        assertThat(f.key()).isEqualTo("step:r000001:drain:1");
        assertThat(f.at()).isAfterOrEqualTo(due).isBefore(due.plusMillis(1500));
        assertThat(armedAfterCleanup()).isZero();
    }

    /** Quartz drops a fired job just after it ran, on its own thread: wait for that, boundedly. */
    private int armedAfterCleanup() throws InterruptedException {
        for (int i = 0; i < 100 && timers.armedCount() > 0; i++) Thread.sleep(10);
        return timers.armedCount();
    }

    @Test
    void firesAtOnceWhenItsTimeHasPassed() throws Exception {
        timers.arm("approval:r000002", Instant.now().minusSeconds(3600));

        assertThat(fired.poll(5, TimeUnit.SECONDS)).extracting(Fired::key).isEqualTo("approval:r000002");
    }

    @Test
    void armingTheSameKeyAgainMovesIt() throws Exception {
        timers.arm("recheck:p/fares-3/n2", Instant.now().plusSeconds(30));
        Instant sooner = Instant.now().plusMillis(200);
        timers.arm("recheck:p/fares-3/n2", sooner);

        Fired f = fired.poll(5, TimeUnit.SECONDS);
        assertThat(f).isNotNull();
        assertThat(f.at()).isAfterOrEqualTo(sooner);
        assertThat(armedAfterCleanup()).as("the key was moved, not armed twice").isZero();
    }

    @Test
    void aCancelledTimerDoesNotFire() throws Exception {
        timers.arm("wait:r000003:settle", Instant.now().plusMillis(300));
        timers.arm("wait:r000004:settle", Instant.now().plusMillis(600));
        timers.cancel("wait:r000003:settle");

        Fired f = fired.poll(5, TimeUnit.SECONDS);
        assertThat(f).extracting(Fired::key).isEqualTo("wait:r000004:settle");
        assertThat(fired).isEmpty();
    }
}
