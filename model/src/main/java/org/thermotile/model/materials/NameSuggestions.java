package org.thermotile.model.materials;

import java.util.Collection;
import java.util.Optional;

/**
 * "Did you mean …?" for identifiers and keys typed by users, by Levenshtein edit distance
 * (Levenshtein 1966; insert, delete and substitute each cost 1), case-insensitive.
 */
public final class NameSuggestions {
    private NameSuggestions() {}

    /**
     * The known name closest to {@code typed}, if it is close enough to be a plausible typo:
     * distance ≤ max(2, a third of the typed length). Failing that, an abbreviation: the shortest
     * known name that contains all of {@code typed}'s letters in order ("temp_c" → "temperature_c"),
     * for typed names of 3 letters or more. Ties go to the earlier name in {@code known}'s
     * iteration order, so the answer is deterministic.
     *
     * @param typed what the user wrote
     * @param known the valid names
     * @return the suggestion, or empty when nothing is close
     */
    public static Optional<String> closest(String typed, Collection<String> known) {
        if (typed == null) {
            return Optional.empty();
        }
        String t = typed.toLowerCase(java.util.Locale.ROOT);
        String best = null;
        int bestDistance = Integer.MAX_VALUE;
        for (String k : known) {
            int d = editDistance(t, k.toLowerCase(java.util.Locale.ROOT));
            if (d < bestDistance) {
                bestDistance = d;
                best = k;
            }
        }
        int limit = Math.max(2, t.length() / 3);
        if (best != null && bestDistance <= limit) {
            return Optional.of(best);
        }
        String abbreviated = null;
        if (t.length() >= 3) {
            for (String k : known) {
                if (isSubsequence(t, k.toLowerCase(java.util.Locale.ROOT))
                        && (abbreviated == null || k.length() < abbreviated.length())) {
                    abbreviated = k;
                }
            }
        }
        return Optional.ofNullable(abbreviated);
    }

    private static boolean isSubsequence(String small, String big) {
        int j = 0;
        for (int i = 0; i < big.length() && j < small.length(); i++) {
            if (big.charAt(i) == small.charAt(j)) {
                j++;
            }
        }
        return j == small.length();
    }

    /** " Did you mean 'x'?" or "" — ready to append to an error message. */
    public static String didYouMean(String typed, Collection<String> known) {
        return closest(typed, known).map(s -> " Did you mean '" + s + "'?").orElse("");
    }

    /** Levenshtein distance between two strings (two-row dynamic programme, O(|a|·|b|)). */
    public static int editDistance(String a, String b) {
        int[] previous = new int[b.length() + 1];
        int[] current = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            previous[j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            current[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int substitute = previous[j - 1] + (a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1);
                current[j] = Math.min(substitute, Math.min(previous[j] + 1, current[j - 1] + 1));
            }
            int[] swap = previous;
            previous = current;
            current = swap;
        }
        return previous[b.length()];
    }
}
