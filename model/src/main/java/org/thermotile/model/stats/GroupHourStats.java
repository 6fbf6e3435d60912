package org.thermotile.model.stats;

/**
 * Per group (a material, a district) and per hour: the sum and count of surface temperatures and
 * a histogram of them, so that means and quantiles (10 %, 90 %) over many tiles can be merged
 * exactly by adding.
 *
 * <p>Histogram: {@value #BINS} bins of {@value #BIN_K} K from {@value #LOW_C} °C; values outside
 * fall into the first or last bin. A quantile is read off at the centre of the bin where the
 * cumulative count reaches it, so it is exact to ±{@value #BIN_K}/2 K.
 */
public final class GroupHourStats implements java.io.Serializable {
    private static final long serialVersionUID = 1L;
    public static final double LOW_C = -30.0;
    public static final double BIN_K = 0.5;
    public static final int BINS = 260;

    public final int groups;
    public final int hours;
    private final double[] sumC;
    private final long[] count;
    private final int[] hist;

    public GroupHourStats(int groups, int hours) {
        this.groups = groups;
        this.hours = hours;
        sumC = new double[groups * hours];
        count = new long[groups * hours];
        hist = new int[groups * hours * BINS];
    }

    /** Adds one cell's temperature [°C] to group {@code g} at hour {@code h}. */
    public void add(int g, int h, double tempC) {
        int gh = g * hours + h;
        sumC[gh] += tempC;
        count[gh]++;
        int b = (int) Math.floor((tempC - LOW_C) / BIN_K);
        b = b < 0 ? 0 : (b >= BINS ? BINS - 1 : b);
        hist[gh * BINS + b]++;
    }

    /** Adds another tile's statistics (same groups and hours). */
    public void merge(GroupHourStats o) {
        if (o.groups != groups || o.hours != hours) {
            throw new IllegalArgumentException("cannot merge " + o.groups + "×" + o.hours + " into " + groups + "×" + hours);
        }
        for (int i = 0; i < sumC.length; i++) {
            sumC[i] += o.sumC[i];
            count[i] += o.count[i];
        }
        for (int i = 0; i < hist.length; i++) {
            hist[i] += o.hist[i];
        }
    }

    /** These statistics with groups merged: group g goes into {@code newGroupOf[g]} of {@code newGroups}. */
    public GroupHourStats regroup(int[] newGroupOf, int newGroups) {
        GroupHourStats r = new GroupHourStats(newGroups, hours);
        for (int g = 0; g < groups; g++) {
            int ng = newGroupOf[g];
            for (int h = 0; h < hours; h++) {
                int src = g * hours + h;
                int dst = ng * hours + h;
                r.sumC[dst] += sumC[src];
                r.count[dst] += count[src];
                for (int b = 0; b < BINS; b++) {
                    r.hist[dst * BINS + b] += hist[src * BINS + b];
                }
            }
        }
        return r;
    }

    public long count(int g, int h) {
        return count[g * hours + h];
    }

    /** Mean [°C], NaN when the group has no cell. */
    public double meanC(int g, int h) {
        long n = count[g * hours + h];
        return n == 0 ? Double.NaN : sumC[g * hours + h] / n;
    }

    /** Quantile q ∈ (0, 1) [°C] from the histogram (±BIN_K/2), NaN when the group has no cell. */
    public double quantileC(int g, int h, double q) {
        int gh = g * hours + h;
        long n = count[gh];
        if (n == 0) {
            return Double.NaN;
        }
        double target = q * n;
        long cum = 0;
        for (int b = 0; b < BINS; b++) {
            cum += hist[gh * BINS + b];
            if (cum >= target) {
                return LOW_C + (b + 0.5) * BIN_K;
            }
        }
        return LOW_C + (BINS - 0.5) * BIN_K;
    }
}
