package org.thermotile.model.stats;

import java.util.Arrays;

/**
 * Per group (a material, a district) and per hour: the sum and count of surface temperatures and
 * a histogram of them, so that means and quantiles (10 %, 90 %) over many tiles can be merged
 * exactly by adding.
 *
 * <p>Histogram: {@value #BINS} bins of {@value #BIN_K} K from {@value #LOW_C} °C; values outside
 * fall into the first or last bin. A quantile is read off at the centre of the bin where the
 * cumulative count reaches it, so it is exact to ±{@value #BIN_K}/2 K.
 *
 * <p>Memory: each group-hour keeps only the bins from its lowest to its highest occupied one (a
 * group's cells span a few kelvin in an hour, so typically 5–40 bins instead of {@value #BINS});
 * values are added hour by hour (every cell of hour h before any of hour h + 1, as a tile run
 * does), gathered in one full-width histogram per group and trimmed when the hour changes. The
 * bins, and so the quantiles, are exactly those of a full histogram. The full-width histograms
 * are cleared and reused from hour to hour, so adding allocates only the trimmed copies. What still
 * grows with the hours is the per-hour result itself (mean, band and count per group and hour).
 */
public final class GroupHourStats implements java.io.Serializable {
    private static final long serialVersionUID = 2L;
    public static final double LOW_C = -30.0;
    public static final double BIN_K = 0.5;
    public static final int BINS = 260;
    private static final int[] EMPTY = new int[0];

    public final int groups;
    public final int hours;
    private final double[] sumC;
    private final long[] count;
    /** Per group-hour, the index of its first kept bin. */
    private final short[] firstBin;
    /** Per group-hour, the counts of bins firstBin … firstBin + length − 1. */
    private final int[][] bins;
    /** The hour being gathered in {@link #open} (−1: none). */
    private transient int openHour = -1;
    /**
     * Full-width histograms of the open hour, per group (null until a group is first used), reused
     * from hour to hour: zero outside the open hour's added bins.
     */
    private transient int[][] open;
    /** Per group, whether it has values in the open hour. */
    private transient boolean[] touched;

    public GroupHourStats(int groups, int hours) {
        this.groups = groups;
        this.hours = hours;
        sumC = new double[groups * hours];
        count = new long[groups * hours];
        firstBin = new short[groups * hours];
        bins = new int[groups * hours][];
        Arrays.fill(bins, EMPTY);
    }

    /** The bin of a temperature [°C]: ⌊(T − LOW_C)/BIN_K⌋ clamped to 0 … BINS − 1. */
    static int bin(double tempC) {
        int b = (int) Math.floor((tempC - LOW_C) / BIN_K);
        return b < 0 ? 0 : (b >= BINS ? BINS - 1 : b);
    }

    /** Adds one cell's temperature [°C] to group {@code g} at hour {@code h}. */
    public void add(int g, int h, double tempC) {
        int gh = g * hours + h;
        sumC[gh] += tempC;
        count[gh]++;
        if (h != openHour) {
            close();
            openHour = h;
        }
        if (open == null) {
            open = new int[groups][];
            touched = new boolean[groups];
        }
        int[] o = open[g];
        if (!touched[g]) {
            if (o == null) {
                o = new int[BINS];
                open[g] = o;
            }
            touched[g] = true;
            addTrimmed(o, gh); // the hour may have been closed before (added out of order)
            bins[gh] = EMPTY;
        }
        o[bin(tempC)]++;
    }

    /** Trims the open hour's histograms into their group-hours. */
    private void close() {
        if (open == null || openHour < 0) {
            return;
        }
        for (int g = 0; g < groups; g++) {
            int[] o = open[g];
            if (!touched[g]) {
                continue;
            }
            int gh = g * hours + openHour;
            int lo = 0;
            while (lo < BINS && o[lo] == 0) {
                lo++;
            }
            int hi = BINS - 1;
            while (hi >= lo && o[hi] == 0) {
                hi--;
            }
            firstBin[gh] = (short) (lo < BINS ? lo : 0);
            bins[gh] = lo <= hi ? Arrays.copyOfRange(o, lo, hi + 1) : EMPTY;
            if (lo <= hi) {
                Arrays.fill(o, lo, hi + 1, 0); // every non-zero bin lies in lo … hi: the array is clear again
            }
            touched[g] = false;
        }
        openHour = -1;
    }

