package dev.tend.api.view;

import java.util.List;

/**
 * A loaded playbook as the console shows it: what it is for and the steps a run goes through.
 *
 * @param mode  live or shadow
 * @param steps its steps in order (on-failure steps not included)
 */
public record PlaybookView(String playbook, int version, String description, String mode, List<PlannedStep> steps) {
    public PlaybookView {
        steps = List.copyOf(steps);
    }

    /**
     * One step as written.
     *
     * @param kind   action, wait-healthy or page
     * @param detail the action's name, the signals waited for, or the channel notified
     */
    public record PlannedStep(String step, String kind, String detail) {
    }
}
