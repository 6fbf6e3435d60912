package org.thermotile.jobs.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/** Nice numbers (Heckbert 1990): the 1-2-5 series, worked by hand. */
class NiceScaleTest {
    @Test
    void niceFloorIsTheLargest125NumberBelow() {
        assertEquals(50, NiceScale.niceFloor(75), 0);
        assertEquals(2000, NiceScale.niceFloor(2500), 0);
        assertEquals(200, NiceScale.niceFloor(200), 0);
        assertEquals(1000, NiceScale.niceFloor(1999), 0);
        assertEquals(0.5, NiceScale.niceFloor(0.7), 1e-12);
    }

    @Test
    void looseTicksCoverTheRangeOnA125Step() {
        // 26.5 … 55.8: range 29.3 → nice 50; 50/5 = 10 → rounded nice 10 → ticks 20 … 60
        assertArrayEquals(new double[] {20, 30, 40, 50, 60}, NiceScale.looseTicks(26.5, 55.8, 6), 1e-12);
        assertArrayEquals(new double[] {26.5}, NiceScale.looseTicks(26.5, 26.5, 6), 0);
        double[] t = NiceScale.looseTicks(-4.5, 5.3, 6);
        assertTrue(t[0] <= -4.5 && t[t.length - 1] >= 5.3);
    }

    @Test
    void innerTicksStayInside() {
        assertArrayEquals(new double[] {30, 40, 50}, NiceScale.innerTicks(26.5, 55.8, 6), 1e-12);
        assertEquals("0.5", NiceScale.label(0.5, 0.5));
        assertEquals("40", NiceScale.label(40, 10));
    }

    @Test
    void distanceLabels() {
        assertEquals("50 m", MapRenderer.distanceLabel(50));
        assertEquals("2 km", MapRenderer.distanceLabel(2000));
        assertEquals("0.5 m", MapRenderer.distanceLabel(0.5));
    }
}
