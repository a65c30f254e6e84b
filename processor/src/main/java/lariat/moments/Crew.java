package lariat.moments;

import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicLong;
import java.util.concurrent.locks.LockSupport;

/**
 * A small set of daemon threads that, together with the calling thread, run the numbered parts 0..P−1 of
 * one job and return when all are done. Parts are claimed one at a time from a shared counter, so a part
 * runs on whichever thread is free first; a job whose parts each compute their own, fixed entries (as
 * {@link RankUpdate} does) therefore gives the same bits whoever runs which part and however many threads
 * there are. If the crew is busy with another caller's job, or no worker wakes in time, the caller runs the
 * remaining parts itself.
 *
 * <p>Idle workers spin for {@value #SPIN_NANOS} ns after their last part (consecutive blocks of one stream
 * follow each other closely) and then park. Crews are shared per thread count and live as long as the JVM;
 * {@link #run} allocates nothing.
 */
final class Crew {

    /**
     * A job: part p of 0..parts−1 may run on any thread, in any order relative to the other parts. {@code slot}
     * numbers the thread running it, 0 for the caller and 1..threads−1 for the workers, so a job can give each
     * thread its own workspace.
     */
    interface Job {
        void runPart(int part, int slot);
    }

    /** Largest thread count a crew supports (further threads would rarely find work in one block). */
    static final int MAX_THREADS = 64;
    private static final long SPIN_NANOS = 200_000L;
    private static final Crew[] SHARED = new Crew[MAX_THREADS + 1];

    private final Thread[] workers;
    private final AtomicBoolean busy = new AtomicBoolean();
    /** generation (bits 32..63), parts (16..31), next unclaimed part (0..15). */
    private final AtomicLong claims = new AtomicLong();
    private final AtomicInteger done = new AtomicInteger();
    private volatile Job job;
    private volatile Thread caller;
    private volatile boolean callerParked;
    private final AtomicInteger parkedWorkers = new AtomicInteger();
    private volatile Throwable failure;

    private Crew(int threads) {
        workers = new Thread[threads - 1];
        for (int w = 0; w < workers.length; w++) {
            int slot = w + 1;
            Thread t = new Thread(() -> work(slot), "lariat-moments-" + threads + "-" + slot);
            t.setDaemon(true);
            workers[w] = t;
        }
        for (Thread t : workers) {
            t.start();
        }
    }

    /** The shared crew of {@code threads} threads (the caller counts as one), 2 &lt;= threads &lt;= MAX_THREADS. */
    static synchronized Crew shared(int threads) {
        if (threads < 2 || threads > MAX_THREADS) {
            throw new IllegalArgumentException("threads must be in [2, " + MAX_THREADS + "], was " + threads);
        }
        if (SHARED[threads] == null) {
            SHARED[threads] = new Crew(threads);
        }
        return SHARED[threads];
    }

    /**
     * Runs parts 0..parts−1 of {@code job} on the caller and the idle workers, returning when all have
     * finished; rethrows an error or unchecked exception thrown by a part. 1 &lt;= parts &lt; 2^16.
     */
    void run(Job job, int parts) {
        if (parts < 1 || parts >= 1 << 16) {
            throw new IllegalArgumentException("parts must be in [1, 65535], was " + parts);
        }
        if (!busy.compareAndSet(false, true)) {
            for (int p = 0; p < parts; p++) {
                job.runPart(p, 0);
            }
            return;
        }
        try {
            this.job = job;
            failure = null;
            caller = Thread.currentThread();
            done.set(0);
            long generation = (claims.get() >>> 32) + 1;
            claims.set((generation << 32) | ((long) parts << 16));
            if (parkedWorkers.get() > 0) {
                for (Thread t : workers) {
                    LockSupport.unpark(t);
                }
            }
            claimAndRun(0);
            awaitParts(parts);
            Throwable f = failure;
            if (f != null) {
                rethrow(f);
            }
        } finally {
            this.job = null;
            busy.set(false);
        }
    }

    /** Claims and runs parts of the current generation until none is left. */
    private void claimAndRun(int slot) {
        while (true) {
            long s = claims.get();
            int next = (int) (s & 0xFFFF);
            int parts = (int) ((s >>> 16) & 0xFFFF);
            if (next >= parts) {
                return;
            }
            if (claims.compareAndSet(s, s + 1)) {
                try {
                    job.runPart(next, slot);
                } catch (Throwable t) {
                    failure = t;
                }
                if (done.incrementAndGet() == parts && callerParked) {
                    LockSupport.unpark(caller);
                }
            }
        }
    }

    private void awaitParts(int parts) {
        long start = System.nanoTime();
        while (done.get() < parts) {
            if (System.nanoTime() - start < SPIN_NANOS) {
                Thread.onSpinWait();
            } else {
                callerParked = true;
                if (done.get() < parts) {
                    LockSupport.park(this);
                }
                callerParked = false;
            }
        }
    }

    private void work(int slot) {
        long seen = 0;
        while (true) {
            long start = System.nanoTime();
            long generation;
            while ((generation = claims.get() >>> 32) == seen) {
                if (System.nanoTime() - start < SPIN_NANOS) {
                    Thread.onSpinWait();
                } else {
                    parkedWorkers.incrementAndGet();
                    if (claims.get() >>> 32 == seen) {
                        LockSupport.park(this);
                    }
                    parkedWorkers.decrementAndGet();
                    start = System.nanoTime();
                }
            }
            seen = generation;
            claimAndRun(slot);
        }
    }

    private static void rethrow(Throwable t) {
        if (t instanceof RuntimeException) {
            throw (RuntimeException) t;
        }
        if (t instanceof Error) {
            throw (Error) t;
        }
        throw new IllegalStateException("a part of a moments job failed", t);
    }
}
