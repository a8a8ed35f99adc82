package dev.tend.cli;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.store.LedgerEntry;

import java.util.Iterator;
import java.util.Map;
import java.util.Set;

/** One readable line per ledger entry: seq, time, kind, target, playbook, run, then the other fields. */
final class LedgerText {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Set<String> SHOWN = Set.of("seq", "at", "kind", "cluster", "node", "playbook", "run");

    /** Fields that say most, shown first. */
    private static final java.util.List<String> FIRST = java.util.List.of("verdict", "reasons", "state", "outcome", "reason", "message");

    private static void append(StringBuilder sb, String key, JsonNode v) {
        sb.append(' ').append(key).append('=').append(v.isTextual() ? v.asText() : v.toString());
    }

    private LedgerText() {
    }

    static String line(LedgerEntry e) {
        JsonNode n;
        try {
            n = JSON.readTree(e.entry());
        } catch (JsonProcessingException ex) {
            return String.format("%6d %s %s (unreadable entry: %s)", e.seq(), e.at(), e.kind(), ex.getOriginalMessage());
        }
        String target = n.hasNonNull("cluster") ? n.get("cluster").asText() + (n.hasNonNull("node") ? "/" + n.get("node").asText() : "") : "-";
        StringBuilder sb = new StringBuilder(String.format("%6d %s %-21s %-16s %-30s %-8s", e.seq(), e.at(), e.kind(), target,
                n.path("playbook").asText("-"), n.path("run").asText("-")));
        for (String first : FIRST) {
            if (n.has(first)) append(sb, first, n.get(first));
        }
        for (Iterator<Map.Entry<String, JsonNode>> it = n.fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> f = it.next();
            if (SHOWN.contains(f.getKey()) || FIRST.contains(f.getKey())) continue;
            append(sb, f.getKey(), f.getValue());
        }
        return sb.toString();
    }
}
