package org.thermotile.model.geometry;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.lang.management.ManagementFactory;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.junit.jupiter.api.Test;

/**
 * Tile-size independence: a tile computed from its window with a halo (clipped to the city and
 * padded with 0 m outside it, as the tile task reads it) gives bit-for-bit the values of the
 * whole city computed at once. A seeded random city of boxes (clearly invented test data) on an
 * odd-sized grid, so that edge tiles are partial.
 */
class TileEdgeTest {
    private static final int COLS = 300;
    private static final int ROWS = 270;
    private static final double CELL_M = 2.0;
    private static final double RADIUS_M = 40.0;
    private static final double MIN_SUN_DEG = 10.0;
    private static final double TAU = 0.25;
    private static final double[][] SUNS = {{15, 100}, {35, 285}, {62, 200}, {10, 45}};

    private static float[] randomCity(long seed, int boxes, float maxHeight) {
        SplittableRandom rnd = new SplittableRandom(seed);
        float[] h = new float[COLS * ROWS];
        for (int i = 0; i < boxes; i++) {
            int c0 = rnd.nextInt(COLS);
            int r0 = rnd.nextInt(ROWS);
            int w = 2 + rnd.nextInt(15);
            int d = 2 + rnd.nextInt(15);
            float height = 3f + (float) rnd.nextDouble() * (maxHeight - 3f);
            for (int r = r0; r < Math.min(ROWS, r0 + d); r++) {
                for (int c = c0; c < Math.min(COLS, c0 + w); c++) {
                    h[r * COLS + c] = Math.max(h[r * COLS + c], height);
                }
            }
        }
        return h;
    }

    /** The window of a tile with {@code halo} cells around it, zeros outside the city. */
    private static float[] windowWithHalo(float[] h, int tc0, int tr0, int tw, int th, int halo) {
        int wc = tw + 2 * halo;
        int wr = th + 2 * halo;
        float[] w = new float[wc * wr];
        for (int r = 0; r < wr; r++) {
            int gr = tr0 - halo + r;
            if (gr < 0 || gr >= ROWS) {
                continue;
            }
            for (int c = 0; c < wc; c++) {
                int gc = tc0 - halo + c;
                if (gc >= 0 && gc < COLS) {
                    w[r * wc + c] = h[gr * COLS + gc];
                }
            }
        }
        return w;
    }

    @ParameterizedTest
    @ValueSource(ints = {64, 256})
    void tilesWithHaloEqualTheWholeCity(int tile) {
        float[] heights = randomCity(20260713L, 260, 40f);
        float[] trees = randomCity(7L, 120, 14f);
        SkyViewFactor svf = new SkyViewFactor(CELL_M, RADIUS_M);
        double[] svfAll = svf.all(heights, COLS, ROWS);
        int shadowHalo = Shadows.haloCells(40, MIN_SUN_DEG, CELL_M);
        Shadows shadows = new Shadows(CELL_M, shadowHalo);
        double[][] beamAll = new double[SUNS.length][];
        for (int s = 0; s < SUNS.length; s++) {
            beamAll[s] = shadows.beamFactorsAll(heights, trees, TAU, COLS, ROWS, SUNS[s][0], SUNS[s][1]);
        }
        int halo = Math.max(svf.haloCells(), shadowHalo);
        long compared = 0;
        int partlyShaded = 0;
        for (int tr0 = 0; tr0 < ROWS; tr0 += tile) {
            for (int tc0 = 0; tc0 < COLS; tc0 += tile) {
                int tw = Math.min(tile, COLS - tc0);
                int th = Math.min(tile, ROWS - tr0);
                int wc = tw + 2 * halo;
                int wr = th + 2 * halo;
                float[] wh = windowWithHalo(heights, tc0, tr0, tw, th, halo);
                float[] wt = windowWithHalo(trees, tc0, tr0, tw, th, halo);
                double[] tileSvf = new double[tw * th];
                svf.window(wh, wc, wr, halo, halo, tw, th, tileSvf);
                double[] tileBeam = new double[tw * th];
                for (int s = 0; s < SUNS.length; s++) {
                    shadows.beamFactors(wh, wt, TAU, wc, wr, halo, halo, tw, th, SUNS[s][0], SUNS[s][1], tileBeam);
                    for (int r = 0; r < th; r++) {
                        for (int c = 0; c < tw; c++) {
                            int g = (tr0 + r) * COLS + tc0 + c;
                            assertEquals(beamAll[s][g], tileBeam[r * tw + c], 0.0,
                                    "beam factor, sun " + s + ", row " + (tr0 + r) + ", col " + (tc0 + c));
                            partlyShaded += tileBeam[r * tw + c] == TAU ? 1 : 0;
                        }
                    }
                }
                for (int r = 0; r < th; r++) {
                    for (int c = 0; c < tw; c++) {
                        int g = (tr0 + r) * COLS + tc0 + c;
                        assertEquals(Double.doubleToLongBits(svfAll[g]),
                                Double.doubleToLongBits(tileSvf[r * tw + c]),
                                "sky view factor at row " + (tr0 + r) + ", col " + (tc0 + c));
                        compared++;
                    }
                }
            }
        }
        assertEquals((long) COLS * ROWS, compared);
        assertTrue(partlyShaded > 0, "the city has tree shade");
    }

    /**
     * No allocation in the per-cell loops: the bytes the thread allocates while computing a
     * 300 × 270 window stay below 4 kB (one object per cell would be over 1 MB).
     */
    @Test
    void perCellLoopsDoNotAllocate() {
        java.lang.management.ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        Assumptions.assumeTrue(mx instanceof com.sun.management.ThreadMXBean,
                "this JVM does not report allocated bytes per thread");
        com.sun.management.ThreadMXBean bean = (com.sun.management.ThreadMXBean) mx;
        Assumptions.assumeTrue(bean.isThreadAllocatedMemorySupported() && bean.isThreadAllocatedMemoryEnabled());
        float[] heights = randomCity(99L, 200, 30f);
        SkyViewFactor svf = new SkyViewFactor(CELL_M, 20.0, 16);
        Shadows shadows = new Shadows(CELL_M, Shadows.haloCells(30, MIN_SUN_DEG, CELL_M));
        double[] out = new double[COLS * ROWS];
        double[] beam = new double[COLS * ROWS];
        for (int warm = 0; warm < 2; warm++) {
            svf.window(heights, COLS, ROWS, 0, 0, COLS, ROWS, out);
            shadows.beamFactors(heights, heights, TAU, COLS, ROWS, 0, 0, COLS, ROWS, 30, 140, beam);
        }
        long id = Thread.currentThread().getId();
        long before = bean.getThreadAllocatedBytes(id);
        svf.window(heights, COLS, ROWS, 0, 0, COLS, ROWS, out);
        shadows.beamFactors(heights, heights, TAU, COLS, ROWS, 0, 0, COLS, ROWS, 30, 140, beam);
        long allocated = bean.getThreadAllocatedBytes(id) - before;
        assertTrue(allocated < 4096, "allocated " + allocated + " bytes for " + COLS * ROWS + " cells");
    }
}
