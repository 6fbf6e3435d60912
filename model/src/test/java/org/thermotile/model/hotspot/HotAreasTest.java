package org.thermotile.model.hotspot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.Test;

/**
 * The whole analysis on synthetic cities of 4 m cells aggregated to 40 m (invented data). Noise:
 * independent N(0, σ²) per simulation cell, so an analysis cell of 100 cells has σ/10.
 */
class HotAreasTest {
    static final int W = 300, H = 250, F = 10, NODATA = -128;
    static final double CELL = 4, CELL_AREA = 16;
    static final NormalDistribution PHI = new NormalDistribution(null, 0, 1);

    static float[] noisyCity(long seed, double sigma) {
        SplittableRandom rnd = new SplittableRandom(seed);
        float[] v = new float[W * H];
        for (int i = 0; i < v.length; i++) {
            double g = Math.sqrt(-2 * Math.log(1 - rnd.nextDouble())) * Math.cos(2 * Math.PI * rnd.nextDouble());
            v[i] = (float) (318 + sigma * g);
        }
        return v;
    }

    static int[] analyse(float[] v, FalseDiscovery m, double q, double distanceM) {
        AnalysisGrid g = AnalysisGrid.aggregate(v, W, H, CELL_AREA, F);
        GlobalMoments gm = new GlobalMoments();
        for (double x : g.mean()) {
            gm.add(x);
        }
        DistanceBand band = DistanceBand.of(distanceM, CELL * F, CELL * F, DistanceBand.Weights.BINARY);
        HotAreas.Result r = HotAreas.analyse(g.mean(), g.width(), g.height(), band, gm, g.weightedMedian(), m, q, 1.0,
                PHI::cumulativeProbability, NODATA);
        return HotAreas.dropSmall(r.codes(), g.width(), g.height(), NODATA, 2);
    }

    /**
     * A planted 200 m × 200 m block (50 × 50 simulation cells, aligned to 5 × 5 analysis cells)
     * of +5 K in a city with σ = 3 K noise per 4 m cell: found as exactly one warm area of
     * 40 000 m² (tolerance: the 25 cells of the block, ± 0 cells; an aligned block has no partial
     * cell, and the noise of a 40 m cell, σ = 0.3 K, cannot reach the 1 K minimum excess outside
     * it nor undo the 5 K inside), with the band distance found by the Moran's I rule.
     */
    @Test
    void plantedBlockIsOneAreaOfTheRightSize() {
        float[] v = noisyCity(7, 3.0);
        int c0 = 100, r0 = 80;
        for (int r = r0; r < r0 + 50; r++) {
            for (int c = c0; c < c0 + 50; c++) {
                v[r * W + c] += 5f;
            }
        }
        AnalysisGrid g = AnalysisGrid.aggregate(v, W, H, CELL_AREA, F);
        double d = MoransI.peak(MoransI.scan(g.mean(), g.width(), g.height(), CELL * F, 8));
        assertTrue(d >= CELL * F);
        int[] codes = analyse(v, FalseDiscovery.BY, 0.05, d);
        int[] sign = new int[codes.length];
        for (int i = 0; i < codes.length; i++) {
            sign[i] = Integer.signum(codes[i] == NODATA ? 0 : codes[i]);
        }
        Clusters c = Clusters.label(sign, g.width(), g.height(), NODATA);
        assertEquals(1, c.count(), "areas at D = " + d + " m");
        assertEquals(25, c.size(0));
        assertEquals(40_000.0, c.size(0) * (CELL * F) * (CELL * F), 0.0);
        for (int i : c.cells(0)) {
            assertEquals(40, codes[i], "+5 K is in the 'warmer by >= 4 K' band");
        }
    }

    /**
     * A city of pure noise (σ = 7 K per 4 m cell, 0.7 K per 40 m cell, so about 15 % of the
     * analysis cells exceed the 1 K minimum by chance) over 20 seeded repeats at q = 0.05 (BH):
     * under the complete null BH's FDR equals the chance of any false discovery and is at most q
     * (Benjamini & Hochberg 1995, theorem 1 and its remark on the familywise error), so the number
     * of repeats with a false area is Binomial(20, ≤ 0.05), mean ≤ 1; we assert at most 3
     * (P(X &gt; 3) ≈ 0.016 at p = 0.05). The number of false areas is counted.
     */
    @Test
    void pureNoiseGivesNoHotArea() {
        int repeatsWithArea = 0, falseAreas = 0;
        for (long seed = 100; seed < 120; seed++) {
            int[] codes = analyse(noisyCity(seed, 7.0), FalseDiscovery.BH, 0.05, 80);
            int[] sign = new int[codes.length];
            for (int i = 0; i < codes.length; i++) {
                sign[i] = codes[i] == NODATA ? 0 : Integer.signum(codes[i]);
            }
            int n = Clusters.label(sign, W / F, H / F, NODATA).count();
            falseAreas += n;
            repeatsWithArea += n > 0 ? 1 : 0;
        }
        assertTrue(repeatsWithArea <= 3, repeatsWithArea + " of 20 noise cities have an area (" + falseAreas + " areas)");
    }

    /** The excess test alone would flag many noise cells: the check above is not empty. */
    @Test
    void noiseCellsDoExceedTheMinimumExcess() {
        AnalysisGrid g = AnalysisGrid.aggregate(noisyCity(100, 7.0), W, H, CELL_AREA, F);
        double med = g.weightedMedian();
        int over = 0;
        for (double m : g.mean()) {
            over += Math.abs(m - med) >= 1.0 ? 1 : 0;
        }
        assertTrue(over > g.mean().length / 20, over + " cells");
    }

    @Test
    void dropSmallRemovesSingleCells() {
        int[] codes = {10, 0, 0, 20, 20, 0, 0, 0, -10, NODATA};
        int[] out = HotAreas.dropSmall(codes, 5, 2, NODATA, 2);
        assertEquals(0, out[0]);
        assertEquals(20, out[3]);
        assertEquals(0, out[8]);
        assertEquals(NODATA, out[9]);
    }
}
