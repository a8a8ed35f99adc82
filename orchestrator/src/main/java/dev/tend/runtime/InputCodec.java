package dev.tend.runtime;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.engine.Input;
import dev.tend.shared.Id;
import dev.tend.shared.Target;
import dev.tend.shared.TendException;
import dev.tend.shared.wire.CompactLine;
import dev.tend.shared.wire.LineResult;
import dev.tend.shared.wire.Rfc3339;
import dev.tend.shared.wire.WireReader;
import dev.tend.shared.wire.WireWriter;
import dev.tend.store.InputRow;

import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Turns engine inputs into journal rows and back. Transitions and topology events are kept
 * as wire format v1 lines, so a recording exported from the journal is plain wire format.
 */
public final class InputCodec {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final WireReader WIRE = WireReader.trusted("journal");

    private InputCodec() {
    }

    public static InputRow encode(Input in, Instant now) {
        Id cluster = in.cluster();
        String c = cluster == null ? null : cluster.value();
        if (in instanceof Input.Transition t) {
            return InputRow.of(in.kind(), now, t.transition().at(), c,
                    CompactLine.of(t.wire() != null ? t.wire() : WireWriter.line(t.transition())));
        }
        if (in instanceof Input.Topology t) {
            return InputRow.of(in.kind(), now, t.event().at(), c, CompactLine.of(WireWriter.line(t.event())));
        }
        Map<String, Object> m = new LinkedHashMap<>();
        if (in instanceof Input.TimerFired t) m.put("key", t.key());
        else if (in instanceof Input.ExecutorResult r) {
            m.put("run", r.runId());
            m.put("step", r.stepId());
            m.put("attempt", r.attempt());
            m.put("success", r.success());
            m.put("message", r.message());
            m.put("clears", r.clears().stream().map(Id::value).toList());
            m.put("detail", r.detail());
        } else if (in instanceof Input.OutcomeUnknown u) {
            m.put("run", u.runId());
            m.put("step", u.stepId());
            m.put("attempt", u.attempt());
        } else if (in instanceof Input.Command cmd) {
            m.put("by", cmd.by());
            m.put("from", cmd.from());
            if (cmd instanceof Input.Approve a) m.put("run", a.runId());
            else if (cmd instanceof Input.Reject r) {
                m.put("run", r.runId());
                m.put("reason", r.reason());
            } else if (cmd instanceof Input.AbortRun a) {
                m.put("run", a.runId());
                m.put("reason", a.reason());
            } else if (cmd instanceof Input.Exclude e) {
                target(m, e.target());
                m.put("reason", e.reason());
                m.put("owner", e.owner());
                m.put("until", e.until() == null ? null : Rfc3339.format(e.until()));
            } else if (cmd instanceof Input.Unexclude u) target(m, u.target());
            else if (cmd instanceof Input.EngageBrake b) m.put("reason", b.reason());
            else if (cmd instanceof Input.ReleaseBrake b) m.put("reason", b.reason());
            else if (cmd instanceof Input.ClearLoop l) {
                m.put("playbook", l.playbook().value());
                target(m, l.target());
            }
        }
        try {
            return InputRow.of(in.kind(), now, null, c, JSON.writeValueAsString(m));
        } catch (JsonProcessingException e) {
            throw new TendException("cannot encode a " + in.kind() + " input: " + e.getMessage(), e);
        }
    }

    private static void target(Map<String, Object> m, Target t) {
        m.put("cluster", t.cluster().value());
        m.put("node", t.node() == null ? null : t.node().value());
    }

    public static Input decode(InputRow row) {
        if (row.kind().equals("transition") || row.kind().equals("topology")) {
            LineResult r = WIRE.parseLine(row.payload(), row.seq());
            if (r instanceof LineResult.Event e) {
                return e.event() instanceof dev.tend.shared.HealthTransition t ? new Input.Transition(t)
                        : new Input.Topology((dev.tend.shared.TopologyEvent) e.event());
            }
            throw new TendException("journal entry " + row.seq() + " holds an unreadable " + row.kind() + ": " + r);
        }
        JsonNode m;
        try {
            m = JSON.readTree(row.payload());
        } catch (JsonProcessingException e) {
            throw new TendException("journal entry " + row.seq() + " is not JSON: " + e.getOriginalMessage(), e);
        }
        String by = text(m, "by"), from = text(m, "from");
        return switch (row.kind()) {
            case "timer" -> new Input.TimerFired(text(m, "key"));
            case "executor-result" -> {
                List<Id> clears = new ArrayList<>();
                m.path("clears").forEach(n -> clears.add(Id.of(n.asText())));
                @SuppressWarnings("unchecked")
                Map<String, Object> detail = JSON.convertValue(m.path("detail"), Map.class);
                yield new Input.ExecutorResult(text(m, "run"), text(m, "step"), m.path("attempt").asInt(),
                        m.path("success").asBoolean(), text(m, "message"), clears, detail);
            }
            case "outcome-unknown" -> new Input.OutcomeUnknown(text(m, "run"), text(m, "step"), m.path("attempt").asInt());
            case "approve" -> new Input.Approve(text(m, "run"), by, from);
            case "reject" -> new Input.Reject(text(m, "run"), text(m, "reason"), by, from);
            case "abort" -> new Input.AbortRun(text(m, "run"), text(m, "reason"), by, from);
            case "exclude-add" -> new Input.Exclude(target(m), text(m, "reason"), text(m, "owner"),
                    m.hasNonNull("until") ? Rfc3339.parse(m.get("until").asText()) : null, by, from);
            case "exclude-remove" -> new Input.Unexclude(target(m), by, from);
            case "brake-engage" -> new Input.EngageBrake(text(m, "reason"), by, from);
            case "brake-release" -> new Input.ReleaseBrake(text(m, "reason"), by, from);
            case "loop-clear" -> new Input.ClearLoop(Id.of(text(m, "playbook")), target(m), by, from);
            case "tick" -> new Input.Tick();
            default -> throw new TendException("journal entry " + row.seq() + " has an unknown kind '" + row.kind() + "'");
        };
    }

    private static Target target(JsonNode m) {
        Id cluster = Id.of(text(m, "cluster"));
        String node = text(m, "node");
        return node == null ? Target.cluster(cluster) : Target.node(cluster, Id.of(node));
    }

    private static String text(JsonNode m, String field) {
        JsonNode n = m.get(field);
        return n == null || n.isNull() ? null : n.asText();
    }
}
