package dev.tend.playbooks.load;

import dev.tend.playbooks.FlapLimit;
import dev.tend.playbooks.Limits;
import dev.tend.playbooks.LoopLimit;
import dev.tend.playbooks.Position;
import dev.tend.playbooks.RateLimit;
import dev.tend.shared.yaml.Fields;
import dev.tend.shared.yaml.RenamedKeys;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;

import java.util.List;
import java.util.Map;

/** Reads a playbook's {@code limits:} or the {@code defaults:} of tend.yaml; every key optional. */
final class LimitsReader {
    static final List<String> KEYS = List.of("per-cluster", "fleet", "per-zone", "rate", "cooldown", "loop",
            "impaired-fraction", "keep-quorum", "keep-replicas", "flapping");
    private static final RenamedKeys RENAMED = RenamedKeys.of("keep-in-sync", "keep-replicas");

    private LimitsReader() {
    }

    /** Null after a problem (recorded in {@code f}). Records where each key was written under {@code where.key}. */
    static Limits read(Fields f, YNode node, String where, Map<String, Position> positions) {
        YMap m = f.asMap(node, where);
        if (m == null) return null;
        Read.allowOnly(f, m, where, KEYS, RENAMED);
        for (YMap.Entry e : m.entries()) positions.put(where + "." + e.key().value(), Read.position(e.key()));
        int before = f.problems().size();
        Limits.Builder b = Limits.builder()
                .perCluster(Read.integer(f, m, "per-cluster", where, where + ".per-cluster", false, 1, 1000))
                .fleet(Read.integer(f, m, "fleet", where, where + ".fleet", false, 1, 1_000_000))
                .perZone(Read.integer(f, m, "per-zone", where, where + ".per-zone", false, 1, 1_000_000))
                .rate(Read.value(f, m, "rate", where, where + ".rate", false, RateLimit::parse))
                .cooldown(Read.duration(f, m, "cooldown", where, where + ".cooldown", false))
                .loop(Read.value(f, m, "loop", where, where + ".loop", false, LoopLimit::parse))
                .impairedFraction(Read.fraction(f, m, "impaired-fraction", where, where + ".impaired-fraction", false))
                .keepQuorum(Read.bool(f, m, "keep-quorum", where, where + ".keep-quorum"))
                .keepReplicas(Read.bool(f, m, "keep-replicas", where, where + ".keep-replicas"))
                .flapping(Read.value(f, m, "flapping", where, where + ".flapping", false, FlapLimit::parse));
        if (f.problems().size() > before) return null;
        try {
            return b.build();
        } catch (IllegalArgumentException e) {
            f.add(m, where, e.getMessage());
            return null;
        }
    }
}
