package org.thermotile.jobs.config;

import java.util.Collection;
import java.util.Optional;

/**
 * "Did you mean …?" for misspelt keys, names and ids.
 *
 * <p>Distance is the optimal-string-alignment form of the Damerau–Levenshtein distance: the least
 * number of single-character insertions, deletions, substitutions and transpositions of two
 * adjacent characters (Damerau 1964, "A technique for computer detection and correction of
 * spelling errors", Commun. ACM 7(3); Levenshtein 1966), with the restriction that no substring
 * is edited twice. Cost O(|a|·|b|) time and memory; used on short words only.
 */
public final class Suggest {
    private Suggest() {
    }

    /**
     * Optimal-string-alignment distance between {@code a} and {@code b} (case-sensitive).
     *
     * @return number of edits [count], 0 for equal strings
     */
    public static int distance(String a, String b) {
        int n = a.length();
        int m = b.length();
        int[][] d = new int[n + 1][m + 1];
        for (int i = 0; i <= n; i++) {
            d[i][0] = i;
        }
        for (int j = 0; j <= m; j++) {
            d[0][j] = j;
        }
        for (int i = 1; i <= n; i++) {
            for (int j = 1; j <= m; j++) {
                int cost = a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1;
                int v = Math.min(Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1), d[i - 1][j - 1] + cost);
                if (i > 1 && j > 1 && a.charAt(i - 1) == b.charAt(j - 2)
                        && a.charAt(i - 2) == b.charAt(j - 1)) {
                    v = Math.min(v, d[i - 2][j - 2] + 1);
                }
                d[i][j] = v;
            }
        }
        return d[n][m];
    }

    /**
     * The candidate closest to {@code word}, if it is close enough to be a likely typo: at most 1
     * edit for words of up to 3 characters, 2 up to 6 characters, 3 beyond; failing that, a
     * candidate that starts with the word (4 characters or more) or that the word starts with.
     * Comparison ignores case. Ties go to the earlier candidate, so the answer is deterministic.
     */
    public static Optional<String> closest(String word, Collection<String> candidates) {
        String w = word.toLowerCase(java.util.Locale.ROOT);
        int limit = w.length() <= 3 ? 1 : w.length() <= 6 ? 2 : 3;
        String best = null;
        int bestD = Integer.MAX_VALUE;
        for (String c : candidates) {
            int dist = distance(w, c.toLowerCase(java.util.Locale.ROOT));
            if (dist < bestD) {
                bestD = dist;
                best = c;
            }
        }
        if (best != null && bestD <= limit) {
            return Optional.of(best);
        }
        if (w.length() >= 4) {
            for (String c : candidates) {
                String lc = c.toLowerCase(java.util.Locale.ROOT);
                if (lc.startsWith(w) || w.startsWith(lc)) {
                    return Optional.of(c);
                }
            }
        }
        return Optional.empty();
    }

    /** " (did you mean 'x'?)" or the empty string. */
    static String didYouMean(String word, Collection<String> candidates) {
        return closest(word, candidates).map(c -> "; did you mean '" + c + "'?").orElse("");
    }
}
