package lariat.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;

import java.util.List;
import org.junit.jupiter.api.Test;

class NearestNameTest {

    /** kitten -> sitting takes three edits (a standard example of edit distance; common practice, from memory). */
    @Test
    void distance_kittenSitting_isThree() {
        assertEquals(3, NearestName.distance("kitten", "sitting"));
        assertEquals(0, NearestName.distance("", ""));
        assertEquals(4, NearestName.distance("", "flow"));
    }

    @Test
    void of_farName_givesNoSuggestion() {
        assertNull(NearestName.of("zz", List.of("select.rule", "path.ridge")));
        assertEquals("path.ridge", NearestName.of("path.rige", List.of("select.rule", "path.ridge")));
    }
}
