package dev.tend.api;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.type.TypeReference;
import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.api.view.ApprovalView;
import dev.tend.api.view.BrakeView;
import dev.tend.api.view.ExclusionView;
import dev.tend.api.view.RunView;
import dev.tend.api.view.StepView;
import dev.tend.shared.TendException;
import dev.tend.store.ApprovalRow;
import dev.tend.store.ExclusionRow;
import dev.tend.store.RunRow;
import dev.tend.store.StepRow;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/** Turns the store's projection rows into the API's views. */
final class Views {
    private Views() {
    }

    static RunView run(RunRow r, List<StepRow> steps) {
        List<StepView> s = new ArrayList<>(steps.size());
        for (StepRow st : steps) {
            s.add(new StepView(st.stepId(), st.ordinal(), text(st.detail(), "kind"), st.state().wireName(), st.attempt(),
                    st.startedAt(), st.endedAt(), st.outcome()));
        }
        return new RunView(r.runId(), r.playbook(), r.playbookVersion(), r.cluster(), r.node(), r.state().wireName(), r.shadow(),
                r.createdAt(), r.startedAt(), r.endedAt(), r.outcome(), r.currentStep(), s);
    }

    static ApprovalView approval(ApprovalRow a) {
        List<String> reasons = a.reasons() == null ? List.of() : read(a.reasons(), new TypeReference<List<String>>() { });
        return new ApprovalView(a.runId(), a.playbook(), a.cluster(), a.node(), a.state().wireName(), a.requestedBy(), a.requestedAt(),
                a.expiresAt(), a.decidedBy(), a.decidedAt(), reasons);
    }

    static ExclusionView exclusion(ExclusionRow x, Instant now) {
        return new ExclusionView(x.cluster(), x.node(), x.reason(), x.owner(), x.createdAt(), x.until(),
                x.until() == null || now.isBefore(x.until()));
    }

    static BrakeView brake(Optional<String> stateJson) {
        return stateJson.map(j -> read(j, new TypeReference<BrakeView>() { })).orElse(BrakeView.released());
    }

    private static String text(String json, String field) {
        if (json == null) return null;
        JsonNode n = read(json, new TypeReference<JsonNode>() { }).get(field);
        return n == null || n.isNull() ? null : n.asText();
    }

    private static <T> T read(String json, TypeReference<T> type) {
        try {
            return ApiJson.MAPPER.readValue(json, type);
        } catch (JsonProcessingException e) {
            throw new TendException("the store holds unreadable JSON (" + e.getOriginalMessage() + "): " + json, e);
        }
    }
}
