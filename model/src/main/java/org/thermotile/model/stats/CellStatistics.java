package org.thermotile.model.stats;

import java.util.Arrays;
import org.thermotile.model.balance.SurfaceBlock;

/**
 * Streaming per-cell statistics of hourly surface temperature over a period: peak, mean, night
 * minimum, local hour of the peak, hours and degree-hours above a threshold. O(cells) memory,
 * independent of the number of hours.
 *
 * <p>Degree-hours above a threshold θ: {@code Σ_h max(0, T_h − θ) · 1 h} [K h]; hours above:
 * the count of hourly samples with T_h &gt; θ. A night sample is one taken with the sun below the
 * horizon. Ties for the peak keep the earliest hour (deterministic).
 */
public final class CellStatistics {
    public final int cells;
    public final double thresholdK;
    private final double[] peakK;
    private final double[] sumK;
    private final double[] nightMinK;
    private final int[] peakLocalHour;
    private final int[] hoursAbove;
    private final double[] degreeHoursAbove;
    private int samples;
    private int nightSamples;

    public CellStatistics(int cells, double thresholdK) {
        this.cells = cells;
        this.thresholdK = thresholdK;
        peakK = new double[cells];
        Arrays.fill(peakK, Double.NEGATIVE_INFINITY);
        sumK = new double[cells];
        nightMinK = new double[cells];
        Arrays.fill(nightMinK, Double.POSITIVE_INFINITY);
        peakLocalHour = new int[cells];
        hoursAbove = new int[cells];
        degreeHoursAbove = new double[cells];
    }

    /** Adds one hourly sample of every cell's surface temperature. */
    public void sample(SurfaceBlock block, int localHourOfDay, boolean night) {
        for (int c = 0; c < cells; c++) {
            sample(c, block.surfaceTempK(c), localHourOfDay, night);
        }
        samples++;
        if (night) {
            nightSamples++;
        }
    }

    /** Adds one sample of one cell. */
    private void sample(int c, double tK, int localHourOfDay, boolean night) {
        if (tK > peakK[c]) {
            peakK[c] = tK;
            peakLocalHour[c] = localHourOfDay;
        }
        sumK[c] += tK;
        if (night && tK < nightMinK[c]) {
            nightMinK[c] = tK;
        }
        double over = tK - thresholdK;
        if (over > 0) {
            hoursAbove[c]++;
            degreeHoursAbove[c] += over;
        }
    }

    public int samples() {
        return samples;
    }

    /** Peak surface temperature [K] (NaN before any sample). */
    public double peakK(int c) {
        return samples == 0 ? Double.NaN : peakK[c];
    }

    /** Mean surface temperature [K]. */
    public double meanK(int c) {
        return samples == 0 ? Double.NaN : sumK[c] / samples;
    }

    /** Night minimum [K]; NaN when no sample fell at night (polar day). */
    public double nightMinK(int c) {
        return nightSamples == 0 ? Double.NaN : nightMinK[c];
    }

    /** Local clock hour (0…23) of the peak. */
    public int peakLocalHour(int c) {
        return peakLocalHour[c];
    }

    /** Hours with surface temperature above the threshold. */
    public int hoursAbove(int c) {
        return hoursAbove[c];
    }

    /** Degree-hours above the threshold [K h]. */
    public double degreeHoursAbove(int c) {
        return degreeHoursAbove[c];
    }
}
