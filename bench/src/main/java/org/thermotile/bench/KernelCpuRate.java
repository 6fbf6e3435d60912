package org.thermotile.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.Arrays;

/**
 * The kernel's rate in cell-hours per CPU-second of the stepping thread: the same block and hours
 * as {@link KernelBenchmark}, timed with the thread's CPU clock rather than the wall clock, so a
 * comparison of two builds made on a busy machine is not skewed by time slices lost to other
 * processes (cache sharing still is). Prints each round and the median.
 *
 * <pre>java -cp … org.thermotile.bench.KernelCpuRate [material] [chunk] [hours per round] [rounds] [node|cell] [standard|coarse]</pre>
 */
public final class KernelCpuRate {
    private KernelCpuRate() {}

    public static void main(String[] args) {
        KernelBenchmark b = new KernelBenchmark();
        b.material = args.length > 0 ? args[0] : "asphalt_aged";
        b.chunk = args.length > 1 ? Integer.parseInt(args[1]) : 256;
        int hours = args.length > 2 ? Integer.parseInt(args[2]) : 24;
        int rounds = args.length > 3 ? Integer.parseInt(args[3]) : 7;
        b.layout = args.length > 4 ? args[4] : "node";
        b.spacing = args.length > 5 ? args[5] : "standard";
        b.setUp();
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        double sink = 0;
        for (int h = 0; h < 2 * hours; h++) {
            sink += b.oneHour(); // warm-up: let the JIT compile the loops
        }
        double[] rate = new double[rounds];
        for (int r = 0; r < rounds; r++) {
            long c0 = mx.getCurrentThreadCpuTime();
            for (int h = 0; h < hours; h++) {
                sink += b.oneHour();
            }
            long c1 = mx.getCurrentThreadCpuTime();
            rate[r] = (double) KernelBenchmark.CELLS * hours / ((c1 - c0) * 1e-9);
            System.out.printf("round %d: %.3g cell-hours per CPU-second%n", r + 1, rate[r]);
        }
        double[] sorted = rate.clone();
        Arrays.sort(sorted);
        System.out.printf("%s chunk %d %s %s: median %.3g cell-hours per CPU-second (min %.3g, max %.3g; check %.1f)%n",
                b.material, b.chunk, b.layout, b.spacing, sorted[rounds / 2], sorted[0], sorted[rounds - 1], sink / (rounds * hours + 2 * hours));
    }
}
