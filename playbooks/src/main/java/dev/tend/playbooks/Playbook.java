package dev.tend.playbooks;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;

import java.util.ArrayList;
import java.util.Collections;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.Set;
import java.util.TreeMap;

/**
 * A playbook (DESIGN.md section 5, v1 shape), validated and immutable.
 *
 * @param id          unique within a playbook directory
 * @param version     at least 1; 1 when not written
 * @param description free text, never null (empty when not written)
 * @param mode        live or shadow
 * @param when        the transitions it reacts to
 * @param unless      masks: signals that explain the problem and forbid acting
 * @param limits      limits as written; unset fields fall back to the fleet-wide defaults
 * @param window      the change window, or null when changes are allowed at any time
 * @param approval    when a human must approve, or null when never
 * @param steps       at least one step, run in order
 * @param onFailure   steps run when a step fails, in order (possibly none)
 * @param source      the file path it was read from
 * @param contentHash SHA-256 hex of the file's bytes
 * @param line        line of the {@code playbook:} key, for messages
 * @param column      column of the {@code playbook:} key
 * @param positions   where parts were written, by path ({@code trigger}, {@code trigger.clusters},
 *                    {@code limits.impaired-fraction}, {@code window}, {@code steps.<id>},
 *                    {@code on-failure.<id>}, {@code on-stand-down.<id>}); see {@link #position(String)}
 * @param onStandDown steps run when a run stands down because its problem went away or a
 *                    mask or exclusion now applies (DESIGN.md section 4), in order (possibly none):
 *                    undo what the steps so far began, such as a drain
 */
public record Playbook(Id id, int version, String description, Mode mode, Trigger trigger, List<MaskRule> unless,
                       Limits limits, ChangeWindow window, ApprovalPolicy approval, List<Step> steps,
                       List<Step> onFailure, String source, String contentHash, int line, int column,
                       Map<String, Position> positions, List<Step> onStandDown) {
    public Playbook {
        Objects.requireNonNull(id, "playbook");
        if (version < 1) throw new IllegalArgumentException("playbook " + id + " version must be at least 1, got " + version);
        description = description == null ? "" : description;
        Objects.requireNonNull(mode, "mode");
        Objects.requireNonNull(trigger, "trigger");
        unless = List.copyOf(unless);
        limits = limits == null ? Limits.none() : limits;
        steps = List.copyOf(steps);
        onFailure = List.copyOf(onFailure);
        onStandDown = onStandDown == null ? List.of() : List.copyOf(onStandDown);
        if (steps.isEmpty()) throw new IllegalArgumentException("playbook " + id + " needs at least one step");
        Set<Id> ids = new HashSet<>();
        for (Step s : steps) if (!ids.add(s.id())) throw new IllegalArgumentException("playbook " + id + " uses step id " + s.id() + " twice");
        for (Step s : onFailure) if (!ids.add(s.id())) throw new IllegalArgumentException("playbook " + id + " uses step id " + s.id() + " twice");
        for (Step s : onStandDown) if (!ids.add(s.id())) throw new IllegalArgumentException("playbook " + id + " uses step id " + s.id() + " twice");
        Objects.requireNonNull(source, "source");
        Objects.requireNonNull(contentHash, "contentHash");
        positions = Collections.unmodifiableMap(new TreeMap<>(positions));
    }

    public boolean isShadow() {
        return mode == Mode.SHADOW;
    }

    /** True when {@code t} on a cluster with {@code clusterTags} satisfies {@link #trigger()}. */
    public boolean matches(HealthTransition t, Map<String, String> clusterTags) {
        return trigger.matches(t, clusterTags);
    }

    /** The step (of steps or on-failure) with this id. */
    public Optional<Step> step(Id stepId) {
        for (Step s : allSteps()) if (s.id().equals(stepId)) return Optional.of(s);
        return Optional.empty();
    }

    /** Steps, then on-failure steps, then on-stand-down steps, in order. */
    public List<Step> allSteps() {
        List<Step> all = new ArrayList<>(steps);
        all.addAll(onFailure);
        all.addAll(onStandDown);
        return List.copyOf(all);
    }

    /** Where {@code path} was written, or where the playbook starts when that is not known. */
    public Position position(String path) {
        Position p = positions.get(path);
        return p != null ? p : new Position(line, column);
    }
}
