package dev.tend.serve;

import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.store.TimerRow;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.List;

import static dev.tend.serve.ServeFixture.OLGA;
import static dev.tend.serve.ServeFixture.VERA;
import static dev.tend.serve.ServeFixture.awaitTrue;
import static dev.tend.serve.ServeFixture.transition;
import static org.assertj.core.api.Assertions.assertThat;

/** Timers armed before a stop fire at their time after the next start on the same store. */
class ServeRestartTest {
    @TempDir
    Path dir;

    @RegisterExtension
    final ServeFixture serve = new ServeFixture().stepTimeout(Duration.ofSeconds(4)).approvalExpiry(Duration.ofSeconds(4));

    @Test
    void aStepTimeoutAndAnApprovalExpiryArmedBeforeAStopFireAtTheirTimeAfterTheNextStart() {
        serve.start(dir);
        serve.post("/api/v1/transitions", OLGA, transition("dispatch-1", "n2", "heartbeat", "silent"));
        serve.post("/api/v1/transitions", OLGA, transition("fares-3", "n2", "process-down", "breach"));
        String approvalRun = serve.awaitPendingApproval();
        List<TimerRow> armed = serve.store().read(r -> r.timers());
        TimerRow step = armed.stream().filter(t -> t.key().startsWith("step:")).findFirst().orElseThrow();
        TimerRow expiry = armed.stream().filter(t -> t.key().equals("approval:" + approvalRun)).findFirst().orElseThrow();
        String stepRun = step.key().split(":")[1];

        serve.stop();
        Instant restartedAt = Instant.now();
        assertThat(restartedAt).as("stopped before either timer was due").isBefore(step.due()).isBefore(expiry.due());
        serve.restart();

        assertThat(serve.server().recovery().timersArmed()).isGreaterThanOrEqualTo(2);
        awaitTrue("the step timed out and the approval lapsed", Duration.ofSeconds(10),
                () -> serve.run(stepRun).get("state").asText().equals("failed")
                        && serve.run(approvalRun).get("state").asText().equals("cancelled"));
        JsonNode timedOut = serve.get("/api/v1/ledger?kind=step-timed-out&run=" + stepRun, VERA).json().get("entries");
        JsonNode lapsed = serve.get("/api/v1/ledger?kind=approval-lapsed&run=" + approvalRun, VERA).json().get("entries");
        assertThat(timedOut).hasSize(1);
        assertThat(lapsed).hasSize(1);
        assertThat(Instant.parse(timedOut.get(0).get("at").asText())).isAfterOrEqualTo(step.due())
                .isBefore(step.due().plusSeconds(2));
        assertThat(Instant.parse(lapsed.get(0).get("at").asText())).isAfterOrEqualTo(expiry.due())
                .isBefore(expiry.due().plusSeconds(2));
        assertThat(serve.get("/api/v1/approvals?state=lapsed", VERA).json()).hasSize(1);
    }
}
