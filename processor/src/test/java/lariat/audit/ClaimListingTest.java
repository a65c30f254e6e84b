package lariat.audit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import lariat.schema.KeyClaim;
import lariat.stage.ClaimLog;
import org.junit.jupiter.api.Test;

/**
 * Owners and conflicts of a claims listing, on small sequences worked by hand: the owner of a model key of
 * an input topic is its earliest live claim (the rule the stage applies, {@code KeyClaims}).
 */
class ClaimListingTest {

    private final Map<String, KeyClaim> claims = new LinkedHashMap<>();
    private final Map<String, Long> offsets = new LinkedHashMap<>();

    private void claim(String topic, int partition, String key, long offset) {
        String k = new String(ClaimLog.recordKey(topic, partition, key), StandardCharsets.UTF_8);
        claims.put(k, KeyClaim.newBuilder().setKey(key).setInputTopic(topic).setInputPartition(partition)
                .setClaimedBy("pumps-" + partition).setFirstOffset(null).setClaimedAtMs(Instant.EPOCH).build());
        offsets.put(k, offset);
    }

    @Test
    void of_keyOnTwoPartitions_earliestClaimOwnsAndConflictListsOwnerFirst() {
        claim("readings", 1, "st-07", 5);
        claim("readings", 0, "st-07", 2);
        claim("readings", 0, "st-08", 3);
        ClaimListing l = ClaimListing.of(claims, offsets, 0);
        // sorted by offset: st-07@0 (2), st-08@0 (3), st-07@1 (5)
        assertEquals(List.of(2L, 3L, 5L), l.entries().stream().map(ClaimListing.Entry::offset).toList());
        assertTrue(l.find("readings", 0, "st-07").owner());
        assertFalse(l.find("readings", 1, "st-07").owner());
        assertTrue(l.find("readings", 0, "st-08").owner());
        assertEquals(Map.of("readings st-07", List.of(0, 1)), l.conflicts());
        assertNull(l.find("readings", 2, "st-07"));
    }

    @Test
    void of_sameKeyOnTwoInputTopics_eachTopicHasItsOwnOwnerAndNoConflict() {
        claim("north", 0, "st-07", 1);
        claim("south", 3, "st-07", 2);
        ClaimListing l = ClaimListing.of(claims, offsets, 4);
        assertTrue(l.find("north", 0, "st-07").owner());
        assertTrue(l.find("south", 3, "st-07").owner());
        assertTrue(l.conflicts().isEmpty());
        assertEquals(4, l.passedOver());
    }
}
