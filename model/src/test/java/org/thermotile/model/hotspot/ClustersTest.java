package org.thermotile.model.hotspot;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

class ClustersTest {

    @Test
    void fourConnectedComponentsOfEqualCodes() {
        // 6 × 4, drawn by hand:
        //   3 3 0 2 2 0
        //   3 0 0 2 0 -1
        //   0 3 0 2 -1 -1
        //   9 9 9 0 0 -1     (9 = no data)
        int[] codes = {
            3, 3, 0, 2, 2, 0,
            3, 0, 0, 2, 0, -1,
            0, 3, 0, 2, -1, -1,
            9, 9, 9, 0, 0, -1};
        Clusters c = Clusters.label(codes, 6, 4, 9);
        // Clusters in order of first cell: {0,1,6} (3s), {3,4,9,15} (2s), {11,16,17,23} (−1s),
        // {13} (the 3 touching the first group only at a corner).
        assertEquals(4, c.count());
        assertArrayEquals(new int[] {0, 1, 6}, c.cells(0));
        assertArrayEquals(new int[] {3, 4, 9, 15}, c.cells(1));
        assertArrayEquals(new int[] {11, 16, 17, 23}, c.cells(2));
        assertArrayEquals(new int[] {13}, c.cells(3));
        assertEquals(Clusters.NONE, c.labelOf(2));
        assertEquals(Clusters.NONE, c.labelOf(18));
    }
}
