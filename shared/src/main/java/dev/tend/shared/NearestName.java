package dev.tend.shared;

import java.util.Collection;
import java.util.Optional;
import java.util.TreeSet;

/**
 * "Did you mean ...?": the known name closest to a mistyped one, by Levenshtein edit
 * distance (insertions, deletions and substitutions of one character each count one).
 * Ties go to the name that sorts first, so the suggestion does not depend on the order
 * of {@code known}. Stateless.
 */
public final class NearestName {
    private NearestName() {
    }

    /** The known name at most {@code maxDistance} edits from {@code name}, other than {@code name} itself. */
    public static Optional<String> among(String name, Collection<String> known, int maxDistance) {
        String best = null;
        int bestDistance = maxDistance + 1;
        for (String k : new TreeSet<>(known)) {
            if (k.equals(name)) continue;
            int d = distance(name, k);
            if (d < bestDistance) {
                best = k;
                bestDistance = d;
            }
        }
        return Optional.ofNullable(best);
    }

    /** The Levenshtein edit distance between {@code a} and {@code b}. */
    public static int distance(String a, String b) {
        int[] prev = new int[b.length() + 1];
        int[] cur = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) prev[j] = j;
        for (int i = 1; i <= a.length(); i++) {
            cur[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int cost = a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1;
                cur[j] = Math.min(Math.min(cur[j - 1] + 1, prev[j] + 1), prev[j - 1] + cost);
            }
            int[] t = prev;
            prev = cur;
            cur = t;
        }
        return prev[b.length()];
    }
}
