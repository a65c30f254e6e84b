package lariat.moments;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.concurrent.atomic.AtomicIntegerArray;

import org.junit.jupiter.api.Test;

/**
 * {@link Crew} runs every part of every job exactly once, numbers the running thread within the crew, and passes
 * a part's failure to the caller.
 */
class CrewTest {

    @Test
    void run_manyJobsOfVaryingParts_eachPartExactlyOnce() {
        Crew crew = Crew.shared(3);
        for (int job = 0; job < 2000; job++) {
            int parts = 1 + job % 37;
            AtomicIntegerArray runs = new AtomicIntegerArray(parts);
            AtomicIntegerArray slots = new AtomicIntegerArray(parts);
            crew.run((part, slot) -> {
                runs.incrementAndGet(part);
                slots.set(part, slot);
            }, parts);
            for (int p = 0; p < parts; p++) {
                assertEquals(1, runs.get(p), "job " + job + " part " + p);
                int slot = slots.get(p);
                assertTrue(slot >= 0 && slot < 3, "job " + job + " part " + p + " slot " + slot);
            }
        }
    }

    @Test
    void run_partThrows_callerGetsTheException() {
        Crew crew = Crew.shared(2);
        IllegalStateException thrown = new IllegalStateException("part 5 failed");
        IllegalStateException seen = assertThrows(IllegalStateException.class, () -> crew.run((p, slot) -> {
            if (p == 5) {
                throw thrown;
            }
        }, 8));
        assertSame(thrown, seen);
        AtomicIntegerArray runs = new AtomicIntegerArray(4);
        crew.run((part, slot) -> runs.incrementAndGet(part), 4);
        assertEquals(4, runs.get(0) + runs.get(1) + runs.get(2) + runs.get(3));
    }

    @Test
    void shared_outOfRange_rejected() {
        assertThrows(IllegalArgumentException.class, () -> Crew.shared(1));
        assertThrows(IllegalArgumentException.class, () -> Crew.shared(Crew.MAX_THREADS + 1));
    }
}
