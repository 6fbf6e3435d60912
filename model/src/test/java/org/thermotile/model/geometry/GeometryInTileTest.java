package org.thermotile.model.geometry;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.SplittableRandom;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.thermotile.model.balance.Convection;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.forcing.TestWeather;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.tile.TileSimulation;

/** Geometry through the tile simulation: the kernel's shading, sky view and wall longwave. */
class GeometryInTileTest {
    private static Forcing forcing;
    private static TileSimulation.Settings settings;
    private static final Material[] ASPHALT = {MaterialLibrary.get("asphalt_aged")};

    /** Three clear July days at 45° N (invented site), statistics over the last two. */
    @BeforeAll
    static void weather() {
        forcing = TestWeather.clearJuly(3);
        settings = new TileSimulation.Settings(10, Convection.mcAdams(), Physical.ZERO_CELSIUS_K + 24, 24,
                Physical.ZERO_CELSIUS_K + 45, new int[0]);
    }

    private static TileSimulation.Geometry geometry(float[] h, float[] trees, int wc, int wr, int halo) {
        return new TileSimulation.Geometry(h, trees, wc, wr, halo, 1.0, 60.0, SkyViewFactor.DEFAULT_DIRECTIONS,
                0.3, 10.0, GeometryFactors.DEFAULT_WALL_EMISSIVITY);
    }

    private static int[] all(int cells) {
        return new int[cells]; // palette index 0 everywhere
    }

    /**
     * Flat open ground: b = 1 (or Ψ = 1 at low sun), Ψ = 1, so the geometry path gives the plain
     * path's temperatures (up to rounding of beam + diffuse against GHI) and no shade.
     */
    @Test
    void flatGroundGeometryEqualsNoGeometry() {
        int halo = 60;
        int tile = 4;
        int w = tile + 2 * halo;
        TileSimulation.Result plain = TileSimulation.run(ASPHALT, all(tile * tile), null, 0, forcing, settings);
        TileSimulation.Result geo = TileSimulation.run(ASPHALT, all(tile * tile), null, 0, forcing, settings,
                geometry(new float[w * w], null, w, w, halo));
        assertNull(plain.skyViewFactor);
        for (int c = 0; c < tile * tile; c++) {
            assertEquals(plain.peakC[c], geo.peakC[c], 1e-9);
            assertEquals(plain.meanC[c], geo.meanC[c], 1e-9);
            assertEquals(plain.nightMinC[c], geo.nightMinC[c], 1e-9);
            assertEquals(1.0, geo.skyViewFactor[c], 1e-12);
            assertEquals(0.0, geo.shadedHours[c], 0.0);
        }
    }

    /**
     * Physical response (the radiation balance, qualitatively as described for canyons by Oke
     * 1987, Boundary Layer Climates, 2nd ed.; from memory): the floor of an east–west street
     * canyon of H/W = 2 misses the beam for much of the day and part of the diffuse sky, so its
     * afternoon peak is lower than open asphalt's; by night the walls (at the air temperature)
     * send more longwave than the clear sky they hide, so its night minimum is higher. Its sky
     * view factor is Oke's cos(atan(2H/W)) within 0.01.
     */
    @Test
    void canyonFloorIsCoolerByDayAndWarmerByNight() {
        int halo = Shadows.haloCells(20, 10, 1.0); // 114
        int tc = 3;
        int tr = 41;
        int wc = tc + 2 * halo;
        int wr = tr + 2 * halo;
        float[] h = new float[wc * wr];
        int floor0 = halo + 15; // floor rows [floor0, floor0 + 11): W = 11 m between 20 m walls
        for (int r = 0; r < wr; r++) {
            boolean wall = (r >= floor0 - 15 && r < floor0) || (r >= floor0 + 11 && r < floor0 + 26);
            if (wall) {
                Arrays.fill(h, r * wc, (r + 1) * wc, 20f);
            }
        }
        TileSimulation.Result canyon = TileSimulation.run(ASPHALT, all(tc * tr), null, 0, forcing, settings,
                geometry(h, null, wc, wr, halo));
        TileSimulation.Result open = TileSimulation.run(ASPHALT, all(tc * tr), null, 0, forcing, settings);
        int centre = (floor0 + 5 - halo) * tc + 1;
        assertEquals(Math.cos(Math.atan(2 * 20.0 / 11.0)), canyon.skyViewFactor[centre], 0.01);
        assertTrue(canyon.peakC[centre] < open.peakC[centre] - 1.0,
                "canyon peak " + canyon.peakC[centre] + " °C, open " + open.peakC[centre] + " °C");
        assertTrue(canyon.nightMinC[centre] > open.nightMinC[centre],
                "canyon night minimum " + canyon.nightMinC[centre] + " °C, open " + open.nightMinC[centre] + " °C");
        assertTrue(canyon.shadedHours[centre] > 10, "shaded hours " + canyon.shadedHours[centre]);
        int roof = 5 * tc + 1; // a roof cell of the north block, above everything around it
        assertEquals(1.0, canyon.skyViewFactor[roof], 1e-12);
        assertEquals(0.0, canyon.shadedHours[roof], 0.0);
    }

