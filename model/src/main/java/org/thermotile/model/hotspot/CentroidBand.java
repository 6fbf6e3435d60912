package org.thermotile.model.hotspot;

import java.util.Arrays;
import java.util.Locale;

/**
 * A fixed distance band over points (the centroids of zones): zone j is a neighbour of zone i when
 * the distance between their centroids d_ij = √((x_i − x_j)² + (y_i − y_j)²) ≤ D [m], i itself
 * included, with binary weights w_ij = 1 (Getis & Ord 1992, section 2: the weights of a distance
 * band d; Gi* includes j = i). The band edge keeps a relative tolerance of 1e-9 of D, as
 * {@link DistanceBand} does on a raster.
 *
 * <p>Gi* and Moran's I on the zones are the formulas of {@link GiStar} and {@link MoransI} with
 * these weights: each zone is one observation, whatever its area (Getis & Ord 1992 and Ord &
 * Getis 1995 treat the units of a study area alike; the area only enters the zone's own mean).
 * Zones without data (value NaN: no valid cell, or below the minimum coverage) are left out of
 * every sum, as no-data cells are on a raster.
 *
 * <p>Neighbour lists are found by a sweep over the points sorted by x, then kept in ascending zone
 * order, so every sum runs over j = 0, 1, … like the O(n²) definition. Cost: O(n log n + n × k)
 * for k zones per band, plus the sweep over the zones within D in x.
 */
public final class CentroidBand {
    private final double distanceM;
    private final int[] start;     // CSR: neighbours of i are nbr[start[i] .. start[i+1]-1]
    private final int[] nbr;

    private CentroidBand(double distanceM, int[] start, int[] nbr) {
        this.distanceM = distanceM;
        this.start = start;
        this.nbr = nbr;
    }

    /**
     * The band of distance {@code distanceM} over the points (x_i, y_i) [m].
     *
     * @throws IllegalArgumentException when the arrays differ in length, a coordinate is not
     *                                  finite, or D is not a positive number
     */
    public static CentroidBand of(double[] x, double[] y, double distanceM) {
        if (x.length != y.length) {
            throw new IllegalArgumentException(x.length + " x but " + y.length + " y coordinates");
        }
        if (!(distanceM > 0) || !Double.isFinite(distanceM)) {
            throw new IllegalArgumentException("band distance " + distanceM + " m must be a positive number of metres");
        }
        int n = x.length;
        for (int i = 0; i < n; i++) {
            if (!Double.isFinite(x[i]) || !Double.isFinite(y[i])) {
                throw new IllegalArgumentException("centroid " + i + " is not finite: " + x[i] + ", " + y[i]);
            }
        }
        double reach = distanceM * (1 + DistanceBand.EDGE_TOLERANCE);
        double reach2 = reach * reach;
        Integer[] boxed = new Integer[n];
        for (int i = 0; i < n; i++) {
            boxed[i] = i;
        }
        Arrays.sort(boxed, (a, b) -> {
            int c = Double.compare(x[a], x[b]);
            return c != 0 ? c : Integer.compare(a, b);
        });
        int[] order = new int[n], pos = new int[n];
        for (int k = 0; k < n; k++) {
            order[k] = boxed[k];
            pos[order[k]] = k;
        }
        int[] start = new int[n + 1];
        int[] buf = new int[Math.max(16, n)];
        int[] all = new int[Math.max(16, n)];
        int size = 0;
        for (int i = 0; i < n; i++) {
            int m = 0;
            for (int dir = -1; dir <= 1; dir += 2) {
                for (int k = dir < 0 ? pos[i] : pos[i] + 1; k >= 0 && k < n; k += dir) {
                    int j = order[k];
                    double dx = x[j] - x[i];
                    if (Math.abs(dx) > reach) {
                        break;
                    }
                    double dy = y[j] - y[i];
                    if (dx * dx + dy * dy <= reach2) {
                        buf[m++] = j;
                    }
                }
            }
            Arrays.sort(buf, 0, m);
            if (size + m > all.length) {
                all = Arrays.copyOf(all, Math.max(all.length * 2, size + m));
            }
            System.arraycopy(buf, 0, all, size, m);
            size += m;
            start[i + 1] = size;
        }
        return new CentroidBand(distanceM, start, Arrays.copyOf(all, size));
    }

    /** The band distance D [m]. */
    public double distanceM() {
        return distanceM;
    }

    /** Number of points. */
    public int size() {
        return start.length - 1;
    }

    /** The neighbours of {@code i}, itself included, in ascending order (a copy). */
    public int[] neighbours(int i) {
        return Arrays.copyOfRange(nbr, start[i], start[i + 1]);
    }

    /**
     * Number of neighbours of each point other than itself that hold data (both values not NaN);
     * −1 where the point itself has no data.
     */
    public int[] validNeighbours(double[] values) {
        int[] out = new int[size()];
        for (int i = 0; i < out.length; i++) {
            if (Double.isNaN(values[i])) {
                out[i] = -1;
                continue;
            }
            for (int k = start[i]; k < start[i + 1]; k++) {
                int j = nbr[k];
                if (j != i && !Double.isNaN(values[j])) {
                    out[i]++;
                }
            }
        }
        return out;
    }

