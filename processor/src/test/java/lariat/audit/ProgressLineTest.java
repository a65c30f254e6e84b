package lariat.audit;

import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertEquals;

/** The progress line's arithmetic, worked by hand. */
class ProgressLineTest {

    @Test
    void line_quarterDoneInTwoSeconds_estimatesSixSecondsLeft() {
        assertEquals("replay in/0: offset 250 of 1000 (25.0%), 100 records/s, about 6 s left",
                ProgressLine.line("in/0", 250, 1000, 200, 2.0, false));
    }

    @Test
    void line_finished_saysHowLong() {
        assertEquals("replay in/0: offset 1000 of 1000 (100.0%), 500 records/s, done in 2.0 s",
                ProgressLine.line("in/0", 1000, 1000, 1000, 2.0, true));
    }
}
