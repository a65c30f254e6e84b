package lariat.moments;

/**
 * Measurement probe, not part of the build: times RankUpdate.addUpper on one panel of random rows, as
 * rank_update.c does for its tiled kernel (both compute each entry as the same chain of fused
 * multiply-adds; the unit tests certify the Java kernel, the C probe checks itself against a plain loop).
 * The best of five rounds of about 2 G multiply-adds each. Compiled by run.sh against
 * processor/target/classes.
 * Usage: KernelProbe WIDTH PANEL_ROWS  prints one line: width, us per panel, G multiply-adds/s
 */
public final class KernelProbe {
    public static void main(String[] args) {
        int d = Integer.parseInt(args[0]);
        int k = Integer.parseInt(args[1]);
        double[][] x = new double[k][d];
        java.util.SplittableRandom random = new java.util.SplittableRandom(1);
        for (double[] row : x) {
            for (int j = 0; j < d; j++) {
                row[j] = random.nextDouble() - 0.5;
            }
        }
        double[][] c = new double[d][d];
        double work = 0;
        for (int i = 0; i < d; i++) {
            work += d - RankUpdate.firstColumn(i);
        }
        work *= k;
        int repeats = (int) (2e9 / work) + 1;
        double best = Double.POSITIVE_INFINITY;
        for (int round = 0; round < 5; round++) {
            long t0 = System.nanoTime();
            for (int q = 0; q < repeats; q++) {
                RankUpdate.addUpper(x, k, d, c);
            }
            best = Math.min(best, (System.nanoTime() - t0) * 1e-9);
        }
        System.out.printf("%d %.1f %.2f%n", d, best / repeats * 1e6, work * repeats / best / 1e9);
    }
}
