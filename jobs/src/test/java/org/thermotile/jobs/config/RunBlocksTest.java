package org.thermotile.jobs.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.thermotile.model.hotspot.DistanceBand;
import org.thermotile.model.hotspot.FalseDiscovery;

/**
 * The {@code geometry:} and {@code hotspots:} blocks are read by the run-file reader like every other
 * block: all problems of the file together, each with its line and column, unknown keys with a
 * did-you-mean, and a number mistyped as text ("1OO") an error rather than the default.
 */
class RunBlocksTest {
    private static final String MINIMAL = String.join("\n",
            "name: test-run",
            "inputs:",
            "  land_cover: lc.tif",
            "  classes: worldcover",
            "  heights: heights.tif",
            "weather:",
            "  file: weather.csv",
            "period:",
            "  start: 2026-07-13",
            "  end: 2026-07-14",
            "outputs:",
            "  maps: [peak, mean]",
            "");

    private static RunFile parse(String text) {
        return RunFileReader.parse(text, Path.of("/data/riverside"), "run.yaml");
    }

    private static List<String> problems(String text) {
        return assertThrows(RunFileException.class, () -> parse(text)).problems();
    }

    private static String find(List<String> problems, String part) {
        return problems.stream().filter(p -> p.contains(part)).findFirst()
                .orElseThrow(() -> new AssertionError("'" + part + "' not in " + problems));
    }

    @Test
    void geometryProblemsAreReportedTogetherWithLineAndColumn() {
        List<String> ps = problems(MINIMAL + String.join("\n",
                "geometry:",
                "  sky_view_directions: 1OO",
                "  search_radius_m: 5000",
                "  min_sun_elevation: 10",
                "  canopy_transmissivity: 1.5",
                "  wall_emissivity: 0",
                ""));
        assertEquals(5, ps.size(), ps.toString());
        assertTrue(find(ps, "geometry.sky_view_directions").startsWith("run.yaml line 14, column 3: "),
                find(ps, "geometry.sky_view_directions"));
        assertTrue(find(ps, "sky_view_directions").contains("expected a number, got the text '1OO'"), ps.toString());
        assertTrue(find(ps, "search_radius_m").contains("5000.0 m must be above 0 and at most 2000.0 m"), ps.toString());
        assertTrue(find(ps, "min_sun_elevation").contains("did you mean 'min_sun_elevation_deg'?"), ps.toString());
        assertTrue(find(ps, "min_sun_elevation").startsWith("run.yaml line 16, column 3: "), ps.toString());
        assertTrue(find(ps, "canopy_transmissivity").contains("must be 0…1"), ps.toString());
        assertTrue(find(ps, "wall_emissivity").contains(
                org.thermotile.model.materials.MaterialProperty.EMISSIVITY.problem(0)), ps.toString());
    }

    @Test
    void geometryWithoutHeightsIsRefusedWithTheOtherProblems() {
        String noHeights = MINIMAL.replace("  heights: heights.tif\n", "");
        List<String> ps = problems(noHeights + "geometry: {sky_view_directions: 8}\nhotspots: {fdr: 0.5}\n");
        assertEquals(3, ps.size(), ps.toString());
        find(ps, "geometry settings need a heights raster or building footprints");
        find(ps, "geometry.sky_view_directions: 8 must be 16…360");
        find(ps, "hotspots.fdr: 0.5 must be above 0 and at most 0.2");
    }

    @Test
    void hotspotProblemsAreReportedTogether() {
        List<String> ps = problems(MINIMAL + String.join("\n",
                "hotspots:",
                "  statistics: [peak, night_mni]",
                "  cell_size_m: \"40\"",
                "  distance_m: -5",
                "  weights: inverse-distance",
                "  fdr: 0",
                "  fdr_method: holm",
                "  min_excess_k: 1OO",
                "  min_area_m2: -1",
                "  zone: x",
                ""));
        assertEquals(9, ps.size(), ps.toString());
        assertTrue(find(ps, "night_mni").contains("is not one of the run's maps"), ps.toString());
        assertTrue(find(ps, "hotspots.cell_size_m").contains("(without quotes)"), ps.toString());
        find(ps, "hotspots.distance_m: -5.0 m must be above 0");
        assertTrue(find(ps, "hotspots.weights").contains("did you mean 'inverse_distance'?"), ps.toString());
        find(ps, "hotspots.fdr: 0.0 must be above 0");
        assertTrue(find(ps, "hotspots.fdr_method").contains("use bh or by"), ps.toString());
        assertTrue(find(ps, "hotspots.min_excess_k").contains("the text '1OO'"), ps.toString());
        find(ps, "hotspots.min_area_m2: -1.0 must be a number of m² at least 0");
        assertTrue(find(ps, "unknown key 'zone'").startsWith("run.yaml line 22, column 3: "), ps.toString());
        for (String p : ps) {
            assertTrue(p.matches("run\\.yaml line \\d+, column \\d+: hotspots.*"), p);
        }
    }

    @Test
    void checkedBlocksGiveTheirValuesAndDefaults() {
        RunFile rf = parse(MINIMAL + "geometry: {search_radius_m: 60}\n"
                + "hotspots: {statistics: [mean], weights: inverse_distance, fdr_method: by, fdr: 0.1}\n");
        RunBlocks.Geometry g = RunBlocks.geometryOf(rf);
        assertEquals(new RunBlocks.Geometry(32, 60, 10, 0.3,
                org.thermotile.model.geometry.GeometryFactors.DEFAULT_WALL_EMISSIVITY), g);
        RunBlocks.Hotspots h = RunBlocks.hotspotsOf(rf);
        assertEquals(List.of("mean"), h.statistics());
        assertEquals(DistanceBand.Weights.INVERSE_DISTANCE, h.weights());
        assertEquals(FalseDiscovery.BY, h.fdrMethod());
        assertEquals(0.1, h.fdr());
        assertTrue(Double.isNaN(h.cellSizeM()) && Double.isNaN(h.distanceM()) && Double.isNaN(h.minExcessK()));
        assertNull(RunBlocks.hotspotsOf(parse(MINIMAL)));
    }
}
