package dev.tend.simulator.report;

import dev.tend.shared.fleet.BrakePeriod;
import com.fasterxml.jackson.core.JsonGenerator;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.TendException;
import dev.tend.shared.time.Durations;

import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.io.Writer;

/**
 * The JSON form of a replay report. Its {@code summary}, {@code runs} and {@code decisions}
 * are the contract of DESIGN.md section 7; the other top-level keys extend it. Keys come in
 * a fixed order, times are RFC 3339 UTC, absent values are {@code null}, and nothing depends
 * on the wall clock or the machine: equal reports give equal bytes.
 *
 * <pre>
 * recording       {name, description, from, until, horizon, events, bad_lines, late_events}
 * replay          {seed, playbooks:[{id, version, sha256}], actions_sha256, fleet, clusters, health_interval}
 * summary         {runs_started, runs_succeeded, runs_failed, held, denied, approvals_requested,
 *                  max_concurrent_runs, brake_engaged, runs_unfinished, hidden_events, runs_stood_down}
 * runs            [{run, playbook, cluster, node, started_at, ended_at, outcome, steps:[{step, kind,
 *                  state, attempt, started_at, ended_at, outcome}], detail}]
 * decisions       [{at, playbook, cluster, node, verdict, reasons:[codes], signal, hold_until}]
 * brake_periods   [{engaged_at, released_at, by, reason}]
 * notifications   [{at, channel, message}]
 * hidden_events   {total, masks:[{cluster, node, signal, masked_at, run, action, lifted_at, hidden_events, reason}]}
 * unhealthy_clusters [{at, max}]   the most clusters unhealthy at once per health_interval
 * assumptions     [sentences]
 * </pre>
 */
public final class ReportJson {
    private ReportJson() {
    }

    public static String toJson(ReplayReport report) {
        StringWriter sw = new StringWriter(64 * 1024);
        write(report, sw);
        return sw.toString();
    }

