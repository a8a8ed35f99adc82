package dev.tend.console;

import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.api.ApiJson;
import dev.tend.cli.TendMain;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.openqa.selenium.By;
import org.openqa.selenium.Dimension;
import org.openqa.selenium.JavascriptExecutor;
import org.openqa.selenium.Rectangle;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.support.ui.ExpectedConditions;
import org.openqa.selenium.support.ui.Select;
import org.openqa.selenium.support.ui.WebDriverWait;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.function.Supplier;

import static dev.tend.console.ConsoleServer.ANNA;
import static dev.tend.console.ConsoleServer.VERA;
import static org.assertj.core.api.Assertions.assertThat;

/**
 * What the console's pages and the HTML reports say, read in a real headless Chromium against
 * a real server whose time runs 30 times faster than the wall clock (as in {@code tend demo}):
 * a critical node of the Larkspur fleet (invented) waits for an approval, a standard one is
 * being replaced when an operator engages the brake by hand. Each page is checked for the
 * words and numbers an on-call person reads: zone cards with the zone's own count, one word
 * for unhealthy clusters, event time explained, accelerated time labelled, a paused run that
 * says the brake paused it, "running" in a colour of its own, each reason of an approval once,
 * a handover banner that names what is true, a timeline zoomed to where activity is with bars
 * one can point at, an HTML handover legend whose entries do not overlap, and replay report
 * times that never break across lines.
 */
class ConsoleWordingTest {
    private static final Duration WAIT = Duration.ofSeconds(30);

    @TempDir
    Path dir;

    @Test
    void everyPageSaysWhatIsTrueInWordsAnOnCallPersonCanActOn() throws Exception {
        try (ConsoleServer server = ConsoleServer.accelerated(dir, 30)) {
            try (HeadlessChromium chromium = HeadlessChromium.start(dir)) {
                look(server, chromium);
            } catch (AssertionError | RuntimeException e) {
                throw new AssertionError(e.getMessage() + "\n---- tend serve log ----\n" + server.log(), e);
            }
        }
    }

    private void look(ConsoleServer server, HeadlessChromium chromium) throws Exception {
        WebDriver d = chromium.driver();
        WebDriverWait wait = new WebDriverWait(d, WAIT);
        // fares-3 is critical (its replacement asks a person), fares-17 standard (playbooks/library/fleet.yaml)
        server.silentSinceTenMinutes("fares-3", "n2");
        String pending = await("an approval is requested", () -> {
            JsonNode a = json(server.get("/api/v1/approvals", VERA));
            return a.size() > 0 ? a.get(0).get("run").asText() : null;
        });
        server.silentSinceTenMinutes("fares-17", "n1");
        String replacing = await("the replacement of fares-17/n1 runs", () -> {
            for (JsonNode r : json(server.get("/api/v1/runs?cluster=fares-17", VERA))) {
                if (r.get("state").asText().equals("running")) return r.get("run").asText();
            }
            return null;
        });
        ConsoleServer.Response engaged = server.post("/api/v1/brake/engage", ANNA, "{\"reason\":\"drill\"}");
        assertThat(engaged.status()).as(engaged.body()).isEqualTo(200);
        await("the run pauses at its next step boundary", () ->
                json(server.get("/api/v1/runs/" + replacing, VERA)).get("state").asText().equals("paused") ? "paused" : null);

        signIn(d, wait, server.url(), ANNA);
        fleet(d, wait, server);
        chromium.screenshot("wording-fleet");

        d.get(server.url() + "/#approvals");
        WebElement card = wait.until(ExpectedConditions.presenceOfElementLocated(By.cssSelector("article.approval[data-run='" + pending + "']")));
        wait.until(ExpectedConditions.presenceOfNestedElementLocatedBy(card, By.cssSelector("li[data-reason]")));
        assertThat(occurrences(card.getText(), "approval-required")).as("the reason is listed once: " + card.getText()).isEqualTo(1);
        assertThat(card.findElements(By.cssSelector("li[data-reason]"))).hasSize(1);
        chromium.screenshot("wording-approvals");

        d.get(server.url() + "/#runs");
        WebElement paused = wait.until(ExpectedConditions.presenceOfElementLocated(By.cssSelector("article.run[data-run='" + replacing + "']")));
        assertThat(paused.getText()).contains("Paused by the fleet brake");
        Object colours = ((JavascriptExecutor) d).executeAsyncScript(
                "const done = arguments[arguments.length - 1];"
                        + "import('./js/dom.js').then(m => { const bg = (s) => { const p = m.pill(s); document.body.append(p);"
                        + " const c = getComputedStyle(p).backgroundColor; p.remove(); return c; };"
                        + " done([m.tone('running'), bg('running'), bg('impaired'), bg('paused')].join('|')); })"
                        + ".catch(e => done('failed ' + e));");
        String[] c = String.valueOf(colours).split("\\|");
        assertThat(c).as(String.valueOf(colours)).hasSize(4);
        assertThat(c[0]).isEqualTo("active");
        assertThat(c[1]).as("running is not the amber of impaired or paused").isNotEqualTo(c[2]).isNotEqualTo(c[3]);
        chromium.screenshot("wording-runs");

        // with the approval settled, the only thing that waits is the brake engaged by hand
        ConsoleServer.Response rejected = server.post("/api/v1/approvals/" + pending + "/reject", ANNA, "{\"reason\":\"not tonight\"}");
        assertThat(rejected.status()).as(rejected.body()).isEqualTo(200);
        handover(d, wait, server, replacing);
        chromium.screenshot("wording-handover");

        abortWithAReason(d, wait, server, replacing);
        chromium.screenshot("wording-abort");

        handoverPage(d, server);
        chromium.screenshot("wording-handover-html");
        replayPage(d);
        chromium.screenshot("wording-replay-html");
    }

