package lariat.it.faults;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import java.util.stream.LongStream;


/**
 * The exactly-once checks every fault test ends with, on what a read_committed reader of the model
 * topic sees: every key of the oracle has models; its versions are exactly 1..n in order (no gap,
 * no duplicate, no reuse); each version covers more records than the one before; and the last
 * version covers all the key's records with a moments fingerprint equal to the oracle's, bit for bit.
 */
final class ExactlyOnce {

    private ExactlyOnce() {
    }

    static void assertHolds(Map<String, List<PublishedModel>> models, MomentOracle oracle, String diagnostics) {
        Map<String, Long> counts = oracle.counts();
        assertEquals(counts.keySet(), models.keySet(), "keys with models\n" + diagnostics);
        for (Map.Entry<String, Long> e : counts.entrySet()) {
            String key = e.getKey();
            List<PublishedModel> v = models.get(key);
            List<Long> versions = v.stream().map(PublishedModel::version).toList();
            assertEquals(LongStream.rangeClosed(1, v.size()).boxed().toList(), versions,
                    "versions of " + key + " must be 1..n\n" + diagnostics);
            for (int i = 1; i < v.size(); i++) {
                assertTrue(v.get(i).recordCount() > v.get(i - 1).recordCount(),
                        key + " version " + (i + 1) + " covers " + v.get(i).recordCount()
                                + " records, not more than version " + i + "'s " + v.get(i - 1).recordCount());
            }
            PublishedModel last = v.get(v.size() - 1);
            assertEquals(e.getValue().longValue(), last.recordCount(), "records of " + key + "'s last model");
            assertEquals(oracle.fingerprint(key), last.fingerprint(),
                    "moments fingerprint of " + key + "'s last model vs the offline oracle\n" + diagnostics);
        }
    }
}
