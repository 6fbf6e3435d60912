package org.thermotile.model.resample;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.Test;

class ResampleTest {

    /**
     * Bilinear interpolation reproduces exactly every function of the form a + b·t + c·u + d·t·u
     * (the bilinear family itself; Press et al. 2007, Numerical Recipes 3rd ed., §3.6, eq. 3.6.5).
     * Seeded random coefficients and points.
     */
    @Test
    void bilinearIsExactOnBilinearFunctions() {
        Random rnd = new Random(20260713L);
        for (int k = 0; k < 200; k++) {
            double a = rnd.nextGaussian() * 10, b = rnd.nextGaussian(), c = rnd.nextGaussian(), d = rnd.nextGaussian();
            double t = rnd.nextDouble(), u = rnd.nextDouble();
            double expected = a + b * t + c * u + d * t * u;
            double got = Resample.bilinear(a, a + b, a + c, a + b + c + d, t, u);
            assertEquals(expected, got, 1e-12 * (1 + Math.abs(expected)));
        }
    }

    /** At the four corners bilinear returns the corner values (interpolation, not smoothing). */
    @Test
    void bilinearPassesThroughTheCorners() {
        assertEquals(1.0, Resample.bilinear(1, 2, 3, 4, 0, 0));
        assertEquals(2.0, Resample.bilinear(1, 2, 3, 4, 1, 0));
        assertEquals(3.0, Resample.bilinear(1, 2, 3, 4, 0, 1));
        assertEquals(4.0, Resample.bilinear(1, 2, 3, 4, 1, 1));
        assertEquals(2.5, Resample.bilinear(1, 2, 3, 4, 0.5, 0.5));
    }

    /** No-data (NaN) among the four gives the nearest of the four, never a mix with NaN. */
    @Test
    void bilinearWithNoDataTakesTheNearest() {
        assertEquals(7.0, Resample.bilinear(7, Double.NaN, 1, 1, 0.2, 0.3));
        assertEquals(5.0, Resample.bilinear(7, 5, Double.NaN, 1, 0.8, 0.1));
        assertTrue(Double.isNaN(Resample.bilinear(Double.NaN, 5, 1, 1, 0.1, 0.1)));
    }

    /** Majority is the statistical mode; ties go to the smallest value; no-data is left out. */
    @Test
    void majorityIsTheModeWithStatedTies() {
        assertEquals(3, Resample.majority(new int[] {3, 1, 3, 2}, 4, 0));
        assertEquals(1, Resample.majority(new int[] {2, 1, 2, 1}, 4, 0));      // tie: smallest
        assertEquals(2, Resample.majority(new int[] {0, 0, 0, 2}, 4, 0));      // no-data left out
        assertEquals(0, Resample.majority(new int[] {0, 0}, 2, 0));            // all no-data
        assertEquals(5, Resample.majority(new int[] {5, 9, 9, 9}, 1, 0));      // only n samples used
    }

    /** Majority does not depend on the order of the samples (seeded shuffles). */
    @Test
    void majorityIgnoresOrder() {
        Random rnd = new Random(7L);
        int[] v = {4, 4, 4, 1, 1, 1, 9, 9, 0, 0, 0, 0};
        for (int k = 0; k < 50; k++) {
            for (int i = v.length - 1; i > 0; i--) {
                int j = rnd.nextInt(i + 1);
                int x = v[i];
                v[i] = v[j];
                v[j] = x;
            }
            assertEquals(1, Resample.majority(v, v.length, 0));
        }
    }

    @Test
    void maxLeavesOutNoData() {
        assertEquals(12f, Resample.max(new float[] {3, Float.NaN, 12, 0}, 4));
        assertTrue(Float.isNaN(Resample.max(new float[] {Float.NaN, Float.NaN}, 2)));
        assertTrue(Float.isNaN(Resample.max(new float[0], 0)));
    }

    @Test
    void nearestIndexIsTheFloorOnHalfOpenCells() {
        assertEquals(0, Resample.nearestIndex(0.0));
        assertEquals(0, Resample.nearestIndex(0.999));
        assertEquals(1, Resample.nearestIndex(1.0));
        assertEquals(-1, Resample.nearestIndex(-0.001));
    }

    @Test
    void subSamplesPerAxis() {
        assertEquals(1, Resample.subSamples(0.4));
        assertEquals(1, Resample.subSamples(1.0));
        assertEquals(2, Resample.subSamples(2.0));
        assertEquals(3, Resample.subSamples(2.5));
        assertThrows(IllegalArgumentException.class, () -> Resample.subSamples(0));
    }
}
