package dev.tend.shared.fleet;

import dev.tend.shared.Id;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;

import static org.assertj.core.api.Assertions.assertThat;

class FleetTest {
    private static ClusterSpec cluster(String id, String... nodes) {
        List<NodeSpec> ns = new ArrayList<>();
        for (String n : nodes) ns.add(new NodeSpec(Id.of(n), "z-a", Map.of()));
        return new ClusterSpec(Id.of(id), Map.of(), null, false, ns);
    }

    private static List<String> ids(Fleet f) {
        return f.clusters().stream().map(c -> c.id().value()).toList();
    }

    @Test
    void aChangedClusterKeepsItsPlaceAndAnAddedOneComesLast() {
        Fleet f = Fleet.of("larkspur", List.of(cluster("fares-1", "n1"), cluster("fares-2", "n1"), cluster("dispatch-1", "n1")));
        Fleet g = f.withCluster(cluster("fares-2", "n1", "n2")).withCluster(cluster("fares-3", "n1"));

        assertThat(ids(g)).containsExactly("fares-1", "fares-2", "dispatch-1", "fares-3");
        assertThat(g.size()).isEqualTo(4);
        assertThat(g.contains(Id.of("fares-2"), Id.of("n2"))).isTrue();
        assertThat(g.contains(Id.of("fares-3"), null)).isTrue();
        // the fleet it came from is unchanged
        assertThat(ids(f)).containsExactly("fares-1", "fares-2", "dispatch-1");
        assertThat(f.size()).isEqualTo(3);
        assertThat(f.contains(Id.of("fares-2"), Id.of("n2"))).isFalse();
        assertThat(f.cluster(Id.of("fares-3"))).isEmpty();
    }

    @Test
    void manyChangesAnswerAsACopyOfEveryClusterWould() {
        // a model: the whole map copied at each change, what Fleet did before it kept an overlay
        SplittableRandom random = new SplittableRandom(7);
        List<ClusterSpec> start = new ArrayList<>();
        for (int i = 0; i < 400; i++) start.add(cluster("transit-" + i, "n1"));
        Fleet fleet = Fleet.of("larkspur", start);
        Map<Id, ClusterSpec> model = new LinkedHashMap<>();
        for (ClusterSpec c : start) model.put(c.id(), c);
        List<Fleet> kept = new ArrayList<>();
        List<Map<Id, ClusterSpec>> keptModels = new ArrayList<>();
        for (int step = 0; step < 3000; step++) {
            // mostly changes of known clusters, some new ones, across several merges of the overlay
            String id = random.nextInt(10) == 0 ? "added-" + random.nextInt(300) : "transit-" + random.nextInt(400);
            ClusterSpec c = cluster(id, "n" + random.nextInt(1, 6), "n" + random.nextInt(6, 9));
            fleet = fleet.withCluster(c);
            model = new LinkedHashMap<>(model);
            model.put(c.id(), c);
            if (step % 250 == 0) {
                kept.add(fleet);
                keptModels.add(model);
            }
            assertThat(fleet.size()).isEqualTo(model.size());
            assertThat(fleet.cluster(c.id())).contains(c);
        }
        assertThat(new ArrayList<>(fleet.clusters())).isEqualTo(new ArrayList<>(model.values()));
        // every fleet taken on the way still answers as it did then
        for (int i = 0; i < kept.size(); i++) {
            assertThat(new ArrayList<>(kept.get(i).clusters())).isEqualTo(new ArrayList<>(keptModels.get(i).values()));
            for (ClusterSpec c : keptModels.get(i).values()) assertThat(kept.get(i).cluster(c.id())).contains(c);
        }
    }
}
