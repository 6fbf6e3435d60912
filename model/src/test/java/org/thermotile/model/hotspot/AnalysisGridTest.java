package org.thermotile.model.hotspot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class AnalysisGridTest {

    /**
     * Conservation of the area-weighted total (the defining property of an area-weighted mean):
     * Σ_K x̄_K A_K = Σ_i a_i x_i, on a seeded raster of odd size (partial edge cells) with 10 %
     * no data. Tolerance: double rounding of ~900 additions, 1e-12 relative.
     */
    @Test
    void aggregationPreservesTheAreaWeightedTotal() {
        SplittableRandom rnd = new SplittableRandom(16);
        for (int f : new int[] {1, 3, 10}) {
            int w = 37, h = 23;
            float[] v = new float[w * h];
            double cellArea = 16.0;                 // 4 m cells
            double total = 0, area = 0;
            for (int i = 0; i < v.length; i++) {
                v[i] = rnd.nextDouble() < 0.1 ? Float.NaN : (float) (300 + 20 * rnd.nextDouble());
                if (!Float.isNaN(v[i])) {
                    total += cellArea * v[i];
                    area += cellArea;
                }
            }
            AnalysisGrid g = AnalysisGrid.aggregate(v, w, h, cellArea, f);
            assertEquals((w + f - 1) / f, g.width());
            assertEquals((h + f - 1) / f, g.height());
            double agg = 0, aggArea = 0;
            for (int k = 0; k < g.mean().length; k++) {
                if (!Double.isNaN(g.mean()[k])) {
                    agg += g.mean()[k] * g.validAreaM2()[k];
                    aggArea += g.validAreaM2()[k];
                }
            }
            assertEquals(total, agg, 1e-12 * total, "f = " + f);
            assertEquals(area, aggArea, 0.0, "f = " + f);
        }
    }

    @Test
    void partialEdgeCellsAndNoDataLowerTheCoverage() {
        // 5 × 1 raster, f = 2: cells {0,1}, {2,3}, {4}; cell 3 is no data.
        float[] v = {1, 3, 10, Float.NaN, 7};
        AnalysisGrid g = AnalysisGrid.aggregate(v, 5, 1, 1.0, 2);
        assertEquals(3, g.width());
        assertEquals(1, g.height());
        assertEquals(2.0, g.mean()[0], 0.0);
        assertEquals(10.0, g.mean()[1], 0.0);
        assertEquals(7.0, g.mean()[2], 0.0);
        assertEquals(0.5, g.coverage()[0], 0.0);     // 2 of 4 cells of a full 2 × 2 cell (one row only)
        assertEquals(0.25, g.coverage()[1], 0.0);
        assertEquals(0.25, g.coverage()[2], 0.0);
        AnalysisGrid empty = AnalysisGrid.aggregate(new float[] {Float.NaN, Float.NaN}, 2, 1, 1.0, 2);
        assertTrue(Double.isNaN(empty.mean()[0]));
        assertEquals(0.0, empty.coverage()[0], 0.0);
    }

    @Test
    void factorMustBeAWholeMultipleOfAtLeastOne() {
        assertEquals(10, AnalysisGrid.factor(40, 4));
        assertEquals(1, AnalysisGrid.factor(4, 4));
        assertThrows(IllegalArgumentException.class, () -> AnalysisGrid.factor(2, 4));
        assertThrows(IllegalArgumentException.class, () -> AnalysisGrid.factor(30, 4));
    }

    @Test
    void zoneMeansAreAreaWeighted() {
        float[] v = {1, 2, 3, Float.NaN, 5, 6};
        int[] zone = {0, 0, 1, 1, -1, 1};
        double[][] m = AnalysisGrid.zoneMeans(v, zone, 2, 4.0);
        assertEquals(1.5, m[0][0], 0.0);
        assertEquals(4.5, m[0][1], 0.0);
        assertEquals(8.0, m[1][0], 0.0);
        assertEquals(8.0, m[1][1], 0.0);
    }

    @Test
    void weightedMedianByHand() {
        // means 1, 2, 9 with areas 1, 1, 3: half the area (2.5) is reached only at 9.
        AnalysisGrid g = new AnalysisGrid(1, 3, 1, new double[] {9, 1, 2}, new double[] {3, 1, 1}, new double[3]);
        assertEquals(9.0, g.weightedMedian(), 0.0);
        // equal areas: the lower median of 1, 2, 9, 10 is 2.
        AnalysisGrid e = new AnalysisGrid(1, 4, 1, new double[] {10, 1, 9, 2}, new double[] {1, 1, 1, 1}, new double[4]);
        assertEquals(2.0, e.weightedMedian(), 0.0);
    }

    /**
     * Coverage rule: a 23 × 20 raster of 4 m cells at f = 10 leaves a last column of analysis
     * cells 3 cells wide, 30 % covered; at the default minimum coverage (0.5) they are left out
     * (mean NaN) with their coverage kept, and the full cells keep their means bit for bit. Each
     * kept or dropped mean is the exact area-weighted mean of its cells (values chosen so sums are
     * exact in binary: the aggregation is exact, not merely within rounding).
     */
    @Test
    void anEdgeCellThirtyPercentCoveredIsLeftOutAtTheDefault() {
        int w = 23, h = 20, f = 10;
        float[] v = new float[w * h];
        for (int r = 0; r < h; r++) {
            for (int c = 0; c < w; c++) {
                v[r * w + c] = (c % 4) * 0.25f + r;          // exact binary fractions
            }
        }
        AnalysisGrid g = AnalysisGrid.aggregate(v, w, h, 16.0, f);
        assertEquals(3, g.width());
        assertEquals(2, g.height());
        for (int ar = 0; ar < 2; ar++) {
            for (int ac = 0; ac < 3; ac++) {
                double sum = 0, area = 0;
                for (int r = ar * f; r < ar * f + f; r++) {
                    for (int c = ac * f; c < Math.min(w, ac * f + f); c++) {
                        sum += 16.0 * v[r * w + c];
                        area += 16.0;
                    }
                }
                assertEquals(sum / area, g.mean()[ar * 3 + ac], 0.0, "cell " + ac + ", " + ar);
                assertEquals(area, g.validAreaM2()[ar * 3 + ac], 0.0);
            }
            assertEquals(0.3, g.coverage()[ar * 3 + 2], 1e-15);
        }
        AnalysisGrid kept = g.withMinCoverage(AnalysisGrid.DEFAULT_MIN_COVERAGE);
        assertEquals(2, g.belowCoverage(AnalysisGrid.DEFAULT_MIN_COVERAGE));
        for (int ar = 0; ar < 2; ar++) {
            assertTrue(Double.isNaN(kept.mean()[ar * 3 + 2]), "30 % edge cell left out");
            assertEquals(0.3, kept.coverage()[ar * 3 + 2], 1e-15, "coverage carried");
            for (int ac = 0; ac < 2; ac++) {
                assertEquals(g.mean()[ar * 3 + ac], kept.mean()[ar * 3 + ac], 0.0);
            }
        }
        // At a minimum of 0.3 the edge cells stay (the minimum itself is kept); at 0 every cell with data stays.
        assertEquals(0, g.belowCoverage(0.3));
        assertEquals(g.mean()[2], g.withMinCoverage(0.3).mean()[2], 0.0);
        assertEquals(0, g.belowCoverage(0));
        assertThrows(IllegalArgumentException.class, () -> g.withMinCoverage(1.5));
        // The median leaves the dropped cells out: full cells only.
        AnalysisGrid full = AnalysisGrid.aggregate(java.util.Arrays.copyOf(v, v.length), w, h, 16.0, f);
        assertEquals(kept.weightedMedian(), medianOfColumns(full, 2), 0.0);
    }

    private static double medianOfColumns(AnalysisGrid g, int columns) {
        double[] m = new double[g.height() * columns];
        for (int r = 0; r < g.height(); r++) {
            for (int c = 0; c < columns; c++) {
                m[r * columns + c] = g.mean()[r * g.width() + c];
            }
        }
        java.util.Arrays.sort(m);
        return m[(m.length - 1) / 2];     // lower median of equal areas
    }
}
