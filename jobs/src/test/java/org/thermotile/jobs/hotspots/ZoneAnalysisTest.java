package org.thermotile.jobs.hotspots;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.locationtech.jts.geom.Geometry;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.hotspot.AnalysisGrid;
import org.thermotile.model.hotspot.DistanceBand.Weights;
import org.thermotile.model.hotspot.GlobalMoments;
import org.thermotile.model.hotspot.ZoneSums;

/** Zone analysis without Spark: exact-overlap means, the false-zone rate on pure noise, and bad zone files. */
class ZoneAnalysisTest {
    @TempDir
    static Path dir;
    static Path run;

    @BeforeAll
    static void write() throws IOException {
        run = ZoneFixture.write(dir);
    }

    static ZoneFile read(String... features) throws IOException {
        Path f = Files.createTempFile(dir, "zones", ".geojson");
        Files.writeString(f, ZoneFixture.collection(List.of(features)));
        return ZoneFile.read(f, "block_ref", ZoneFixture.grid(), "--zones");
    }

    /**
     * Exact overlap weights by hand: on 2 m cells with values v = col + 10·row, the square from
     * (0.5, 0.5) to (2.5, 1.5) cells covers, in row 0, ¼ of cells 0 and 2 and ½ of cell 1 (its
     * lower half-row: x 1–2, y ½) and the same in row 1 — area weights ¼, ½, ¼ per row of a 4 m²
     * cell. Mean = Σ a v / Σ a, exact in binary. A cell-aligned zone gets the plain mean of its cells.
     */
    @Test
    void zoneMeansWeighCellsByTheirExactOverlap() throws IOException {
        RasterGrid g = RasterGrid.ofEpsg(4, 3, 0, 6, 2, -2, 32632);
        float[] v = new float[12];
        for (int r = 0; r < 3; r++) {
            for (int c = 0; c < 4; c++) {
                v[r * 4 + c] = c + 10 * r;
            }
        }
        org.locationtech.jts.geom.GeometryFactory gf = new org.locationtech.jts.geom.GeometryFactory();
        Geometry offset = gf.toGeometry(new org.locationtech.jts.geom.Envelope(1, 5, 6 - 3, 6 - 1));   // cells (0.5…2.5, 0.5…1.5)
        Geometry aligned = gf.toGeometry(new org.locationtech.jts.geom.Envelope(2, 6, 0, 4));          // cells 1–2, rows 1–2
        Geometry outside = gf.toGeometry(new org.locationtech.jts.geom.Envelope(8, 10, 0, 6));         // right of the grid
        ZoneSums s = ZoneHotspots.accumulate(List.of(offset, aligned, outside), g, 0, 0, 4, 3, v);
        double[] a = {1, 2, 1, 1, 2, 1};                      // m²: ¼, ½, ¼ of 4 m², rows 0 and 1
        double[] x = {0, 1, 2, 10, 11, 12};
        double sum = 0, area = 0;
        for (int i = 0; i < a.length; i++) {
            sum += a[i] * x[i];
            area += a[i];
        }
        assertEquals(area, s.validAreaM2(0), 1e-12);
        assertEquals(sum / area, s.mean(0), 1e-12);
        assertEquals(8.0, area, 0.0);                         // = the zone's area: fully covered
        assertEquals((11 + 12 + 21 + 22) / 4.0, s.mean(1), 0.0);
        assertEquals(16.0, s.validAreaM2(1), 0.0);
        assertEquals(0.0, s.validAreaM2(2), 0.0);
        // Windows add up: two halves give the whole, so the zone's area-weighted total is preserved.
        ZoneSums left = ZoneHotspots.accumulate(List.of(offset), g, 0, 0, 2, 3, crop(v, 4, 0, 2, 3));
        ZoneSums right = ZoneHotspots.accumulate(List.of(offset), g, 2, 0, 2, 3, crop(v, 4, 2, 2, 3));
        left.merge(right);
        assertEquals(sum, left.weightedSum(0), 1e-12);
        assertEquals(area, left.validAreaM2(0), 1e-12);
        // No data lowers the covered area, not the mean of the rest.
        float[] nd = v.clone();
        nd[1] = Float.NaN;
        ZoneSums n = ZoneHotspots.accumulate(List.of(offset), g, 0, 0, 4, 3, nd);
        assertEquals(area - 2, n.validAreaM2(0), 1e-12);
        assertEquals((sum - 2 * 1) / (area - 2), n.mean(0), 1e-12);
    }

    private static float[] crop(float[] v, int w, int c0, int cw, int h) {
        float[] o = new float[cw * h];
        for (int r = 0; r < h; r++) {
            System.arraycopy(v, r * w + c0, o, r * cw, cw);
        }
        return o;
    }

