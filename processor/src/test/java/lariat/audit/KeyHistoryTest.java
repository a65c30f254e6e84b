package lariat.audit;

import org.junit.jupiter.api.Test;

import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** As-of lookups, gaps and duplicates on hand-made histories (expected values worked by hand). */
class KeyHistoryTest {

    private static final String[] NONE = {};

    /** Versions 1..3 of k: last event times 100, 200, 300; published at 1000, 2000, 3000; and one of another key. */
    private static List<PublishedVersion> threeVersions() {
        return List.of(
                Versions.published(Versions.of("k", 2, 200, 2000, NONE, new double[0]), 1),
                Versions.published(Versions.of("other", 1, 150, 1500, NONE, new double[0]), 2),
                Versions.published(Versions.of("k", 1, 100, 1000, NONE, new double[0]), 0),
                Versions.published(Versions.of("k", 3, 300, 3000, NONE, new double[0]), 3));
    }

    @Test
    void of_unorderedInput_sortsByVersionAndDropsOtherKeys() {
        KeyHistory h = KeyHistory.of("k", threeVersions());
        assertEquals(List.of(1L, 2L, 3L), h.versions().stream().map(PublishedVersion::version).toList());
        assertEquals(List.of(), h.gaps());
    }

    @Test
    void asOfEventTime_betweenAndAtBoundaries_picksNewestWithoutLaterRecords() {
        KeyHistory h = KeyHistory.of("k", threeVersions());
        assertTrue(h.asOfEventTime(99).isEmpty());
        assertEquals(1, h.asOfEventTime(100).orElseThrow().version());
        assertEquals(1, h.asOfEventTime(199).orElseThrow().version());
        assertEquals(2, h.asOfEventTime(200).orElseThrow().version());
        assertEquals(3, h.asOfEventTime(Long.MAX_VALUE).orElseThrow().version());
    }

    @Test
    void asOfPublishTime_betweenAndAtBoundaries_picksNewestPublishedBefore() {
        KeyHistory h = KeyHistory.of("k", threeVersions());
        assertTrue(h.asOfPublishTime(999).isEmpty());
        assertEquals(1, h.asOfPublishTime(1000).orElseThrow().version());
        assertEquals(2, h.asOfPublishTime(2999).orElseThrow().version());
        assertEquals(3, h.asOfPublishTime(3000).orElseThrow().version());
    }

    @Test
    void gapsAndDuplicates_missingAndRepeatedVersions_areListed() {
        List<PublishedVersion> in = List.of(
                Versions.published(Versions.of("k", 1, 100, 1000, NONE, new double[0]), 0),
                Versions.published(Versions.of("k", 4, 400, 4000, NONE, new double[0]), 1),
                Versions.published(Versions.of("k", 4, 401, 4001, NONE, new double[0]), 2));
        KeyHistory h = KeyHistory.of("k", in);
        assertEquals(List.of(2L, 3L), h.gaps());
        assertEquals(List.of(4L), h.duplicates());
        assertEquals(400, h.get(4).orElseThrow().lastEventTimeMs(), "the first copy is kept");
    }

    @Test
    void of_emptyKey_throwsNamingKey() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> KeyHistory.of("", List.of()));
        assertTrue(e.getMessage().startsWith("key"));
    }
}
