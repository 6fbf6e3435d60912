package org.thermotile.jobs.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.Base64;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import javax.imageio.ImageIO;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * The report on two invented run folders: a full one (districts, district table, hotspots, a
 * scenario) and a bare one (maps and the material table only, a grid larger than the page so it
 * is drawn reduced). One shared embedded Spark session writes the Parquet tables.
 */
class RunReportTest {
    static SparkSession spark;
    @TempDir
    static Path tmp;
    static Path full, bare;
    static RunReport.Result fullReport, bareReport;

    static final FakeRun.Options FULL = new FakeRun.Options(60, 40, 5, true, true, true, true);
    static final FakeRun.Options BARE = new FakeRun.Options(1000, 150, 10, false, false, false, false);

    @BeforeAll
    static void writeRuns() throws IOException {
        spark = SparkSessions.get(null, 1);
        full = tmp.resolve("full");
        bare = tmp.resolve("bare");
        FakeRun.write(full, FULL, spark);
        FakeRun.write(bare, BARE, spark);
        fullReport = RunReport.build(full);
        bareReport = RunReport.build(bare);
        String keep = System.getProperty("thermotile.report.keep");      // to look at the pages by eye
        if (keep != null) {
            copyTree(full, Path.of(keep, "full"));
            copyTree(bare, Path.of(keep, "bare"));
        }
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    static String html(RunReport.Result r) throws IOException {
        return Files.readString(r.html());
    }

    static RunReport.MapEntry entry(RunReport.Result r, String key) {
        return r.maps().stream().filter(m -> m.key().equals(key)).findFirst().orElseThrow(() ->
                new AssertionError("no map " + key + " in " + r.maps().stream().map(RunReport.MapEntry::key).toList()));
    }

    /** The GeoTIFF behind a map entry, read back with the project's reader: grid and values. */
    record Read(RasterGrid grid, float[] values) {
    }

    static Read readBack(Path tif) {
        try (GeoTiffReader r = GeoTiffReader.open(tif)) {
            return new Read(r.grid(), r.readFloatWindow(0, 0, r.grid().width(), r.grid().height()));
        }
    }

    static Path tifOf(RunReport.MapEntry e) {
        String n = e.png().getFileName().toString();
        return e.png().resolveSibling(n.substring(0, n.length() - 4) + ".tif");
    }

    static BufferedImage png(RunReport.MapEntry e) throws IOException {
        return ImageIO.read(e.png().toFile());
    }

    // ------------------------------------------------------------------------ legend and range

    /** The legend's ends equal the smallest and largest value read back from each map's GeoTIFF. */
    @Test
    void legendRangeIsTheGeoTiffsDataRange() throws IOException {
        for (RunReport.Result r : List.of(fullReport, bareReport)) {
            String page = html(r);
            for (String key : List.of("peak", "mean", "night_min", "degree_hours")) {
                RunReport.MapEntry e = entry(r, key);
                Read back = readBack(tifOf(e));
                double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
                for (float v : back.values()) {
                    if (!Float.isNaN(v)) {
                        lo = Math.min(lo, v);
                        hi = Math.max(hi, v);
                    }
                }
                assertEquals(lo, e.figure().dataMin(), 0, key);
                assertEquals(hi, e.figure().dataMax(), 0, key);
                assertEquals(lo, e.figure().colourLow(), 0, key + ": the ramp starts at the data minimum");
                assertEquals(hi, e.figure().colourHigh(), 0, key + ": the ramp ends at the data maximum");
                Map<String, String> attrs = figureAttributes(page, key);
                assertEquals(lo, Double.parseDouble(attrs.get("data-min")), 0, key);
                assertEquals(hi, Double.parseDouble(attrs.get("data-max")), 0, key);
                String shown = String.format(Locale.ROOT, "Data range %.1f – %.1f %s", lo, hi, e.unit());
                assertTrue(page.contains(shown), key + ": caption shows '" + shown + "'");
            }
        }
    }

    /**
     * The PNG's colours follow the legend: the bar's top row is the ramp's end and its bottom row
     * the ramp's start, and the cells holding the GeoTIFF's minimum and maximum are drawn with them.
     */
    @Test
    void legendEndsAndExtremeCellsShareTheRampsEndColours() throws IOException {
        RunReport.MapEntry e = entry(fullReport, "peak");
        BufferedImage img = png(e);
        var bar = e.figure().legendBar();
        int cx = bar.x + bar.width / 2;
        assertEquals(ColourRamp.KILN.rgb(1), img.getRGB(cx, bar.y) & 0xffffff, "top of the legend bar");
        assertEquals(ColourRamp.KILN.rgb(0), img.getRGB(cx, bar.y + bar.height - 1) & 0xffffff, "bottom of the bar");
        Read back = readBack(tifOf(e));
        int w = back.grid().width();
        int iMin = -1, iMax = -1;
        for (int i = 0; i < back.values().length; i++) {
            float v = back.values()[i];
            if (Float.isNaN(v)) {
                continue;
            }
            if (iMin < 0 || v < back.values()[iMin]) {
                iMin = i;
            }
            if (iMax < 0 || v > back.values()[iMax]) {
                iMax = i;
            }
        }
        var map = e.figure().map();
        double s = (double) map.width / w;
        for (int[] cell : new int[][] {{iMin, 0}, {iMax, 1}}) {
            int col = cell[0] % w, row = cell[0] / w;
            int px = (int) (map.x + (col + 0.5) * s), py = (int) (map.y + (row + 0.5) * s);
            assertEquals(ColourRamp.KILN.rgb(cell[1]), img.getRGB(px, py) & 0xffffff,
                    "cell col " + col + " row " + row + " drawn with the ramp's " + (cell[1] == 0 ? "start" : "end"));
        }
        // a no-data cell (top-left corner) is hatched, not a ramp colour
        int nd = img.getRGB(map.x + 1, map.y + 1) & 0xffffff;
        assertTrue(nd == 0xa0a0a0 || nd == 0xf2f2f2, "no-data cell hatched, found " + Integer.toHexString(nd));
    }

    // ---------------------------------------------------------------------------- scale bar

    /**
     * The scale bar's drawn length, measured in the PNG, equals its label in metres divided by
     * the ground size of a screen pixel, from the GeoTIFF's pixel size and the map's drawn width
     * (also measured in the PNG, from its frame). Checked on an enlarged and a reduced grid.
     */
    @Test
    void scaleBarLengthMatchesThePixelSize() throws IOException {
        for (RunReport.Result r : List.of(fullReport, bareReport)) {
            RunReport.MapEntry e = entry(r, "peak");
            BufferedImage img = png(e);
            Read back = readBack(tifOf(e));
            MapRenderer.ScaleBar bar = e.figure().scaleBar();
            int ink = MapRenderer.INK.getRGB() & 0xffffff;
            int measuredBar = run(img, bar.x0(), bar.y() + bar.heightPx() / 2, ink);
            var map = e.figure().map();
            int measuredFrame = run(img, map.x - 1, map.y - 1, ink) - 2;      // the frame runs 1 px outside the map
            assertEquals(map.width, measuredFrame, "drawn map width measured from its frame");
            double metresPerScreenPx = back.grid().pixelWidth() * back.grid().width() / measuredFrame;
            double expectedPx = bar.metres() / metresPerScreenPx;
            assertEquals(expectedPx, measuredBar, 1.0, r.html() + ": bar of " + bar.metres() + " m");
            double leading = bar.metres() / Math.pow(10, Math.floor(Math.log10(bar.metres())));
            assertTrue(Set.of(1.0, 2.0, 5.0).contains(Math.rint(leading * 1e9) / 1e9), "1, 2 or 5 × 10ⁿ m: " + bar.metres());
            assertTrue(measuredBar <= map.width / 4.0 + 1, "at most a quarter of the map's width");
            assertTrue(html(r).contains("scale bar " + MapRenderer.distanceLabel(bar.metres())));
        }
        // by hand for the two grids: 60 cells of 5 m drawn 12 px each (760/60 → 12), quarter width
        // 180 px = 75 m → 50 m = 120 px; 1000 cells of 10 m drawn in 760 px (13.16 m per px), quarter
        // width 190 px = 2500 m → 2 km = 152 px.
        assertEquals(50, entry(fullReport, "peak").figure().scaleBar().metres(), 0);
        assertEquals(120, entry(fullReport, "peak").figure().scaleBar().lengthPx());
        assertEquals(2000, entry(bareReport, "peak").figure().scaleBar().metres(), 0);
        assertEquals(152, entry(bareReport, "peak").figure().scaleBar().lengthPx());
    }

    /** Length of the run of pixels of colour {@code rgb} starting at (x, y) going right. */
    static int run(BufferedImage img, int x, int y, int rgb) {
        int n = 0;
        while (x + n < img.getWidth() && (img.getRGB(x + n, y) & 0xffffff) == rgb) {
            n++;
        }
        return n;
    }

    // ------------------------------------------------------------------------------ sections

    @Test
    void sectionsAppearWhenTheirFilesExistAndAreOmittedCleanlyOtherwise() throws IOException {
        assertEquals(List.of("run", "maps", "curves", "districts", "hotspots", "scenarios", "files"), fullReport.sections());
        assertEquals(List.of("run", "maps", "curves", "files"), bareReport.sections());
        String b = html(bareReport);
        for (String absent : List.of("id=\"districts\"", "id=\"hotspots\"", "id=\"scenarios\"", "href=\"#hotspots\"",
                "href=\"#scenarios\"", "href=\"#districts\"", "class=\"missing\"", "Outlines:")) {
            assertFalse(b.contains(absent), "bare report has no " + absent);
        }
        String f = html(fullReport);
        for (String present : List.of("id=\"chart-district-Old Quay\"", "id=\"chart-district-Linden Park\"",
                "id=\"map-hotspots-peak-band\"", "id=\"map-hotspots-peak-excess\"", "Hot and cold areas", "id=\"map-scenarios-cool_roofs-delta_peak\"",
                "id=\"map-scenarios-cool_roofs-baseline_peak\"", "id=\"map-scenarios-cool_roofs-peak\"", "id=\"ranking\"",
                "Cost per degree hour (EUR)", "Adoption (%)", "Outlines: the 2 districts")) {
            assertTrue(f.contains(present), "full report has " + present);
        }
        for (RunReport.Result r : List.of(fullReport, bareReport)) {
            String page = html(r);
            for (String tag : List.of("section", "figure", "table", "svg", "div", "dl", "ul", "figcaption", "tr")) {
                assertEquals(count(page, "<" + tag + "[ >]"), count(page, "</" + tag + ">"), r.html() + ": <" + tag + "> balanced");
            }
            for (String key : List.of("peak", "mean", "night_min", "degree_hours")) {
                assertTrue(page.contains("id=\"map-" + key + "\""), key);
            }
            for (String part : List.of("id=\"chart-diurnal-materials\"", "id=\"chart-daily-peaks\"", "Cell-hours",
                    "Wall time", "Energy closure", "2026-07-15 to 2026-07-16", "not air temperature",
                    "not a heat-health index", "licensed professionals", "local building codes")) {
                assertTrue(page.contains(part), r.html() + " shows " + part);
            }
        }
    }

    static int count(String s, String regex) {
        Matcher m = Pattern.compile(regex).matcher(s);
        int n = 0;
        while (m.find()) {
            n++;
        }
        return n;
    }

    /** Side-by-side programme maps share one colour range; the delta map is centred at zero. */
    @Test
    void scenarioMapsShareAScaleAndDeltasAreCentredAtZero() throws IOException {
        RunReport.MapEntry base = entry(fullReport, "scenarios/cool_roofs/baseline_peak");
        RunReport.MapEntry prog = entry(fullReport, "scenarios/cool_roofs/peak");
        assertEquals(base.figure().colourLow(), prog.figure().colourLow(), 0);
        assertEquals(base.figure().colourHigh(), prog.figure().colourHigh(), 0);
        assertEquals(Math.min(base.figure().dataMin(), prog.figure().dataMin()), base.figure().colourLow(), 0);
        RunReport.MapEntry delta = entry(fullReport, "scenarios/cool_roofs/delta_peak");
        assertEquals(-delta.figure().colourLow(), delta.figure().colourHigh(), 0, "symmetric limits");
        assertEquals(Math.max(Math.abs(delta.figure().dataMin()), Math.abs(delta.figure().dataMax())),
                delta.figure().colourHigh(), 0);
        // the bar's middle row is the diverging ramp's centre colour (value 0): row yy of the bar is
        // drawn with t = 1 - yy / (height - 1), so the row nearest t = 0.5 carries the ramp's centre
        var bar = delta.figure().legendBar();
        BufferedImage img = png(delta);
        int mid = Math.round((bar.height - 1) / 2f);
        double tMid = 1 - (double) mid / (bar.height - 1);
        assertEquals(0.5, tMid, 0.5 / (bar.height - 1) + 1e-12, "the middle row is the ramp's centre");
        assertEquals(ColourRamp.FULCRUM.rgb(tMid), img.getRGB(bar.x + bar.width / 2, bar.y + mid) & 0xffffff,
                "middle of the delta legend bar");
        assertTrue(bar.height > 10, "a legend bar tall enough to read");
    }

    // ------------------------------------------------------------------------ self-contained

    @Test
    void pageIsSelfContainedAndThePngsAreWrittenUnderMaps() throws IOException {
        for (RunReport.Result r : List.of(fullReport, bareReport)) {
            String page = html(r);
            assertTrue(page.contains("Content-Security-Policy\" content=\"default-src 'none'"));
            Matcher src = Pattern.compile("\\ssrc=\"([^\"]*)\"").matcher(page);
            int images = 0;
            while (src.find()) {
                assertTrue(src.group(1).startsWith("data:image/png;base64,"), "embedded image");
                images++;
            }
            assertEquals(r.maps().size(), images);
            Matcher href = Pattern.compile("href=\"([^\"]*)\"").matcher(page);
            while (href.find()) {
                assertTrue(href.group(1).startsWith("#") || href.group(1).equals("data:,"), href.group(1));
            }
            assertEquals(count(page, "https?://"), count(page, "xmlns=\"http://www.w3.org/2000/svg\""),
                    "no address other than the SVG namespace");
            for (String key : List.of("peak", "mean", "night_min", "degree_hours")) {
                RunReport.MapEntry e = entry(r, key);
                assertEquals(r.html().getParent().resolve("maps/" + key + ".png"), e.png());
                byte[] file = Files.readAllBytes(e.png());
                Matcher m = Pattern.compile("id=\"map-" + key + "\"[^>]*>\\s*<img src=\"data:image/png;base64,([^\"]+)\"")
                        .matcher(page);
                assertTrue(m.find(), key);
                assertArrayEquals(file, Base64.getDecoder().decode(m.group(1)), key + ": embedded = maps/" + key + ".png");
                BufferedImage img = ImageIO.read(new ByteArrayInputStream(file));
                assertEquals(e.figure().width(), img.getWidth());
            }
        }
    }

    @Test
    void sameFolderGivesTheSameBytes() throws IOException {
        byte[] html = Files.readAllBytes(fullReport.html());
        byte[] peak = Files.readAllBytes(full.resolve("maps/peak.png"));
        RunReport.build(full);
        assertArrayEquals(html, Files.readAllBytes(fullReport.html()));
        assertArrayEquals(peak, Files.readAllBytes(full.resolve("maps/peak.png")));
    }

    // --------------------------------------------------------------------------------- tables

    /** Our Parquet reader sees what DuckDB (an independent reader) sees in Spark's part files. */
    @Test
    void parquetReaderAgreesWithDuckDb() throws Exception {
        Path mh = full.resolve("tables/material_hours");
        Table t = Table.readParquet(mh);
        assertEquals(List.of("material", "time", "local_hour_h", "mean_c", "cells"), t.columns());
        List<String> ours = new ArrayList<>();
        for (Object[] r : t.rows()) {
            ours.add(r[0] + "|" + r[1] + "|" + r[2] + "|" + r[3] + "|" + r[4]);
        }
        List<String> duck = new ArrayList<>();
        try (Connection c = DriverManager.getConnection("jdbc:duckdb:"); Statement s = c.createStatement();
             ResultSet rs = s.executeQuery("SELECT material, time, local_hour_h, mean_c, cells FROM read_parquet('"
                     + mh.resolve("*.parquet") + "')")) {
            while (rs.next()) {
                duck.add(rs.getString(1) + "|" + rs.getString(2) + "|" + rs.getInt(3) + "|" + rs.getDouble(4) + "|"
                        + rs.getLong(5));
            }
        }
        ours.sort(null);
        duck.sort(null);
        assertEquals(duck, ours);
    }

    /** The diurnal means and daily peaks equal those computed here directly from the rows written. */
    @Test
    void curvesAreTheTablesHourlyMeansAndDailyMaxima() {
        Path mh = full.resolve("tables/material_hours");
        List<Curves.Group> groups = Curves.of(Table.readParquet(mh), "material", mh);
        assertEquals(List.of(FakeRun.MATERIALS), groups.stream().map(Curves.Group::key).toList());
        for (int m = 0; m < FakeRun.MATERIALS.length; m++) {
            Curves.Group g = groups.get(m);
            assertEquals(FakeRun.MATERIAL_CELLS[m], g.cells());
            for (int h = 0; h < 24; h++) {
                double expected = (FakeRun.invented(m, h) + FakeRun.invented(m, 24 + h)) / 2;
                assertEquals(expected, g.meanByHour()[h], 1e-12, "hour " + h);
            }
            double day1 = Double.NEGATIVE_INFINITY, day2 = Double.NEGATIVE_INFINITY;
            for (int h = 0; h < 24; h++) {
                day1 = Math.max(day1, FakeRun.invented(m, h));
                day2 = Math.max(day2, FakeRun.invented(m, 24 + h));
            }
            assertEquals(day1, g.dailyPeak().firstEntry().getValue(), 1e-12);
            assertEquals(day2, g.dailyPeak().lastEntry().getValue(), 1e-12);
            assertTrue(Double.isNaN(g.p10ByHour()[12]), "material table has no percentiles");
        }
        // all cells: cell-weighted mean per hour, then its daily maximum
        TreeMap<java.time.LocalDate, Double> all = Curves.allCellsDailyPeak(Table.readParquet(mh), mh);
        double best = Double.NEGATIVE_INFINITY;
        long n = 0;
        for (long c : FakeRun.MATERIAL_CELLS) {
            n += c;
        }
        for (int h = 0; h < 24; h++) {
            double s = 0;
            for (int m = 0; m < FakeRun.MATERIALS.length; m++) {
                s += FakeRun.MATERIAL_CELLS[m] * FakeRun.invented(m, 24 + h);
            }
            best = Math.max(best, s / n);
        }
        assertEquals(best, all.lastEntry().getValue(), 1e-12);
    }

    @Test
    void districtBandsComeFromThePercentileColumns() {
        Path dh = full.resolve("tables/district_hours");
        List<Curves.Group> groups = Curves.of(Table.readParquet(dh), "district", dh);
        assertEquals(List.of(FakeRun.DISTRICTS), groups.stream().map(Curves.Group::key).toList());
        Curves.Group linden = groups.get(1);
        double mean14 = (FakeRun.invented(1, 14) + FakeRun.invented(1, 38)) / 2 - 2;
        assertEquals(mean14, linden.meanByHour()[14], 1e-12);
        assertEquals(mean14 - 4, linden.p10ByHour()[14], 1e-12);
        assertEquals(mean14 + 6, linden.p90ByHour()[14], 1e-12);
    }

    // --------------------------------------------------------------------------------- errors

    @Test
    void aFolderWithoutManifestIsAClearError() throws IOException {
        Path empty = Files.createDirectories(tmp.resolve("not-a-run"));
        ReportException e = assertThrows(ReportException.class, () -> RunReport.build(empty));
        assertTrue(e.getMessage().contains(empty.toString()) && e.getMessage().contains("manifest.json")
                && e.getMessage().contains("Fix:"), e.getMessage());
    }

    /** A districts file that has gone (the run folder was copied elsewhere) is noted; the report is still made. */
    @Test
    void missingDistrictsFileIsNotedNotFatal() throws IOException {
        Path moved = tmp.resolve("moved");
        copyTree(bare, moved);
        String m = Files.readString(moved.resolve("manifest.json")).replace("\"classes\" : \"worldcover\"",
                "\"classes\" : \"worldcover\", \"districts\" : \"/nowhere/districts.geojson\"");
        Files.writeString(moved.resolve("manifest.json"), m);
        RunReport.Result r = RunReport.build(moved);
        String page = html(r);
        assertTrue(page.contains("District outlines are not drawn: /nowhere/districts.geojson"), "noted");
        assertEquals(List.of("run", "maps", "curves", "files"), r.sections());
    }

    @Test
    void malformedPolygonNamesFileFeatureAndFix() throws IOException {
        Path f = tmp.resolve("open-ring.geojson");
        Files.writeString(f, "{\"type\":\"FeatureCollection\",\"features\":[{\"type\":\"Feature\",\"properties\":{},"
                + "\"geometry\":{\"type\":\"Polygon\",\"coordinates\":[[[0,0],[1,0],[1,1],[0,1]]]}}]}");
        ReportException e = assertThrows(ReportException.class, () -> GeoJsonPolygons.read(f));
        assertTrue(e.getMessage().contains(f + ", features[0]") && e.getMessage().contains("not closed")
                && e.getMessage().contains("Fix:"), e.getMessage());
    }

    /** The resolved run file writes whole days as midnight to midnight; the page shows inclusive dates. */
    @Test
    void periodReadsAsInclusiveDates() {
        assertEquals("2026-07-15 to 2026-07-16", RunReport.periodText("2026-07-15T00:00", "2026-07-17T00:00"));
        assertEquals("2026-07-15 to 2026-07-16", RunReport.periodText("2026-07-15", "2026-07-16"));
        assertEquals("2026-07-13 06:00 to 2026-07-19 18:00", RunReport.periodText("2026-07-13T06:00", "2026-07-19T18:00"));
    }

    static void copyTree(Path from, Path to) throws IOException {
        try (Stream<Path> s = Files.walk(from)) {
            for (Path p : s.toList()) {
                Path q = to.resolve(from.relativize(p).toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(q);
                } else {
                    Files.copy(p, q);
                }
            }
        }
    }

    static Map<String, String> figureAttributes(String page, String key) {
        Matcher m = Pattern.compile("<figure class=\"map\" id=\"map-" + Pattern.quote(key) + "\"([^>]*)>").matcher(page);
        assertTrue(m.find(), "figure for " + key);
        Map<String, String> out = new java.util.HashMap<>();
        Matcher a = Pattern.compile("(data-[a-z-]+)=\"([^\"]*)\"").matcher(m.group(1));
        while (a.find()) {
            out.put(a.group(1), a.group(2));
        }
        return out;
    }

    // ------------------------------------------------------------------------------ browser

    /** The pages in headless Chromium (Debian's chromium): an independent renderer. */
    @Nested
    class InChromium {
        @Test
        void reportsLoadCleanlyWithEveryImageDecoded() throws Exception {
            Chromium.executable();
            for (RunReport.Result r : List.of(fullReport, bareReport)) {
                Chromium.Load l = Chromium.load(r.html(), tmp);
                assertEquals(r.maps().size(), l.images(), "images in the page");
                assertEquals(0, l.undecoded(), "every image decodes");
                assertTrue(l.svgs() >= 2, "inline SVG charts: " + l.svgs());
                assertEquals(0, l.requests(), "no requests beyond the page itself");
                assertEquals(0, l.errors(), "no load errors");
                assertEquals(List.of(), l.console(), "no console messages");
            }
        }

        /** The same probe flags a page with a missing image and a blocked script: the checks can fail. */
        @Test
        void probeCatchesABrokenPage() throws Exception {
            Chromium.executable();
            String page = html(bareReport).replace("</main>",
                    "<img src=\"maps/nothing-here.png\" alt=\"\"><script>console.error('x')</script></main>");
            Path broken = tmp.resolve("broken.html");
            Files.writeString(broken, page);
            Chromium.Load l = Chromium.load(broken, tmp);
            assertEquals(1, l.undecoded());
            assertTrue(l.console().size() >= 2, "CSP refusals logged: " + l.console());
        }

        @Test
        void screenshotAt1280x800IsNotBlank() throws Exception {
            Chromium.executable();
            Path shot = tmp.resolve("report-1280x800.png");
            Chromium.screenshot(fullReport.html(), 1280, 800, shot, tmp);
            BufferedImage img = ImageIO.read(shot.toFile());
            assertEquals(1280, img.getWidth());
            assertEquals(800, img.getHeight());
            Set<Integer> colours = new HashSet<>();
            long nonWhite = 0;
            for (int y = 0; y < img.getHeight(); y += 2) {
                for (int x = 0; x < img.getWidth(); x += 2) {
                    int c = img.getRGB(x, y) & 0xffffff;
                    colours.add(c);
                    if (c != 0xffffff) {
                        nonWhite++;
                    }
                }
            }
            double share = nonWhite / (img.getWidth() / 2.0 * img.getHeight() / 2.0);
            assertTrue(share > 0.05, "more than 5 % of the screen is drawn: " + share);
            assertTrue(colours.size() > 50, "text and colour, not a flat page: " + colours.size() + " colours");
            Files.copy(shot, Path.of("target", "report-screenshot.png"), java.nio.file.StandardCopyOption.REPLACE_EXISTING);
        }
    }
}
