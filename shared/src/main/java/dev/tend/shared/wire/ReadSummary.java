package dev.tend.shared.wire;

import dev.tend.shared.Problem;

import java.util.List;

/**
 * The counts of one {@link WireReader#readAll} pass.
 *
 * @param lines           lines read; equals events + headers + blanks + bad
 * @param events          health transitions and topology events handed on
 * @param headers         recording headers handed on (0 or 1)
 * @param blanks          empty lines
 * @param bad             rejected lines
 * @param problems        the problems of the first {@link WireReader#MAX_PROBLEMS_KEPT} bad
 *                        lines, in line order; unmodifiable
 * @param problemsOmitted bad lines after those, counted but not kept
 */
public record ReadSummary(long lines, long events, long headers, long blanks, long bad,
                          List<Problem> problems, long problemsOmitted) {
    public ReadSummary {
        if (lines < 0 || events < 0 || headers < 0 || blanks < 0 || bad < 0 || problemsOmitted < 0) {
            throw new IllegalArgumentException("counts must not be negative");
        }
        if (lines != events + headers + blanks + bad) {
            throw new IllegalArgumentException("lines (" + lines + ") must equal events + headers + blanks + bad ("
                    + (events + headers + blanks + bad) + ")");
        }
        problems = List.copyOf(problems);
        if (problems.size() + problemsOmitted != bad) {
            throw new IllegalArgumentException("problems kept (" + problems.size() + ") plus omitted ("
                    + problemsOmitted + ") must equal bad lines (" + bad + ")");
        }
    }

    /** True when no line was rejected. */
    public boolean isClean() {
        return bad == 0;
    }
}
