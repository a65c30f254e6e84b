package lariat.stage;

import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;

class AlertTrackerTest {

    private static final ActiveSet A = ActiveSet.of(new int[] {0, 2}, new int[] {1, -1});
    private static final ActiveSet B = ActiveSet.of(new int[] {0, 2, 3}, new int[] {1, -1, 1});
    private static final ActiveSet A_FLIPPED = ActiveSet.of(new int[] {0, 2}, new int[] {1, 1});

    @Test
    void offer_persistenceOne_announcesEveryChange() {
        AlertTracker t = new AlertTracker();
        assertNotNull(t.offer(A, 1, 1), "first selection enters from the empty set");
        assertNull(t.offer(A, 2, 1), "same set again");
        AlertTracker.Announcement a = t.offer(B, 3, 1);
        assertEquals(A, a.before);
        assertEquals(1, a.beforeVersion);
        assertArrayEquals(new int[] {3}, B.enteredSince(a.before));
    }

    @Test
    void offer_persistenceThree_announcesOnlyAfterThreeConsecutiveRefits() {
        AlertTracker t = new AlertTracker();
        t.offer(A, 1, 1);
        assertNull(t.offer(B, 2, 3));
        assertNull(t.offer(B, 3, 3));
        AlertTracker.Announcement a = t.offer(B, 4, 3);
        assertNotNull(a, "held for three refits");
        assertEquals(2, a.firstSeenVersion);
        assertEquals(3, a.heldRefits);
        assertEquals(B, t.announced());
    }

    @Test
    void offer_flappingBetweenSets_neverAnnounces() {
        AlertTracker t = new AlertTracker();
        t.offer(A, 1, 1);
        for (int v = 2; v < 20; v += 2) {
            assertNull(t.offer(B, v, 2), "B at version " + v);
            assertNull(t.offer(A, v + 1, 2), "back to A at version " + (v + 1));
        }
        assertEquals(A, t.announced());
    }

    @Test
    void activeSet_signFlip_isReportedAsFlipNotEntry() {
        assertArrayEquals(new int[] {2}, A_FLIPPED.flippedSince(A));
        assertArrayEquals(new int[0], A_FLIPPED.enteredSince(A));
        assertArrayEquals(new int[0], A_FLIPPED.leftSince(A));
    }
}
