package org.thermotile.jobs.io.weather;

/**
 * Whether, and how far, {@link WeatherCsv} may fill missing hours (a jump in time between two
 * rows) instead of refusing the file.
 *
 * <p>{@link #linear(int) linear(N)} fills each run of at most N consecutive missing hours by
 * linear interpolation in time between the two rows around it,
 * {@code x(t) = x₀ + (x₁ − x₀)·(t − t₀)/(t₁ − t₀)}, for every column; an optional column stays
 * "not given" (NaN) in the gap when either surrounding row leaves it empty. Longer gaps remain an
 * error. Linear filling cannot recreate a daily cycle: keep N to a few hours.
 *
 * @param maxHours longest run of missing hours that is filled [h]; 0 means no filling
 */
public record GapFill(int maxHours) {
    public GapFill {
        if (maxHours < 0) {
            throw new IllegalArgumentException("gap fill: the longest gap to fill must be 0 or more hours, got "
                    + maxHours);
        }
    }

    /** No filling: any missing hour is an error. */
    public static GapFill none() {
        return new GapFill(0);
    }

    /** Linear interpolation in time over runs of at most {@code maxHours} (≥ 1) missing hours. */
    public static GapFill linear(int maxHours) {
        if (maxHours < 1) {
            throw new IllegalArgumentException("gap fill: linear filling needs a longest gap of at least 1 hour, got "
                    + maxHours);
        }
        return new GapFill(maxHours);
    }

    /** True when no gap may be filled. */
    public boolean isNone() {
        return maxHours == 0;
    }
}
