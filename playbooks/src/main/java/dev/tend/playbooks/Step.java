package dev.tend.playbooks;

import dev.tend.shared.Id;

/**
 * One step of a playbook's {@code steps} or {@code on-failure}: call an action, wait until
 * signals are healthy, or page a channel. Ids are unique within a playbook (steps and
 * on-failure together).
 */
public sealed interface Step permits ActionStep, WaitHealthyStep, PageStep {
    Id id();

    /** The playbook key that names this kind of step: {@code action}, {@code wait-healthy} or {@code page}. */
    String kind();
}
