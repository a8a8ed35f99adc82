package dev.tend.cli;

import dev.tend.engine.LedgerKind;
import org.apache.commons.text.similarity.LevenshteinDistance;

import java.util.Arrays;
import java.util.Collection;
import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;
import java.util.stream.Collectors;

/**
 * The kinds of ledger entries {@code tend audit --kind} can filter on: those tend writes,
 * and any other kind a given ledger holds (an older or newer version may write more). A
 * kind outside both is a typing mistake, answered with the nearest known kind.
 */
final class LedgerKinds {
    /** The kinds tend writes (the engine, the driver, the courier, the API). */
    static final Set<String> WRITTEN = Arrays.stream(LedgerKind.values()).map(LedgerKind::wire)
            .collect(Collectors.toUnmodifiableSet());

    /** Edits at most this far from a known kind are offered as "did you mean". */
    private static final int NEAR = 3;

    private LedgerKinds() {
    }

    /** Every kind known for a ledger that holds {@code present}, sorted. */
    static TreeSet<String> known(Collection<String> present) {
        TreeSet<String> all = new TreeSet<>(WRITTEN);
        all.addAll(present);
        return all;
    }

    /** The known kind nearest to {@code kind} by edit distance (Levenshtein, via Apache Commons Text), if near enough. */
    static Optional<String> nearest(String kind, Collection<String> known) {
        LevenshteinDistance distance = new LevenshteinDistance(NEAR);
        String best = null;
        int bestDistance = Integer.MAX_VALUE;
        for (String k : new TreeSet<>(known)) {
            int d = distance.apply(kind, k);
            if (d >= 0 && d < bestDistance) {
                best = k;
                bestDistance = d;
            }
        }
        return Optional.ofNullable(best);
    }
}
