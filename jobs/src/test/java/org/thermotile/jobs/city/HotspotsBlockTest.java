package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.hotspots.HotspotOptions;
import org.thermotile.model.hotspot.FalseDiscovery;

/** The run file's hotspots block: new keys read, bad values named with the fix (5 m cells). */
class HotspotsBlockTest {
    @TempDir
    Path dir;

    HotspotsBlock block(String yaml) throws IOException {
        Path rf = CityFixture.write(dir, 256, "");
        Files.writeString(rf, Files.readString(rf) + "hotspots: " + yaml + "\n");
        return HotspotsBlock.of(RunFileReader.read(rf), CityFixture.CELL);
    }

    String error(String yaml) {
        return assertThrows(RuntimeException.class, () -> block(yaml)).getMessage();
    }

    @Test
    void readsTheNewKeys() throws IOException {
        HotspotsBlock b = block("{cell_size_m: 20, fdr: 0.05, fdr_method: by, min_excess_k: 2, min_area_m2: 800}");
        HotspotOptions o = b.options("peak", 256);
        assertEquals(20.0, o.cellSizeM());
        assertTrue(Double.isNaN(o.distanceM()), "no distance: the Moran's I rule");
        assertEquals(FalseDiscovery.BY, o.fdrMethod());
        assertEquals(2.0, o.minExcessK());
        assertEquals(800.0, o.minAreaM2());
    }

    @Test
    void badValuesNameTheKeyAndTheFix() {
        String c = error("{cell_size_m: 2}");
        assertTrue(c.contains("hotspots.cell_size_m: 2 m is less than the simulation cell (5.0 m)") && c.contains("Fix"), c);
        String d = error("{cell_size_m: 20, distance_m: 10}");
        assertTrue(d.contains("hotspots.distance_m: 10 m is less than one analysis cell (20.0 m)") && d.contains("Fix"), d);
        String dd = error("{distance_m: 30}");
        assertTrue(dd.contains("one analysis cell (40.0 m)"), dd);
        String m = error("{fdr_method: holm}");
        assertTrue(m.contains("use bh or by"), m);
        String e = error("{min_excess_k: 0}");
        assertTrue(e.contains("hotspots.min_excess_k") && e.contains("Fix"), e);
    }

    @Test
    void readsTheZoneAndCoverageKeys() throws IOException {
        Files.writeString(dir.resolve("blocks.geojson"), "{}");          // read by the zone analysis, not here
        HotspotsBlock b = block("{min_coverage: 0.3, zones: blocks.geojson, zone_id: block_ref}");
        assertEquals(0.3, b.options("peak", 256).minCoverage());
        assertEquals(dir.resolve("blocks.geojson").toAbsolutePath().normalize(), b.zoneOptions().file());
        assertEquals("block_ref", b.zoneOptions().idProperty());
        assertEquals("hotspots.zones", b.zoneOptions().option());
        HotspotsBlock plain = block("{fdr: 0.05}");
        assertEquals(0.5, plain.options("peak", 256).minCoverage(), "the default minimum coverage");
        assertEquals(null, plain.zoneOptions());
    }

    @Test
    void badZoneAndCoverageValuesNameTheKeyAndTheFix() throws IOException {
        String c = error("{min_coverage: 1.5}");
        assertTrue(c.contains("hotspots.min_coverage: 1.5 must be a share from 0 to 1") && c.contains("Fix"), c);
        String z = error("{zones: nowhere.geojson}");
        assertTrue(z.contains("hotspots.zones:") && z.contains("nowhere.geojson not found") && z.contains("Fix"), z);
        String id = error("{zone_id: ref}");
        assertTrue(id.contains("hotspots.zone_id: given without zones") && id.contains("Fix"), id);
        Files.writeString(dir.resolve("blocks.geojson"), "{}");
        String w = error("{zones: blocks.geojson, weights: inverse_distance}");
        assertTrue(w.contains("zones use binary weights"), w);
    }
}
