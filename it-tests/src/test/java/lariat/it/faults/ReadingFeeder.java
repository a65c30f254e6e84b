package lariat.it.faults;

import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;

/**
 * Feeds good readings of {@link StationFeed} into a run at a steady pace from its own thread until
 * {@link #finish()}, so faults land while records keep arriving. The readings are deterministic
 * from the seed; only how many are sent depends on how long the faults take.
 */
final class ReadingFeeder implements AutoCloseable {

    private final ExecutorService thread = Executors.newSingleThreadExecutor();
    private final Future<Integer> sent;
    private volatile boolean stop;

    private ReadingFeeder(FaultRun run, long seed, int stations, int perSecond, int max) {
        StationFeed feed = StationFeed.of(seed, stations);
        int batch = 10;
        long pauseMs = Math.max(1, 1000L * batch / perSecond);
        this.sent = thread.submit(() -> {
            int n = 0;
            while (!stop && n < max) {
                run.send(feed.next());
                n++;
                if (n % batch == 0) {
                    Thread.sleep(pauseMs);
                }
            }
            run.flush();
            return n;
        });
    }

    /** Starts feeding about {@code perSecond} readings a second, at most {@code max} in all. */
    static ReadingFeeder start(FaultRun run, long seed, int stations, int perSecond, int max) {
        return new ReadingFeeder(run, seed, stations, perSecond, max);
    }

    /** Stops feeding, waits until every reading sent is acknowledged and returns how many were sent. */
    int finish() throws Exception {
        stop = true;
        return sent.get(120, TimeUnit.SECONDS);
    }

    @Override
    public void close() {
        stop = true;
        thread.shutdownNow();
    }
}
