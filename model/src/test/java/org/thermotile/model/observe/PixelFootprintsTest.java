package org.thermotile.model.observe;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;

import org.junit.jupiter.api.Test;

class PixelFootprintsTest {
    /**
     * A 30 m pixel over 4 m cells, offset by 2 m from the grid: along x it covers 2 m of column 0
     * and all of columns 1–7 (2 + 7·4 = 30), the same along y. With v = col + 10·row the
     * area-weighted mean is, by hand, (0·2 + 4·(1+…+7))/30 · (1 + 10) = 112/30 · 11 = 41.0667.
     */
    @Test
    void thirtyMetrePixelOverFourMetreCellsIsTheAreaWeightedMean() {
        PixelFootprints grid = new PixelFootprints(1000.0, 5000.0, 4.0, 12, 12);
        double[] v = new double[144];
        for (int r = 0; r < 12; r++) {
            for (int c = 0; c < 12; c++) {
                v[r * 12 + c] = c + 10 * r;
            }
        }
        PixelFootprints.Footprint f = grid.rectangle(1002.0, 5000.0 - 32.0, 1032.0, 5000.0 - 2.0);
        assertEquals(64, f.cells().length);
        assertEquals(900.0, f.pixelArea(), 1e-9);
        assertEquals(1.0, f.coverage(), 1e-12);
        assertEquals(4.0, f.areas()[0], 1e-9, "corner cell: 2 m × 2 m");
        assertEquals(8.0, f.areas()[1], 1e-9, "edge cell: 4 m × 2 m");
        assertEquals(16.0, f.areas()[9], 1e-9, "inner cell");
        assertEquals(112.0 / 30.0 * 11.0, f.weightedMean(v), 1e-12);
    }

    /** A NaN cell (no data) drops out of both sums: its area does not count. */
    @Test
    void cellsWithoutValueAreLeftOut() {
        PixelFootprints grid = new PixelFootprints(0, 8, 4.0, 2, 2);
        double[] v = {10, 20, Double.NaN, 40};
        PixelFootprints.Footprint f = grid.rectangle(2, 2, 6, 6); // 2×2 m of each cell
        assertEquals((10 + 20 + 40) / 3.0, f.weightedMean(v), 1e-12);
    }

    /**
     * A square pixel turned 45° (a reprojected footprint) keeps its area: the overlaps sum to the
     * footprint's area 2·(a/√2)²… here a diamond with half-diagonal 10 m, area 200 m² (analytic);
     * and half of one hanging off the grid's west edge covers 0.5.
     */
    @Test
    void rotatedFootprintAreaIsConservedAndEdgesCount() {
        PixelFootprints grid = new PixelFootprints(0, 100, 4.0, 25, 25);
        PixelFootprints.Footprint f = grid.footprint(
                new double[] {50, 60, 50, 40}, new double[] {40, 50, 60, 50});
        assertEquals(200.0, f.pixelArea(), 1e-9);
        assertEquals(1.0, f.coverage(), 1e-12);
        PixelFootprints.Footprint edge = grid.footprint(
                new double[] {0, 10, 0, -10}, new double[] {40, 50, 60, 50});
        assertEquals(0.5, edge.coverage(), 1e-12);
        PixelFootprints.Footprint outside = grid.rectangle(200, 0, 230, 30);
        assertArrayEquals(new int[0], outside.cells());
        assertEquals(0.0, outside.coverage());
    }

    @Test
    void nearestSamplingForFinerPixels() {
        PixelFootprints grid = new PixelFootprints(0, 8, 4.0, 2, 2);
        assertEquals(0, grid.cellAt(1, 7));
        assertEquals(3, grid.cellAt(5, 1));
        assertEquals(-1, grid.cellAt(9, 1));
    }
}
