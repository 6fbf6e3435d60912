package org.thermotile.model.stats;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.LocalDate;
import java.util.Arrays;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.thermotile.model.balance.Convection;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.forcing.ForcingPreparer;
import org.thermotile.model.forcing.Site;
import org.thermotile.model.forcing.SyntheticWeather;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.tile.TileSimulation;

/**
 * The trimmed group-hour histograms against exact percentiles of a small city: two tiles of mixed
 * materials, merged, every hour's surface temperatures kept whole for the exact answer.
 */
class GroupHourStatsTest {

    /**
     * The exact q-quantile of n values: the ⌈q·n⌉-th smallest, the inverse of the empirical
     * distribution function (Hyndman &amp; Fan 1996, "Sample quantiles in statistical packages",
     * The American Statistician 50(4), definition 1). The histogram's value is the centre of the
     * 0.5 K bin holding that order statistic, so within BIN_K/2 = 0.25 K of it (plus the float
     * rounding of the kept hourly values, below 1e-4 K at these temperatures).
     */
    static double exactQuantile(double[] sorted, double q) {
        int k = (int) Math.ceil(q * sorted.length);
        return sorted[Math.max(0, k - 1)];
    }

    @Test
    void p10AndP90OfASmallCityAreWithinHalfABinOfTheExactPercentiles() {
        Site site = new Site(45.3, 9.9, 100);
        Forcing f = ForcingPreparer.prepare(SyntheticWeather.clearSky(site, SyntheticWeather.Spec.withRelativeHumidity(
                LocalDate.of(2026, 7, 1), 3, 7200, 20, 33, 0.45, 2.0)), site);
        Material[] palette = {MaterialLibrary.get("asphalt_aged"), MaterialLibrary.get("roof_membrane_white"),
                MaterialLibrary.get("grass_irrigated"), MaterialLibrary.get("concrete")};
        int first = 24;
        int sampled = f.hours() - first;
        int[] all = new int[sampled];
        for (int i = 0; i < sampled; i++) {
            all[i] = first + i;
        }
        TileSimulation.Settings s = new TileSimulation.Settings(10, Convection.mcAdams(), 288.15, first,
                Physical.ZERO_CELSIUS_K + 40, all);
        Random rnd = new Random(11);
        int cells = 30 * 30;
        int[][] idx = new int[2][cells];
        TileSimulation.Result[] r = new TileSimulation.Result[2];
        for (int t = 0; t < 2; t++) {
            for (int c = 0; c < cells; c++) {
                idx[t][c] = rnd.nextInt(10) == 0 ? TileSimulation.NO_MATERIAL : rnd.nextInt(palette.length);
            }
            // Distinct cells: tile 1 gets a darker aged asphalt so that values spread within a group.
            Material[] pal = palette.clone();
            if (t == 1) {
                pal[0] = MaterialLibrary.get("asphalt_fresh");
            }
            r[t] = TileSimulation.run(pal, idx[t], f, s);
        }
        GroupHourStats merged = new GroupHourStats(palette.length, sampled);
        merged.merge(r[0].materialHours);
        merged.merge(r[1].materialHours);

        int checked = 0;
        double worst = 0;
        for (int g = 0; g < palette.length; g++) {
            for (int h = 0; h < sampled; h++) {
                double[] v = new double[2 * cells];
                int n = 0;
                int[] full = new int[GroupHourStats.BINS];
                for (int t = 0; t < 2; t++) {
                    for (int c = 0; c < cells; c++) {
                        if (idx[t][c] == g) {
                            v[n++] = r[t].hourlyC[h][c];
                            full[GroupHourStats.bin(r[t].hourlyC[h][c])]++;
                        }
                    }
                }
                assertEquals(n, merged.count(g, h));
                double[] sorted = Arrays.copyOf(v, n);
                Arrays.sort(sorted);
                for (double q : new double[] {0.1, 0.9}) {
                    double est = merged.quantileC(g, h, q);
                    double exact = exactQuantile(sorted, q);
                    assertEquals(exact, est, GroupHourStats.BIN_K / 2 + 1e-4, "group " + g + " hour " + h + " q " + q);
                    worst = Math.max(worst, Math.abs(est - exact));
                    checked++;
                }
            }
        }
        assertTrue(checked == 2 * palette.length * sampled && worst > 0, "every group-hour checked");
        // Memory: far fewer bins kept than the full-width histograms would hold.
        long full = (long) palette.length * sampled * GroupHourStats.BINS;
        assertTrue(merged.keptBins() * 5 < full, merged.keptBins() + " bins kept of " + full);
        System.out.printf("group-hour quantiles: %d checked, largest |p − exact| %.3f K, %d of %d bins kept%n",
                checked, worst, merged.keptBins(), full);
    }

