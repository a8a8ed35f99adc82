package dev.tend.serve;

import dev.tend.cli.TendMain;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;

import static dev.tend.serve.ServeFixture.ANNA;
import static dev.tend.serve.ServeFixture.AUTOMATION;
import static dev.tend.serve.ServeFixture.OLGA;
import static dev.tend.serve.ServeFixture.VERA;
import static dev.tend.serve.ServeFixture.awaitTrue;
import static dev.tend.serve.ServeFixture.transition;
import static org.assertj.core.api.Assertions.assertThat;

/** The CLI front ends (approvals, approve, reject, exclude, brake) against a real server over HTTP. */
class OperatorCommandsTest {
    @TempDir
    Path dir;

    @RegisterExtension
    final ServeFixture serve = new ServeFixture();

    record Run(int exit, String out, String err) {
    }

    private Run tend(String token, String... args) {
        List<String> all = new ArrayList<>(List.of(args));
        all.add("--server");
        all.add(serve.server().url());
        if (token != null) {
            all.add("--token");
            all.add(token);
        }
        StringWriter out = new StringWriter(), err = new StringWriter();
        int code = TendMain.run(all.toArray(String[]::new), new PrintWriter(out, true), new PrintWriter(err, true));
        return new Run(code, out.toString(), err.toString());
    }

    @Test
    void approvalsApproveAndTheTwoPersonRuleFromTheCommandLine() {
        serve.start(dir);
        serve.post("/api/v1/transitions", OLGA, transition("fares-3", "n2", "process-down", "breach"));
        String run = serve.awaitPendingApproval();

        Run list = tend(VERA, "approvals");
        Run self = tend(AUTOMATION, "approve", run);
        Run ok = tend(ANNA, "approve", run);
        Run twice = tend(ANNA, "approve", run);

        assertThat(list.exit()).as(list.err()).isZero();
        assertThat(list.out()).contains(run, "restart-critical", "fares-3/n2", "pending", "approval-required");
        assertSecondsOnly(list.out());
        assertThat(self.exit()).isEqualTo(1);
        assertThat(self.err()).contains("two-person rule: whoever requested a run cannot approve it");
        assertThat(ok.exit()).as(ok.err()).isZero();
        assertThat(ok.out()).startsWith("approved " + run + " (restart-critical on fares-3/n2); guards passed: run ");
        assertThat(twice.exit()).isEqualTo(1);
        // approving twice says who approved it and when, to the second
        assertThat(twice.err()).containsPattern("the run was already approved by anna at \\d{4}-\\d\\d-\\d\\dT\\d\\d:\\d\\d:\\d\\dZ");
        assertThat(tend(VERA, "approvals", "--state", "approved").out()).contains(run);
    }

    @Test
    void rejectNeedsAReasonAndCancelsTheRun() {
        serve.start(dir);
        serve.post("/api/v1/transitions", OLGA, transition("fares-3", "n2", "process-down", "breach"));
        String run = serve.awaitPendingApproval();

        Run noReason = tend(ANNA, "reject", run);
        Run r = tend(ANNA, "reject", run, "--reason", "fares team is on it");

        assertThat(noReason.exit()).isEqualTo(2);
        assertThat(noReason.err()).contains("Missing required option: '--reason=R'");
        assertThat(r.exit()).as(r.err()).isZero();
        assertThat(r.out()).isEqualTo("rejected " + run + " (restart-critical on fares-3/n2); run cancelled\n");
    }

    @Test
    void excludeAddListRemove() {
        serve.start(dir);

        Run add = tend(OLGA, "exclude", "add", "dispatch-1", "n2", "--reason", "disk swap by the owner", "--owner", "team-operations",
                "--until", "4h");
        Run list = tend(VERA, "exclude", "list");
        Run remove = tend(OLGA, "exclude", "remove", "dispatch-1", "n2");
        Run again = tend(OLGA, "exclude", "remove", "dispatch-1", "n2");
        Run badUntil = tend(OLGA, "exclude", "add", "dispatch-1", "--reason", "r", "--owner", "o", "--until", "tomorrow");

        assertThat(add.exit()).as(add.err()).isZero();
        assertThat(add.out()).startsWith("excluded dispatch-1/n2 until ").endsWith(" (owner team-operations): disk swap by the owner\n");
        assertThat(list.out()).contains("dispatch-1/n2", "team-operations", "yes", "disk swap by the owner");
        assertSecondsOnly(list.out());
        assertSecondsOnly(add.out());
        assertThat(remove.out()).isEqualTo("removed the exclusion of dispatch-1/n2\n");
        assertThat(again.exit()).isEqualTo(2);
        assertThat(again.err()).contains("dispatch-1/n2 is not excluded");
        assertThat(badUntil.exit()).isEqualTo(2);
        assertThat(badUntil.err()).contains("--until: 'tomorrow' is not a time");
        assertThat(tend(VERA, "exclude", "list").out()).isEqualTo("no exclusions\n");
    }

