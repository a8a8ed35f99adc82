package dev.tend.simulator.report;

import org.junit.jupiter.api.Test;

import dev.tend.shared.ReasonCode;
import dev.tend.shared.Verdict;

import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

class ReportRenderTest {
    @Test
    void theTextFormTellsTotalsRunsByPlaybookHoldsByReasonBrakeAndHiddenEvents() {
        String text = ReportText.render(Fixtures.sample());
        assertThat(text).contains("runs started       2 (1 succeeded, 0 failed, 1 unfinished)")
                .contains("replace-silent-node")
                .contains("holds by reason")
                // each reason with the targets it held or denied, not a count alone
                .containsPattern("unconfirmed +1  the problem has not lasted its confirm-for yet\n +[a-z]+-\\d+(/n\\d)? \\(1 target\\)")
                .contains("denials by reason")
                .containsPattern("masked +1  an owner-caused signal explains the problem\n +[a-z]+-\\d+(/n\\d)? \\(1 target\\)")
                .contains("2027-03-16T01:40:00Z to 2027-03-16T02:20:00Z (40m)")
                .contains("3 recorded events hidden after 1 simulated fix")
                .contains("no approval arrives in a replay");
        assertThat(text.lines().count()).as("one screenful").isLessThan(60);
    }

    @Test
    void theTextFormCutsLongListsAndSaysHowManyWereLeftOut() {
        List<RunEntry> runs = new java.util.ArrayList<>();
        for (int i = 1; i <= 30; i++) runs.add(Fixtures.run(String.format("r%06d", i), "tickets-" + i, "n1", i, i + 20, "succeeded"));
        String text = ReportText.render(Fixtures.report(runs, List.of(), List.of()));
        assertThat(text).contains("... and 22 more (see --format json)");
        assertThat(text.lines().count()).isLessThan(60);
    }

    @Test
    void theHtmlFormIsOneSelfContainedPageWithAnInlineSvgTimeline() {
        String html = ReportHtml.render(Fixtures.sample());
        assertThat(html).startsWith("<!DOCTYPE html>").contains("<svg xmlns=\"http://www.w3.org/2000/svg\"").contains("</svg>")
                .contains("fill=\"#f4c7c3\"")          // the brake period
                .contains("<title>r000001 replace-silent-node on tickets-12/n2: succeeded")
                .contains("unhealthy</text>");
        assertThat(html).doesNotContain("<script").doesNotContain("<link").doesNotContain(" src=").doesNotContain("url(")
                .doesNotContain("@import");
        assertThat(html).contains("two silent nodes &lt;and&gt; a &quot;quote&quot;").doesNotContain("<and>");
    }

    @Test
    void approvalRequiredIsExplainedBesideItsCountWhenNoApprovalWasRequested() {
        ReplayReport r = Fixtures.report(List.of(), List.of(
                Fixtures.decision(0, "fares-3", "n1", Verdict.HOLD, ReasonCode.FLEET_BRAKE, ReasonCode.APPROVAL_REQUIRED),
                Fixtures.decision(1, "fares-4", "n2", Verdict.HOLD, ReasonCode.FLEET_BRAKE, ReasonCode.APPROVAL_REQUIRED)), List.of());
        String why = "0 approvals requested: these decisions were also held by another guard, and a person is asked only once"
                + " approval is the last reason left";
        assertThat(ReportText.render(r)).containsPattern("approval-required +2  the playbook asks a person for this cluster\n"
                + " +fares-3/n1, fares-4/n2 \\(2 targets\\)\n +" + java.util.regex.Pattern.quote(why));
        assertThat(ReportHtml.render(r)).containsPattern("<code>approval-required</code></td><td>[^<]*</td><td class=\"n\">2</td>"
                + "<td>fares-3/n1, fares-4/n2 \\(2 targets\\)<br><span class=\"muted\">" + java.util.regex.Pattern.quote(why));
    }

    @Test
    void theHtmlListsHeldAndDeniedTargetsByReasonWithTheFirstOnesAndACount() {
        List<DecisionEntry> decisions = new java.util.ArrayList<>();
        for (int i = 1; i <= 7; i++) decisions.add(Fixtures.decision(i, "fares-" + i, "n1", Verdict.HOLD, ReasonCode.FLEET_BRAKE));
        decisions.add(Fixtures.decision(9, "dispatch-1", null, Verdict.DENY, ReasonCode.EXCLUDED));
        String html = ReportHtml.render(Fixtures.report(List.of(), decisions, List.of()));
        assertThat(html).contains("<h2>Holds by reason</h2>")
                .contains("<td><code>fleet-brake</code></td><td>the fleet brake is engaged</td><td class=\"n\">7</td>"
                        + "<td>fares-1/n1, fares-2/n1, fares-3/n1 and 4 more (7 targets)</td>")
                .contains("<h2>Denials by reason</h2>")
                .contains("<td><code>excluded</code></td><td>the target is excluded</td><td class=\"n\">1</td>"
                        + "<td>dispatch-1 (1 target)</td>");
    }

    @Test
    void aZeroIsNeverColouredAsSuccess() {
        String none = ReportHtml.render(Fixtures.report(List.of(), List.of(), List.of()));
        assertThat(none).contains("<div class=\"tile\"><b>0</b><span>succeeded</span></div>");
        String some = ReportHtml.render(Fixtures.sample());
        assertThat(some).contains("<div class=\"tile\"><b class=\"ok\">1</b><span>succeeded</span></div>");
    }

    @Test
    void noTimeOnThePageCanBreakAcrossLines() {
        String html = ReportHtml.render(Fixtures.sample());
        assertThat(html).contains(".t { white-space: nowrap; }");
        String outsideSvg = html.replaceAll("(?s)<svg .*?</svg>", "");
        java.util.regex.Matcher m = java.util.regex.Pattern.compile("(<span class=\"t\">)?\\d{4}-\\d{2}-\\d{2}T\\d{2}:\\d{2}:\\d{2}Z")
                .matcher(outsideSvg);
        int times = 0;
        while (m.find()) {
            times++;
            assertThat(m.group(1)).as("time %s at offset %d sits in a span.t", m.group(), m.start()).isNotNull();
        }
        assertThat(times).as("the sample's times: recording, brake, notification, fix, runs").isGreaterThanOrEqualTo(8);
    }

    @Test
    void maskedIsTheReasonCodesWordAndTheReplaysHiddenEventsAreNotCalledMasks() {
        ReplayReport r = Fixtures.sample();
        for (String page : List.of(ReportText.render(r), ReportHtml.render(r))) {
            assertThat(page).contains("masked");
            // "masked" appears only as the reason code; the replay's own hiding is "events hidden"
            assertThat(page.replace("masked", "")).doesNotContainIgnoringCase("mask");
            assertThat(page).containsIgnoringCase("events hidden");
        }
    }

    @Test
    void theTimelineSaysWhenThereIsNothingToDraw() {
        ReplayReport r = Fixtures.report(List.of(), List.of(), List.of());
        assertThat(ReportHtml.render(r)).contains(">no runs</text>");
    }
}
