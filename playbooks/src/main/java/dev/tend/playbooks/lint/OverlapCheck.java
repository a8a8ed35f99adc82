package dev.tend.playbooks.lint;

import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.Trigger;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;

import java.util.ArrayList;
import java.util.List;

/** The {@code overlap} check: pairs of live playbooks that can react to the same transition. */
final class OverlapCheck {
    private OverlapCheck() {
    }

    static List<Finding> check(List<Playbook> playbooks, Fleet fleetOrNull) {
        List<Finding> out = new ArrayList<>();
        for (int j = 0; j < playbooks.size(); j++) {
            Playbook b = playbooks.get(j);
            if (b.isShadow()) continue;
            for (int i = 0; i < j; i++) {
                Playbook a = playbooks.get(i);
                if (a.isShadow() || !a.trigger().sameEvent(b.trigger())) continue;
                String where = fleetOrNull == null ? overlapByTags(a, b) : overlapInFleet(a, b, fleetOrNull);
                if (where == null) continue;
                Trigger t = b.trigger();
                out.add(Lint.finding(Severity.ERROR, Lint.OVERLAP, b, b.position("trigger"), "playbooks '" + a.id() + "' ("
                        + a.source() + ":" + a.position("trigger").line() + ") and '" + b.id() + "' can both match the same transition: "
                        + t.signal() + " " + t.state().wireName() + " at " + t.scope().wireName() + " scope " + where
                        + "; make their cluster selectors disjoint, or put one of them in shadow mode"));
            }
        }
        return out;
    }

    private static String overlapByTags(Playbook a, Playbook b) {
        if (!a.trigger().clusters().overlaps(b.trigger().clusters())) return null;
        return "on any cluster whose tags match both " + a.trigger().clusters() + " and " + b.trigger().clusters();
    }

    private static String overlapInFleet(Playbook a, Playbook b, Fleet fleet) {
        String first = null;
        int count = 0;
        for (ClusterSpec c : fleet.clusters()) {
            if (a.trigger().clusters().matches(c.tags()) && b.trigger().clusters().matches(c.tags())) {
                if (first == null || c.id().value().compareTo(first) < 0) first = c.id().value();
                count++;
            }
        }
        if (count == 0) return null;
        return "on " + count + (count == 1 ? " cluster (" : " clusters, e.g. ") + first + (count == 1 ? ")" : "");
    }
}
