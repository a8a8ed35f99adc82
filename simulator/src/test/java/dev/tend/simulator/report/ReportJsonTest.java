package dev.tend.simulator.report;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

class ReportJsonTest {
    private static List<String> keys(JsonNode n) {
        List<String> out = new ArrayList<>();
        n.fieldNames().forEachRemaining(out::add);
        return out;
    }

    @Test
    void carriesTheContractFieldsOfDesignSection7InAFixedOrder() throws Exception {
        JsonNode j = new ObjectMapper().readTree(ReportJson.toJson(Fixtures.sample()));
        assertThat(keys(j)).containsExactly("recording", "replay", "summary", "runs", "decisions", "brake_periods",
                "notifications", "hidden_events", "unhealthy_clusters", "assumptions");
        assertThat(keys(j.get("summary"))).startsWith("runs_started", "runs_succeeded", "runs_failed", "held", "denied",
                "approvals_requested", "max_concurrent_runs", "brake_engaged");
        assertThat(keys(j.get("runs").get(0))).startsWith("run", "playbook", "cluster", "node", "started_at", "ended_at", "outcome", "steps");
        assertThat(keys(j.get("decisions").get(0))).startsWith("at", "playbook", "cluster", "node", "verdict", "reasons");
        assertThat(j.get("summary").get("brake_engaged").asBoolean()).isTrue();
        assertThat(j.get("decisions").get(2).get("reasons")).extracting(JsonNode::asText).containsExactly("masked", "unconfirmed");
        assertThat(j.get("decisions").get(0).get("at").asText()).isEqualTo("2027-03-16T01:00:00Z");
    }

    @Test
    void absentValuesAreNullNotLeftOut() throws Exception {
        JsonNode j = new ObjectMapper().readTree(ReportJson.toJson(Fixtures.sample()));
        JsonNode unfinished = j.get("runs").get(1);
        assertThat(unfinished.has("ended_at")).isTrue();
        assertThat(unfinished.get("ended_at").isNull()).isTrue();
        assertThat(j.get("decisions").get(1).get("hold_until").isNull()).isTrue();
    }

    @Test
    void equalReportsGiveEqualBytesWithUnixLineBreaksAndOneLinePerListEntry() {
        String a = ReportJson.toJson(Fixtures.sample());
        String b = ReportJson.toJson(Fixtures.sample());
        assertThat(a).isEqualTo(b).doesNotContain("\r").endsWith("}\n");
        assertThat(a.lines().filter(l -> l.contains("\"verdict\":")).count()).isEqualTo(3);
    }

    @Test
    void hiddenEventsSayHowManyAndWhy() throws Exception {
        JsonNode h = new ObjectMapper().readTree(ReportJson.toJson(Fixtures.sample())).get("hidden_events");
        assertThat(h.get("total").asLong()).isEqualTo(3);
        assertThat(h.get("masks").get(0).get("reason").asText()).contains("cleared by run r000001 (replace-node)");
    }
}