    /**
     * Gi* z-scores with binary weights ({@link GiStar#zScore}): x̄ and S from {@code global}. NaN
     * where the point has no data, and where no other point with data lies in its band (an
     * isolated zone is not tested: its "neighbourhood" would be itself alone).
     *
     * @param values one value per point [unit of the field], NaN for no data
     */
    public double[] zScores(double[] values, GlobalMoments global) {
        if (values.length != size()) {
            throw new IllegalArgumentException(values.length + " values for " + size() + " points");
        }
        if (global.count() < 2) {
            throw new IllegalArgumentException("Gi* needs at least 2 valid zones, the field has " + global.count());
        }
        double[] z = new double[size()];
        double n = global.count(), mean = global.mean(), sd = global.sd();
        for (int i = 0; i < z.length; i++) {
            if (Double.isNaN(values[i])) {
                z[i] = Double.NaN;
                continue;
            }
            double sumWX = 0, sumW = 0;
            int others = 0;
            for (int k = start[i]; k < start[i + 1]; k++) {
                int j = nbr[k];
                double v = values[j];
                if (Double.isNaN(v)) {
                    continue;
                }
                sumWX += v;
                sumW += 1;
                if (j != i) {
                    others++;
                }
            }
            z[i] = others == 0 ? Double.NaN : GiStar.zScore(sumWX, sumW, sumW, n, mean, sd);
        }
        return z;
    }

    /** Global Moran's I with these binary weights (self excluded), as {@link MoransI#of} on a raster. */
    public MoransI.Result moran(double[] values) {
        MoransI.Moments mo = MoransI.Moments.of(values, "Moran's I needs at least 3 valid zones, there are ");
        int n = mo.n();
        double mean = mo.mean(), m2 = mo.m2();
        double cross = 0, s0 = 0, sumRow2 = 0;
        for (int i = 0; i < size(); i++) {
            if (Double.isNaN(values[i])) {
                continue;
            }
            double rowSum = 0, rowCross = 0;
            for (int k = start[i]; k < start[i + 1]; k++) {
                int j = nbr[k];
                if (j == i || Double.isNaN(values[j])) {
                    continue;
                }
                rowSum += 1;
                rowCross += values[j] - mean;
            }
            cross += (values[i] - mean) * rowCross;
            s0 += rowSum;
            sumRow2 += rowSum * rowSum;
        }
        return MoransI.fromSums(distanceM, n, s0, sumRow2, cross, m2);
    }

    /**
     * The largest nearest-neighbour distance among the points with data [m]: the smallest band in
     * which every zone with data has a neighbour (common practice for the first distance of a scan,
     * from memory). A sweep over the points sorted by x that stops once |Δx| exceeds the best
     * distance found (exact; about O(n √n) for points spread over an area); 0 for fewer than 2 points.
     */
    public static double largestNearestNeighbour(double[] x, double[] y, double[] values) {
        int m = 0;
        for (double v : values) {
            m += Double.isNaN(v) ? 0 : 1;
        }
        if (m < 2) {
            return 0;
        }
        Integer[] boxed = new Integer[m];
        int k = 0;
        for (int i = 0; i < values.length; i++) {
            if (!Double.isNaN(values[i])) {
                boxed[k++] = i;
            }
        }
        Arrays.sort(boxed, (a, b) -> {
            int c = Double.compare(x[a], x[b]);
            return c != 0 ? c : Integer.compare(a, b);
        });
        double worst = 0;
        for (int p = 0; p < m; p++) {
            int i = boxed[p];
            double best = Double.POSITIVE_INFINITY;
            for (int dir = -1; dir <= 1; dir += 2) {
                for (int q = p + dir; q >= 0 && q < m; q += dir) {
                    int j = boxed[q];
                    double dx = x[j] - x[i];
                    if (Math.abs(dx) > best) {
                        break;
                    }
                    best = Math.min(best, Math.hypot(dx, y[j] - y[i]));
                }
            }
            worst = Math.max(worst, best);
        }
        return worst;
    }

    /**
     * Moran's I over D_k = k · step, k = 1 … steps (the zones' incremental scan; the peak, found
     * with {@link MoransI#peak}, is the default band).
     */
    public static MoransI.Result[] scan(double[] x, double[] y, double[] values, double stepM, int steps) {
        if (steps < 1 || !(stepM > 0)) {
            throw new IllegalArgumentException(String.format(Locale.ROOT, "scan of %d steps of %s m", steps, stepM));
        }
        MoransI.Result[] out = new MoransI.Result[steps];
        for (int k = 1; k <= steps; k++) {
            out[k - 1] = of(x, y, k * stepM).moran(values);
        }
        return out;
    }
}