    private static void fleet(WebDriver d, WebDriverWait wait, ConsoleServer server) {
        wait.until(ExpectedConditions.presenceOfElementLocated(By.cssSelector("tr[data-cluster='fares-3']")));
        JsonNode h = json(server.get("/api/v1/health", VERA));
        List<WebElement> zones = d.findElements(By.cssSelector("section.zone"));
        assertThat(zones).hasSize(h.get("zones").size());
        for (int i = 0; i < zones.size(); i++) {
            JsonNode z = h.get("zones").get(i);
            WebElement card = d.findElement(By.cssSelector("section.zone[data-zone='" + z.get("zone").asText() + "']"));
            assertThat(card.findElement(By.cssSelector(".zone-nodes")).getText()).isEqualTo(z.get("nodes").asInt() + " nodes");
            assertThat(card.findElement(By.cssSelector(".card-head")).getText()).as("not the fleet's total in the heading")
                    .doesNotContain(h.get("clusters").asInt() + " clusters");
        }
        String page = d.findElement(By.id("page")).getText();
        // one word for a cluster with a signal in breach or silent: the API's "unhealthy"
        assertThat(page).contains("unhealthy clusters (").doesNotContainIgnoringCase("impaired");
        assertThat(d.findElement(By.cssSelector("tr[data-cluster='fares-3']")).getText()).contains("unhealthy", "within tolerance");
        assertThat(page).contains("event time (newest transition)").contains("behind server time");
        assertThat(d.findElement(By.id("server-time")).getText()).startsWith("demo time ");
        WebElement scale = d.findElement(By.id("time-scale"));
        assertThat(scale.isDisplayed()).isTrue();
        assertThat(scale.getText()).isEqualTo("accelerated 30× the wall clock");
        assertThat(d.findElement(By.id("brake")).getText()).contains("by hand", "drill",
                "Runs already under way pause at their next step boundary");
    }

    private static void handover(WebDriver d, WebDriverWait wait, ConsoleServer server, String run) {
        d.get(server.url() + "/#handover");
        WebElement banner = wait.until(ExpectedConditions.presenceOfElementLocated(By.id("handover-banner")));
        assertThat(banner.getText()).startsWith("Needs attention: the fleet brake is engaged by hand, by anna (drill)")
                .doesNotContain("waits for a person").doesNotContain("approval");
        WebElement chart = d.findElement(By.id("handover-timeline"));
        Duration shown = Duration.between(Instant.parse(chart.getAttribute("data-from")), Instant.parse(chart.getAttribute("data-to")));
        assertThat(shown).as("zoomed to where activity is, not the 12 hours asked for").isLessThan(Duration.ofHours(1));
        List<WebElement> bars = chart.findElements(By.cssSelector(".bar"));
        assertThat(bars).isNotEmpty();
        for (WebElement bar : bars) {
            assertThat(bar.getRect().getWidth()).as("every bar can be pointed at").isGreaterThanOrEqualTo(6);
            assertThat(bar.getAttribute("title")).as("its label on hover").isNotBlank();
        }
        assertThat(chart.findElement(By.cssSelector(".bar[data-run='" + run + "']")).getAttribute("title"))
                .contains(run, "replace-silent-node", "fares-17/n1", "paused");
        new Select(d.findElement(By.id("timeline-span"))).selectByValue("period");
        WebElement whole = wait.until(ExpectedConditions.presenceOfElementLocated(By.id("handover-timeline")));
        Duration all = Duration.between(Instant.parse(whole.getAttribute("data-from")), Instant.parse(whole.getAttribute("data-to")));
        assertThat(all).as("the whole period once picked").isGreaterThanOrEqualTo(Duration.ofHours(11));
    }

