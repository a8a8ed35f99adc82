package dev.tend.shared.fleet;

import dev.tend.shared.Id;
import dev.tend.shared.yaml.Fields;
import dev.tend.shared.yaml.YList;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;
import dev.tend.shared.yaml.YScalar;
import dev.tend.shared.yaml.YamlDocument;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Loads a fleet file (YAML or JSON, DESIGN.md section 3). Every problem is reported at
 * once, located, through {@link dev.tend.shared.InvalidInputException}.
 */
public final class FleetFile {
    private static final List<String> TOP = List.of("fleet", "clusters");
    private static final List<String> CLUSTER = List.of("id", "tags", "replication", "quorum", "nodes");
    private static final List<String> NODE = List.of("id", "zone", "tags");
    private static final List<String> REPLICATION = List.of("factor", "min-in-sync");

    private FleetFile() {
    }

    public static Fleet load(Path file) {
        return parse(file.toString(), YamlDocument.read(file));
    }

    public static Fleet parse(String source, String text) {
        return parse(source, YamlDocument.parse(source, text));
    }

    private static Fleet parse(String source, YNode root) {
        Fields f = new Fields(source);
        YMap top = f.asMap(root, "fleet file");
        if (top == null) {
            f.throwIfAny();
        }
        f.allowOnly(top, "the fleet file", TOP);
        String name = f.string(top, "fleet", "the fleet file", true);
        List<ClusterSpec> clusters = new ArrayList<>();
        Set<Id> seen = new HashSet<>();
        YList list = top.get("clusters").map(n -> f.asList(n, "clusters")).orElse(null);
        if (list == null && !top.has("clusters")) f.add(top, "clusters", "the fleet file needs 'clusters'");
        if (list != null) {
            for (YNode item : list.items()) {
                ClusterSpec c = cluster(f, item);
                if (c == null) continue;
                if (!seen.add(c.id())) {
                    f.add(item, "id", "cluster " + c.id() + " is listed twice");
                    continue;
                }
                clusters.add(c);
            }
        }
        f.throwIfAny();
        return Fleet.of(name, clusters);
    }

    private static ClusterSpec cluster(Fields f, YNode node) {
        YMap m = f.asMap(node, "clusters[]");
        if (m == null) return null;
        f.allowOnly(m, "a cluster", CLUSTER);
        Id id = f.id(m, "id", "a cluster", true);
        String where = "cluster " + (id == null ? "?" : id.value());
        Map<String, String> tags = tags(f, m, where);
        Replication replication = null;
        if (m.has("replication")) {
            YMap r = f.asMap(m.get("replication").get(), "replication");
            if (r != null) {
                f.allowOnly(r, where + " replication", REPLICATION);
                Integer factor = f.integer(r, "factor", where + " replication", true, 1, 100);
                Integer min = f.integer(r, "min-in-sync", where + " replication", true, 1, 100);
                if (factor != null && min != null) {
                    if (min > factor) {
                        f.add(r.get("min-in-sync").get(), "min-in-sync", where + ": replication.min-in-sync (" + min
                                + ") cannot exceed replication.factor (" + factor + ")");
                    } else {
                        replication = new Replication(factor, min);
                    }
                }
            }
        }
        Boolean quorum = f.bool(m, "quorum", where, false);
        List<NodeSpec> nodes = new ArrayList<>();
        Set<Id> seen = new HashSet<>();
        YList list = m.get("nodes").map(n -> f.asList(n, where + " nodes")).orElse(null);
        if (list != null) {
            for (YNode item : list.items()) {
                YMap nm = f.asMap(item, where + " nodes[]");
                if (nm == null) continue;
                f.allowOnly(nm, "a node of " + where, NODE);
                Id nid = f.id(nm, "id", "a node of " + where, true);
                String zone = f.parsed(nm, "zone", "a node of " + where, false, z -> Id.of(z).value());
                Map<String, String> ntags = tags(f, nm, "node " + nid);
                if (nid == null) continue;
                if (!seen.add(nid)) {
                    f.add(item, "id", "node " + nid + " is listed twice in " + where);
                    continue;
                }
                nodes.add(new NodeSpec(nid, zone, ntags));
            }
        }
        if (id == null) return null;
        return new ClusterSpec(id, tags, replication, quorum != null && quorum, nodes);
    }

    private static Map<String, String> tags(Fields f, YMap m, String where) {
        Map<String, String> tags = new LinkedHashMap<>();
        if (!m.has("tags")) return tags;
        YMap t = f.asMap(m.get("tags").get(), where + " tags");
        if (t == null) return tags;
        for (YMap.Entry e : t.entries()) {
            if (e.value() instanceof YScalar s && !s.plainNull()) tags.put(e.key().value(), s.value());
            else f.add(e.value(), e.key().value(), where + ": tag '" + e.key().value() + "' must be a single value");
        }
        return tags;
    }
}
