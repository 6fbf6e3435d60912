package org.thermotile.model.hotspot;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** Gi* and Moran's I over zone centroids. */
class CentroidBandTest {

    /**
     * Gi* of scattered centroids against an O(n²) reference written here from the definition
     * (Getis & Ord 1992 eq. for G*_i with binary distance-band weights, standardised as in Ord &
     * Getis 1995: (Σ_j w_ij x_j − x̄ W_i) / (S √((n S₁ᵢ − W_i²)/(n − 1))), S the population
     * standard deviation), with 8 % of zones without data. Tolerance 1e-9 (summation order).
     */
    @Test
    void giStarMatchesTheQuadraticDefinition() {
        SplittableRandom rnd = new SplittableRandom(1992);
        int n = 300;
        double[] x = new double[n], y = new double[n], v = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = 500_000 + 1000 * rnd.nextDouble();
            y[i] = 5_020_000 + 700 * rnd.nextDouble();
            v[i] = rnd.nextDouble() < 0.08 ? Double.NaN : 30 + 3 * rnd.nextGaussian() + x[i] % 7 / 7;
        }
        for (double d : new double[] {45, 90, 200}) {
            CentroidBand band = CentroidBand.of(x, y, d);
            GlobalMoments g = new GlobalMoments();
            for (double a : v) {
                g.add(a);
            }
            double[] z = band.zScores(v, g);
            // Reference: the whole double loop.
            int m = 0;
            double sum = 0;
            for (double a : v) {
                if (!Double.isNaN(a)) {
                    m++;
                    sum += a;
                }
            }
            double mean = sum / m, ss = 0;
            for (double a : v) {
                if (!Double.isNaN(a)) {
                    ss += (a - mean) * (a - mean);
                }
            }
            double s = Math.sqrt(ss / m);
            int tested = 0;
            for (int i = 0; i < n; i++) {
                if (Double.isNaN(v[i])) {
                    assertTrue(Double.isNaN(z[i]));
                    continue;
                }
                double wx = 0, w = 0;
                int others = 0;
                for (int j = 0; j < n; j++) {
                    if (!Double.isNaN(v[j]) && Math.hypot(x[i] - x[j], y[i] - y[j]) <= d) {
                        wx += v[j];
                        w += 1;
                        others += j == i ? 0 : 1;
                    }
                }
                if (others == 0) {
                    assertTrue(Double.isNaN(z[i]), "isolated zone " + i + " is not tested");
                    continue;
                }
                tested++;
                double ref = (wx - mean * w) / (s * Math.sqrt((m * w - w * w) / (m - 1)));
                assertEquals(ref, z[i], 1e-9, "zone " + i + " at " + d + " m");
            }
            assertTrue(tested > n / 2, "most zones tested at " + d + " m: " + tested);
        }
    }

    /**
     * On a lattice the centroid band is the raster band: Moran's I and Gi* of points at the cell
     * centres equal {@link MoransI#of} and {@link GiStar} on the raster, to rounding (1e-12).
     */
    @Test
    void onALatticeTheCentroidBandIsTheRasterBand() {
        int w = 17, h = 13;
        double cell = 40;
        SplittableRandom rnd = new SplittableRandom(7);
        double[] v = new double[w * h], x = new double[w * h], y = new double[w * h];
        for (int r = 0; r < h; r++) {
            for (int c = 0; c < w; c++) {
                int i = r * w + c;
                v[i] = (r == 3 && c < 4) ? Double.NaN : 40 + rnd.nextGaussian() + 0.3 * c;
                x[i] = 500_020 + c * cell;
                y[i] = 5_020_000 - 20 - r * cell;
            }
        }
        GlobalMoments g = new GlobalMoments();
        for (double a : v) {
            g.add(a);
        }
        for (double d : new double[] {40, 80, 120}) {
            MoransI.Result raster = MoransI.of(v, w, h, cell, cell, d);
            MoransI.Result points = CentroidBand.of(x, y, d).moran(v);
            assertEquals(raster.i(), points.i(), 1e-12, "I at " + d);
            assertEquals(raster.z(), points.z(), 1e-9, "z(I) at " + d);

            DistanceBand band = DistanceBand.of(d, cell, cell, DistanceBand.Weights.BINARY);
            int rc = band.radiusCols(), rr = band.radiusRows();
            double[] win = new double[(w + 2 * rc) * (h + 2 * rr)];
            java.util.Arrays.fill(win, Double.NaN);
            for (int r = 0; r < h; r++) {
                System.arraycopy(v, r * w, win, (r + rr) * (w + 2 * rc) + rc, w);
            }
            double[] zr = new double[w * h];
            GiStar.zScores(win, w, h, band, g, zr);
            double[] zp = CentroidBand.of(x, y, d).zScores(v, g);
            assertArrayEquals(zr, zp, 1e-9, "Gi* at " + d);
        }
    }

    @Test
    void neighboursAreSymmetricSortedAndIncludeTheZoneItself() {
        double[] x = {0, 30, 60, 0, 1000}, y = {0, 0, 0, 40, 1000};
        CentroidBand b = CentroidBand.of(x, y, 50);
        assertArrayEquals(new int[] {0, 1, 3}, b.neighbours(0));
        assertArrayEquals(new int[] {0, 1, 2, 3}, b.neighbours(1));   // (30, 0)–(0, 40): exactly 50 m, in the band
        assertArrayEquals(new int[] {4}, b.neighbours(4));
        double[] v = {1, 2, 3, 4, 5};
        assertArrayEquals(new int[] {2, 3, 1, 2, 0}, b.validNeighbours(v));
        assertEquals(Math.hypot(940, 1000), CentroidBand.largestNearestNeighbour(x, y, v), 1e-9);
        GlobalMoments g = new GlobalMoments();
        for (double a : v) {
            g.add(a);
        }
        assertTrue(Double.isNaN(b.zScores(v, g)[4]), "an isolated zone is not tested");
    }

    /** The sweep's largest nearest-neighbour distance = the O(n²) minimum over pairs, with zones without data skipped. */
    @Test
    void largestNearestNeighbourMatchesThePairwiseMinimum() {
        SplittableRandom rnd = new SplittableRandom(44);
        for (int trial = 0; trial < 5; trial++) {
            int n = 50 + 70 * trial;
            double[] x = new double[n], y = new double[n], v = new double[n];
            for (int i = 0; i < n; i++) {
                x[i] = trial == 4 ? Math.floor(10 * rnd.nextDouble()) * 40 : 800 * rnd.nextDouble();   // ties in x
                y[i] = 600 * rnd.nextDouble();
                v[i] = rnd.nextDouble() < 0.1 ? Double.NaN : 1;
            }
            double worst = 0;
            for (int i = 0; i < n; i++) {
                if (Double.isNaN(v[i])) {
                    continue;
                }
                double best = Double.POSITIVE_INFINITY;
                for (int j = 0; j < n; j++) {
                    if (j != i && !Double.isNaN(v[j])) {
                        best = Math.min(best, Math.hypot(x[i] - x[j], y[i] - y[j]));
                    }
                }
                worst = Math.max(worst, best);
            }
            assertEquals(worst, CentroidBand.largestNearestNeighbour(x, y, v), 0.0, "trial " + trial);
        }
    }
}