    /** Adds group-hour {@code gh}'s kept bins into a full-width histogram. */
    private void addTrimmed(int[] full, int gh) {
        int[] k = bins[gh];
        int f = firstBin[gh];
        for (int i = 0; i < k.length; i++) {
            full[f + i] += k[i];
        }
    }

    /** Adds a full-width histogram into group-hour {@code gh}, widening its kept range as needed. */
    private void addBins(int gh, int otherFirst, int[] other) {
        if (other.length == 0) {
            return;
        }
        int[] k = bins[gh];
        if (k.length == 0) {
            firstBin[gh] = (short) otherFirst;
            bins[gh] = other.clone();
            return;
        }
        int f = firstBin[gh];
        int lo = Math.min(f, otherFirst);
        int hi = Math.max(f + k.length, otherFirst + other.length);
        int[] r = (lo == f && hi == f + k.length) ? k : new int[hi - lo];
        if (r != k) {
            System.arraycopy(k, 0, r, f - lo, k.length);
        }
        for (int i = 0; i < other.length; i++) {
            r[otherFirst - lo + i] += other[i];
        }
        firstBin[gh] = (short) lo;
        bins[gh] = r;
    }

    /** Adds another tile's statistics (same groups and hours). */
    public void merge(GroupHourStats o) {
        if (o.groups != groups || o.hours != hours) {
            throw new IllegalArgumentException("cannot merge " + o.groups + "×" + o.hours + " into " + groups + "×" + hours);
        }
        close();
        o.close();
        for (int i = 0; i < sumC.length; i++) {
            sumC[i] += o.sumC[i];
            count[i] += o.count[i];
            addBins(i, o.firstBin[i], o.bins[i]);
        }
    }

    /** These statistics with groups merged: group g goes into {@code newGroupOf[g]} of {@code newGroups}. */
    public GroupHourStats regroup(int[] newGroupOf, int newGroups) {
        close();
        GroupHourStats r = new GroupHourStats(newGroups, hours);
        for (int g = 0; g < groups; g++) {
            int ng = newGroupOf[g];
            for (int h = 0; h < hours; h++) {
                int src = g * hours + h;
                int dst = ng * hours + h;
                r.sumC[dst] += sumC[src];
                r.count[dst] += count[src];
                r.addBins(dst, firstBin[src], bins[src]);
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

    /**
     * Quantile q ∈ (0, 1) [°C] from the histogram: the centre LOW_C + (b + ½)·BIN_K of the first bin
     * b whose cumulative count reaches q·n (±BIN_K/2), NaN when the group has no cell.
     */
    public double quantileC(int g, int h, double q) {
        close();
        int gh = g * hours + h;
        long n = count[gh];
        if (n == 0) {
            return Double.NaN;
        }
        double target = q * n;
        long cum = 0;
        int[] k = bins[gh];
        int f = firstBin[gh];
        for (int i = 0; i < k.length; i++) {
            cum += k[i];
            if (cum >= target) {
                return LOW_C + (f + i + 0.5) * BIN_K;
            }
        }
        return LOW_C + (BINS - 0.5) * BIN_K;
    }

    /** Bins kept over all group-hours (the memory of the histograms, in ints). */
    public long keptBins() {
        close();
        long s = 0;
        for (int[] k : bins) {
            s += k.length;
        }
        return s;
    }

    private void writeObject(java.io.ObjectOutputStream out) throws java.io.IOException {
        close();
        out.defaultWriteObject();
    }

    private void readObject(java.io.ObjectInputStream in) throws java.io.IOException, ClassNotFoundException {
        in.defaultReadObject();
        openHour = -1;
    }
}
