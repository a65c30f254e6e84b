package lariat.config;

import java.util.Collection;

/**
 * Finds the known name closest to a misspelt one by Levenshtein edit distance (insertions,
 * deletions and substitutions of one character each cost 1; Levenshtein 1966, Soviet Physics
 * Doklady 10(8)). A name further than a third of its length (at least 2) is no suggestion.
 */
final class NearestName {

    private NearestName() {
    }

    /** The closest name, or {@code null} when none is close; ties go to the alphabetically first. */
    static String of(String wrong, Collection<String> known) {
        int limit = Math.max(2, wrong.length() / 3);
        String best = null;
        int bestDistance = Integer.MAX_VALUE;
        for (String k : known) {
            int d = distance(wrong, k);
            if (d <= limit && (d < bestDistance || d == bestDistance && k.compareTo(best) < 0)) {
                best = k;
                bestDistance = d;
            }
        }
        return best;
    }

    static int distance(String a, String b) {
        int[] prev = new int[b.length() + 1];
        int[] cur = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            prev[j] = j;
        }
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
