package org.thermotile.model.geometry;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class ShadowsTest {

    private static final int N = 200;              // grid of N × N cells of 1 m
    private static final int B0 = 90, B1 = 110;    // box footprint: columns and rows [90, 110)
    private static final float H = 20f;            // box height [m]

    private static float[] box() {
        float[] h = new float[N * N];
        for (int r = B0; r < B1; r++) {
            for (int c = B0; c < B1; c++) {
                h[r * N + c] = H;
            }
        }
        return h;
    }

    /**
     * A box building on flat ground: the shadow reaches H / tan(e) beyond the wall along the
     * anti-solar azimuth (plane geometry of a vertical edge and a sun ray), to the nearest cell.
     * Measured along the line from the box centre in the anti-solar direction: the distance
     * beyond the box of the last shaded cell centre on that line's cells. Three suns: due south
     * (shadow north), due east at a low 30° (shadow west), and oblique from 250°.
     */
    @ParameterizedTest
    @CsvSource({"45, 180", "30, 90", "60, 250"})
    void boxShadowLengthIsHeightOverTanElevation(double elevationDeg, double azimuthDeg) {
        Shadows sh = new Shadows(1.0, Shadows.haloCells(H, 10, 1.0));
        double[] b = sh.beamFactorsAll(box(), null, 0, N, N, elevationDeg, azimuthDeg);
        double expected = H / Math.tan(Math.toRadians(elevationDeg));
        // Walk from the box centre (100, 100) along the anti-solar azimuth in 0.01 m steps.
        double anti = Math.toRadians(azimuthDeg + 180);
        double ux = Math.sin(anti);
        double vy = -Math.cos(anti);
        double exitT = Double.NaN;
        double lastShadedT = Double.NaN;
        for (double t = 0; t < 90; t += 0.01) {
            double x = 100 + t * ux;
            double y = 100 + t * vy;
            int c = (int) Math.floor(x);
            int r = (int) Math.floor(y);
            boolean inBox = c >= B0 && c < B1 && r >= B0 && r < B1;
            if (!inBox && Double.isNaN(exitT)) {
                exitT = t;
            }
            if (!inBox && b[r * N + c] == 0.0) {
                // distance beyond the box of this cell's centre, projected on the line
                double cx = c + 0.5 - 100;
                double cy = r + 0.5 - 100;
                lastShadedT = cx * ux + cy * vy;
            }
        }
        double length = lastShadedT - exitT;
        assertEquals(expected, length, 1.0, "shadow length [m] for sun at " + elevationDeg + "°, "
                + azimuthDeg + "°");
    }

    /**
     * Every cell against the analytic shadow of a prism on flat ground: a ground point is shaded
     * when the horizontal segment of length H / tan(e) from it towards the sun meets the box's
     * footprint (the slab test for a segment and a rectangle). Cells whose entry distance is
     * within 1e-6 m of the shadow's edge are skipped (a tie either way is right).
     */
    @ParameterizedTest
    @CsvSource({"45, 180", "30, 90", "60, 250", "12, 131.7", "75, 333"})
    void everyCellMatchesTheAnalyticPrismShadow(double elevationDeg, double azimuthDeg) {
        Shadows sh = new Shadows(1.0, Shadows.haloCells(H, 10, 1.0));
        double[] b = sh.beamFactorsAll(box(), null, 0, N, N, elevationDeg, azimuthDeg);
        double lengthM = H / Math.tan(Math.toRadians(elevationDeg));
        double a = Math.toRadians(azimuthDeg);
        double wx = Math.sin(a);   // towards the sun, columns per metre
        double wy = -Math.cos(a);  // towards the sun, rows per metre
        int shaded = 0;
        for (int r = 0; r < N; r++) {
            for (int c = 0; c < N; c++) {
                boolean inBox = c >= B0 && c < B1 && r >= B0 && r < B1;
                if (inBox) {
                    assertEquals(1.0, b[r * N + c], 0.0, "flat roof is sunlit");
                    continue;
                }
                double enter = slabEntry(c + 0.5, r + 0.5, wx, wy);
                if (Math.abs(enter - lengthM) < 1e-6) {
                    continue;
                }
                boolean expected = enter < lengthM;
                assertEquals(expected ? 0.0 : 1.0, b[r * N + c], 0.0, "cell row " + r + ", col " + c);
                shaded += expected ? 1 : 0;
            }
        }
        assertTrue(shaded > 100, "the test saw a shadow");
    }

    /** Entry distance of the ray (x, y) + s (wx, wy), s ≥ 0, into the box; +∞ if it misses. */
    private static double slabEntry(double x, double y, double wx, double wy) {
        double lo = 0;
        double hi = Double.POSITIVE_INFINITY;
        double[][] axes = {{x, wx}, {y, wy}};
        for (double[] ax : axes) {
            double p = ax[0];
            double w = ax[1];
            if (Math.abs(w) < 1e-12) {
                if (p < B0 || p > B1) {
                    return Double.POSITIVE_INFINITY;
                }
                continue;
            }
            double s1 = (B0 - p) / w;
            double s2 = (B1 - p) / w;
            lo = Math.max(lo, Math.min(s1, s2));
            hi = Math.min(hi, Math.max(s1, s2));
        }
        return lo <= hi ? lo : Double.POSITIVE_INFINITY;
    }

    /** Trees pass τ of the beam; a building's shadow wins over a tree's; under a crown is τ. */
    @Test
    void canopyTransmitsTauAndBuildingsWin() {
        int n = 60;
        float[] h = new float[n * n];
        float[] trees = new float[n * n];
        // tree crown 8 m tall on rows 10..12, columns 20..22; building 10 m on rows 40..44, columns 20..24
        for (int r = 10; r <= 12; r++) {
            for (int c = 20; c <= 22; c++) {
                trees[r * n + c] = 8f;
            }
        }
        for (int r = 40; r <= 44; r++) {
            for (int c = 20; c <= 24; c++) {
                h[r * n + c] = 10f;
            }
            trees[r * n + 25] = 12f; // a row of taller trees just east of the building
        }
        double tau = 0.3;
        Shadows sh = new Shadows(1.0, 40);
        // Sun due south at 45°: shadows fall north (towards row 0) as long as the height.
        double[] b = sh.beamFactorsAll(h, trees, tau, n, n, 45, 180);
        assertEquals(tau, b[11 * n + 21], 0.0, "under the crown");
        assertEquals(tau, b[5 * n + 21], 0.0, "in the crown's shadow, 4.5 m north of it");
        assertEquals(1.0, b[1 * n + 21], 0.0, "beyond the crown's shadow (8 m)");
        assertEquals(0.0, b[35 * n + 22], 0.0, "in the building's shadow");
        assertEquals(tau, b[35 * n + 25], 0.0, "in the shadow of the trees beside it");
        assertEquals(1.0, b[42 * n + 22], 0.0, "the roof");
        assertEquals(1.0, b[50 * n + 22], 0.0, "south of the building");
        // Building shadow over a tree shadow: the building wins (0, not τ).
        float[] both = trees.clone();
        for (int c = 20; c <= 24; c++) {
            both[36 * n + c] = 6f; // a hedge inside the building's shadow
        }
        double[] b2 = sh.beamFactorsAll(h, both, tau, n, n, 45, 180);
        assertEquals(0.0, b2[34 * n + 22], 0.0);
    }

    /** Night: no beam anywhere. */
    @Test
    void sunBelowHorizonGivesNoBeam() {
        Shadows sh = new Shadows(1.0, 10);
        double[] b = sh.beamFactorsAll(box(), null, 0, N, N, -3, 200);
        for (double v : b) {
            assertEquals(0.0, v, 0.0);
        }
    }

    /**
     * The halo ⌈H / tan(e_min) / cell⌉: by hand, 30 m at 10° on 1 m cells is
     * 30 / 0.176327 = 170.14 → 171 cells (tan 10° = 0.176327, any table of tangents); 20 m at
     * 45° on 2 m cells is exactly 10.
     */
    @Test
    void haloFromTallestHeightAndLowestSun() {
        assertEquals(171, Shadows.haloCells(30, 10, 1.0));
        assertEquals(10, Shadows.haloCells(20, 45, 2.0));
        assertEquals(0, Shadows.haloCells(0, 5, 1.0));
        assertThrows(IllegalArgumentException.class, () -> Shadows.haloCells(30, 0, 1.0));
        assertThrows(IllegalArgumentException.class, () -> Shadows.haloCells(-1, 10, 1.0));
        assertThrows(IllegalArgumentException.class, () -> new Shadows(1.0, -1));
    }

    /** A shadow exactly the halo long is still found whole: rays reach the halo distance. */
    @Test
    void shadowAsLongAsTheHaloIsComplete() {
        double e = 10;
        int halo = Shadows.haloCells(H, e, 1.0);
        Shadows sh = new Shadows(1.0, halo);
        int n = 2 * halo + 40;
        float[] h = new float[n * n];
        int c0 = n - 30;
        for (int r = 0; r < n; r++) {
            h[r * n + c0] = H; // a long north–south wall of one cell
        }
        double[] b = sh.beamFactorsAll(h, null, 0, n, n, e, 90); // sun due east: shadow west
        double lengthM = H / Math.tan(Math.toRadians(e));
        int row = n / 2;
        int count = 0;
        for (int c = c0 - 1; c >= 0 && b[row * n + c] == 0.0; c--) {
            count++;
        }
        assertEquals(Math.round(lengthM), count, "cells shaded west of the wall");
    }
}
