package dev.tend.simulator.report;

import dev.tend.shared.fleet.BrakePeriod;
import dev.tend.shared.Id;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.Verdict;

import java.time.Duration;
import java.time.Instant;
import java.util.List;

/** Small replay reports built by hand, for the renderer and comparison tests. */
final class Fixtures {
    static final Instant T0 = Instant.parse("2027-03-16T01:00:00Z");

    private Fixtures() {
    }

    static Instant at(int minutes) {
        return T0.plus(Duration.ofMinutes(minutes));
    }

    static RunEntry run(String id, String cluster, String node, int start, Integer end, String outcome) {
        return new RunEntry(id, Id.of("replace-silent-node"), Id.of(cluster), node == null ? null : Id.of(node), at(start),
                end == null ? null : at(end), outcome, outcome.equals("succeeded") ? "all steps succeeded" : null,
                List.of(new StepEntry("drain", "action", "succeeded", 1, at(start), at(start + 2), "simulated success"),
                        new StepEntry("replace", "action", end == null ? "running" : "succeeded", 1, at(start + 2),
                                end == null ? null : at(end), null)));
    }

    static DecisionEntry decision(int minute, String cluster, String node, Verdict v, ReasonCode... reasons) {
        return new DecisionEntry(at(minute), Id.of("replace-silent-node"), Id.of(cluster), node == null ? null : Id.of(node), v,
                List.of(reasons), Id.of("heartbeat"), v == Verdict.HOLD ? at(minute + 5) : null);
    }

    static ReplayReport report(List<RunEntry> runs, List<DecisionEntry> decisions, List<BrakePeriod> brakes) {
        long started = runs.size();
        long ok = runs.stream().filter(r -> r.outcome().equals("succeeded")).count();
        long failed = runs.stream().filter(r -> r.outcome().equals("failed")).count();
        long unfinished = runs.stream().filter(r -> r.endedAt() == null).count();
        long held = decisions.stream().filter(d -> d.verdict() == Verdict.HOLD).count();
        long denied = decisions.stream().filter(d -> d.verdict() == Verdict.DENY).count();
        Summary s = new Summary(started, ok, failed, held, denied, 0, runs.isEmpty() ? 0 : 1, !brakes.isEmpty(), unfinished, 3, 0);
        return new ReplayReport(
                new RecordingInfo("quiet-night", "two silent nodes <and> a \"quote\"", T0, at(300), at(300), 111, 0, 0),
                new ReplayInfo(7, List.of(new PlaybookRef("replace-silent-node", 1, "ab".repeat(32))), "cd".repeat(32), "larkspur", 300,
                        Duration.ofMinutes(1)),
                s, runs, decisions, brakes,
                List.of(new NotificationEntry(at(40), "oncall", "fleet brake engaged: 24 clusters unhealthy")),
                List.of(new HiddenMask(Id.of("tickets-12"), Id.of("n2"), Id.of("heartbeat"), at(20), "r000001", "replace-node",
                        at(280), 3)),
                List.of(new HealthPoint(T0, 0), new HealthPoint(at(1), 2), new HealthPoint(at(2), 1)),
                List.of("no approval arrives in a replay"));
    }

    static ReplayReport sample() {
        return report(List.of(run("r000001", "tickets-12", "n2", 5, 26, "succeeded"), run("r000002", "telemetry-7", "n3", 160, null, "running")),
                List.of(decision(0, "tickets-12", "n2", Verdict.HOLD, ReasonCode.UNCONFIRMED),
                        decision(5, "tickets-12", "n2", Verdict.START),
                        decision(60, "tickets-13", "n2", Verdict.DENY, ReasonCode.MASKED, ReasonCode.UNCONFIRMED)),
                List.of(new BrakePeriod(at(40), "automatic", "24 clusters unhealthy (8.0% of the fleet)", at(80), null, null)));
    }
}
