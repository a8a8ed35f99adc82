package dev.tend.simulator.report;

import org.junit.jupiter.api.Test;

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
                .containsPattern("unconfirmed +1  [a-z]+-\\d+(/n\\d)? \\(1 target\\)")
                .contains("denials by reason")
                .containsPattern("masked +1  [a-z]+-\\d+(/n\\d)? \\(1 target\\)")
                .contains("2027-03-16T01:40:00Z to 2027-03-16T02:20:00Z (40m)")
                .contains("3 recorded events hidden by 1 mask")
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
    void theTimelineSaysWhenThereIsNothingToDraw() {
        ReplayReport r = Fixtures.report(List.of(), List.of(), List.of());
        assertThat(ReportHtml.render(r)).contains(">no runs</text>");
    }
}
