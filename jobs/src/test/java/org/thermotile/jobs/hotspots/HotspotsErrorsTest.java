package org.thermotile.jobs.hotspots;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.model.hotspot.DistanceBand.Weights;

/** Bad inputs are refused before any Spark work, with the file, the value and the fix. */
class HotspotsErrorsTest {
    @TempDir
    static Path dir;
    static Path run;

    @BeforeAll
    static void write() throws IOException {
        run = HotspotFixture.write(dir.resolve("run"));
    }

    static String error(Path runDir, HotspotOptions opt) {
        return assertThrows(UserInputException.class, () -> Hotspots.prepare(runDir, opt)).getMessage();
    }

    @Test
    void distanceSmallerThanOneCell() {
        // The default analysis cell on 5 m cells is 40 m (8 × 8 cells).
        String m = error(run, HotspotOptions.of("peak").withDistance(30, Weights.BINARY));
        assertTrue(m.contains("--distance (distance_m) 30 m is smaller than one analysis cell (40 m)"), m);
        assertTrue(m.contains("Fix: give at least 40 m, or leave it out"), m);
        Hotspots.prepare(run, HotspotOptions.of("peak").withCellSize(10).withDistance(10, Weights.BINARY));
    }

    @Test
    void cellSizeBelowTheSimulationCell() {
        String m = error(run, HotspotOptions.of("peak").withCellSize(2));
        assertTrue(m.contains("--cell-size (cell_size_m) 2 m is smaller than the simulation cell"), m);
        assertTrue(m.contains("peak.tif (5 m)") && m.contains("Fix: give a whole multiple of 5 m, e.g. --cell-size 40"), m);
        String k = error(run, HotspotOptions.of("peak").withCellSize(12));
        assertTrue(k.contains("not a whole multiple of the simulation cell 5.0 m") && k.contains("e.g. --cell-size 10"), k);
    }

    @Test
    void polygonsOutsideTheGrid() throws IOException {
        Path r = HotspotFixture.write(dir.resolve("faraway"), dir.resolve("faraway/districts.geojson").toString());
        Files.writeString(r.resolve("districts.geojson"), """
                {"type": "FeatureCollection",
                 "crs": {"type": "name", "properties": {"name": "urn:ogc:def:crs:EPSG::32632"}}, "features": [
                 {"type": "Feature", "properties": {"id": "N9", "name": "Northpoint"},
                  "geometry": {"type": "Polygon", "coordinates": [[[600000, 5100000], [600100, 5100000],
                   [600100, 5100100], [600000, 5100000]]]}}]}
                """);
        String m = assertThrows(UserInputException.class, () -> Hotspots.prepare(r, HotspotOptions.of("peak")
                .withDistricts(DistrictCells.GEOJSON))).getMessage();
        assertTrue(m.contains("districts.geojson"), m);
        assertTrue(m.contains("N9") || m.contains("outside"), m);
        assertTrue(m.contains("Fix"), m);
    }

    @Test
    void distanceLargerThanTheGrid() {
        // The grid is 150 × 110 cells of 5 m: 750 m × 550 m.
        // On the analysis grid of 40 m: 19 × 14 cells, 760 m × 560 m.
        String m = error(run, HotspotOptions.of("peak").withDistance(600, Weights.BINARY));
        assertTrue(m.contains("--distance 600 m is larger than the grid"), m);
        assertTrue(m.contains("760 m × 560 m") && m.contains("at most 560 m"), m);
        Hotspots.prepare(run, HotspotOptions.of("peak").withDistance(560, Weights.BINARY));   // the limit itself is fine
    }

    @Test
    void unknownStatisticListsTheValidOnes() {
        String m = error(run, HotspotOptions.of("peek"));
        assertTrue(m.contains("unknown statistic 'peek'"), m);
        assertTrue(m.contains("one of peak, mean, night_min, degree_hours"), m);
        assertTrue(m.contains("did you mean 'peak'?"), m);
        String h = error(run, HotspotOptions.of("peak_hour"));
        assertTrue(h.contains("peak_hour is a clock hour"), h);
        String d = error(run, HotspotOptions.of("delta_peak"));
        assertTrue(d.contains("unknown statistic 'delta_peak'"), "a delta needs a scenario: " + d);
    }

    @Test
    void unknownScenarioListsTheValidOnes() {
        String m = error(run, HotspotOptions.of("peak").withScenario("cool_roof"));
        assertTrue(m.contains("unknown scenario 'cool_roof'"), m);
        assertTrue(m.contains("valid: baseline (the run itself), cool_roofs"), m);
        assertTrue(m.contains("did you mean 'cool_roofs'?"), m);
        // A scenario's statistics: its own maps and the differences from the run.
        String s = error(run, HotspotOptions.of("mean").withScenario("cool_roofs"));
        assertTrue(s.contains("one of peak, delta_peak"), s);
        assertEquals(List.of("cool_roofs"), RunFolder.open(run).scenarios());
        Hotspots.prepare(run, HotspotOptions.of("peak").withScenario("baseline"));
    }