    /**
     * Writes the report and a final line break to {@code out}; the caller closes it.
     *
     * @throws TendException when {@code out} fails
     */
    public static void write(ReplayReport report, Writer out) {
        try (JsonGenerator g = JsonOutput.generator(out)) {
            g.writeStartObject();
            recording(g, report.recording());
            replay(g, report.replay());
            summary(g, report.summary());
            g.writeArrayFieldStart("runs");
            for (RunEntry r : report.runs()) run(g, r);
            g.writeEndArray();
            g.writeArrayFieldStart("decisions");
            for (DecisionEntry d : report.decisions()) decision(g, d);
            g.writeEndArray();
            g.writeArrayFieldStart("brake_periods");
            for (BrakePeriod b : report.brakePeriods()) {
                g.writeStartObject();
                JsonOutput.time(g, "engaged_at", b.engagedAt());
                JsonOutput.time(g, "released_at", b.releasedAt());
                JsonOutput.text(g, "by", b.engagedBy());
                JsonOutput.text(g, "reason", b.reason());
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeArrayFieldStart("notifications");
            for (NotificationEntry n : report.notifications()) {
                g.writeStartObject();
                JsonOutput.time(g, "at", n.at());
                g.writeStringField("channel", n.channel());
                g.writeStringField("message", n.message());
                g.writeEndObject();
            }
            g.writeEndArray();
            hidden(g, report);
            g.writeArrayFieldStart("unhealthy_clusters");
            for (HealthPoint p : report.unhealthy()) {
                g.writeStartObject();
                JsonOutput.time(g, "at", p.at());
                g.writeNumberField("max", p.unhealthyClusters());
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeArrayFieldStart("assumptions");
            for (String a : report.assumptions()) g.writeString(a);
            g.writeEndArray();
            g.writeEndObject();
            g.flush();
            out.write('\n');
            out.flush();
        } catch (IOException e) {
            throw new TendException("cannot write the replay report: " + e.getMessage(), e);
        } catch (UncheckedIOException e) {
            throw new TendException("cannot write the replay report: " + e.getCause().getMessage(), e);
        }
    }

    private static void recording(JsonGenerator g, RecordingInfo r) throws IOException {
        g.writeObjectFieldStart("recording");
        g.writeStringField("name", r.name());
        JsonOutput.text(g, "description", r.description());
        JsonOutput.time(g, "from", r.from());
        JsonOutput.time(g, "until", r.until());
        JsonOutput.time(g, "horizon", r.horizon());
        g.writeNumberField("events", r.events());
        g.writeNumberField("bad_lines", r.badLines());
        g.writeNumberField("late_events", r.lateEvents());
        g.writeArrayFieldStart("bad_line_problems");
        for (dev.tend.shared.Problem p : r.problems()) {
            g.writeStartObject();
            g.writeNumberField("line", p.line());
            g.writeNumberField("column", p.column());
            g.writeStringField("field", p.field());
            g.writeStringField("message", p.message());
            g.writeEndObject();
        }
        g.writeEndArray();
        g.writeEndObject();
    }

    private static void replay(JsonGenerator g, ReplayInfo r) throws IOException {
        g.writeObjectFieldStart("replay");
        g.writeNumberField("seed", r.seed());
        g.writeArrayFieldStart("playbooks");
        for (PlaybookRef p : r.playbooks()) {
            g.writeStartObject();
            g.writeStringField("id", p.id());
            g.writeNumberField("version", p.version());
            g.writeStringField("sha256", p.sha256());
            g.writeEndObject();
        }
        g.writeEndArray();
        JsonOutput.text(g, "actions_sha256", r.actionsSha256());
        g.writeStringField("fleet", r.fleet());
        g.writeNumberField("clusters", r.clusters());
        g.writeStringField("health_interval", Durations.format(r.healthInterval()));
        g.writeEndObject();
    }

    private static void summary(JsonGenerator g, Summary s) throws IOException {
        g.writeObjectFieldStart("summary");
        g.writeNumberField("runs_started", s.runsStarted());
        g.writeNumberField("runs_succeeded", s.runsSucceeded());
        g.writeNumberField("runs_failed", s.runsFailed());
        g.writeNumberField("held", s.held());
        g.writeNumberField("denied", s.denied());
        g.writeNumberField("approvals_requested", s.approvalsRequested());
        g.writeNumberField("max_concurrent_runs", s.maxConcurrentRuns());
        g.writeBooleanField("brake_engaged", s.brakeEngaged());
        g.writeNumberField("runs_unfinished", s.runsUnfinished());
        g.writeNumberField("hidden_events", s.hiddenEvents());
        g.writeNumberField("runs_stood_down", s.runsStoodDown());
        g.writeEndObject();
    }

    private static void run(JsonGenerator g, RunEntry r) throws IOException {
        g.writeStartObject();
        g.writeStringField("run", r.run());
        JsonOutput.id(g, "playbook", r.playbook());
        JsonOutput.id(g, "cluster", r.cluster());
        JsonOutput.id(g, "node", r.node());
        JsonOutput.time(g, "started_at", r.startedAt());
        JsonOutput.time(g, "ended_at", r.endedAt());
        g.writeStringField("outcome", r.outcome());
        g.writeArrayFieldStart("steps");
        for (StepEntry s : r.steps()) {
            g.writeStartObject();
            g.writeStringField("step", s.step());
            g.writeStringField("kind", s.kind());
            g.writeStringField("state", s.state());
            g.writeNumberField("attempt", s.attempt());
            JsonOutput.time(g, "started_at", s.startedAt());
            JsonOutput.time(g, "ended_at", s.endedAt());
            JsonOutput.text(g, "outcome", s.outcome());
            g.writeEndObject();
        }
        g.writeEndArray();
        JsonOutput.text(g, "detail", r.detail());
        g.writeEndObject();
    }

    private static void decision(JsonGenerator g, DecisionEntry d) throws IOException {
        g.writeStartObject();
        JsonOutput.time(g, "at", d.at());
        JsonOutput.id(g, "playbook", d.playbook());
        JsonOutput.id(g, "cluster", d.cluster());
        JsonOutput.id(g, "node", d.node());
        g.writeStringField("verdict", d.verdict().wireName());
        g.writeArrayFieldStart("reasons");
        for (ReasonCode c : d.reasons()) g.writeString(c.code());
        g.writeEndArray();
        JsonOutput.id(g, "signal", d.signal());
        JsonOutput.time(g, "hold_until", d.holdUntil());
        g.writeEndObject();
    }

    private static void hidden(JsonGenerator g, ReplayReport report) throws IOException {
        g.writeObjectFieldStart("hidden_events");
        g.writeNumberField("total", report.summary().hiddenEvents());
        g.writeArrayFieldStart("masks");
        for (HiddenMask m : report.masks()) {
            g.writeStartObject();
            JsonOutput.id(g, "cluster", m.cluster());
            JsonOutput.id(g, "node", m.node());
            JsonOutput.id(g, "signal", m.signal());
            JsonOutput.time(g, "masked_at", m.maskedAt());
            g.writeStringField("run", m.run());
            g.writeStringField("action", m.action());
            JsonOutput.time(g, "lifted_at", m.liftedAt());
            g.writeNumberField("hidden_events", m.hiddenEvents());
            g.writeStringField("reason", m.reason());
            g.writeEndObject();
        }
        g.writeEndArray();
        g.writeEndObject();
    }
}
