package org.thermotile.model.geometry;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

class SkyViewFactorTest {

    /** Canyon floor width in cells: odd, so that one cell sits exactly on the centre line. */
    private static final int W_CELLS = 21;
    private static final int WALL_CELLS = 6;
    private static final int ROWS = 201;

    /**
     * An "infinite" street canyon along the y axis (north–south): floor of {@link #W_CELLS} cells
     * at 0 m between two building blocks of height H, {@link #ROWS} rows long; cell size 1 m.
     */
    private static float[] canyon(double heightM) {
        int cols = W_CELLS + 2 * WALL_CELLS;
        float[] h = new float[cols * ROWS];
        for (int r = 0; r < ROWS; r++) {
            for (int c = 0; c < cols; c++) {
                boolean wall = c < WALL_CELLS || c >= WALL_CELLS + W_CELLS;
                h[r * cols + c] = wall ? (float) heightM : 0f;
            }
        }
        return h;
    }

    /**
     * Infinite street canyon, centre of the floor: Ψ = cos(atan(2H/W)) (Oke 1987, Boundary Layer
     * Climates, 2nd ed.; Johnson &amp; Watson 1984, J. Climate Appl. Meteorol. 23, 329–335), within
     * 0.01. The search radius (80 m) reaches the walls in every sampled direction except along
     * the canyon (the nearest sampled azimuth, 11.25°, meets a wall 54 m away) and stays inside the
     * canyon's length (±100 m).
     */
    @ParameterizedTest
    @ValueSource(doubles = {0.5, 1.0, 2.0})
    void canyonFloorCentreMatchesOke(double aspect) {
        double w = W_CELLS; // [m], 1 m cells
        double hM = aspect * w;
        int cols = W_CELLS + 2 * WALL_CELLS;
        SkyViewFactor svf = new SkyViewFactor(1.0, 80.0);
        double got = svf.at(canyon(hM), cols, ROWS, WALL_CELLS + W_CELLS / 2, ROWS / 2);
        double expected = Math.cos(Math.atan(2 * hM / w));
        assertEquals(expected, got, 0.01, "H/W = " + aspect);
    }

    /**
     * Off the centre line, the 2-D view factor of an infinitesimal floor strip to the canyon's
     * opening, Ψ = ½(cos β₁ + cos β₂) with β₁, β₂ the elevations of the two wall tops (Hottel's
     * strip formula F = ½(sin φ₂ − sin φ₁); e.g. Modest, Radiative Heat Transfer, view factor
     * catalogue; from memory). It reduces to Oke's centre value when β₁ = β₂. Within 0.01.
     */
    @Test
    void canyonFloorOffCentreMatchesStripFormula() {
        double hM = 21.0; // H/W = 1
        int cols = W_CELLS + 2 * WALL_CELLS;
        SkyViewFactor svf = new SkyViewFactor(1.0, 80.0);
        float[] h = canyon(hM);
        for (int i : new int[] {2, 5, 15}) { // floor cell index from the west wall
            double xWest = i + 0.5;          // distance of the cell centre from each wall face [m]
            double xEast = W_CELLS - xWest;
            double expected = 0.5 * (Math.cos(Math.atan(hM / xWest)) + Math.cos(Math.atan(hM / xEast)));
            double got = svf.at(h, cols, ROWS, WALL_CELLS + i, ROWS / 2);
            assertEquals(expected, got, 0.01, "floor cell " + i);
        }
    }

    /** The direction sum converges to the integral: more directions, closer to Oke's value. */
    @Test
    void canyonErrorShrinksWithMoreDirections() {
        double hM = 2.0 * W_CELLS;
        int cols = W_CELLS + 2 * WALL_CELLS;
        double expected = Math.cos(Math.atan(2 * hM / W_CELLS));
        float[] h = canyon(hM);
        double e8 = Math.abs(new SkyViewFactor(1.0, 80.0, 8).at(h, cols, ROWS, WALL_CELLS + 10, ROWS / 2) - expected);
        double e16 = Math.abs(new SkyViewFactor(1.0, 80.0, 16).at(h, cols, ROWS, WALL_CELLS + 10, ROWS / 2) - expected);
        double e32 = Math.abs(new SkyViewFactor(1.0, 80.0, 32).at(h, cols, ROWS, WALL_CELLS + 10, ROWS / 2) - expected);
        assertTrue(e32 < e16 && e16 < e8, "errors " + e8 + ", " + e16 + ", " + e32);
    }

    /** Flat open ground sees the whole sky: Ψ = 1 (definition of the view factor), within 1e-12. */
    @Test
    void flatOpenGroundIsOne() {
        int cols = 37;
        int rows = 23;
        SkyViewFactor svf = new SkyViewFactor(2.0, 30.0, 16);
        for (float level : new float[] {0f, 12.5f}) { // bare ground, and one roof plane everywhere
            float[] h = new float[cols * rows];
            Arrays.fill(h, level);
            for (double v : svf.all(h, cols, rows)) {
                assertEquals(1.0, v, 1e-12);
            }
        }
    }

    /** A roof sees the sky above its own height: an isolated tower's roof has Ψ = 1, its foot less. */
    @Test
    void roofSeesSkyAboveItsOwnHeight() {
        int cols = 41;
        int rows = 41;
        float[] h = new float[cols * rows];
        for (int r = 18; r <= 22; r++) {
            for (int c = 18; c <= 22; c++) {
                h[r * cols + c] = 30f;
            }
        }
        SkyViewFactor svf = new SkyViewFactor(1.0, 20.0);
        assertEquals(1.0, svf.at(h, cols, rows, 20, 20), 1e-12);
        assertEquals(1.0, svf.at(h, cols, rows, 18, 18), 1e-12);
        double foot = svf.at(h, cols, rows, 20, 17);
        assertTrue(foot < 0.9 && foot > 0.4, "foot of the tower: " + foot);
    }

    /** Bad input names the place and the fix. */
    @Test
    void badHeightsAreRefusedWithTheirPlace() {
        float[] h = new float[12];
        h[7] = Float.NaN;
        SkyViewFactor svf = new SkyViewFactor(1.0, 5.0);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> svf.all(h, 4, 3));
        assertTrue(e.getMessage().contains("row 1, column 3") && e.getMessage().contains("Fix"), e.getMessage());
        h[7] = -2f;
        assertThrows(IllegalArgumentException.class, () -> svf.all(h, 4, 3));
        h[7] = 1500f;
        assertThrows(IllegalArgumentException.class, () -> svf.all(h, 4, 3));
        assertThrows(IllegalArgumentException.class, () -> svf.all(new float[11], 4, 3));
        assertThrows(IllegalArgumentException.class, () -> new SkyViewFactor(1.0, 5.0, 2));
        assertThrows(IllegalArgumentException.class, () -> new SkyViewFactor(1.0, 0.5));
    }
}
