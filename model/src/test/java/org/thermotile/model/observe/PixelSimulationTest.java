package org.thermotile.model.observe;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.thermotile.model.balance.Convection;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.forcing.TestWeather;
import org.thermotile.model.geometry.GeometryFactors;
import org.thermotile.model.geometry.Shadows;
import org.thermotile.model.geometry.SkyViewFactor;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.tile.TileSimulation;

/** A pixel simulated as its own cells gives what the city tile gives those cells, area-weighted. */
class PixelSimulationTest {
    static Forcing forcing;
    static TileSimulation.Settings settings;
    static final Material[] PALETTE = {MaterialLibrary.get("asphalt_aged"), MaterialLibrary.get("grass_irrigated"),
        MaterialLibrary.get("roof_membrane_dark")};
    /** Hour 13 local of the second day (UTC+2 synthetic weather starts at local midnight). */
    static int h13;

    @BeforeAll
    static void weather() {
        forcing = TestWeather.clearJuly(3);
        settings = new TileSimulation.Settings(10, Convection.mcAdams(), Physical.ZERO_CELSIUS_K + 24, 24,
                Physical.ZERO_CELSIUS_K + 45, new int[0]);
        for (int h = 24; h < forcing.hours(); h++) {
            if (forcing.localHourOfDay(h) == 13) {
                h13 = h;
                break;
            }
        }
        assertTrue(h13 > 24 && h13 + 24 < forcing.hours(), "hour " + h13 + " leaves a day after it to cut");
    }

    /** The whole forcing's hourly outputs at {@code hours}, [hour][cell] in K. */
    static double[][] reference(int[] cells, TileSimulation.Geometry g, int... hours) {
        TileSimulation.Result r = TileSimulation.run(PALETTE, cells, null, 0, forcing,
                new TileSimulation.Settings(10, settings.convection(), settings.deepGroundK(), 24,
                        settings.thresholdK(), hours), g);
        double[][] out = new double[hours.length][cells.length];
        for (int k = 0; k < hours.length; k++) {
            for (int c = 0; c < cells.length; c++) {
                out[k][c] = r.hourlyC[k][c] + Physical.ZERO_CELSIUS_K;
            }
        }
        return out;
    }

    /**
     * Two cells covered 3 m² and 1 m², one not covered: the area-weighted mean (by hand) of the
     * cells' own temperatures from a run over the whole forcing (so the cut forcing changes
     * nothing), at 13:00 and a quarter past (linear in between, as the comparison).
     */
    @Test
    void pixelIsTheAreaWeightedMeanOfItsCells() {
        int[] cells = {0, 1, 2};
        double[][] ref = reference(cells, null, h13, h13 + 1);
        PixelCells p = new PixelCells(new int[] {0, 1, TileSimulation.NO_MATERIAL}, new double[] {3, 1, 0}, null);
        PixelSimulation sim = new PixelSimulation(forcing, settings, new double[] {h13, h13 + 0.25});
        assertTrue(sim.hours() < forcing.hours(), "forcing cut after the last hour needed");
        double[] v = sim.simulate(PALETTE, List.of(p))[0];
        double at13 = (3 * ref[0][0] + ref[0][1]) / 4;
        double at14 = (3 * ref[1][0] + ref[1][1]) / 4;
        assertEquals(at13, v[0], 1e-9);
        assertEquals(at13 + 0.25 * (at14 - at13), v[1], 1e-9);
        assertTrue(Math.abs(ref[0][0] - ref[0][1]) > 5, "asphalt and lawn differ at 13:00");
        assertEquals(0, p.dominant(PALETTE.length), "asphalt covers most");
    }

    /** Flat pixels run together (one kernel run) give exactly what each gives alone. */
    @Test
    void flatPixelsTogetherEqualEachAlone() {
        PixelSimulation sim = new PixelSimulation(forcing, settings, new double[] {h13});
        PixelCells a = new PixelCells(new int[] {0, 2}, new double[] {1, 2}, null);
        PixelCells b = PixelCells.flat(1);
        double[][] both = sim.simulate(PALETTE, List.of(a, b));
        assertArrayEquals(sim.simulate(PALETTE, List.of(a))[0], both[0]);
        assertArrayEquals(sim.simulate(PALETTE, List.of(b))[0], both[1]);
    }

    /**
     * A 2 × 2-cell pixel inside an 8 × 8 tile beside a 10 m block: simulated through its own window
     * (the tile's heights around it, same halo) its cells get the sky view factor and shadows the
     * tile gives them, so the pixel equals the tile's cells bit for bit, area-weighted.
     */
    @Test
    void pixelWindowWithGeometryEqualsTheTilesCells() {
        double cell = 5;
        double radius = 30;
        int dirs = 32;
        double minSun = 10;
        int halo = Math.max(new SkyViewFactor(cell, radius, dirs).haloCells(), Shadows.haloCells(10, minSun, cell));
        int tw = 8;
        int ww = tw + 2 * halo;
        float[] heights = new float[ww * ww];
        int[] tileCells = new int[tw * tw];
        for (int r = 0; r < tw; r++) {
            for (int c = 0; c < tw; c++) {
                boolean roof = r >= 2 && r <= 3 && c >= 5 && c <= 6;
                heights[(r + halo) * ww + c + halo] = roof ? 10f : 0f;
                tileCells[r * tw + c] = roof ? 2 : (r + c) % 2;
            }
        }
        TileSimulation.Geometry tile = new TileSimulation.Geometry(heights, null, ww, ww, halo, cell, radius, dirs, 0.3,
                minSun, GeometryFactors.DEFAULT_WALL_EMISSIVITY);
        double[][] ref = reference(tileCells, tile, h13);
        // The pixel: tile cells (row 4..5, col 4..5), its window the tile's heights from (4, 4).
        int pw = 2 + 2 * halo;
        float[] ph = new float[pw * pw];
        for (int r = 0; r < pw; r++) {
            System.arraycopy(heights, (4 + r) * ww + 4, ph, r * pw, pw);
        }
        TileSimulation.Geometry window = new TileSimulation.Geometry(ph, null, pw, pw, halo, cell, radius, dirs, 0.3,
                minSun, GeometryFactors.DEFAULT_WALL_EMISSIVITY);
        int[] idx = {tileCells[4 * tw + 4], tileCells[4 * tw + 5], tileCells[5 * tw + 4], tileCells[5 * tw + 5]};
        double[] areas = {25, 12.5, 6.25, 25};
        double[] v = new PixelSimulation(forcing, settings, new double[] {h13})
                .simulate(PALETTE, List.of(new PixelCells(idx, areas, window)))[0];
        double expect = (25 * ref[0][4 * tw + 4] + 12.5 * ref[0][4 * tw + 5] + 6.25 * ref[0][5 * tw + 4]
                + 25 * ref[0][5 * tw + 5]) / 68.75;
        assertEquals(expect, v[0], 1e-9);
        // Geometry matters here: the same cells on open ground differ.
        double[] open = new PixelSimulation(forcing, settings, new double[] {h13})
                .simulate(PALETTE, List.of(new PixelCells(idx, areas, null)))[0];
        assertTrue(Math.abs(open[0] - v[0]) > 0.05, "geometry changes the pixel: " + open[0] + " vs " + v[0]);
    }

    @Test
    void observationInTheSpinUpIsRefused() {
        var e = assertThrows(IllegalArgumentException.class,
                () -> new PixelSimulation(forcing, settings, new double[] {3}));
        assertTrue(e.getMessage().contains("spin-up"), e.getMessage());
    }
}
