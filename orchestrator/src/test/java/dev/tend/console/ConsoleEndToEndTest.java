package dev.tend.console;

import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.api.ApiJson;
import dev.tend.engine.LedgerKind;
import dev.tend.shared.ReasonCode;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.openqa.selenium.By;
import org.openqa.selenium.JavascriptExecutor;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.support.ui.ExpectedConditions;
import org.openqa.selenium.support.ui.WebDriverWait;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Arrays;
import java.util.List;

import static dev.tend.console.ConsoleServer.ANNA;
import static dev.tend.console.ConsoleServer.VERA;
import static org.assertj.core.api.Assertions.assertThat;

/**
 * The web console end to end in a real headless Chromium against a real server: a
 * critical-tier node of the Larkspur fleet (invented) goes silent, the run waits for an
 * approval; a viewer sees it but gets no approve button, and the server refuses the viewer's
 * forged approval; the fleet page lists the approval's page, which its channel does not take;
 * an approver approves it on the page and sees the run start.
 */
class ConsoleEndToEndTest {
    private static final Duration WAIT = Duration.ofSeconds(20);

    @TempDir
    Path dir;

    @Test
    void anApproverApprovesAPendingRunOnThePageAndItStartsWhileAViewerCanNeither() {
        try (ConsoleServer server = ConsoleServer.start(dir)) {
            try (HeadlessChromium chromium = HeadlessChromium.start(dir)) {
                walkThrough(server, chromium);
            } catch (AssertionError | RuntimeException e) {
                throw new AssertionError(e.getMessage() + "\n---- tend serve log ----\n" + server.log(), e);
            }
        }
    }

    private void walkThrough(ConsoleServer server, HeadlessChromium chromium) {
        WebDriver d = chromium.driver();
        WebDriverWait wait = new WebDriverWait(d, WAIT);
        // fares-3 is tier critical in playbooks/library/fleet.yaml: replace-silent-node asks a person first
        server.silentSinceTenMinutes("fares-3", "n2");
        String run = awaitPendingRun(server);

        signIn(d, wait, server.url(), VERA);
        d.get(server.url() + "/#approvals");
        WebElement card = wait.until(ExpectedConditions.presenceOfElementLocated(By.cssSelector("article.approval[data-run='" + run + "']")));
        assertThat(card.getText()).contains("fares-3/n2", "replace-silent-node", "approval-required");
        // the code's meaning is the server's (GET /api/v1/vocabulary), not a copy kept in the page
        assertThat(card.getText()).contains(ReasonCode.APPROVAL_REQUIRED.meaning());
        assertThat(d.findElements(By.cssSelector("button[data-action='approve']"))).isEmpty();
        assertThat(d.findElements(By.cssSelector("button[data-action='reject']"))).isEmpty();
        assertThat(card.getText()).contains("Deciding needs the approver role.");

        // what a viewer could try from the browser's own console: the server, not the page, refuses it
        Object forged = ((JavascriptExecutor) d).executeAsyncScript(
                "const done = arguments[arguments.length - 1];"
                        + "fetch('api/v1/approvals/' + arguments[0] + '/approve', {method: 'POST',"
                        + " headers: {'Authorization': 'Bearer ' + arguments[1], 'Content-Type': 'application/json'}, body: '{}'})"
                        + ".then(r => r.json().then(b => done(r.status + ' ' + b.error + ' ' + b.role_needed)))"
                        + ".catch(e => done('failed ' + e));", run, VERA);
        assertThat(forged).isEqualTo("403 forbidden approver");
        assertThat(json(server.get("/api/v1/runs/" + run, VERA)).get("state").asText()).isEqualTo("awaiting-approval");

        d.findElement(By.id("sign-out")).click();
        signIn(d, wait, server.url(), ANNA);
        WebElement unhealthy = wait.until(ExpectedConditions.presenceOfElementLocated(By.cssSelector("tr[data-cluster='fares-3']")));
        assertThat(unhealthy.getText()).contains("fares-3/n2", "heartbeat", "silent");
        assertThat(d.findElement(By.cssSelector("#brake .brake-state")).getText()).isEqualTo("released");
        assertThat(d.findElements(By.id("brake-engage"))).hasSize(1);
        // the approval request paged oncall, whose command never succeeds: the fleet page lists it as not delivered
        WebElement page = wait.until(ExpectedConditions.presenceOfElementLocated(By.cssSelector("#pages tr[data-page='" + run + "/approval']")));
        assertThat(page.getText()).contains("approval-requested", "oncall", "pending", "attempt");
        assertThat(d.findElement(By.cssSelector("#pages .pages-state")).getText()).isEqualTo("1 not delivered");
        chromium.screenshot("fleet");
        d.get(server.url() + "/#approvals");
        WebElement approve = wait.until(ExpectedConditions.elementToBeClickable(
                By.cssSelector("button[data-action='approve'][data-run='" + run + "']")));
        chromium.screenshot("approvals");
        approve.click();
        wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("notice"), "Approved " + run));

        d.get(server.url() + "/#runs");
        WebElement started = wait.until(ExpectedConditions.presenceOfElementLocated(By.cssSelector(
                "[data-run='" + run + "'][data-state='running'], [data-run='" + run + "'][data-state='succeeded']")));
        assertThat(started.getAttribute("data-state")).isIn("running", "succeeded");
        chromium.screenshot("runs");
        JsonNode approval = json(server.get("/api/v1/approvals?state=all", VERA)).get(0);
        assertThat(approval.get("decided_by").asText()).isEqualTo("anna");

        d.get(server.url() + "/#ledger");
        wait.until(ExpectedConditions.presenceOfElementLocated(By.cssSelector("#timeline li[data-kind='approval-granted']")));
        // the kind filter offers every kind the server writes, from the server's own list
        List<String> offered = d.findElements(By.cssSelector("#filter-kind option")).stream()
                .map(o -> o.getAttribute("value")).filter(v -> !v.isEmpty()).toList();
        assertThat(offered).containsExactlyElementsOf(Arrays.stream(LedgerKind.values()).map(LedgerKind::wire).toList());
        chromium.screenshot("ledger");
        d.get(server.url() + "/#handover");
        WebElement ledgerStatus = wait.until(ExpectedConditions.presenceOfElementLocated(By.id("ledger-status")));
        assertThat(ledgerStatus.getText()).contains("verified");
        chromium.screenshot("handover");
    }

    private static void signIn(WebDriver d, WebDriverWait wait, String url, String token) {
        d.get(url + "/");
        WebElement field = wait.until(ExpectedConditions.visibilityOfElementLocated(By.id("token")));
        field.sendKeys(token);
        d.findElement(By.id("login-button")).click();
        wait.until(ExpectedConditions.visibilityOfElementLocated(By.id("app")));
    }

    /** The run of the one pending approval, once the engine asked for it (polling the server's state, not time). */
    private static String awaitPendingRun(ConsoleServer server) {
        long deadline = System.nanoTime() + WAIT.toNanos();
        while (System.nanoTime() < deadline) {
            JsonNode pending = json(server.get("/api/v1/approvals", VERA));
            if (pending.size() > 0) return pending.get(0).get("run").asText();
            try {
                Thread.sleep(50);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new AssertionError(e);
            }
        }
        throw new AssertionError("no approval was requested within " + WAIT + "; runs: " + server.get("/api/v1/runs", VERA).body());
    }

    private static JsonNode json(ConsoleServer.Response r) {
        if (r.status() != 200) throw new AssertionError("the server answered " + r);
        try {
            return ApiJson.MAPPER.readTree(r.body());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

}
