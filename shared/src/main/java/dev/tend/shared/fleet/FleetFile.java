package dev.tend.shared.fleet;

import dev.tend.shared.Id;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.yaml.Fields;
import dev.tend.shared.yaml.YList;
import dev.tend.shared.yaml.RenamedKeys;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;
import dev.tend.shared.yaml.YScalar;
import dev.tend.shared.yaml.StreamedDocument;
import dev.tend.shared.yaml.YamlDocument;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * Loads a fleet file (YAML or JSON, DESIGN.md section 3). Every problem is reported at
 * once, located and in reading order, through {@link InvalidInputException}; messages
 * name the place by path, e.g. {@code clusters[0].replication.min-healthy}.
 */
public final class FleetFile {
    private static final List<String> TOP = List.of("fleet", "clusters");
    private static final List<String> CLUSTER = List.of("id", "tags", "replication", "quorum", "nodes");
    private static final List<String> NODE = List.of("id", "zone", "tags");
    private static final List<String> REPLICATION = List.of("factor", "min-healthy");
    private static final RenamedKeys RENAMED_REPLICATION = RenamedKeys.of("min-in-sync", "min-healthy");

    private FleetFile() {
    }

    /**
     * Loads the fleet file at {@code file}. Clusters are read one at a time (see
     * {@link StreamedDocument}), so a fleet of 100,000 nodes loads in seconds and in memory
     * proportional to the fleet itself, not to the file's parse tree.
     */
    public static Fleet load(Path file) {
        Fields f = new Fields(file.toString());
        Clusters clusters = new Clusters(f);
        YNode root;
        try {
            root = StreamedDocument.read(file, "clusters", clusters::add);
        } catch (InvalidInputException e) {
            f.addAll(e.problems());
            throw invalid(f);
        }
        return top(f, root, clusters);
    }

    public static Fleet parse(String source, String text) {
        Fields f = new Fields(source);
        return top(f, YamlDocument.parse(source, text), new Clusters(f));
    }

    /** The top level; clusters not streamed into {@code clusters} yet are read from {@code root}. */
    private static Fleet top(Fields f, YNode root, Clusters clusters) {
        YMap top = f.asMap(root, "a fleet file");
        if (top == null) throw invalid(f);
        f.allowOnly(top, "the fleet file", TOP);
        String name = null;
        Optional<YNode> nameNode = f.node(top, "fleet", "the fleet file", true);
        if (nameNode.isPresent()) name = f.parsedNode(nameNode.get(), "fleet", v -> v);
        Optional<YNode> listNode = f.node(top, "clusters", "the fleet file", true);
        YList list = listNode.map(n -> f.asList(n, "clusters")).orElse(null);
        if (list != null) {
            for (int i = 0; i < list.items().size(); i++) clusters.add(i, list.items().get(i));
        }
        if (f.hasProblems()) throw invalid(f);
        return Fleet.of(name, clusters.specs);
    }

    /** The clusters read so far, each checked as it comes. */
    private static final class Clusters {
        private final Fields f;
        private final List<ClusterSpec> specs = new ArrayList<>();
        private final Map<Id, Integer> seen = new HashMap<>();
        /** One id per node name across the fleet (n1 of every cluster is the same instance): lookups then match by identity. */
        private final Map<Id, Id> nodeIds = new HashMap<>();

        Clusters(Fields f) {
            this.f = f;
        }

        void add(int i, YNode item) {
            ClusterSpec c = cluster(f, item, "clusters[" + i + "]", nodeIds);
            if (c == null) return;
            Integer first = seen.putIfAbsent(c.id(), i);
            if (first != null) {
                f.add(item, "id", "clusters[" + i + "]: cluster " + c.id() + " is listed twice; the first is clusters[" + first + "]");
                return;
            }
            specs.add(c);
        }
    }

    /** Null after recording a problem. {@code where} is the cluster's path, e.g. {@code clusters[0]}. */
    private static ClusterSpec cluster(Fields f, YNode node, String where, Map<Id, Id> nodeIds) {
        YMap m = f.asMap(node, where);
        if (m == null) return null;
        f.allowOnly(m, where, CLUSTER);
        Id id = f.id(m, "id", where, true);
        Map<String, String> tags = tags(f, m, where);
        Replication replication = null;
        if (m.has("replication")) {
            String rw = where + ".replication";
            YMap r = f.asMap(m.get("replication").get(), rw);
            if (r != null) {
                f.allowOnly(r, rw, REPLICATION, RENAMED_REPLICATION);
                Integer factor = f.integer(r, "factor", rw, true, 1, 100);
                Integer min = f.integer(r, "min-healthy", rw, !RENAMED_REPLICATION.writtenIn(r, "min-in-sync"), 1, 100);
                if (factor != null && min != null) {
                    if (min > factor) {
                        f.add(r.get("min-healthy").get(), "min-healthy", rw + ".min-healthy (" + min
                                + ") cannot exceed " + rw + ".factor (" + factor + "): there are only " + factor + " copies");
                    } else {
                        replication = new Replication(factor, min);
                    }
                }
            }
        }
        Boolean quorum = f.bool(m, "quorum", where, false);
        List<NodeSpec> nodes = new ArrayList<>();
        Map<Id, Integer> seen = new HashMap<>();
        YList list = m.get("nodes").map(n -> f.asList(n, where + ".nodes")).orElse(null);
        if (list != null) {
            for (int i = 0; i < list.items().size(); i++) {
                YNode item = list.items().get(i);
                String nw = where + ".nodes[" + i + "]";
                YMap nm = f.asMap(item, nw);
                if (nm == null) continue;
                f.allowOnly(nm, nw, NODE);
                Id nid = f.id(nm, "id", nw, true);
                String zone = f.parsed(nm, "zone", nw, false, z -> Id.of(z).value());
                Map<String, String> ntags = tags(f, nm, nw);
                if (nid == null) continue;
                Integer first = seen.putIfAbsent(nid, i);
                if (first != null) {
                    f.add(item, "id", nw + ": node " + nid + " is listed twice; the first is " + where + ".nodes[" + first + "]");
                    continue;
                }
                Id shared = nodeIds.putIfAbsent(nid, nid);
                nodes.add(new NodeSpec(shared == null ? nid : shared, zone, ntags));
            }
        }
        if (id == null) return null;
        return new ClusterSpec(id, tags, replication, quorum != null && quorum, nodes);
    }

    private static Map<String, String> tags(Fields f, YMap m, String where) {
        Map<String, String> tags = new LinkedHashMap<>();
        if (!m.has("tags")) return tags;
        YMap t = f.asMap(m.get("tags").get(), where + ".tags");
        if (t == null) return tags;
        for (YMap.Entry e : t.entries()) {
            if (e.value() instanceof YScalar s && !s.plainNull()) tags.put(e.key().value(), s.value());
            else f.add(e.value(), e.key().value(), where + ".tags." + e.key().value() + " must be a single value, got "
                    + Fields.kindOf(e.value()));
        }
        return tags;
    }

    /** Every problem recorded, in reading order (by line, then column), so a person can fix the file top to bottom. */
    private static InvalidInputException invalid(Fields f) {
        List<Problem> problems = new ArrayList<>(f.problems());
        problems.sort(Comparator.comparingInt(Problem::line).thenComparingInt(Problem::column));
        return new InvalidInputException(problems);
    }
}
