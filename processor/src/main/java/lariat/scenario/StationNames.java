package lariat.scenario;

import java.util.ArrayList;
import java.util.List;

/** Invented station names: a place-like word and a number, e.g. "north-03"; unique for any count. */
final class StationNames {

    private static final String[] WORDS = {
        "north", "ridge", "basin", "cedar", "delta", "harbor", "summit", "quarry", "marsh", "vale", "pine", "mesa"};
    private static final int[] NUMBERS = {3, 11, 7, 14, 9, 5, 6, 12, 4, 8, 10, 2};

    private StationNames() {
    }

    /** The first {@code n} names; round r ≥ 1 adds 20·r to the numbers. */
    static List<String> of(int n) {
        List<String> names = new ArrayList<>(n);
        for (int i = 0; i < n; i++) {
            int round = i / WORDS.length;
            int k = i % WORDS.length;
            names.add(String.format(java.util.Locale.ROOT, "%s-%02d", WORDS[k], NUMBERS[k] + 20 * round));
        }
        return List.copyOf(names);
    }
}
