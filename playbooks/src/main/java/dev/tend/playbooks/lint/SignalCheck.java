package dev.tend.playbooks.lint;

import dev.tend.playbooks.MaskRule;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.SimulatedAction;
import dev.tend.playbooks.Step;
import dev.tend.playbooks.WaitHealthyStep;
import dev.tend.shared.Id;
import dev.tend.shared.NearestName;

import java.util.List;
import java.util.Set;
import java.util.TreeSet;

/**
 * Signal names that can never match. With a declared vocabulary (tend.yaml {@code signals:}),
 * a playbook that triggers or masks on a signal outside it is an error
 * ({@code undeclared-signal}): the wire refuses such lines, so the playbook could never act, or
 * its mask never hold. Without one, a trigger signal that nothing else names (no other
 * playbook's trigger, no mask, no wait-healthy step, no simulated action's clears) and that is
 * one edit away from a signal something does name is a warning ({@code signal-typo}): the
 * {@code replica-lagg} that never matches a transition.
 */
final class SignalCheck {
    /** How close a name must be to count as a typo of another (common practice, no source). */
    private static final int TYPO_DISTANCE = 1;

    private SignalCheck() {
    }

    static void check(PlaybookSet set, List<Finding> out) {
        if (set.config().declaresSignals()) {
            Set<String> declared = new TreeSet<>();
            for (Id s : set.config().signals()) declared.add(s.value());
            for (Playbook p : set.playbooks()) {
                undeclared(p, p.trigger().signal(), "triggers", "trigger", declared, out);
                for (MaskRule m : p.unless()) undeclared(p, m.signal(), "masks", "unless", declared, out);
            }
            return;
        }
        for (Playbook p : set.playbooks()) {
            String trigger = p.trigger().signal().value();
            Set<String> others = namedBesides(set, p);
            if (others.contains(trigger)) continue;
            NearestName.among(trigger, others, TYPO_DISTANCE).ifPresent(near -> out.add(Lint.finding(Severity.WARNING, Lint.SIGNAL_TYPO,
                    p, p.position("trigger"), "trigger signal '" + trigger + "' is named nowhere else, and is one edit away from '"
                            + near + "', which is; if it is a typo, this playbook never matches a transition (declare the"
                            + " fleet's signals in tend.yaml to make this an error)")));
        }
    }

    private static void undeclared(Playbook p, Id signal, String verb, String where, Set<String> declared, List<Finding> out) {
        if (declared.contains(signal.value())) return;
        out.add(Lint.finding(Severity.ERROR, Lint.UNDECLARED_SIGNAL, p, p.position(where), "playbook " + verb + " on signal '"
                + signal + "', which tend.yaml does not declare" + NearestName.among(signal.value(), declared, 2)
                .map(n -> " (did you mean '" + n + "'?)").orElse("") + "; lines with it are refused, so it can never "
                + (verb.equals("triggers") ? "match" : "mask")));
    }

    /** Every signal named in the set except by {@code p}'s own trigger. */
    private static Set<String> namedBesides(PlaybookSet set, Playbook p) {
        Set<String> out = new TreeSet<>();
        for (Playbook q : set.playbooks()) {
            if (q != p) out.add(q.trigger().signal().value());
            for (MaskRule m : q.unless()) out.add(m.signal().value());
            for (Step s : q.allSteps()) if (s instanceof WaitHealthyStep w) w.signals().forEach(id -> out.add(id.value()));
        }
        for (Id a : set.actions().ids()) {
            if (set.actions().get(a).orElse(null) instanceof SimulatedAction s) s.clears().forEach(id -> out.add(id.value()));
        }
        return out;
    }
}