    @Test
    void trimmedBinsGiveTheQuantilesOfAFullHistogramWhateverTheOrderOfAdding() {
        Random rnd = new Random(3);
        GroupHourStats a = new GroupHourStats(2, 3);
        GroupHourStats b = new GroupHourStats(2, 3);
        int[][] full = new int[6][GroupHourStats.BINS];
        long[] n = new long[6];
        for (int i = 0; i < 5000; i++) {
            int g = rnd.nextInt(2);
            int h = rnd.nextInt(3); // hours out of order: reopened and widened
            double t = 20 + 15 * rnd.nextGaussian();
            (i % 2 == 0 ? a : b).add(g, h, t);
            full[g * 3 + h][GroupHourStats.bin(t)]++;
            n[g * 3 + h]++;
        }
        a.merge(b);
        for (int gh = 0; gh < 6; gh++) {
            for (double q : new double[] {0.1, 0.5, 0.9}) {
                double target = q * n[gh];
                long cum = 0;
                int bin = 0;
                while ((cum += full[gh][bin]) < target) {
                    bin++;
                }
                assertEquals(GroupHourStats.LOW_C + (bin + 0.5) * GroupHourStats.BIN_K, a.quantileC(gh / 3, gh % 3, q), 0.0);
            }
        }
    }

    /**
     * Adding hour after hour allocates only each group-hour's trimmed bins, not a fresh full-width
     * histogram per group and hour (memory and garbage flat in the hours of a tile run). Bytes
     * allocated by this thread, from the JVM's own counter.
     */
    @Test
    void addingHoursAllocatesOnlyTheTrimmedBins() {
        int hours = 4_000;
        GroupHourStats st = new GroupHourStats(2, hours);
        com.sun.management.ThreadMXBean mx =
                (com.sun.management.ThreadMXBean) java.lang.management.ManagementFactory.getThreadMXBean();
        long tid = Thread.currentThread().getId();
        for (int round = 0; round < 2; round++) {     // the second round is measured, after the JIT's first pass
            st = new GroupHourStats(2, hours);
            long before = mx.getThreadAllocatedBytes(tid);
            for (int h = 0; h < hours; h++) {
                for (int i = 0; i < 50; i++) {
                    st.add(0, h, 20.0 + 0.02 * i);    // 20.0 … 20.98 °C: bins 100 and 101
                    st.add(1, h, 35.2);               // one bin
                }
            }
            st.keptBins();                            // closes the last hour
            long allocated = mx.getThreadAllocatedBytes(tid) - before;
            // Trimmed copies: 2 group-hours per hour, each an int[1] or int[2] (≤ 24 bytes with
            // header); a full-width histogram would be 16 + 4·260 = 1,056 bytes per group-hour.
            if (round == 1) {
                assertTrue(allocated < hours * 2L * 100, "allocated " + allocated + " bytes over " + hours + " hours");
            }
        }
        assertEquals(3 * hours, st.keptBins());
        assertEquals(20.25, st.quantileC(0, 17, 0.1), 1e-12);   // bin 100's centre: −30 + 100.5 · 0.5
        assertEquals(20.75, st.quantileC(0, 17, 0.9), 1e-12);   // bin 101's centre
        assertEquals(35.25, st.quantileC(1, hours - 1, 0.5), 1e-12);
    }
}