    /** The runs page's Abort asks for a reason, and the reason typed is the one the ledger keeps. */
    private static void abortWithAReason(WebDriver d, WebDriverWait wait, ConsoleServer server, String run) {
        d.get(server.url() + "/#runs");
        wait.until(ExpectedConditions.elementToBeClickable(By.cssSelector("button[data-action='abort'][data-run='" + run + "']"))).click();
        org.openqa.selenium.Alert ask = wait.until(ExpectedConditions.alertIsPresent());
        assertThat(ask.getText()).contains("Abort " + run, "Say why");
        ask.sendKeys("owner is replacing the node by hand");
        ask.accept();
        wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("notice"), "Aborted " + run));
        JsonNode aborted = json(server.get("/api/v1/ledger?run=" + run + "&kind=run-ended", VERA)).get("entries").get(0);
        assertThat(aborted.toString()).contains("owner is replacing the node by hand").contains("anna");
    }

    /** The printable handover page: its legend entries sit side by side without overlapping. */
    private void handoverPage(WebDriver d, ConsoleServer server) throws IOException {
        Instant now = Instant.parse(json(server.get("/api/v1/health", VERA)).get("at").asText());
        ConsoleServer.Response html = server.get("/api/v1/handover?format=html&since=" + now.minus(Duration.ofHours(12)), VERA);
        assertThat(html.status()).as(html.body()).isEqualTo(200);
        Path file = dir.resolve("handover.html");
        Files.writeString(file, html.body());
        d.get(file.toUri().toString());
        List<WebElement> items = d.findElements(By.cssSelector("ul.legend li"));
        assertThat(items).hasSizeGreaterThan(8);
        for (int i = 0; i < items.size(); i++) {
            for (int j = i + 1; j < items.size(); j++) {
                assertThat(overlap(items.get(i).getRect(), items.get(j).getRect()))
                        .as("legend '%s' and '%s' overlap", items.get(i).getText(), items.get(j).getText()).isFalse();
            }
        }
        assertThat(d.findElement(By.tagName("body")).getText()).contains("Zoomed to where activity is");
    }

    /** A replay report in a narrow window: no time wraps inside itself, and no zero is coloured as success. */
    private void replayPage(WebDriver d) throws IOException {
        Path root = ConsoleServer.library().getParent().getParent();
        Path out = dir.resolve("replay.html");
        StringWriter err = new StringWriter();
        int code = TendMain.run(new String[]{"replay", root.resolve("simulator/recordings/zone-outage.jsonl").toString(),
                "--playbooks", ConsoleServer.library().toString(), "--fleet", ConsoleServer.library().resolve("fleet.yaml").toString(),
                "--format", "html", "--out", out.toString()}, new PrintWriter(new StringWriter(), true), new PrintWriter(err, true));
        assertThat(code).as(err.toString()).isZero();
        d.manage().window().setSize(new Dimension(480, 900));
        d.get(out.toUri().toString());
        List<WebElement> times = d.findElements(By.cssSelector("span.t"));
        assertThat(times).hasSizeGreaterThan(3);
        Object broken = ((JavascriptExecutor) d).executeScript(
                "return [...document.querySelectorAll('span.t')].filter(s => s.getClientRects().length !== 1).map(s => s.textContent);");
        assertThat((List<?>) broken).as("times broken across lines").isEmpty();
        WebElement succeeded = d.findElement(By.xpath("//div[@class='tile'][span='succeeded']/b"));
        assertThat(succeeded.getText()).isEqualTo("0");
        assertThat(succeeded.getCssValue("color")).as("0 succeeded is not green").isNotEqualTo("rgba(47, 125, 50, 1)");
        assertThat(d.findElement(By.tagName("body")).getText()).contains("approval-required")
                .contains("a person is asked only once approval is the last reason left");
    }

    private static boolean overlap(Rectangle a, Rectangle b) {
        return a.getX() < b.getX() + b.getWidth() && b.getX() < a.getX() + a.getWidth()
                && a.getY() < b.getY() + b.getHeight() && b.getY() < a.getY() + a.getHeight();
    }

    private static int occurrences(String text, String word) {
        int n = 0;
        for (int i = text.indexOf(word); i >= 0; i = text.indexOf(word, i + 1)) n++;
        return n;
    }

    private static void signIn(WebDriver d, WebDriverWait wait, String url, String token) {
        d.get(url + "/");
        wait.until(ExpectedConditions.visibilityOfElementLocated(By.id("token"))).sendKeys(token);
        d.findElement(By.id("login-button")).click();
        wait.until(ExpectedConditions.visibilityOfElementLocated(By.id("app")));
    }

    /** Polls the server's state (not the time) every 50 ms until {@code value} is not null. */
    private static String await(String what, Supplier<String> value) {
        long deadline = System.nanoTime() + WAIT.toNanos();
        while (System.nanoTime() < deadline) {
            String v = value.get();
            if (v != null) return v;
            try {
                Thread.sleep(50);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new AssertionError(e);
            }
        }
        throw new AssertionError("timed out waiting until " + what);
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
