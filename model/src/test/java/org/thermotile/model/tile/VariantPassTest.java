package org.thermotile.model.tile;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.ObjectOutputStream;
import java.io.UncheckedIOException;
import java.util.SplittableRandom;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.thermotile.model.balance.Convection;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.forcing.TestWeather;
import org.thermotile.model.geometry.GeometryFactors;
import org.thermotile.model.geometry.SkyViewFactor;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;

/**
 * The variant pass ({@link TileSimulation#runVariants}): several programmes of one tile stepped
 * together, the unchanged cells once. Its promise is exact, so the checks are bit for bit against
 * each variant run on its own: every per-cell statistic, hourly map and total, and the group-hour
 * histograms compared in their serialised form.
 */
class VariantPassTest {
    private static Forcing forcing;
    private static TileSimulation.Settings settings;

    private static final int TILE = 12;
    private static final int HALO = 36;
    private static final int CELLS = TILE * TILE;

    /** Two clear July days at 45° N (invented site), statistics over the second, two hourly maps. */
    @BeforeAll
    static void weather() {
        forcing = TestWeather.clearJuly(2);
        settings = new TileSimulation.Settings(10, Convection.mcAdams(), Physical.ZERO_CELSIUS_K + 24, 24,
                Physical.ZERO_CELSIUS_K + 45, new int[] {30, 38});
    }

    /** The base palette: dry and evaporating, slab and layered constructions. */
    private static Material[] basePalette() {
        return new Material[] {MaterialLibrary.get("asphalt_aged"), MaterialLibrary.get("roof_membrane_dark"),
            MaterialLibrary.get("grass_irrigated"), MaterialLibrary.get("concrete_pavers"),
            MaterialLibrary.get("tree_canopy")};
    }

    /** A base palette with programme materials appended (the jobs' layout of a variant's palette). */
    private static Material[] extended(String... ids) {
        Material[] base = basePalette();
        Material[] out = java.util.Arrays.copyOf(base, base.length + ids.length);
        for (int i = 0; i < ids.length; i++) {
            out[base.length + i] = MaterialLibrary.get(ids[i]);
        }
        return out;
    }

    private static int[] baseline(long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        int[] idx = new int[CELLS];
        for (int c = 0; c < CELLS; c++) {
            idx[c] = r.nextInt(10) == 0 ? TileSimulation.NO_MATERIAL : r.nextInt(5);
        }
        return idx;
    }

    /**
     * Buildings (on the dark-roof cells, 6…20 m) and trees in a window whose halo has blocks of its
     * own; shadows cast down to 30° of sun elevation, which a 36-cell halo covers for 20 m.
     */
    private static TileSimulation.Geometry geometry(int[] idx) {
        int w = TILE + 2 * HALO;
        float[] heights = new float[w * w];
        float[] trees = new float[w * w];
        SplittableRandom r = new SplittableRandom(7);
        for (int row = 0; row < w; row++) {
            for (int col = 0; col < w; col++) {
                boolean inside = row >= HALO && row < HALO + TILE && col >= HALO && col < HALO + TILE;
                int i = row * w + col;
                if (inside) {
                    int c = (row - HALO) * TILE + (col - HALO);
                    if (idx[c] == 1) {
                        heights[i] = 6 + r.nextInt(15);
                    } else if (idx[c] == 4) {
                        trees[i] = 8;
                    }
                } else if (r.nextInt(12) == 0) {
                    heights[i] = 10;
                }
            }
        }
        return new TileSimulation.Geometry(heights, trees, w, w, HALO, 1.0, 30.0, SkyViewFactor.DEFAULT_DIRECTIONS,
                0.3, 30.0, GeometryFactors.DEFAULT_WALL_EMISSIVITY);
    }

    private static int[] districts() {
        int[] d = new int[CELLS];
        for (int c = 0; c < CELLS; c++) {
            d[c] = c % TILE < 4 ? -1 : (c / TILE < 6 ? 0 : 1);
        }
        return d;
    }

