package dev.tend.simulator.report;

import dev.tend.shared.ReasonCode;
import dev.tend.shared.Verdict;
import org.junit.jupiter.api.Test;

import java.util.List;

import static dev.tend.simulator.report.Fixtures.decision;
import static dev.tend.simulator.report.Fixtures.report;
import static dev.tend.simulator.report.Fixtures.run;
import static org.assertj.core.api.Assertions.assertThat;

class ReportComparisonTest {
    @Test
    void aReportComparedWithItselfHasNoDifferences() {
        ReplayReport r = Fixtures.sample();
        ReportComparison c = ReportComparison.of("a", r, "b", r);
        assertThat(c.isSame()).isTrue();
        assertThat(ComparisonText.render(c)).contains("no differences");
        assertThat(ComparisonJson.toJson(c)).contains("\"same\": true");
    }

    @Test
    void listsRunsStartedInOnlyOneSetAndRunsWithADifferentOutcome() {
        ReplayReport a = report(List.of(run("r000001", "tickets-12", "n2", 5, 26, "succeeded"),
                run("r000002", "telemetry-7", "n3", 160, 180, "succeeded")), List.of(), List.of());
        ReplayReport b = report(List.of(run("r000001", "telemetry-7", "n3", 170, 190, "failed"),
                run("r000002", "dispatch-4", "n1", 200, 220, "succeeded")), List.of(), List.of());
        ReportComparison c = ReportComparison.of("library", a, "longer-confirm", b);
        assertThat(c.runs()).extracting(RunDifference::kind, RunDifference::target).containsExactly(
                org.assertj.core.groups.Tuple.tuple(RunDifference.Kind.ONLY_IN_A, "tickets-12/n2"),
                org.assertj.core.groups.Tuple.tuple(RunDifference.Kind.OUTCOME, "telemetry-7/n3"),
                org.assertj.core.groups.Tuple.tuple(RunDifference.Kind.ONLY_IN_B, "dispatch-4/n1"));
        assertThat(ComparisonText.render(c)).contains("started only in A: replace-silent-node on tickets-12/n2")
                .contains("different outcome: replace-silent-node on telemetry-7/n3: A succeeded (r000002), B failed (r000001)");
        SummaryDelta succeeded = c.summary().stream().filter(d -> d.field().equals("runs_succeeded")).findFirst().orElseThrow();
        assertThat(succeeded.a()).isEqualTo(2);
        assertThat(succeeded.b()).isEqualTo(1);
        assertThat(succeeded.delta()).isEqualTo(-1);
    }

    @Test
    void listsTargetsWhoseHoldReasonsDiffer() {
        ReplayReport a = report(List.of(), List.of(decision(0, "tickets-12", "n2", Verdict.HOLD, ReasonCode.UNCONFIRMED)), List.of());
        ReplayReport b = report(List.of(), List.of(decision(0, "tickets-12", "n2", Verdict.HOLD, ReasonCode.UNCONFIRMED, ReasonCode.FLEET_BRAKE)),
                List.of());
        ReportComparison c = ReportComparison.of("a", a, "b", b);
        assertThat(c.reasons()).singleElement().satisfies(r -> {
            assertThat(r.target()).isEqualTo("tickets-12/n2");
            assertThat(r.a()).containsExactly(ReasonCode.UNCONFIRMED);
            assertThat(r.b()).containsExactly(ReasonCode.UNCONFIRMED, ReasonCode.FLEET_BRAKE);
        });
        assertThat(ComparisonJson.toJson(c)).contains("\"b\":[\"unconfirmed\",\"fleet-brake\"]");
    }

    @Test
    void theHtmlFormHoldsBothTimelinesAndTheDifferences() {
        ReplayReport a = Fixtures.sample();
        ReplayReport b = report(List.of(), List.of(), List.of());
        String html = ComparisonHtml.render(ReportComparison.of("a", a, "b", b));
        assertThat(html).contains("Runs that differ").contains("Timeline A: a").contains("Timeline B: b");
        assertThat(html.split("<svg ", -1)).hasSize(3);
    }

    @Test
    void theSummaryIsLabelledInWordsNotJsonFieldNames() {
        ReportComparison c = ReportComparison.of("a", Fixtures.sample(), "b", report(List.of(), List.of(), List.of()));
        for (String page : List.of(ComparisonText.render(c), ComparisonHtml.render(c))) {
            assertThat(page).contains("most runs at once").contains("runs succeeded").contains("fleet brake engaged")
                    .contains("approvals requested");
            for (SummaryDelta d : c.summary()) if (d.field().contains("_")) assertThat(page).doesNotContain(d.field());
        }
        assertThat(ComparisonJson.toJson(c)).as("the JSON keeps its field names").contains("\"max_concurrent_runs\"");
    }
}
