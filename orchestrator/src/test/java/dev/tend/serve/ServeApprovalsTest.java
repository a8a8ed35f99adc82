package dev.tend.serve;

import com.fasterxml.jackson.databind.JsonNode;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;

import static dev.tend.serve.ServeFixture.ANNA;
import static dev.tend.serve.ServeFixture.AUTOMATION;
import static dev.tend.serve.ServeFixture.OLGA;
import static dev.tend.serve.ServeFixture.VERA;
import static dev.tend.serve.ServeFixture.awaitTrue;
import static dev.tend.serve.ServeFixture.transition;
import static org.assertj.core.api.Assertions.assertThat;

/** Approvals through the HTTP API of a real server: expiry, the two-person rule, guards checked again. */
class ServeApprovalsTest {
    @TempDir
    Path dir;

    @RegisterExtension
    final ServeFixture serve = new ServeFixture();

    private String requestApproval() {
        ServeFixture.Response r = serve.post("/api/v1/transitions", OLGA, transition("fares-3", "n2", "process-down", "breach"));
        assertThat(r.status()).as(r.text()).isEqualTo(200);
        return serve.awaitPendingApproval();
    }

    @Test
    void approvedRunStartsAndTheLedgerNamesTheApproverAndTheirAddress() {
        serve.start(dir);
        String run = requestApproval();
        assertThat(serve.run(run).get("state").asText()).isEqualTo("awaiting-approval");

        ServeFixture.Response r = serve.post("/api/v1/approvals/" + run + "/approve", ANNA, "");

        assertThat(r.status()).as(r.text()).isEqualTo(200);
        assertThat(r.json().at("/approval/state").asText()).isEqualTo("approved");
        assertThat(r.json().at("/approval/decided_by").asText()).isEqualTo("anna");
        assertThat(r.json().get("verdict").asText()).isEqualTo("start");
        awaitTrue("the approved run succeeded", Duration.ofSeconds(10),
                () -> serve.run(run).get("state").asText().equals("succeeded"));
        JsonNode granted = serve.get("/api/v1/ledger?kind=approval-granted&run=" + run, VERA).json().get("entries");
        assertThat(granted).hasSize(1);
        assertThat(granted.get(0).get("by").asText()).isEqualTo("anna");
        assertThat(granted.get(0).get("from").asText()).isEqualTo("127.0.0.1");
    }

    @Test
    void whoeverRequestedARunCannotApproveIt() {
        serve.start(dir);
        String run = requestApproval();
        // the engine requests runs as "automation"; a token of that name stands for the requester

        ServeFixture.Response r = serve.post("/api/v1/approvals/" + run + "/approve", AUTOMATION, "");

        assertThat(r.status()).as(r.text()).isEqualTo(409);
        assertThat(r.json().get("error").asText()).isEqualTo("refused");
        assertThat(r.json().get("message").asText()).isEqualTo("two-person rule: whoever requested a run cannot approve it");
        assertThat(serve.run(run).get("state").asText()).isEqualTo("awaiting-approval");
        JsonNode refused = serve.get("/api/v1/ledger?kind=approval-refused&run=" + run, VERA).json().get("entries");
        assertThat(refused).hasSize(1);
        assertThat(refused.get(0).get("by").asText()).isEqualTo("automation");
    }

    @Test
    void anApprovalLapsesAtItsExpiryAndTheRunIsCancelled() {
        serve.approvalExpiry(Duration.ofSeconds(2)).start(dir);
        String run = requestApproval();
        Instant expiresAt = Instant.parse(serve.get("/api/v1/approvals", VERA).json().get(0).get("expires_at").asText());

        awaitTrue("the approval lapsed", Duration.ofSeconds(8),
                () -> serve.get("/api/v1/approvals?state=lapsed", VERA).json().size() == 1);

        assertThat(serve.run(run).get("state").asText()).isEqualTo("cancelled");
        JsonNode lapsed = serve.get("/api/v1/ledger?kind=approval-lapsed&run=" + run, VERA).json().get("entries");
        assertThat(lapsed).hasSize(1);
        assertThat(Instant.parse(lapsed.get(0).get("at").asText())).isAfterOrEqualTo(expiresAt);
        ServeFixture.Response late = serve.post("/api/v1/approvals/" + run + "/approve", ANNA, "");
        assertThat(late.status()).isEqualTo(409);
        assertThat(late.json().get("message").asText()).startsWith("the approval lapsed at ")
                .endsWith(" (it expired at " + expiresAt.truncatedTo(java.time.temporal.ChronoUnit.SECONDS) + ")");
    }

    @Test
    void anApprovalNeverOverridesTheFleetBrakeTheRunStartsOnceItIsReleased() {
        serve.start(dir);
        String run = requestApproval();
        ServeFixture.Response engaged = serve.post("/api/v1/brake/engage", OLGA, "{\"reason\":\"city-wide network event\"}");
        assertThat(engaged.status()).as(engaged.text()).isEqualTo(200);
        assertThat(engaged.json().get("engaged").asBoolean()).isTrue();
        assertThat(engaged.json().get("by").asText()).isEqualTo("olga");

        ServeFixture.Response r = serve.post("/api/v1/approvals/" + run + "/approve", ANNA, "");

        assertThat(r.status()).as(r.text()).isEqualTo(200);
        assertThat(r.json().get("verdict").asText()).isEqualTo("hold");
        assertThat(r.json().get("reasons")).extracting(JsonNode::asText).contains("fleet-brake");
        assertThat(r.json().at("/run/state").asText()).isEqualTo("held");
        assertThat(serve.run(run).get("started_at").isNull()).isTrue();

        ServeFixture.Response released = serve.post("/api/v1/brake/release", OLGA, "{\"reason\":\"network back\"}");
        assertThat(released.status()).as(released.text()).isEqualTo(200);
        awaitTrue("the held run succeeded after the release", Duration.ofSeconds(10),
                () -> serve.run(run).get("state").asText().equals("succeeded"));
    }

    @Test
    void aRejectedRunIsCancelledWithTheReason() {
        serve.start(dir);
        String run = requestApproval();

        ServeFixture.Response noReason = serve.post("/api/v1/approvals/" + run + "/reject", ANNA, "{}");
        ServeFixture.Response r = serve.post("/api/v1/approvals/" + run + "/reject", ANNA,
                "{\"reason\":\"payments freeze agreed with the fares team\"}");

        assertThat(noReason.status()).isEqualTo(400);
        assertThat(noReason.json().get("message").asText()).isEqualTo("reason is required");
        assertThat(r.status()).as(r.text()).isEqualTo(200);
        assertThat(r.json().at("/approval/state").asText()).isEqualTo("rejected");
        assertThat(r.json().at("/run/state").asText()).isEqualTo("cancelled");
        assertThat(r.json().at("/run/outcome").asText()).isEqualTo("rejected by anna: payments freeze agreed with the fares team");
    }

    @Test
    void approvingARunWithoutAnApprovalIsNotFound() {
        serve.start(dir);

        ServeFixture.Response r = serve.post("/api/v1/approvals/r999999/approve", ANNA, "");

        assertThat(r.status()).isEqualTo(404);
        assertThat(r.json().get("message").asText()).isEqualTo("no approval was requested for run r999999");
    }
}
