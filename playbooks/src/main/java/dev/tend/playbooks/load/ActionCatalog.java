package dev.tend.playbooks.load;

import dev.tend.playbooks.ActionDef;
import dev.tend.playbooks.Actions;
import dev.tend.shared.Id;

import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;

/**
 * What playbooks may refer to: the actions that loaded, plus the ids of actions that were
 * declared but had problems of their own (so a broken action is not reported a second time
 * as undefined by every step that names it).
 */
record ActionCatalog(Actions actions, Set<Id> declared, boolean fileExists, boolean readable) {
    ActionCatalog {
        declared = Set.copyOf(declared);
    }

    static ActionCatalog of(Actions actions) {
        return new ActionCatalog(actions, actions.ids(), actions.source() != null || !actions.ids().isEmpty(), true);
    }

    /** For an actions.yaml that could not be parsed at all: every name counts as declared, so nothing cascades. */
    static ActionCatalog unreadable() {
        return new ActionCatalog(Actions.empty(), Set.of(), true, false);
    }

    boolean isDeclared(Id id) {
        return !readable || declared.contains(id);
    }

    Optional<ActionDef> get(Id id) {
        return actions.get(id);
    }

    /** "defined actions: a, b, c" or why there are none. */
    String describeDefined() {
        if (declared.isEmpty()) {
            return fileExists ? "actions.yaml defines no actions" : "there is no actions.yaml in the playbook directory, so no action is defined";
        }
        return "the defined actions are: " + String.join(", ", new TreeSet<>(declared.stream().map(Id::value).toList()));
    }
}
