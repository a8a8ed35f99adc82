package dev.tend.playbooks;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;

import java.util.List;

/**
 * A playbook directory, playbook, {@code actions.yaml} or {@code tend.yaml} that cannot be
 * loaded. Carries every located problem of every file, so all can be fixed in one pass.
 */
public class PlaybookInvalidException extends InvalidInputException {
    public PlaybookInvalidException(List<Problem> problems) {
        super(problems);
    }
}