    /**
     * Pure noise gives no hot zone: 20 seeded cities whose 100 blocks each get an independent level
     * N(0, 2²) K plus N(0, 1) K per cell (zones independent: the null hypothesis of Gi*, and block
     * levels large enough to pass the 1 K minimum excess, so only the FDR stands between noise and a
     * false zone). Under the complete null, FDR control at q is control of the chance of any false
     * discovery (Benjamini & Hochberg 1995, theorem 1 and the remark after it): about 1 repeat in 20
     * at q = 0.05. We allow at most 3 of 20 (P(X ≥ 4) = 1.6 % for Binomial(20, 0.05)).
     */
    @Test
    void pureNoiseGivesNoHotZoneAtFivePercent() {
        ZoneFile zf = blocksOnly();
        RasterGrid g = ZoneFixture.grid();
        List<Geometry> geoms = zf.zones().stream().map(ZoneFile.Zone::geometry).toList();
        int n = geoms.size();
        double[] cx = new double[n], cy = new double[n];
        for (int i = 0; i < n; i++) {
            cx[i] = zf.zones().get(i).centroidX();
            cy[i] = zf.zones().get(i).centroidY();
        }
        HotspotOptions opt = HotspotOptions.of("peak");
        int repeatsWithHot = 0, hotZones = 0, significant = 0, beyondExcess = 0, rawP = 0, tests = 0;
        for (int seed = 0; seed < 20; seed++) {
            float[] v = ZoneFixture.noise(1000 + seed, 1, 2, false);
            ZoneSums s = ZoneHotspots.accumulate(geoms, g, 0, 0, g.width(), g.height(), v);
            double[] values = new double[n];
            GlobalMoments gm = new GlobalMoments();
            for (int i = 0; i < n; i++) {
                values[i] = s.mean(i);
                gm.add(values[i]);
            }
            double median = AnalysisGrid.aggregate(v, g.width(), g.height(), g.pixelAreaM2(), 10).weightedMedian();
            ZoneHotspots.Analysis a = ZoneHotspots.analyse(values, cx, cy, gm, median, opt);
            int hot = 0;
            for (int i = 0; i < n; i++) {
                hot += a.codes()[i] != null && a.codes()[i] > 0 ? 1 : 0;
                significant += a.q()[i] <= 0.05 ? 1 : 0;
                rawP += a.p()[i] <= 0.05 ? 1 : 0;
                tests += Double.isNaN(a.p()[i]) ? 0 : 1;
                beyondExcess += Math.abs(values[i] - median) >= 1 ? 1 : 0;
            }
            hotZones += hot;
            repeatsWithHot += hot > 0 ? 1 : 0;
        }
        System.out.printf("pure noise, 20 repeats of 100 zones: %d repeats with a hot zone, %d hot zones, %d zones "
                + "with q <= 0.05, %d zone-repeats beyond the 1 K excess, %d of %d unadjusted p <= 0.05%n",
                repeatsWithHot, hotZones, significant, beyondExcess, rawP, tests);
        // The tests are live: unadjusted, about 5 % of null zones have p <= 0.05 (we allow 2–10 %: the normal
        // approximation of Gi* on small bands, Ord & Getis 1995, and the dependence between overlapping bands).
        assertTrue(rawP >= 0.02 * tests && rawP <= 0.10 * tests, rawP + " of " + tests + " unadjusted p <= 0.05");
        assertTrue(beyondExcess > 20 * 100 / 2, "the excess alone would flag many zones: " + beyondExcess);
        assertTrue(repeatsWithHot <= 3, repeatsWithHot + " of 20 noise cities had a hot zone");
    }

