package dev.tend.replay;

import dev.tend.playbooks.ActionDef;
import dev.tend.playbooks.Actions;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.shared.Id;
import dev.tend.shared.json.Sha256;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * {@code --actions FILE}: the actions of another actions.yaml replace the playbook set's
 * actions of the same id for a replay (say, a simulated stand-in for a command action, or a
 * slower or less reliable variant); actions it does not name stay as they were.
 */
public final class ActionOverrides {
    private ActionOverrides() {
    }

    /**
     * {@code policy} with {@code overrides} laid over its actions. The result's actions hash
     * is the SHA-256 of both files' hashes, so a report tells the combination apart.
     *
     * @throws IllegalArgumentException when a playbook would name an undefined action (it cannot: actions are only added or replaced)
     */
    public static PlaybookSet apply(PlaybookSet policy, Actions overrides) {
        Map<Id, ActionDef> merged = new LinkedHashMap<>(policy.actions().byId());
        merged.putAll(overrides.byId());
        String hash = Sha256.hexOf(String.valueOf(policy.actions().contentHash()), String.valueOf(overrides.contentHash()));
        String source = policy.actions().source() == null ? overrides.source() : policy.actions().source() + " + " + overrides.source();
        return PlaybookSet.of(policy.playbooks(), new Actions(merged, source, hash), policy.config());
    }
}
