package lariat.stage;

import org.junit.jupiter.api.Test;

import java.nio.charset.StandardCharsets;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The claim bookkeeping on hand-checked sequences of claims-topic records: the expected owner of each
 * sequence is worked out by hand from the rule "the partition of the key's earliest claim".
 */
class KeyClaimsTest {

    private static final String[] CHANNELS = {"flow", "current"};

    private static KeyState state(String key, int partition) {
        return KeyState.create(key, partition, CHANNELS, 8, Double.POSITIVE_INFINITY, 0);
    }

    /** north-03 claimed on partition 0 by st-a at offset 1, then on partition 1 by st-b at offset 2. */
    private static KeyClaims claimedOn0Then1() {
        KeyClaims c = new KeyClaims("claims");
        c.add("north-03", 0, "st-a", 1);
        c.add("north-03", 1, "st-b", 2);
        return c;
    }

    private static List<Integer> partitions(KeyClaims c, String key) {
        return c.claims(key).stream().map(x -> x.partition).toList();
    }

    @Test
    void add_claimsOfTwoPartitions_ownerIsTheEarliestInTopicOrder() {
        KeyClaims c = new KeyClaims("claims");
        assertTrue(c.add("north-03", 1, "st-b", 4));
        assertTrue(c.add("north-03", 0, "st-a", 9));
        assertEquals(1, c.owner("north-03").partition, "partition 1 claimed first, at offset 4");
        assertEquals("st-b", c.owner("north-03").claimedBy);
        assertEquals(List.of(1, 0), partitions(c, "north-03"), "claims kept in topic order");
        assertNull(c.owner("south-01"), "a key without claims has no owner");
        assertEquals(2, c.size());
    }

    @Test
    void add_repeatedPair_keepsItsFirstPlace() {
        KeyClaims c = claimedOn0Then1();
        assertFalse(c.add("north-03", 0, "st-a", 3), "a repeat of (north-03, 0) is not a new pair");
        assertEquals(List.of(0, 1), partitions(c, "north-03"));
        assertEquals(0, c.owner("north-03").partition);
        assertEquals(1, c.owner("north-03").position, "the owner's claim is still the one at offset 1");
        assertEquals(2, c.size());
    }

    @Test
    void remove_tombstoneOfTheOwnersClaim_nextClaimOwns() {
        KeyClaims c = claimedOn0Then1();
        assertTrue(c.remove("north-03", 0, 3));
        assertEquals(1, c.owner("north-03").partition);
        assertFalse(c.remove("north-03", 5, 4), "a tombstone of an unknown pair changes nothing");
        assertTrue(c.remove("north-03", 1, 5));
        assertNull(c.owner("north-03"));
        assertEquals(0, c.size());
    }

    @Test
    void add_positionNotAfterTheLast_isRefused() {
        KeyClaims c = new KeyClaims("claims");
        c.add("north-03", 0, "st-a", 7);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> c.add("south-01", 0, "st-a", 7));
        assertTrue(e.getMessage().contains("position must follow 7") && e.getMessage().contains("was 7"),
                e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> c.add("south-01", -1, "st-a", 8));
        assertEquals(7, c.position());
    }

    @Test
    void needsClaim_sentThenReadBack_claimsEachPairOnce() {
        KeyClaims c = new KeyClaims("claims");
        assertTrue(c.needsClaim("north-03", 0));
        c.sent("north-03", 0);
        assertFalse(c.needsClaim("north-03", 0), "sent in a committed transaction, not read back yet");
        assertTrue(c.needsClaim("north-03", 1), "another pair of the same key still needs its claim");
        c.add("north-03", 0, "st-a", 0);
        assertFalse(c.needsClaim("north-03", 0), "read back");
        c.clear();
        assertTrue(c.needsClaim("north-03", 0), "a reader that starts again learns the pair from the topic");
    }

    @Test
    void unclaimed_restoredAndNewStates_listsOnlyPairsWithoutClaim() {
        KeyClaims c = new KeyClaims("claims");
        KeyState restored = state("north-03", 0);
        KeyState fresh = state("south-01", 1);
        KeyState known = state("east-02", 1);
        c.add("east-02", 1, "st-a", 0);
        List<KeyState> all = List.of(restored, fresh, known);
        assertEquals(List.of(restored, fresh), c.unclaimed(all));
        c.sent("north-03", 0);
        c.sent("south-01", 1);
        assertEquals(List.of(), c.unclaimed(all), "idempotent: nothing is claimed twice");
    }

    @Test
    void ownedElsewhere_keyClaimedFirstByAnotherPartition_isListed() {
        KeyClaims c = new KeyClaims("claims");
        KeyState mine = state("north-03", 1);
        KeyState owned = state("south-01", 1);
        c.add("north-03", 0, "st-a", 0);
        c.add("north-03", 1, "st-b", 1);
        c.add("south-01", 1, "st-b", 2);
        c.add("south-01", 0, "st-a", 3);
        assertEquals(List.of(mine), c.ownedElsewhere(List.of(mine, owned)));
    }

    @Test
    void refusal_keyOwnedByAnotherPartition_namesTheOwner() {
        KeyClaims c = new KeyClaims("fleet.claims");
        c.add("north-03", 0, "fleet-a", 12);
        String why = c.refusal("north-03", 1);
        assertTrue(why.contains("owned elsewhere") && why.contains("input partition 0 claimed it first")
                && why.contains("fleet-a") && why.contains("'fleet.claims'") && why.contains("not partition 1"), why);
        assertNull(c.refusal("north-03", 0), "the owner's partition may hold it");
        assertNull(c.refusal("south-01", 1), "an unclaimed key may start anywhere");
    }

    @Test
    void firstReport_samePairTwice_trueOnce() {
        KeyClaims c = new KeyClaims("claims");
        assertTrue(c.firstReport("north-03", 1));
        assertFalse(c.firstReport("north-03", 1));
        assertTrue(c.firstReport("north-03", 2));
        c.clear();
        assertFalse(c.firstReport("north-03", 1), "reported once per process");
    }

    @Test
    void recordKey_onePerPair_distinctAcrossPairs() {
        byte[] a = ClaimLog.recordKey("readings", 1, "2|x");
        byte[] b = ClaimLog.recordKey("readings", 12, "x");
        assertEquals("readings|1|2|x", new String(a, StandardCharsets.UTF_8));
        assertNotEquals(new String(a, StandardCharsets.UTF_8), new String(b, StandardCharsets.UTF_8),
                "a key holding the separator does not collide with another partition's");
        assertEquals(new String(a, StandardCharsets.UTF_8),
                new String(ClaimLog.recordKey("readings", 1, "2|x"), StandardCharsets.UTF_8),
                "the same pair gives the same bytes, so compaction keeps one claim");
        assertNotEquals(new String(ClaimLog.recordKey("readings", 0, "x"), StandardCharsets.UTF_8),
                new String(ClaimLog.recordKey("readings.v2", 0, "x"), StandardCharsets.UTF_8));
    }
}