    /** The fixture's 100 plain blocks (no merged, split or edge zones). */
    static ZoneFile blocksOnly() {
        try {
            List<String> f = new ArrayList<>();
            for (int br = 0; br < 10; br++) {
                for (int bc = 0; bc < 10; bc++) {
                    f.add(ZoneFixture.polygon("B-" + bc + "-" + br,
                            ZoneFixture.rect(bc * 10, br * 10, bc * 10 + 10, br * 10 + 10)));
                }
            }
            return read(f.toArray(String[]::new));
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    static String error(String... features) {
        return assertThrows(UserInputException.class, () -> read(features)).getMessage();
    }

    @Test
    void duplicateIdsNameBothFeatures() {
        String m = error(ZoneFixture.polygon("B-1", ZoneFixture.rect(0, 0, 10, 10)),
                ZoneFixture.polygon("B-2", ZoneFixture.rect(10, 0, 20, 10)),
                ZoneFixture.polygon("B-1", ZoneFixture.rect(20, 0, 30, 10)));
        assertTrue(m.contains("features[2]: zone id 'B-1' is used twice (also features[0])"), m);
        assertTrue(m.contains("Fix: make the ids in 'block_ref' unique"), m);
    }

    @Test
    void aPointIsNotAZone() {
        String m = error(ZoneFixture.polygon("B-1", ZoneFixture.rect(0, 0, 10, 10)),
                "{\"type\": \"Feature\", \"properties\": {\"block_ref\": \"P-7\"}, \"geometry\": {\"type\": \"Point\", "
                        + "\"coordinates\": [500010, 5019990]}}");
        assertTrue(m.contains("features[1] (id 'P-7'): geometry type 'Point' is not a zone"), m);
        assertTrue(m.contains("Fix: give Polygon or MultiPolygon"), m);
    }

    @Test
    void aZoneOutsideTheGridIsNamed() {
        String m = error(ZoneFixture.polygon("B-1", ZoneFixture.rect(0, 0, 10, 10)),
                ZoneFixture.polygon("far", ZoneFixture.rect(200, 0, 210, 10)));
        assertTrue(m.contains("features[1] (id 'far')") && m.contains("lies outside the grid"), m);
        assertTrue(m.contains("x 500800.0…500840.0") && m.contains("grid (x 500000.0…500400.0"), m);
        assertTrue(m.contains("Fix: remove it, or correct its coordinates"), m);
        // Touching the grid's edge from outside is still outside (no area on the grid).
        String t = error(ZoneFixture.polygon("edge", ZoneFixture.rect(100, 0, 110, 10)));
        assertTrue(t.contains("features[0] (id 'edge')") && t.contains("outside the grid"), t);
    }

    @Test
    void aMissingIdListsTheFeaturesProperties() {
        String m = error("{\"type\": \"Feature\", \"properties\": {\"ref\": \"x\", \"use\": \"park\"}, \"geometry\": "
                + "{\"type\": \"Polygon\", \"coordinates\": [" + ZoneFixture.rect(0, 0, 10, 10) + "]}}");
        assertTrue(m.contains("features[0]: property 'block_ref' (the zone id) is missing or blank"), m);
        assertTrue(m.contains("--zone-id") && m.contains("[ref, use]"), m);
    }

    @Test
    void zonesWithoutTheRunsCrsAreRefused() throws IOException {
        Path f = dir.resolve("wgs84.geojson");
        Files.writeString(f, "{\"type\": \"FeatureCollection\", \"features\": [" + ZoneFixture.polygon("a",
                ZoneFixture.rect(0, 0, 10, 10)) + "]}");
        String m = assertThrows(UserInputException.class, () -> ZoneFile.read(f, "block_ref", ZoneFixture.grid(),
                "--zones")).getMessage();
        assertTrue(m.contains("wgs84.geojson: no \"crs\" member") && m.contains("ogr2ogr -t_srs EPSG:32632"), m);
    }

    @Test
    void preparedChecksRefuseBadSettingsBeforeAnyWork() {
        Path zones = dir.resolve("blocks.geojson");
        ZoneHotspots.ZoneOptions z = new ZoneHotspots.ZoneOptions(zones, "block_ref");
        String w = assertThrows(UserInputException.class, () -> ZoneHotspots.prepare(run, HotspotOptions.of("peak")
                .withDistance(80, Weights.INVERSE_DISTANCE), z)).getMessage();
        assertTrue(w.contains("zones use binary weights"), w);
        String d = assertThrows(UserInputException.class, () -> ZoneHotspots.prepare(run, HotspotOptions.of("peak")
                .withDistance(1000, Weights.BINARY), z)).getMessage();
        assertTrue(d.contains("--distance 1000 m reaches every zone") && d.contains("Fix: give less than"), d);
        String id = assertThrows(UserInputException.class, () -> ZoneHotspots.prepare(run, HotspotOptions.of("peak"),
                new ZoneHotspots.ZoneOptions(zones, null))).getMessage();
        assertTrue(id.contains("property 'id' (the zone id) is missing") && id.contains("block_ref"), id);
        String cov = assertThrows(UserInputException.class, () -> HotspotOptions.of("peak").withMinCoverage(1.2))
                .getMessage();
        assertTrue(cov.contains("--min-coverage (min_coverage) 1.2 is outside [0, 1]"), cov);
        ZoneHotspots.Prepared p = ZoneHotspots.prepare(run, HotspotOptions.of("peak"), z);
        assertEquals(99, p.zones().zones().size());
        assertEquals(run.toAbsolutePath().normalize().resolve("zones/blocks/peak"), p.outDir());
        assertFalse(Files.exists(p.outDir()), "prepare writes nothing");
    }
}