    /**
     * Pins the documented treatment of trees in the sky view (README, "Trees in the sky view
     * factor"): tree crowns shade the beam (through the canopy transmissivity) but are not sky
     * view obstacles, and a tree cell's own sky view factor is that of the ground below it (0 m),
     * with the buildings around it as its only obstacles. So an east–west "canyon" of 20 m trees
     * leaves the floor Ψ = 1 exactly yet shaded, and an 8 m tree in a building canyon of H/W = 2
     * gets the canyon floor's Ψ (Oke 1987's cos(atan(2H/W)) within 0.01, as above).
     */
    @Test
    void treesShadeButAreNotSkyViewObstaclesAndTreeCellsSeeTheSkyFromTheGround() {
        int halo = Shadows.haloCells(20, 10, 1.0);
        int tc = 3;
        int tr = 41;
        int wc = tc + 2 * halo;
        int wr = tr + 2 * halo;
        int floor0 = halo + 15;
        float[] walls = new float[wc * wr];
        for (int r = 0; r < wr; r++) {
            if ((r >= floor0 - 15 && r < floor0) || (r >= floor0 + 11 && r < floor0 + 26)) {
                Arrays.fill(walls, r * wc, (r + 1) * wc, 20f);
            }
        }
        int centre = (floor0 + 5 - halo) * tc + 1;
        TileSimulation.Result treeRows = TileSimulation.run(ASPHALT, all(tc * tr), null, 0, forcing, settings,
                geometry(new float[wc * wr], walls, wc, wr, halo));
        assertEquals(1.0, treeRows.skyViewFactor[centre], 1e-12);
        assertTrue(treeRows.shadedHours[centre] > 5, "shaded hours under trees " + treeRows.shadedHours[centre]);

        float[] tree = new float[wc * wr];
        tree[(floor0 + 5) * wc + halo + 1] = 8f;
        TileSimulation.Result withTree = TileSimulation.run(ASPHALT, all(tc * tr), null, 0, forcing, settings,
                geometry(walls, tree, wc, wr, halo));
        TileSimulation.Result without = TileSimulation.run(ASPHALT, all(tc * tr), null, 0, forcing, settings,
                geometry(walls, null, wc, wr, halo));
        assertEquals(without.skyViewFactor[centre], withTree.skyViewFactor[centre], 1e-12);
        assertEquals(Math.cos(Math.atan(2 * 20.0 / 11.0)), withTree.skyViewFactor[centre], 0.01);
        assertEquals(without.skyViewFactor[centre - 1], withTree.skyViewFactor[centre - 1], 1e-12,
                "the tree does not lower its neighbour's sky view");
    }

    /**
     * Tile-size independence of the temperatures with geometry: a 40 × 30 seeded random city run
     * as one tile equals the same city run as 20 × 15 tiles with halos (bit for bit).
     */
    @Test
    void temperaturesDoNotDependOnTheTiling() {
        int cols = 40;
        int rows = 30;
        SplittableRandom rnd = new SplittableRandom(42);
        float[] city = new float[cols * rows];
        for (int i = 0; i < 25; i++) {
            int c0 = rnd.nextInt(cols);
            int r0 = rnd.nextInt(rows);
            float ht = 3f + 12f * (float) rnd.nextDouble();
            for (int r = r0; r < Math.min(rows, r0 + 2 + rnd.nextInt(5)); r++) {
                for (int c = c0; c < Math.min(cols, c0 + 2 + rnd.nextInt(5)); c++) {
                    city[r * cols + c] = ht;
                }
            }
        }
        int halo = Math.max(60, Shadows.haloCells(15, 10, 1.0));
        double[] whole = runTiles(city, cols, rows, cols, rows, halo);
        double[] split = runTiles(city, cols, rows, 20, 15, halo);
        for (int i = 0; i < whole.length; i++) {
            assertEquals(Double.doubleToLongBits(whole[i]), Double.doubleToLongBits(split[i]), "cell " + i);
        }
    }

    private static double[] runTiles(float[] city, int cols, int rows, int tw, int th, int halo) {
        double[] peak = new double[cols * rows];
        for (int tr0 = 0; tr0 < rows; tr0 += th) {
            for (int tc0 = 0; tc0 < cols; tc0 += tw) {
                int wc = tw + 2 * halo;
                int wr = th + 2 * halo;
                float[] w = new float[wc * wr];
                for (int r = 0; r < wr; r++) {
                    for (int c = 0; c < wc; c++) {
                        int gr = tr0 - halo + r;
                        int gc = tc0 - halo + c;
                        if (gr >= 0 && gr < rows && gc >= 0 && gc < cols) {
                            w[r * wc + c] = city[gr * cols + gc];
                        }
                    }
                }
                TileSimulation.Result res = TileSimulation.run(ASPHALT, all(tw * th), null, 0, forcing, settings,
                        geometry(w, null, wc, wr, halo));
                for (int r = 0; r < th; r++) {
                    for (int c = 0; c < tw; c++) {
                        peak[(tr0 + r) * cols + tc0 + c] = res.peakC[r * tw + c] + 1000 * res.nightMinC[r * tw + c];
                    }
                }
            }
        }
        return peak;
    }

    /** A halo too small for the search radius or the window's own shadows is refused. */
    @Test
    void tooSmallHaloIsRefused() {
        int halo = 20;
        int w = 4 + 2 * halo;
        float[] h = new float[w * w];
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> TileSimulation.run(
                ASPHALT, all(16), null, 0, forcing, settings, geometry(h, null, w, w, halo)));
        assertTrue(e.getMessage().contains("search radius"), e.getMessage());
        int halo2 = 60;
        int w2 = 4 + 2 * halo2;
        float[] h2 = new float[w2 * w2];
        h2[5] = 30f; // 30 m at 10° needs 171 cells
        e = assertThrows(IllegalArgumentException.class, () -> TileSimulation.run(
                ASPHALT, all(16), null, 0, forcing, settings, geometry(h2, null, w2, w2, halo2)));
        assertTrue(e.getMessage().contains("171"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> TileSimulation.run(
                ASPHALT, all(15), null, 0, forcing, settings, geometry(h2, null, w2, w2, halo2)));
    }
}
