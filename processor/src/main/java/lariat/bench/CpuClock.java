package lariat.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;

/** CPU time of the calling thread, in nanoseconds; wall time if the JVM cannot measure thread CPU time. */
final class CpuClock {

    private static final ThreadMXBean THREADS = ManagementFactory.getThreadMXBean();
    private static final boolean SUPPORTED = THREADS.isCurrentThreadCpuTimeSupported();

    private CpuClock() {
    }

    static long nanos() {
        return SUPPORTED ? THREADS.getCurrentThreadCpuTime() : System.nanoTime();
    }
}
