package lariat.codec;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

class ValueTypesTest {

    private static final ChannelLayout AB = ChannelLayout.of(List.of("a", "b"));

    @Test
    void readingOf_arraysCopiedInAndOut() {
        double[] z = {1, 2, 3};
        Reading r = Reading.of("k", AB, z, 1.0, 5);
        z[0] = 99;
        assertEquals(1.0, r.z()[0]);
        r.z()[1] = 99;
        assertEquals(2.0, r.z()[1]);
        double[] out = new double[3];
        r.copyZ(out);
        assertEquals(3.0, out[2]);
        assertEquals(3.0, r.target());
        assertEquals(2, r.width());
    }

    @Test
    void readingOf_badArguments_nameTheArgument() {
        assertTrue(assertThrows(IllegalArgumentException.class, () -> Reading.of("k", AB, new double[] {1, 2}, 1, 0))
                .getMessage().startsWith("z: length must be channels + 1 = 3, got 2"));
        assertTrue(assertThrows(IllegalArgumentException.class,
                () -> Reading.of("k", AB, new double[] {1, Double.NaN, 3}, 1, 0)).getMessage().startsWith("z[1]"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> Reading.of("k", AB, new double[] {1, 2, 3}, 0, 0))
                .getMessage().startsWith("weight"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> Reading.of("", AB, new double[] {1, 2, 3}, 1, 0))
                .getMessage().startsWith("key"));
    }

    @Test
    void layoutOf_repeatedName_rejected() {
        assertTrue(assertThrows(IllegalArgumentException.class, () -> ChannelLayout.of(List.of("a", "a")))
                .getMessage().contains("'a' appears twice"));
    }
}
