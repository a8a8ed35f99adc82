package dev.tend.playbooks;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;

/**
 * A loaded playbook directory: its playbooks in file-name order, its actions and its
 * fleet-wide policy. Immutable and thread-safe.
 */
public final class PlaybookSet {
    private final List<Playbook> playbooks;
    private final Map<Id, Playbook> byId;
    private final Actions actions;
    private final TendConfig config;

    private PlaybookSet(List<Playbook> playbooks, Actions actions, TendConfig config) {
        this.playbooks = List.copyOf(playbooks);
        this.actions = Objects.requireNonNull(actions, "actions");
        this.config = Objects.requireNonNull(config, "config");
        Map<Id, Playbook> map = new HashMap<>();
        for (Playbook p : this.playbooks) {
            Playbook first = map.putIfAbsent(p.id(), p);
            if (first != null) {
                throw new IllegalArgumentException("playbook " + p.id() + " is defined in both " + first.source() + " and " + p.source());
            }
            for (Step s : p.allSteps()) {
                if (s instanceof ActionStep a && actions.get(a.action()).isEmpty()) {
                    throw new IllegalArgumentException("playbook " + p.id() + " step " + a.id() + " names undefined action " + a.action());
                }
            }
        }
        this.byId = Map.copyOf(map);
    }

    /** Playbooks in the given order; ids must be unique and every action step's action defined. */
    public static PlaybookSet of(List<Playbook> playbooks, Actions actions, TendConfig config) {
        return new PlaybookSet(playbooks, actions, config);
    }

    /** Playbooks in file-name order. */
    public List<Playbook> playbooks() {
        return playbooks;
    }

    public Optional<Playbook> playbook(Id id) {
        return Optional.ofNullable(byId.get(id));
    }

    public Actions actions() {
        return actions;
    }

    public TendConfig config() {
        return config;
    }

    /** {@link TendConfig#effectiveLimits(Playbook)} of this set's policy. */
    public EffectiveLimits effectiveLimits(Playbook playbook) {
        return config.effectiveLimits(playbook);
    }

    /**
     * The playbooks whose {@code when} the transition satisfies on a cluster with
     * {@code clusterTags}, in file-name order. Masks, limits and windows are not looked at
     * here; they are guards.
     */
    public List<Playbook> match(HealthTransition t, Map<String, String> clusterTags) {
        // asked for every problem a fleet reports: no iterator, and no list at all when nothing matches
        List<Playbook> out = null;
        for (int i = 0; i < playbooks.size(); i++) {
            Playbook p = playbooks.get(i);
            if (p.matches(t, clusterTags)) {
                if (out == null) out = new ArrayList<>(2);
                out.add(p);
            }
        }
        return out == null ? List.of() : List.copyOf(out);
    }

    public int size() {
        return playbooks.size();
    }
}