    @Test
    void scenarioAgainstTheRunNeedsTheRunsMap() throws IOException {
        Path r = HotspotFixture.write(dir.resolve("nobasepeak"));
        HotspotFixture.manifest(r, null, List.of());
        Files.delete(r.resolve("maps/peak.tif"));
        String m = error(r, HotspotOptions.of("peak").withScenario("cool_roofs"));
        assertTrue(m.contains("maps/peak.tif is missing") && m.contains("--reference scenario"), m);
        Hotspots.prepare(r, HotspotOptions.of("peak").withScenario("cool_roofs")
                .withReference(HotspotOptions.Reference.SCENARIO));
    }

    @Test
    void runWithoutScenariosSaysSo() throws IOException {
        Path r = HotspotFixture.write(dir.resolve("noscen"));
        Hotspots.deleteTree(r.resolve("scenarios"));
        String m = error(r, HotspotOptions.of("peak").withScenario("cool_roofs"));
        assertTrue(m.contains("this run has no scenarios"), m);
    }

    @Test
    void incompleteRunFolders() throws IOException {
        String none = error(dir.resolve("nowhere"), HotspotOptions.of("peak"));
        assertTrue(none.contains("run folder not found"), none);

        Path noManifest = HotspotFixture.write(dir.resolve("nomanifest"));
        Files.delete(noManifest.resolve("manifest.json"));
        String m = error(noManifest, HotspotOptions.of("peak"));
        assertTrue(m.contains("incomplete run folder, manifest.json is missing") && m.contains("--replace"), m);

        Path missingMap = HotspotFixture.write(dir.resolve("missingmap"));
        Files.delete(missingMap.resolve("maps/mean.tif"));
        String mm = error(missingMap, HotspotOptions.of("peak"));
        assertTrue(mm.contains("manifest.json lists maps/mean.tif but it is missing"), mm);

        Path noMaps = HotspotFixture.write(dir.resolve("nomaps"));
        Hotspots.deleteTree(noMaps.resolve("maps"));
        HotspotFixture.manifest(noMaps, null, List.of());
        String nm = error(noMaps, HotspotOptions.of("peak"));
        assertTrue(nm.contains("incomplete run folder, maps/ is missing"), nm);

        Path badJson = HotspotFixture.write(dir.resolve("badjson"));
        Files.writeString(badJson.resolve("manifest.json"), "{\n  \"format\": \"thermotile-run-manifest/1\",\n  \"grid\": {\n}\n");
        String bj = error(badJson, HotspotOptions.of("peak"));
        assertTrue(bj.contains("manifest.json, line 5") && bj.contains("not valid JSON"), bj);

        Path notRun = HotspotFixture.write(dir.resolve("notrun"));
        Files.writeString(notRun.resolve("manifest.json"), "{\"format\": \"something-else\"}");
        String nr = error(notRun, HotspotOptions.of("peak"));
        assertTrue(nr.contains("key format: 'something-else' is not a thermotile run manifest"), nr);
    }

    @Test
    void existingOutputNeedsReplace() throws IOException {
        Path r = HotspotFixture.write(dir.resolve("existing"));
        Files.createDirectories(r.resolve("hotspots/peak"));
        String m = error(r, HotspotOptions.of("peak"));
        assertTrue(m.contains("hotspots/peak already exists") && m.contains("--replace"), m);
        Hotspots.prepare(r, HotspotOptions.of("peak").withReplace(true));
    }

    @Test
    void missingDistrictsFile() throws IOException {
        Path r = HotspotFixture.write(dir.resolve("nodistricts"), dir.resolve("gone.geojson").toString());
        String m = error(r, HotspotOptions.of("peak"));
        assertTrue(m.contains("run_file.inputs.districts") && m.contains("gone.geojson is missing"), m);
    }

    @Test
    void badOptionValues() {
        String f = assertThrows(UserInputException.class, () -> HotspotOptions.of("peak").withFdr(0.3)).getMessage();
        assertTrue(f.contains("--fdr 0.3 is outside (0, 0.20]"), f);
        String e = assertThrows(UserInputException.class, () -> HotspotOptions.of("peak").withEffect(0, 0)).getMessage();
        assertTrue(e.contains("--min-excess 0.0 K") && e.contains("Fix"), e);
        String t = assertThrows(UserInputException.class, () -> HotspotOptions.of("peak").withTileSize(8)).getMessage();
        assertTrue(t.contains("--tile-size 8"), t);
        String d = assertThrows(UserInputException.class,
                () -> HotspotOptions.of("peak").withDistance(-1, Weights.BINARY)).getMessage();
        assertTrue(d.contains("--distance -1.0 is not a positive number of metres"), d);
    }
}
