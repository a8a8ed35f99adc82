package dev.tend.cli;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.engine.LedgerKind;
import dev.tend.store.LedgerEntry;

import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.function.Function;

/**
 * One readable line per ledger entry: seq, time (to the millisecond, so the columns line up),
 * kind, target, playbook, run, then the other fields. An entry about a run that names only
 * its cluster (an executor result, a finished step) is shown with the run's node, looked up
 * by {@code nodeOfRun}; a {@code policy-loaded} entry lists its playbooks as words, not JSON.
 */
final class LedgerText {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Set<String> SHOWN = Set.of("seq", "at", "kind", "cluster", "node", "playbook", "run");
    private static final DateTimeFormatter TIME = DateTimeFormatter.ofPattern("uuuu-MM-dd'T'HH:mm:ss.SSS'Z'").withZone(ZoneOffset.UTC);
    /** Characters of a SHA-256 shown in a line: enough to tell versions apart, as short hashes commonly are (common practice, no source). */
    private static final int SHORT_HASH = 12;

    /** Fields that say most, shown first. */
    private static final List<String> FIRST = List.of("verdict", "reasons", "state", "outcome", "reason", "message");

    private final Function<String, String> nodeOfRun;

    /** @param nodeOfRun the node of a run id, or null when the run is on a whole cluster or unknown */
    LedgerText(Function<String, String> nodeOfRun) {
        this.nodeOfRun = nodeOfRun;
    }

    String line(LedgerEntry e) {
        JsonNode n;
        try {
            n = JSON.readTree(e.entry());
        } catch (JsonProcessingException ex) {
            return String.format("%6d %s %s (unreadable entry: %s)", e.seq(), TIME.format(e.at()), e.kind(), ex.getOriginalMessage());
        }
        StringBuilder sb = new StringBuilder(String.format("%6d %s %-21s %-16s %-30s %-8s", e.seq(), TIME.format(e.at()), e.kind(),
                target(n), n.path("playbook").asText("-"), n.path("run").asText("-")));
        if (e.kind().equals(LedgerKind.POLICY_LOADED.wire())) return policy(sb, n);
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

    private String target(JsonNode n) {
        if (!n.hasNonNull("cluster")) return "-";
        String node = n.hasNonNull("node") ? n.get("node").asText() : n.hasNonNull("run") ? nodeOfRun.apply(n.get("run").asText()) : null;
        return n.get("cluster").asText() + (node == null ? "" : "/" + node);
    }

    private static String policy(StringBuilder sb, JsonNode n) {
        List<String> playbooks = new ArrayList<>();
        for (Iterator<Map.Entry<String, JsonNode>> it = n.path("playbooks").fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> p = it.next();
            playbooks.add(p.getKey() + " " + shortHashes(p.getValue().asText()));
        }
        sb.append(' ').append(playbooks.size()).append(playbooks.size() == 1 ? " playbook: " : " playbooks: ")
                .append(String.join(", ", playbooks));
        if (n.has("actions")) sb.append("; actions ").append(shortHashes(n.get("actions").asText()));
        if (n.has("clusters")) sb.append("; fleet of ").append(n.get("clusters").asText()).append(" clusters");
        for (Iterator<Map.Entry<String, JsonNode>> it = n.fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> f = it.next();
            if (Set.of("playbooks", "actions", "clusters").contains(f.getKey()) || SHOWN.contains(f.getKey())) continue;
            append(sb, f.getKey(), f.getValue());
        }
        return sb.toString();
    }

    /** "v1 sha256:63a9...(64 hex)" as "v1 sha256:63a931176d88". */
    private static String shortHashes(String text) {
        return text.replaceAll("sha256:([0-9a-f]{" + SHORT_HASH + "})[0-9a-f]+", "sha256:$1");
    }

    private static void append(StringBuilder sb, String key, JsonNode v) {
        sb.append(' ').append(key).append('=').append(v.isTextual() ? v.asText() : v.toString());
    }
}
