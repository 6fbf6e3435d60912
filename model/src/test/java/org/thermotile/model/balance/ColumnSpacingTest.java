package org.thermotile.model.balance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.LocalDate;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.stream.IntStream;
import org.junit.jupiter.api.Test;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.forcing.ForcingPreparer;
import org.thermotile.model.forcing.Site;
import org.thermotile.model.forcing.SyntheticWeather;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.tile.TileSimulation;

/**
 * Conduction nodes per library material for each named spacing (the table the README states), and
 * what the coarse spacing costs at the surface over a summer month (the figures the README states).
 */
class ColumnSpacingTest {

    /** id → {standard, coarse} unknown nodes. Roofs are thinner than 25 cm and keep every node. */
    static final Map<String, int[]> NODES = new LinkedHashMap<>();

    static {
        NODES.put("roof_membrane_dark", new int[] {10, 10});
        NODES.put("roof_membrane_white", new int[] {10, 10});
        NODES.put("bitumen_shingle", new int[] {9, 9});
        NODES.put("clay_tile", new int[] {9, 9});
        NODES.put("metal_roof_bare", new int[] {7, 7});
        NODES.put("green_roof", new int[] {11, 11});
        NODES.put("asphalt_fresh", new int[] {15, 11});
        NODES.put("asphalt_aged", new int[] {15, 11});
        NODES.put("concrete", new int[] {15, 12});
        NODES.put("concrete_pavers", new int[] {15, 11});
        NODES.put("gravel", new int[] {15, 11});
        NODES.put("bare_soil_dry", new int[] {15, 11});
        NODES.put("bare_soil_moist", new int[] {15, 11});
        NODES.put("grass_irrigated", new int[] {15, 11});
        NODES.put("grass_dry", new int[] {15, 11});
        NODES.put("tree_canopy", new int[] {1, 1});
        NODES.put("water", new int[] {1, 1});
    }

    @Test
    void nodeCountsPerLibraryMaterialMatchTheTable() {
        assertEquals(NODES.keySet().size(), MaterialLibrary.all().size(), "every library material in the table");
        for (Material m : MaterialLibrary.all()) {
            int[] want = NODES.get(m.id());
            assertEquals(want[0], ColumnGrid.of(m, ColumnSpacing.STANDARD).nodes(), m.id() + " standard");
            assertEquals(want[1], ColumnGrid.of(m, ColumnSpacing.COARSE).nodes(), m.id() + " coarse");
        }
    }

    /**
     * What the coarse spacing costs at the surface, in a whole tile run ({@link TileSimulation})
     * over a summer month of demo-like weather: July at the demo city's site (45.14° N, 9.02° E,
     * 70 m, UTC+2), clear-sky days from {@link SyntheticWeather#clearSky} between 19 and 34 °C,
     * dew point 16 °C, wind 2 m/s (invented, like the demo's hot week), after the run file's
     * default two spin-up days, 10-minute sub-steps, deep ground at the mean air temperature.
     *
     * <p>Every library material runs in one tile. Roofs (and the slabs, canopy and water) keep all
     * their nodes under the coarse spacing ({@link #NODES}), so they must give the same numbers, bit
     * for bit. Pavement and ground columns lose their deep nodes; the limits on their differences
     * are our choice. Measured (largest over the month and the materials): peak 0.099 K (concrete;
     * asphalt 0.008 K), period mean 0.013 K (fresh asphalt), any hour 0.40 K (concrete; asphalt
     * 0.09 K, soils and grass 0.08 K).
     */
    @Test
    void coarseCostsPavementsLittleAndRoofsNothingOverASummerMonth() {
        Site site = new Site(45.1436, 9.0229, 70);
        int spinUpDays = 2;
        Forcing forcing = ForcingPreparer.prepare(SyntheticWeather.clearSky(site,
                SyntheticWeather.Spec.withDewPoint(LocalDate.of(2026, 6, 29), 31 + spinUpDays, 2 * 3600,
                        19, 34, 16, 2.0)), site);
        double deepK = Arrays.stream(forcing.airTempK).average().orElseThrow();
        int first = 24 * spinUpDays;
        int[] hours = IntStream.range(first, forcing.hours()).toArray();
        Material[] palette = MaterialLibrary.all().toArray(Material[]::new);
        int[] cells = IntStream.range(0, palette.length).toArray();
        TileSimulation.Result standard = TileSimulation.run(palette, cells, forcing, new TileSimulation.Settings(
                10, Convection.mcAdams(), deepK, first, Physical.ZERO_CELSIUS_K + 45, hours, ColumnSpacing.STANDARD));
        TileSimulation.Result coarse = TileSimulation.run(palette, cells, forcing, new TileSimulation.Settings(
                10, Convection.mcAdams(), deepK, first, Physical.ZERO_CELSIUS_K + 45, hours, ColumnSpacing.COARSE));
        double worstPeak = 0, worstMean = 0, worstHour = 0;
        int roofs = 0;
        for (int c = 0; c < palette.length; c++) {
            String id = palette[c].id();
            if (NODES.get(id)[0] == NODES.get(id)[1]) {
                assertEquals(standard.peakC[c], coarse.peakC[c], 0.0, id + " peak, bit for bit");
                assertEquals(standard.meanC[c], coarse.meanC[c], 0.0, id + " mean, bit for bit");
                for (int k = 0; k < hours.length; k++) {
                    assertEquals(Float.floatToRawIntBits(standard.hourlyC[k][c]),
                            Float.floatToRawIntBits(coarse.hourlyC[k][c]), id + " hour " + hours[k] + ", bit for bit");
                }
                roofs += id.contains("roof") || id.endsWith("_tile") || id.endsWith("_shingle") ? 1 : 0;
                continue;
            }
            worstPeak = Math.max(worstPeak, Math.abs(coarse.peakC[c] - standard.peakC[c]));
            worstMean = Math.max(worstMean, Math.abs(coarse.meanC[c] - standard.meanC[c]));
            for (int k = 0; k < hours.length; k++) {
                worstHour = Math.max(worstHour, Math.abs(coarse.hourlyC[k][c] - standard.hourlyC[k][c]));
            }
        }
        assertEquals(6, roofs, "every library roof compared bit for bit");
        assertTrue(worstPeak <= 0.15, "peak within 0.15 K, was " + worstPeak);
        assertTrue(worstMean <= 0.02, "period mean within 0.02 K, was " + worstMean);
        assertTrue(worstHour <= 0.5, "every hour within 0.5 K, was " + worstHour);
        assertTrue(worstHour > 0, "pavement and ground columns lose nodes, so some hour differs");
    }
}
