package dev.tend.simulator.synth;

import dev.tend.shared.Id;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.NodeSpec;
import dev.tend.shared.fleet.Replication;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * An invented Larkspur fleet of any size, shaped like the bundled one: broker clusters for
 * fares, dispatch, tickets, telemetry and schedules plus majority-quorum coordination
 * ensembles, nodes spread over zones z-a, z-b and z-c, replication chosen so that every
 * cluster bears one node in three impaired. The same size gives the same fleet.
 */
public final class SyntheticFleet {
    /** The zones, in order. */
    public static final List<String> ZONES = List.of("z-a", "z-b", "z-c");

    private record Family(String name, String team, String kind) {
    }

    // one cycle of 50 clusters: 8 fares, 8 dispatch, 10 tickets, 12 telemetry, 9 schedules, 3 coord
    private static final Family[] CYCLE = cycle();

    private SyntheticFleet() {
    }

    private static Family[] cycle() {
        Family fares = new Family("fares", "payments", "broker");
        Family dispatch = new Family("dispatch", "operations", "broker");
        Family tickets = new Family("tickets", "ticketing", "broker");
        Family telemetry = new Family("telemetry", "vehicle-data", "broker");
        Family schedules = new Family("schedules", "planning", "broker");
        Family coord = new Family("coord", "platform", "coordination");
        List<Family> c = new ArrayList<>();
        Object[][] plan = {{fares, 8}, {dispatch, 8}, {tickets, 10}, {telemetry, 12}, {schedules, 9}, {coord, 3}};
        // interleave, so that any prefix of the fleet has every family
        int[] left = new int[plan.length];
        for (int i = 0; i < plan.length; i++) left[i] = (Integer) plan[i][1];
        while (c.size() < 50) {
            for (int i = 0; i < plan.length; i++) {
                if (left[i]-- > 0) c.add((Family) plan[i][0]);
            }
        }
        return c.toArray(new Family[0]);
    }

    /** {@code clusters} clusters, at least 1. */
    public static Fleet of(int clusters) {
        if (clusters < 1) throw new IllegalArgumentException("clusters must be at least 1, got " + clusters);
        Map<String, Integer> numbers = new LinkedHashMap<>();
        List<ClusterSpec> out = new ArrayList<>(clusters);
        for (int i = 0; i < clusters; i++) {
            Family f = CYCLE[i % CYCLE.length];
            int n = numbers.merge(f.name(), 1, Integer::sum);
            out.add(cluster(i, f, n));
        }
        return Fleet.of("larkspur-synthetic", out);
    }

    private static ClusterSpec cluster(int index, Family f, int number) {
        String tier = switch (f.name()) {
            case "fares", "coord" -> number % 3 == 1 ? "critical" : "standard";
            case "dispatch" -> number % 5 < 2 ? "critical" : "standard";
            case "telemetry" -> "bulk";
            case "tickets" -> number % 4 == 0 ? "bulk" : "standard";
            default -> "standard";
        };
        int size = f.kind().equals("coordination") ? (number % 2 == 0 ? 5 : 3)
                : f.name().equals("telemetry") && number % 3 == 0 ? 6 : number % 4 == 3 ? 5 : 3;
        Replication replication = f.kind().equals("coordination") ? null
                : size == 6 ? new Replication(3, 1) : size == 5 ? new Replication(5, 3) : new Replication(3, 2);
        List<NodeSpec> nodes = new ArrayList<>(size);
        for (int j = 0; j < size; j++) {
            nodes.add(new NodeSpec(Id.of("n" + (j + 1)), ZONES.get((index + j) % ZONES.size()), Map.of()));
        }
        Map<String, String> tags = new LinkedHashMap<>();
        tags.put("tier", tier);
        tags.put("team", f.team());
        tags.put("kind", f.kind());
        return new ClusterSpec(Id.of(f.name() + "-" + number), tags, replication, f.kind().equals("coordination"), nodes);
    }

    /** The fleet file (YAML, the shape of DESIGN.md section 3) for {@code fleet}. */
    public static String yaml(Fleet fleet) {
        StringBuilder sb = new StringBuilder(fleet.size() * 200);
        sb.append("# A synthetic fleet written by `tend record --synthesize`. INVENTED: Larkspur is a fictional\n")
                .append("# city transit data platform; every cluster and tag here is made up.\n")
                .append("fleet: ").append(fleet.name()).append('\n').append("clusters:\n");
        for (ClusterSpec c : fleet.clusters()) {
            sb.append("  - id: ").append(c.id()).append('\n');
            // ClusterSpec keeps tags in an unordered map; a fixed key order keeps the file the same on every run
            sb.append("    tags: { tier: ").append(c.tags().get("tier")).append(", team: ").append(c.tags().get("team"))
                    .append(", kind: ").append(c.tags().get("kind")).append(" }\n");
            if (c.replication() != null) {
                sb.append("    replication: { factor: ").append(c.replication().factor()).append(", min-healthy: ")
                        .append(c.replication().minHealthy()).append(" }\n");
            }
            if (c.quorum()) sb.append("    quorum: true\n");
            sb.append("    nodes:\n");
            for (NodeSpec n : c.nodes()) sb.append("      - { id: ").append(n.id()).append(", zone: ").append(n.zone()).append(" }\n");
        }
        return sb.toString();
    }
}