    @Test
    void excludingAnUnknownClusterOrNodeIsRefusedWithASuggestionExitTwoAndHttp400() {
        serve.start(dir);

        Run cluster = tend(OLGA, "exclude", "add", "dispatch-11", "--reason", "disk swap", "--owner", "team-operations");
        Run node = tend(OLGA, "exclude", "add", "dispatch-1", "n22", "--reason", "disk swap", "--owner", "team-operations");
        ServeFixture.Response http = serve.post("/api/v1/exclusions", OLGA,
                "{\"cluster\":\"dispatch-11\",\"reason\":\"disk swap\",\"owner\":\"team-operations\"}");

        assertThat(cluster.exit()).isEqualTo(2);
        assertThat(cluster.err()).contains("cluster dispatch-11 is not in the topology (did you mean 'dispatch-1'?)");
        assertThat(node.exit()).isEqualTo(2);
        assertThat(node.err()).contains("node n22 is not in the topology of cluster dispatch-1 (did you mean 'n2'?)");
        assertThat(http.status()).isEqualTo(400);
        assertThat(http.json().get("error").asText()).isEqualTo("invalid-input");
        assertThat(http.json().get("message").asText()).contains("did you mean 'dispatch-1'?");
        assertThat(tend(VERA, "exclude", "list").out()).isEqualTo("no exclusions\n");
    }

    @Test
    void brakeEngageStatusRelease() {
        serve.start(dir);

        Run engage = tend(OLGA, "brake", "engage", "--reason", "regional network event");
        Run status = tend(VERA, "brake", "status");
        Run viewer = tend(VERA, "brake", "release", "--reason", "x");
        Run release = tend(OLGA, "brake", "release", "--reason", "network back");
        Run again = tend(OLGA, "brake", "release", "--reason", "network back");

        assertThat(engage.exit()).as(engage.err()).isZero();
        assertThat(engage.out()).startsWith("fleet brake ENGAGED since ").contains(" by olga (by hand: releases only by hand): regional network event");
        assertThat(status.out()).isEqualTo(engage.out());
        assertThat(viewer.exit()).isEqualTo(2);
        assertThat(viewer.err()).contains("this needs a token with the role operator; token vera has viewer");
        assertThat(release.out()).isEqualTo("fleet brake released\n");
        assertThat(again.exit()).isEqualTo(1);
        assertThat(again.err()).contains("the fleet brake is not engaged; nothing was released");
        awaitTrue("the ledger has both brake changes", Duration.ofSeconds(2), () ->
                serve.get("/api/v1/ledger?kind=operator-command", VERA).json().get("entries").size() == 3);
    }

    @Test
    void abortCancelsAnActiveRunWithTheReasonAndWhoGaveIt() {
        serve.start(dir);
        serve.post("/api/v1/transitions", OLGA, transition("fares-3", "n2", "process-down", "breach"));
        String run = serve.awaitPendingApproval();

        Run noReason = tend(OLGA, "abort", run);
        Run viewer = tend(VERA, "abort", run, "--reason", "x");
        Run abort = tend(OLGA, "abort", run, "--reason", "owner is replacing the host");
        Run again = tend(OLGA, "abort", run, "--reason", "twice");

        assertThat(noReason.exit()).isEqualTo(2);
        assertThat(noReason.err()).contains("Missing required option: '--reason=R'");
        assertThat(viewer.exit()).isEqualTo(2);
        assertThat(abort.exit()).as(abort.err()).isZero();
        assertThat(abort.out()).startsWith("aborted " + run + " (restart-critical on fares-3/n2): run cancelled at ");
        assertSecondsOnly(abort.out());
        assertThat(again.exit()).isEqualTo(1);
        assertThat(again.err()).contains("already ended");
        assertThat(serve.run(run).get("state").asText()).isEqualTo("cancelled");
        awaitTrue("the ledger names who aborted and why", Duration.ofSeconds(2), () -> serve.get("/api/v1/ledger?run=" + run, VERA)
                .json().get("entries").toString().contains("owner is replacing the host"));
        assertThat(serve.get("/api/v1/ledger?run=" + run, VERA).json().get("entries").toString()).contains("olga");
    }

    @Test
    void engagingAnEngagedBrakeSaysWhatItReplaced() {
        serve.start(dir);

        tend(OLGA, "brake", "engage", "--reason", "regional network event");
        Run second = tend(OLGA, "brake", "engage", "--reason", "storage vendor maintenance");

        assertThat(second.exit()).as(second.err()).isZero();
        assertThat(second.out()).contains("the fleet brake was already engaged (since ")
                .contains(" by olga: regional network event); its reason is replaced")
                .contains("fleet brake ENGAGED since ").endsWith(": storage vendor maintenance\n");
        assertSecondsOnly(second.out());
    }

    /** Times in operator output are RFC 3339 to the second: no fraction that would overflow a column. */
    private static void assertSecondsOnly(String out) {
        assertThat(out).containsPattern("\\d\\d:\\d\\d:\\d\\dZ").doesNotContainPattern(":\\d\\d\\.\\d+Z");
    }

    @Test
    void aCommandWithoutATokenOrServerSaysWhatIsMissing() throws Exception {
        serve.start(dir);
        int closed;
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            closed = s.getLocalPort();
        }

        Run noToken = tend(null, "brake", "status");
        StringWriter out = new StringWriter(), err = new StringWriter();
        int code = TendMain.run(new String[] {"brake", "status", "--server", "http://127.0.0.1:" + closed, "--token", VERA},
                new PrintWriter(out, true), new PrintWriter(err, true));

        if (System.getenv("TEND_TOKEN") == null) {
            assertThat(noToken.exit()).isEqualTo(2);
            assertThat(noToken.err()).contains("this needs a token: set TEND_TOKEN or pass --token T");
        }
        assertThat(code).isEqualTo(2);
        assertThat(err.toString()).contains("cannot reach tend serve at http://127.0.0.1:" + closed);
    }
}