    private static byte[] bytes(Object r) {
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        try (ObjectOutputStream o = new ObjectOutputStream(b)) {
            o.writeObject(r);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return b.toByteArray();
    }

    /** Every output of a result, bit for bit (all but the stepped cell-hours, which the pass saves). */
    private static void assertSameBits(TileSimulation.Result alone, TileSimulation.Result inPass, String what) {
        assertArrayEquals(alone.peakC, inPass.peakC, what + ": peak");
        assertArrayEquals(alone.meanC, inPass.meanC, what + ": mean");
        assertArrayEquals(alone.nightMinC, inPass.nightMinC, what + ": night minimum");
        assertArrayEquals(alone.degreeHoursAbove, inPass.degreeHoursAbove, what + ": degree-hours");
        for (int i = 0; i < alone.hourlyC.length; i++) {
            assertArrayEquals(alone.hourlyC[i], inPass.hourlyC[i], what + ": hourly map " + i);
        }
        assertArrayEquals(alone.shadedHours, inPass.shadedHours, what + ": shaded hours");
        assertArrayEquals(alone.skyViewFactor, inPass.skyViewFactor, what + ": sky view factor");
        assertArrayEquals(alone.paletteCells, inPass.paletteCells, what + ": cells per palette entry");
        assertEquals(alone.maxClosureResidual, inPass.maxClosureResidual, 0.0, what + ": closure");
        assertEquals(alone.cellHours, inPass.cellHours, what + ": cell-hours");
        assertArrayEquals(bytes(alone.materialHours), bytes(inPass.materialHours), what + ": material-hour histograms");
        assertEquals(alone.districtHours == null, inPass.districtHours == null, what + ": district hours present");
        if (alone.districtHours != null) {
            assertArrayEquals(bytes(alone.districtHours), bytes(inPass.districtHours), what + ": district-hour histograms");
        }
    }

    /**
     * Baseline, a cool-roof programme on some dark roofs, a greening programme that also plants
     * on nodata cells and clears others, and a variant identical to the baseline: each, from the
     * pass, equals its run alone, with geometry and districts.
     */
    @Test
    void everyVariantEqualsItsRunAloneBitForBit() {
        int[] base = baseline(11);
        Material[][] palettes = {basePalette(), extended("roof_membrane_white"), extended("green_roof"), basePalette()};
        int[][] idx = {base, base.clone(), base.clone(), base.clone()};
        for (int c = 0; c < CELLS; c++) {
            if (base[c] == 1 && c % 3 != 0) {
                idx[1][c] = 5;                      // cool roof
            }
            if (base[c] == 3 && c % 2 == 0) {
                idx[2][c] = 5;                      // pavers greened
            }
            if (base[c] == TileSimulation.NO_MATERIAL && c % 2 == 0) {
                idx[2][c] = 2;                      // planted where the land cover had nothing
            }
            if (base[c] == 0 && c % 5 == 0) {
                idx[2][c] = TileSimulation.NO_MATERIAL;
            }
        }
        int[] district = districts();
        TileSimulation.Geometry geom = geometry(base);
        TileSimulation.Result[] pass = TileSimulation.runVariants(palettes, idx, district, 2, forcing, settings, geom);
        assertEquals(palettes.length, pass.length);
        for (int v = 0; v < palettes.length; v++) {
            TileSimulation.Result alone = TileSimulation.run(palettes[v], idx[v], district, 2, forcing, settings, geom);
            assertSameBits(alone, pass[v], "variant " + v);
        }
        // The pass stepped the reference whole, each programme only its changed cells.
        assertEquals(pass[0].cellHours, pass[0].steppedCellHours);
        assertTrue(pass[1].steppedCellHours > 0 && pass[1].steppedCellHours < pass[1].cellHours / 4,
                "the cool roofs change a few cells: " + pass[1].steppedCellHours + " of " + pass[1].cellHours);
        assertTrue(pass[2].steppedCellHours > 0 && pass[2].steppedCellHours < pass[2].cellHours / 2);
        assertEquals(0, pass[3].steppedCellHours, "a variant equal to the reference steps nothing of its own");
    }

    /** Without geometry or districts, and with a reference that lacks cells a variant has. */
    @Test
    void plainTilesAndAReferenceWithFewerCells() {
        int[] ref = baseline(3);
        int[] more = ref.clone();
        for (int c = 0; c < CELLS; c++) {
            if (more[c] == TileSimulation.NO_MATERIAL) {
                more[c] = 4;
            }
        }
        Material[][] palettes = {basePalette(), basePalette()};
        int[][] idx = {ref, more};
        TileSimulation.Result[] pass = TileSimulation.runVariants(palettes, idx, null, 0, forcing, settings, null);
        for (int v = 0; v < 2; v++) {
            assertSameBits(TileSimulation.run(palettes[v], idx[v], forcing, settings), pass[v], "variant " + v);
        }
        // A reference with no cells at all: the other variant steps everything itself.
        int[] none = new int[CELLS];
        java.util.Arrays.fill(none, TileSimulation.NO_MATERIAL);
        TileSimulation.Result[] empty = TileSimulation.runVariants(palettes, new int[][] {none, ref}, null, 0,
                forcing, settings, null);
        assertEquals(0, empty[0].cellHours);
        assertSameBits(TileSimulation.run(palettes[1], ref, forcing, settings), empty[1], "beside an empty reference");
    }

    @Test
    void variantsOfDifferentSizesAreRefused() {
        Material[][] palettes = {basePalette(), basePalette()};
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> TileSimulation.runVariants(
                palettes, new int[][] {new int[4], new int[5]}, null, 0, forcing, settings, null));
        assertTrue(e.getMessage().contains("same cells"), e.getMessage());
    }
}
