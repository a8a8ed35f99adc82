package dev.tend.api.view;

import java.util.List;

/**
 * What {@code POST /api/v1/transitions} did with a body.
 *
 * @param accepted transitions and topology events applied (committed)
 * @param rejected lines refused, each in {@code problems} (at most the first 1000)
 */
public record TransitionsOutcome(long accepted, long rejected, List<LineProblem> problems) {
    public TransitionsOutcome {
        problems = List.copyOf(problems);
    }
}
