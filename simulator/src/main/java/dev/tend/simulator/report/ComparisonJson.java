package dev.tend.simulator.report;

import com.fasterxml.jackson.core.JsonGenerator;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.TendException;

import java.io.IOException;
import java.io.StringWriter;
import java.io.Writer;
import java.util.List;

/**
 * The JSON form of a {@link ReportComparison}, keys in this order:
 * <pre>
 * a, b            {label, recording, seed, summary:{...the report's summary fields}}
 * summary         {field: {a, b, delta}}   (brake_engaged: {a, b} as booleans)
 * runs            [{kind, playbook, cluster, node, occurrence, a:{run, started_at, ended_at, outcome}|null, b:...}]
 * reasons         [{playbook, cluster, node, a:[codes], b:[codes]}]
 * same            true when nothing differs
 * </pre>
 */
public final class ComparisonJson {
    private ComparisonJson() {
    }

    public static String toJson(ReportComparison c) {
        StringWriter sw = new StringWriter();
        write(c, sw);
        return sw.toString();
    }

    public static void write(ReportComparison c, Writer out) {
        try (JsonGenerator g = JsonOutput.generator(out)) {
            g.writeStartObject();
            side(g, "a", c.labelA(), c.a());
            side(g, "b", c.labelB(), c.b());
            g.writeObjectFieldStart("summary");
            for (SummaryDelta d : c.summary()) {
                g.writeObjectFieldStart(d.field());
                if (d.flag()) {
                    g.writeBooleanField("a", d.a() == 1);
                    g.writeBooleanField("b", d.b() == 1);
                } else {
                    g.writeNumberField("a", d.a());
                    g.writeNumberField("b", d.b());
                    g.writeNumberField("delta", d.delta());
                }
                g.writeEndObject();
            }
            g.writeEndObject();
            g.writeArrayFieldStart("runs");
            for (RunDifference d : c.runs()) {
                g.writeStartObject();
                g.writeStringField("kind", d.kind().code());
                JsonOutput.id(g, "playbook", d.playbook());
                JsonOutput.id(g, "cluster", d.cluster());
                JsonOutput.id(g, "node", d.node());
                g.writeNumberField("occurrence", d.occurrence());
                run(g, "a", d.a());
                run(g, "b", d.b());
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeArrayFieldStart("reasons");
            for (ReasonDifference r : c.reasons()) {
                g.writeStartObject();
                JsonOutput.id(g, "playbook", r.playbook());
                JsonOutput.id(g, "cluster", r.cluster());
                JsonOutput.id(g, "node", r.node());
                codes(g, "a", r.a());
                codes(g, "b", r.b());
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeBooleanField("same", c.isSame());
            g.writeEndObject();
            g.flush();
            out.write('\n');
            out.flush();
        } catch (IOException e) {
            throw new TendException("cannot write the comparison: " + e.getMessage(), e);
        }
    }

    private static void side(JsonGenerator g, String field, String label, ReplayReport r) throws IOException {
        g.writeObjectFieldStart(field);
        g.writeStringField("label", label);
        g.writeStringField("recording", r.recording().name());
        g.writeNumberField("seed", r.replay().seed());
        g.writeNumberField("runs", r.runs().size());
        g.writeNumberField("decisions", r.decisions().size());
        g.writeEndObject();
    }

    private static void run(JsonGenerator g, String field, RunEntry r) throws IOException {
        if (r == null) {
            g.writeNullField(field);
            return;
        }
        g.writeObjectFieldStart(field);
        g.writeStringField("run", r.run());
        JsonOutput.time(g, "started_at", r.startedAt());
        JsonOutput.time(g, "ended_at", r.endedAt());
        g.writeStringField("outcome", r.outcome());
        g.writeEndObject();
    }

    private static void codes(JsonGenerator g, String field, List<ReasonCode> codes) throws IOException {
        g.writeArrayFieldStart(field);
        for (ReasonCode c : codes) g.writeString(c.code());
        g.writeEndArray();
    }
}
