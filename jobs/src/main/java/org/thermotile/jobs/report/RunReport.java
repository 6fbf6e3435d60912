package org.thermotile.jobs.report;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Base64;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.TreeMap;
import java.util.stream.Stream;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.storage.RunLayout;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * The run report: one self-contained {@code report.html} in a run folder, readable in any browser
 * with no network and no GIS. Maps are PNG (written under {@code maps/} beside their GeoTIFFs
 * and embedded in the page as data URIs), curves are inline SVG, the style is inline CSS with
 * the system font stack, and a content-security policy forbids every request. Made from the
 * finished run's files alone; nothing is simulated again.
 *
 * <p>What it reads (sections whose files are absent are left out, and the page says so where a
 * reader would look for them):
 * <ul>
 *   <li>{@code manifest.json} (required): inputs, period, grid, simulation summary, timing;</li>
 *   <li>{@code maps/peak.tif, mean.tif, night_min.tif, degree_hours.tif, hours_above.tif};</li>
 *   <li>the districts GeoJSON named by {@code run_file.inputs.districts} (outlines and names);</li>
 *   <li>{@code tables/material_hours} and {@code tables/district_hours} (Parquet);</li>
 *   <li>{@code hotspots/<stat>/}: an excess-band GeoTIFF ({@code *band*.tif}, signed band codes in
 *       tenths of a kelvin, negative = cooler, 0 = not distinct, positive = warmer), an excess
 *       GeoTIFF ({@code *excess_k*.tif}) and polygons ({@code *.geojson}); a scenario's
 *       {@code scenarios/<name>/hotspots/<stat>/summary.json} with its programme change;</li>
 *   <li>{@code scenarios/<name>/maps/<stat>.tif} (the programme's map) and
 *       {@code delta_<stat>.tif} (programme − baseline), and the ranking table
 *       {@code scenarios/ranking} (Parquet folder), {@code ranking.parquet} or {@code ranking.csv}.</li>
 * </ul>
 * Output is deterministic: no clock time is written, so the same run folder gives the same bytes.
 */
public final class RunReport {
    /** The report's file name in the run folder. */
    public static final String FILE = "report.html";

    /** The statistic maps drawn, in page order. */
    static final List<String> MAP_KEYS = RunFile.MapKind.keys(RunFile.MapKind::inReport);

    /**
     * Line colours for categories: the Okabe & Ito (2008) colour-blind-safe palette (hex values
     * from memory), black reserved for "all cells"; after seven, dash patterns tell lines apart.
     */
    static final String[] LINE_COLOURS = {"#E69F00", "#56B4E9", "#009E73", "#0072B2", "#D55E00", "#CC79A7", "#B59A00"};
    static final String[] DASHES = {null, "7 4", "2 3"};

    static final String CAUTION = "Surface temperature is not air temperature, and it is not a heat-health "
            + "index. These results are estimates for comparing options (materials, programmes, places); they do not "
            + "replace measurements, local building codes or licensed professionals, whom you should follow for "
            + "roofing, structural and health decisions.";

    private final Path dir;
    private final JsonNode manifest;
    private final List<String> notes = new ArrayList<>();
    private final StringBuilder body = new StringBuilder();
    private final List<String[]> nav = new ArrayList<>();
    private final List<MapEntry> maps = new ArrayList<>();
    private final Map<String, String> lineColour = new LinkedHashMap<>();
    private List<MapRenderer.Outline> districtOutlines = List.of();
    private String subtitle = "";

    /** A drawn map: its statistic key, title, unit, the figure and where its PNG was written. */
    public record MapEntry(String key, String title, String unit, MapRenderer.Figure figure, Path png) {
    }

    /** What {@link #write} produced: the page, the drawn maps and the ids of the sections shown. */
    public record Result(Path html, List<MapEntry> maps, List<String> sections) {
    }

    private RunReport(Path dir, JsonNode manifest) {
        this.dir = dir;
        this.manifest = manifest;
    }

    /**
     * Writes {@code report.html} (and the map PNGs) into a finished run folder, replacing an older
     * report; what the run command calls at its end and {@code thermotile report RUN_DIR} calls.
     *
     * @return the report's path
     * @throws ReportException when the folder has no readable manifest or a table is damaged
     */
    public static Path write(Path runDir) {
        return build(runDir).html();
    }

    /** As {@link #write}, returning what was drawn (for tests and callers that print a summary). */
    public static Result build(Path runDir) {
        Path dir = runDir.toAbsolutePath().normalize();
        Path mf = dir.resolve("manifest.json");
        if (!Files.isRegularFile(mf)) {
            throw new ReportException(dir + ": no manifest.json, so this is not a finished run folder. Fix: give the "
                    + "folder that 'thermotile run' wrote (it holds manifest.json, maps/ and tables/)");
        }
        JsonNode m;
        try {
            m = new ObjectMapper().readTree(mf.toFile());
        } catch (IOException e) {
            throw new ReportException(mf + ": cannot be read as JSON (" + e.getMessage() + "). Fix: run the job again");
        }
        RunReport r = new RunReport(dir, m);
        if (m.has("periods")) {
            // A run over several periods: a report per period, and an index of them here.
            List<MapEntry> maps = new ArrayList<>();
            for (JsonNode p : m.path("periods")) {
                maps.addAll(build(dir.resolve(p.path("folder").asText())).maps());
            }
            return r.makeIndex(maps);
        }
        return r.make();
    }

    /** The page of a run over several periods: its periods, linked to their reports, and the ranking across them. */
    private Result makeIndex(List<MapEntry> maps) {
        subtitle = "";
        section("periods", "Periods");
        body.append("<p>Each period is a complete run of the baseline and every scenario with its own weather; "
                + "its report, maps and comparison are in its folder. The tables hold every period in one dataset "
                + "per table, partitioned by period and scenario (<code>tables/cells/period=NAME/scenario=NAME/</code>).</p>\n");
        body.append("<table>\n<thead><tr><th>period</th><th>dates (local)</th><th>weather</th><th class=\"n\">"
                + "counted hours</th><th>report</th></tr></thead>\n<tbody>\n");
        for (JsonNode p : manifest.path("periods")) {
            String folder = p.path("folder").asText();
            JsonNode w = p.path("weather");
            String weather = w.isObject() ? fileName(w.path("location").asText()) : w.asText();
            body.append("<tr><td>").append(Html.esc(p.path("name").asText())).append("</td><td>")
                    .append(Html.esc(periodText(p.path("start").asText(), p.path("end").asText())))
                    .append("</td><td><code>")
                    .append(Html.esc(weather)).append("</code></td><td class=\"n\">")
                    .append(p.path("counted_hours").asInt()).append("</td><td><a href=\"")
                    .append(Html.esc(folder + "/" + FILE)).append("\">").append(Html.esc(folder + "/" + FILE))
                    .append("</a></td></tr>\n");
        }
        body.append("</tbody>\n</table>\n");
        Path ranking = dir.resolve("comparison").resolve("ranking_by_period.parquet");
        if (Files.exists(ranking)) {
            section("comparison", "Ranking across periods");
            body.append("<p>Whole grid; rank 1 is best in its period. Peak reduction is baseline minus scenario "
                    + "(positive = cooler). Full tables: <code>comparison/ranking_by_period.csv</code> and "
                    + "<code>.parquet</code>.</p>\n");
            try {
                Table t = Table.readParquet(ranking);
                int iPeriod = t.require("period", ranking), iScen = t.require("scenario", ranking);
                int iDist = t.require("district", ranking), iRank = t.require("rank", ranking);
                int iRed = t.require("peak_reduction_mean_c", ranking);
                int iDh = t.require("degree_hours_avoided_k_h_m2", ranking);
                body.append("<table>\n<thead><tr><th>period</th><th class=\"n\">rank</th><th>scenario</th>"
                        + "<th class=\"n\">mean peak reduction °C</th><th class=\"n\">degree-hours avoided K·h·m²</th>"
                        + "</tr></thead>\n<tbody>\n");
                for (Object[] r : t.rows()) {
                    if (!"(all)".equals(String.valueOf(r[iDist]))) {
                        continue;
                    }
                    body.append("<tr><td>").append(Html.esc(String.valueOf(r[iPeriod]))).append("</td><td class=\"n\">")
                            .append(r[iRank]).append("</td><td>").append(Html.esc(String.valueOf(r[iScen])))
                            .append("</td><td class=\"n\">")
                            .append(String.format(Locale.ROOT, "%.2f", Table.number(r[iRed])))
                            .append("</td><td class=\"n\">")
                            .append(String.format(Locale.ROOT, "%.3g", Table.number(r[iDh])))
                            .append("</td></tr>\n");
                }
                body.append("</tbody>\n</table>\n");
            } catch (ReportException e) {
                body.append("<p class=\"missing\">").append(Html.esc(e.getMessage())).append("</p>\n");
            }
        }
        filesSection();
        return publish(maps);
    }

    private Result make() {
        subtitle = subtitleText();
        loadDistricts();
        runSection();
        mapsSection();
        curvesSection();
        hotspotsSection();
        zonesSection();
        scenariosSection();
        observationSection();
        filesSection();
        return publish(maps);
    }

    /** Writes the page atomically (a temporary sibling renamed over the old report). */
    private Result publish(List<MapEntry> drawnMaps) {
        String page = page();
        Path out = dir.resolve(FILE);
        Path tmp = dir.resolve("." + FILE + ".partial");
        try {
            Files.writeString(tmp, page, StandardCharsets.UTF_8);
            Files.move(tmp, out, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + out, e);
        }
        return new Result(out, List.copyOf(drawnMaps), nav.stream().map(n -> n[0]).toList());
    }

    // ----------------------------------------------------------------------------- run summary

    private String runName() {
        return manifest.path("name").asText(dir.getFileName().toString());
    }

    private String period() {
        JsonNode ps = manifest.path("periods");
        if (ps.isArray() && ps.size() > 0) {
            return ps.size() + " periods, " + periodText(ps.get(0).path("start").asText(""),
                    ps.get(ps.size() - 1).path("end").asText(""));
        }
        JsonNode p = manifest.path("run_file").path("period");
        if (p.isMissingNode()) {
            return "";
        }
        return periodText(p.path("start").asText(""), p.path("end").asText(""));
    }

    /** The dates, after the period's name for one period of a run over several. */
    private String periodLabel() {
        String name = manifest.path("period").asText("");
        return (name.isEmpty() ? "" : "period " + name + ", ") + period();
    }

    /**
     * The period as a reader says it: whole local days as inclusive dates ("2026-07-15 to
     * 2026-07-16" for a start of 2026-07-15T00:00 and an end of 2026-07-17T00:00, as the resolved
     * run file writes it), otherwise the local times as given.
     */
    static String periodText(String start, String end) {
        try {
            java.time.LocalDateTime s = parseLocal(start, false), e = parseLocal(end, true);
            if (s.toLocalTime().equals(java.time.LocalTime.MIDNIGHT) && e.toLocalTime().equals(java.time.LocalTime.MIDNIGHT)
                    && e.isAfter(s)) {
                return s.toLocalDate() + " to " + e.toLocalDate().minusDays(1);
            }
            return s.toString().replace('T', ' ') + " to " + e.toString().replace('T', ' ');
        } catch (java.time.format.DateTimeParseException ex) {
            return start + " to " + end;
        }
    }

    /** A date-time as written, or a plain date as the run file means it (an end date is inclusive). */
    private static java.time.LocalDateTime parseLocal(String t, boolean end) {
        if (t.contains("T")) {
            return java.time.LocalDateTime.parse(t);
        }
        LocalDate d = LocalDate.parse(t);
        return (end ? d.plusDays(1) : d).atStartOfDay();
    }

    private String subtitleText() {
        JsonNode g = manifest.path("grid");
        return runName() + " · " + periodLabel() + " · " + g.path("width").asInt() + " × " + g.path("height").asInt()
                + " cells of " + num(g.path("pixel_m").asDouble(), 1) + " m";
    }

    private void runSection() {
        section("run", "The run");
        JsonNode rf = manifest.path("run_file");
        JsonNode sim = manifest.path("simulation");
        JsonNode grid = manifest.path("grid");
        JsonNode timing = manifest.path("timing");
        body.append("<div class=\"cols\">\n<div>\n<h3>Period and weather</h3>\n<dl>\n");
        JsonNode p = rf.path("period");
        String per = period();
        dd("Period", Html.esc(per) + (per.length() <= 24 ? " (local dates, inclusive)" : " (local time)"));
        dd("Spin-up", plural(p.path("spin_up_days").asLong(), "day") + " simulated before the start, not counted");
        dd("Hours", fmtInt(sim.path("hours").asLong()) + " simulated, " + fmtInt(sim.path("counted_hours").asLong())
                + " counted");
        JsonNode w = rf.path("weather");
        if (w.has("synthetic")) {
            JsonNode s = w.path("synthetic");
            dd("Weather", "synthetic clear-sky days: air " + s.path("t_min_c").asText() + "–" + s.path("t_max_c").asText()
                    + " °C, relative humidity " + s.path("rel_humidity_pct").asText() + " %, wind "
                    + s.path("wind_ms").asText() + " m/s, UTC offset " + Html.esc(s.path("utc_offset").asText()));
        } else if (w.has("file")) {
            dd("Weather", "<code>" + Html.esc(fileName(w.path("file").asText())) + "</code>"
                    + (w.path("fill_gaps_max_hours").asInt() > 0 ? ", gaps of up to "
                            + w.path("fill_gaps_max_hours").asInt() + " h filled linearly" : ""));
        }
        JsonNode site = rf.path("site");
        if (site.has("latitude")) {
            dd("Site", num(site.path("latitude").asDouble(), 3) + "° N, " + num(site.path("longitude").asDouble(), 3)
                    + "° E, " + num(site.path("elevation_m").asDouble(), 0) + " m");
        }
        if (rf.path("outputs").has("threshold_c")) {
            dd("Threshold", num(rf.path("outputs").path("threshold_c").asDouble(), 1)
                    + " °C surface (degree-hours and hours above)");
        }
        body.append("</dl>\n</div>\n<div>\n<h3>Grid and simulation</h3>\n<dl>\n");
        dd("Grid", grid.path("width").asInt() + " × " + grid.path("height").asInt() + " cells of "
                + num(grid.path("pixel_m").asDouble(), 2) + " m, EPSG:" + grid.path("epsg").asInt() + ", "
                + plural(grid.path("tiles").asLong(), "tile"));
        dd("Cells", fmtInt(sim.path("cells").asLong()) + " with a surface material");
        dd("Cell-hours", fmtInt(sim.path("cell_hours").asLong()));
        dd("Wall time", num(timing.path("wall_seconds").asDouble(), 1) + " s ("
                + fmtInt(timing.path("cell_hours_per_second").asLong()) + " cell-hours per second)");
        double closure = sim.path("max_closure_residual").asDouble(Double.NaN);
        dd("Energy closure", "largest residual of any cell " + String.format(Locale.ROOT, "%.2g", closure * 100)
                + " % of its gross energy flux");
        JsonNode v = manifest.path("versions");
        dd("Versions", "thermotile " + Html.esc(v.path("thermotile").asText("?")) + ", Java "
                + Html.esc(v.path("java").asText("?")) + ", Spark " + Html.esc(v.path("spark").asText("?")));
        body.append("</dl>\n</div>\n</div>\n");

        body.append("<h3>Inputs</h3>\n<table class=\"data\"><thead><tr><th>input</th><th>file</th><th>SHA-256 (first 16)"
                + "</th></tr></thead><tbody>\n");
        for (Iterator<Map.Entry<String, JsonNode>> it = manifest.path("inputs").fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> e = it.next();
            String loc = e.getValue().path("location").asText();
            String sha = e.getValue().path("sha256").asText();
            body.append("<tr><td>").append(Html.esc(e.getKey().replace('_', ' '))).append("</td><td title=\"")
                    .append(Html.esc(loc)).append("\"><code>").append(Html.esc(fileName(loc))).append("</code></td><td><code>")
                    .append(Html.esc(sha.length() > 16 ? sha.substring(0, 16) : sha)).append("</code></td></tr>\n");
        }
        body.append("</tbody></table>\n");
        JsonNode mats = sim.path("materials");
        if (mats.size() > 0) {
            body.append("<p class=\"small\">Materials: ");
            List<String> parts = new ArrayList<>();
            mats.fields().forEachRemaining(e -> parts.add("<code>" + Html.esc(e.getKey()) + "</code> "
                    + Html.esc(e.getValue().asText())));
            body.append(String.join("; ", parts)).append(".</p>\n");
        }
        JsonNode mnotes = manifest.path("notes");
        if (mnotes.size() > 0) {
            body.append("<h3>Notes from the run</h3>\n<ul>\n");
            mnotes.forEach(n -> body.append("<li>").append(Html.esc(n.asText())).append("</li>\n"));
            body.append("</ul>\n");
        }
    }

    private void dd(String term, String htmlValue) {
        body.append("<dt>").append(Html.esc(term)).append("</dt><dd>").append(htmlValue).append("</dd>\n");
    }

    // ----------------------------------------------------------------------------------- maps

    private void loadDistricts() {
        String loc = manifest.path("run_file").path("inputs").path("districts").asText(null);
        if (loc == null || loc.isBlank()) {
            return;
        }
        Path file;
        try {
            // A path, a file: URI, or a Hadoop URI (fetched once into a local copy).
            file = org.thermotile.jobs.storage.InputStaging.localPath(loc, "run_file.inputs.districts");
        } catch (RuntimeException e) {
            notes.add("District outlines are not drawn: " + loc + " cannot be read (" + e.getMessage() + ").");
            return;
        }
        if (!Files.isRegularFile(file)) {
            notes.add("District outlines are not drawn: " + file + " (named in the manifest) is not there any more.");
            return;
        }
        try {
            GeoJsonPolygons.Collection c = GeoJsonPolygons.read(file);
            List<MapRenderer.Outline> out = new ArrayList<>();
            for (GeoJsonPolygons.Feature f : c.features()) {
                out.add(new MapRenderer.Outline(f.geometry(), f.property("name", f.property("id", null))));
            }
            districtOutlines = List.copyOf(out);
        } catch (ReportException e) {
            notes.add("District outlines are not drawn: " + e.getMessage());
        }
    }

    private record Raster(RasterGrid grid, float[] values) {
    }

    private static Raster readRaster(Path tif) {
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(tif)) {
            RasterGrid g = r.grid();
            return new Raster(g, r.readFloatWindow(0, 0, g.width(), g.height()));
        }
    }

    private String mapTitle(String key) {
        String th = manifest.path("run_file").path("outputs").has("threshold_c")
                ? num(manifest.path("run_file").path("outputs").path("threshold_c").asDouble(), 0) + " °C" : "the threshold";
        RunFile.MapKind kind = RunFile.MapKind.fromKey(key);
        return kind != null ? kind.title(th) : key.replace('_', ' ');
    }

    /** A map's unit; a file named otherwise (a hot-spot folder of a difference map) in °C. */
    private static String mapUnit(String key) {
        RunFile.MapKind kind = RunFile.MapKind.fromKey(key);
        return kind != null ? kind.unit() : "°C";
    }

    private static String mapExplanation(String key) {
        RunFile.MapKind kind = RunFile.MapKind.fromKey(key);
        return kind != null ? kind.explanation() : "";
    }

    private void mapsSection() {
        section("maps", "Maps");
        body.append("<p>Colours run from the lowest to the highest value of each map (the legend's ends), on the "
                + "thermotile <em>Kiln</em> ramp: darker is cooler and lighter is hotter in colour and in a greyscale "
                + "print alike. Hatched cells have no data. North is up (grid north of EPSG:")
                .append(manifest.path("grid").path("epsg").asInt()).append(").</p>\n<div class=\"figs\">\n");
        int drawn = 0;
        for (String key : MAP_KEYS) {
            Path tif = dir.resolve("maps").resolve(key + ".tif");
            if (!Files.isRegularFile(tif)) {
                continue;
            }
            Raster r = readRaster(tif);
            double[] range = MapRenderer.range(r.values());
            MapRenderer.Style style = new MapRenderer.Style(mapTitle(key), subtitle, mapUnit(key), ColourRamp.KILN);
            MapRenderer.Figure f = MapRenderer.render(r.values(), r.grid(), districtOutlines, style, range[0], range[1]);
            Path png = dir.resolve("maps").resolve(key + ".png");
            writePng(png, f.png());
            maps.add(new MapEntry(key, style.title(), style.unit(), f, png));
            figure(key, f, style.unit(), mapExplanation(key), "maps/" + key + ".png");
            drawn++;
        }
        body.append("</div>\n");
        if (drawn == 0) {
            body.append("<p class=\"missing\">This run folder holds none of the statistic maps (maps/peak.tif, "
                    + "mean.tif, night_min.tif, degree_hours.tif).</p>\n");
        }
        if (!districtOutlines.isEmpty()) {
            body.append("<p class=\"small\">Outlines: the ").append(districtOutlines.size())
                    .append(" districts of the run's districts file.</p>\n");
        }
        for (String n : notes) {
            body.append("<p class=\"missing\">").append(Html.esc(n)).append("</p>\n");
        }
    }

    private void figure(String key, MapRenderer.Figure f, String unit, String explanation, String file) {
        String range = Double.isNaN(f.dataMin()) ? "No cell has a value"
                : unit.isEmpty() ? "Classes over " + fmtInt(f.cells()) + " cells"
                : "Data range " + MapRenderer.legendValue(f.dataMin()) + " – " + MapRenderer.legendValue(f.dataMax())
                        + " " + unit + " over " + fmtInt(f.cells()) + " cells";
        body.append(String.format(Locale.ROOT, "<figure class=\"map\" id=\"map-%s\" data-key=\"%s\" data-min=\"%s\" "
                + "data-max=\"%s\" data-colour-low=\"%s\" data-colour-high=\"%s\" data-scale-m=\"%s\" "
                + "data-scale-px=\"%d\" data-m-per-px=\"%s\">\n", Html.esc(key.replace('/', '-')), Html.esc(key),
                f.dataMin(), f.dataMax(), f.colourLow(), f.colourHigh(), f.scaleBar().metres(), f.scaleBar().lengthPx(),
                f.metresPerScreenPixel()));
        body.append("<img src=\"data:image/png;base64,").append(Base64.getEncoder().encodeToString(f.png()))
                .append("\" width=\"").append(f.width()).append("\" height=\"").append(f.height()).append("\" alt=\"")
                .append(Html.esc(explanation)).append("\">\n");
        body.append("<figcaption>").append(Html.esc(explanation)).append(" <span class=\"range\">")
                .append(Html.esc(range)).append("</span>; scale bar ")
                .append(Html.esc(MapRenderer.distanceLabel(f.scaleBar().metres()))).append(". <code>")
                .append(Html.esc(file)).append("</code></figcaption>\n</figure>\n");
    }

    private static void writePng(Path png, byte[] bytes) {
        try {
            Files.createDirectories(png.getParent());
            Files.write(png, bytes);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + png, e);
        }
    }

    // --------------------------------------------------------------------------------- curves

    private String colourOf(String key) {
        return lineColour.computeIfAbsent(key, k -> LINE_COLOURS[lineColour.size() % LINE_COLOURS.length]);
    }

    private String dashOf(String key) {
        int i = new ArrayList<>(lineColour.keySet()).indexOf(key);
        return DASHES[(i / LINE_COLOURS.length) % DASHES.length];
    }

    private static double[] hours() {
        double[] h = new double[24];
        for (int i = 0; i < 24; i++) {
            h[i] = i;
        }
        return h;
    }

    private static SvgChart diurnalChart(String title, int width, int height, boolean legend) {
        double[] ticks = width > 600 ? new double[] {0, 3, 6, 9, 12, 15, 18, 21} : new double[] {0, 6, 12, 18};
        String[] labels = new String[ticks.length];
        for (int i = 0; i < ticks.length; i++) {
            labels[i] = String.format(Locale.ROOT, "%02d:00", (int) ticks[i]);
        }
        return new SvgChart(title, "local clock hour", "surface temperature [°C]", width, height, legend)
                .xAxis(0, 23, ticks, labels);
    }

    private void curvesSection() {
        RunLayout lay = RunLayout.of(dir);
        Path mh = baselinePartition(lay.table("material_hours"));
        Path dh = baselinePartition(lay.table("district_hours"));
        boolean hasMaterials = Files.exists(mh), hasDistricts = Files.exists(dh);
        section("curves", "Curves");
        if (!hasMaterials) {
            body.append("<p class=\"missing\">No tables/material_hours table in this run folder, so no curves.</p>\n");
        } else {
            Table t = Table.readParquet(mh);
            List<Curves.Group> groups = Curves.of(t, "material", mh);
            groups.forEach(g -> colourOf(g.key()));
            body.append("<h3>Diurnal cycle per material</h3>\n<p>For each material, the surface temperature at each "
                    + "local clock hour, averaged over the material's cells and over the counted days; one panel per "
                    + "kind of surface, all panels on one temperature axis.</p>\n")
                    .append(materialPanels(groups, this::colourOf, this::dashOf));

            TreeMap<LocalDate, Double> all = Curves.allCellsDailyPeak(t, mh);
            List<LocalDate> dates = Curves.dates(groups);
            SvgChart daily = dailyChart("Daily peak of the mean surface temperature", dates, 860, 340);
            daily.add(new SvgChart.Series("all cells", indexX(dates), onDates(all, dates), "#000000", null, 3).withMarkers());
            for (Curves.Group g : groups) {
                daily.add(new SvgChart.Series(g.key(), indexX(dates), onDates(g.dailyPeak(), dates), colourOf(g.key()),
                        dashOf(g.key()), 1.6).withMarkers());
            }
            body.append("<h3>Daily peaks through the period</h3>\n<p>For each day, the highest hourly mean surface "
                    + "temperature of each material's cells, and (black) of all cells together. These are peaks of "
                    + "means: single cells reach higher, as the peak map shows.</p>\n")
                    .append("<div class=\"chart\" id=\"chart-daily-peaks\">").append(daily.toSvg()).append("</div>\n");

            body.append("<h3>Materials</h3>\n<table class=\"data\"><thead><tr><th>material</th><th>cells</th>"
                    + "<th>share</th><th>period mean [°C]</th><th>highest hourly mean [°C]</th><th>at</th></tr></thead><tbody>\n");
            long total = groups.stream().mapToLong(Curves.Group::cells).sum();
            for (Curves.Group g : groups) {
                body.append("<tr><td><span class=\"key\" style=\"background:").append(colourOf(g.key())).append("\"></span>")
                        .append(Html.esc(g.key())).append("</td><td class=\"n\">").append(fmtInt(g.cells()))
                        .append("</td><td class=\"n\">").append(num(100.0 * g.cells() / Math.max(1, total), 1))
                        .append(" %</td><td class=\"n\">").append(num(g.periodMean(), 1)).append("</td><td class=\"n\">")
                        .append(num(g.maxHourly(), 1)).append("</td><td>").append(Html.esc(g.maxTime()))
                        .append("</td></tr>\n");
            }
            body.append("</tbody></table>\n");
        }
        if (hasDistricts) {
            districtsSection(dh);
        }
    }

    /**
     * The diurnal curves of the materials as small multiples: one panel per kind of surface
     * ({@link MaterialKinds}), each material in exactly one panel, all panels on one temperature axis.
     */
    static String materialPanels(List<Curves.Group> groups, java.util.function.Function<String, String> colour,
            java.util.function.Function<String, String> dash) {
        StringBuilder b = new StringBuilder("<div class=\"multiples\" id=\"chart-diurnal-materials\">\n");
        double[] range = MaterialKinds.range(groups);
        for (Map.Entry<String, List<Curves.Group>> kind : MaterialKinds.byKind(groups).entrySet()) {
            SvgChart c = diurnalChart(kind.getKey(), 600, 280, true).legendWidth(290)
                    .legendChars(36);
            if (range[1] > range[0]) {
                c.yRange(range[0], range[1]);
            }
            for (Curves.Group g : kind.getValue()) {
                c.add(new SvgChart.Series(g.key(), hours(), g.meanByHour(), colour.apply(g.key()), dash.apply(g.key()), 2));
            }
            b.append("<figure class=\"small-chart\" id=\"chart-diurnal-").append(MaterialKinds.id(kind.getKey()))
                    .append("\"><figcaption>").append(Html.esc(kind.getKey())).append("</figcaption>")
                    .append(c.toSvg()).append("</figure>\n");
        }
        return b.append("</div>\n").toString();
    }

    private static SvgChart dailyChart(String title, List<LocalDate> dates, int width, int height) {
        int n = dates.size();
        int every = Math.max(1, (int) Math.ceil(n / 12.0));
        List<Double> ticks = new ArrayList<>();
        List<String> labels = new ArrayList<>();
        for (int i = 0; i < n; i += every) {
            ticks.add((double) i);
            labels.add(dates.get(i).toString().substring(5));
        }
        return new SvgChart(title, "local date (month-day)", "surface temperature [°C]", width, height, true)
                .xAxis(-0.3, Math.max(0.3, n - 0.7), ticks.stream().mapToDouble(Double::doubleValue).toArray(),
                        labels.toArray(String[]::new));
    }

    private static double[] indexX(List<LocalDate> dates) {
        double[] x = new double[dates.size()];
        for (int i = 0; i < x.length; i++) {
            x[i] = i;
        }
        return x;
    }

    private static double[] onDates(Map<LocalDate, Double> values, List<LocalDate> dates) {
        double[] y = new double[dates.size()];
        for (int i = 0; i < y.length; i++) {
            y[i] = values.getOrDefault(dates.get(i), Double.NaN);
        }
        return y;
    }

    private void districtsSection(Path dh) {
        Table t = Table.readParquet(dh);
        List<Curves.Group> groups = Curves.of(t, "district", dh);
        section("districts", "Districts");
        double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
        for (Curves.Group g : groups) {
            for (int h = 0; h < 24; h++) {
                for (double v : new double[] {g.meanByHour()[h], g.p10ByHour()[h], g.p90ByHour()[h]}) {
                    if (Double.isFinite(v)) {
                        lo = Math.min(lo, v);
                        hi = Math.max(hi, v);
                    }
                }
            }
        }
        body.append("<p>For each district, the diurnal cycle of its cells' mean surface temperature (line) and the "
                + "band from the 10th to the 90th percentile of its cells, each averaged over the counted days. All "
                + "panels share one temperature axis.</p>\n<div class=\"multiples\">\n");
        for (Curves.Group g : groups) {
            SvgChart c = diurnalChart("District " + g.key(), 420, 250, false);
            if (hi > lo) {
                c.yRange(lo, hi);
            }
            c.add(new SvgChart.Band(hours(), g.p10ByHour(), g.p90ByHour(), "#E69F00", 0.35));
            c.add(new SvgChart.Series("mean", hours(), g.meanByHour(), "#7a3b00", null, 2.2));
            body.append("<figure class=\"small-chart\" id=\"chart-district-").append(Html.esc(g.key()))
                    .append("\"><figcaption>").append(Html.esc(g.key())).append("</figcaption>").append(c.toSvg())
                    .append("</figure>\n");
        }
        body.append("</div>\n<table class=\"data\"><thead><tr><th>district</th><th>cells</th><th>period mean [°C]</th>"
                + "<th>highest hourly mean [°C]</th><th>at</th><th>highest hourly 90th percentile [°C]</th></tr></thead><tbody>\n");
        for (Curves.Group g : groups) {
            body.append("<tr><td>").append(Html.esc(g.key())).append("</td><td class=\"n\">").append(fmtInt(g.cells()))
                    .append("</td><td class=\"n\">").append(num(g.periodMean(), 1)).append("</td><td class=\"n\">")
                    .append(num(g.maxHourly(), 1)).append("</td><td>").append(Html.esc(g.maxTime()))
                    .append("</td><td class=\"n\">").append(num(g.maxP90(), 1)).append("</td></tr>\n");
        }
        body.append("</tbody></table>\n");
    }

    // ------------------------------------------------------------------------------- hotspots

    private static List<Path> list(Path folder) {
        if (!Files.isDirectory(folder)) {
            return List.of();
        }
        try (Stream<Path> s = Files.list(folder)) {
            return s.filter(p -> !p.getFileName().toString().startsWith(".")).sorted().toList();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot list " + folder, e);
        }
    }

    private static Optional<Path> firstMatching(Path folder, String contains, String suffix) {
        return list(folder).stream().filter(p -> {
            String n = p.getFileName().toString().toLowerCase(Locale.ROOT);
            return n.endsWith(suffix) && n.contains(contains);
        }).findFirst();
    }

    private void hotspotsSection() {
        List<Path> stats = list(dir.resolve("hotspots")).stream().filter(Files::isDirectory).toList();
        if (stats.isEmpty()) {
            return;
        }
        section("hotspots", "Hot and cold areas");
        body.append("<p>Areas of analysis cells that are warmer (or cooler) than the city's median by at least the "
                + "minimum excess and pass the false-discovery-rate test of their Getis–Ord Gi* z-score. The band map "
                + "uses thermotile's <em>Verge</em> ramp: aubergine is warmer, green cooler, darker means a larger "
                + "excess; the polygons outline the areas, and the table lists them largest first (area × excess)."
                + "</p>\n");
        for (Path s : stats) {
            String stat = s.getFileName().toString();
            body.append("<h3>").append(Html.esc(mapTitle(stat))).append(" (").append(Html.esc(stat)).append(")</h3>\n");
            List<MapRenderer.Outline> polys = new ArrayList<>();
            List<GeoJsonPolygons.Feature> features = List.of();
            Optional<Path> gj = firstMatching(s, "", ".geojson");
            if (gj.isPresent()) {
                features = GeoJsonPolygons.read(gj.get()).features();
                features.forEach(f -> polys.add(new MapRenderer.Outline(f.geometry(), null)));
            }
            body.append("<div class=\"figs\">\n");
            Optional<Path> bands = firstMatching(s, "band", ".tif");
            if (bands.isPresent()) {
                Raster r = readRaster(bands.get());
                double m = symmetric(MapRenderer.range(r.values()));
                MapRenderer.Style style = new MapRenderer.Style("Hot and cold areas: " + mapTitle(stat).toLowerCase(Locale.ROOT),
                        subtitle, "band", ColourRamp.VERGE, categories(r.values()));
                MapRenderer.Figure f = MapRenderer.render(r.values(), r.grid(), polys, style, -m, m);
                Path png = pngBeside(bands.get());
                writePng(png, f.png());
                String key = "hotspots/" + stat + "/band";
                maps.add(new MapEntry(key, style.title(), "band", f, png));
                figure(key, f, "", "Excess bands over the city's median, with the area polygons outlined.", rel(png));
            }
            Optional<Path> excess = firstMatching(s, "excess_k", ".tif");
            if (excess.isPresent()) {
                Raster r = readRaster(excess.get());
                double m = symmetric(MapRenderer.range(r.values()));
                MapRenderer.Style style = new MapRenderer.Style("Excess over the median: " + mapTitle(stat).toLowerCase(Locale.ROOT),
                        subtitle, "K", ColourRamp.FULCRUM);
                MapRenderer.Figure f = MapRenderer.render(r.values(), r.grid(), polys, style, -m, m);
                Path png = pngBeside(excess.get());
                writePng(png, f.png());
                String key = "hotspots/" + stat + "/excess";
                maps.add(new MapEntry(key, style.title(), "K", f, png));
                figure(key, f, "K", "Each analysis cell's excess over the city's median, in kelvin, on the Fulcrum "
                        + "ramp centred at zero.", rel(png));
            }
            body.append("</div>\n");
            if (gj.isPresent()) {
                polygonTable(features, gj.get());
            }
        }
        programmeChangeTables();
    }

    /** Zone analyses (zones/STEM/STATISTIC/summary.json): the hot zones, largest first. */
    private void zonesSection() {
        List<Path> sums = new ArrayList<>();
        for (Path stem : list(dir.resolve("zones"))) {
            for (Path st : list(stem)) {
                if (Files.isRegularFile(st.resolve("summary.json"))) {
                    sums.add(st.resolve("summary.json"));
                }
            }
        }
        if (sums.isEmpty()) {
            return;
        }
        section("zones", "Hot zones");
        body.append("<p>Zones (blocks, parcels, districts) whose area-weighted mean is warmer than the city's median by "
                + "at least the minimum excess and whose Getis–Ord Gi* passes the false-discovery-rate test; zones with "
                + "too little data (below the minimum coverage) are left out. Largest first.</p>\n");
        for (Path sum : sums) {
            JsonNode j;
            try {
                j = new ObjectMapper().readTree(sum.toFile());
            } catch (IOException e) {
                throw new UncheckedIOException("cannot read " + sum, e);
            }
            Path st = sum.getParent();
            body.append("<h3>").append(Html.esc(st.getParent().getFileName().toString())).append(" (")
                    .append(Html.esc(st.getFileName().toString())).append("): ").append(j.path("hot_zones").size())
                    .append(" hot of ").append(j.path("zones").asInt()).append(" zones</h3>\n")
                    .append("<table class=\"data\"><thead><tr><th>zone</th><th>area [m²]</th><th>excess [K]</th>"
                            + "<th>q</th><th>band</th></tr></thead><tbody>\n");
            JsonNode hot = j.path("hot_zones");
            for (int i = 0; i < Math.min(TABLE_ROWS, hot.size()); i++) {
                JsonNode z = hot.get(i);
                body.append("<tr><td>").append(Html.esc(z.path("zone_id").asText())).append("</td><td class=\"n\">")
                        .append(fmtInt(Math.round(z.path("area_m2").asDouble()))).append("</td><td class=\"n\">")
                        .append(num(z.path("excess_k").asDouble(), 2)).append("</td><td class=\"n\">")
                        .append(String.format(Locale.ROOT, "%.2g", z.path("q").asDouble())).append("</td><td>")
                        .append(Html.esc(z.path("label").asText())).append("</td></tr>\n");
            }
            body.append("</tbody></table>\n");
            if (hot.size() > TABLE_ROWS) {
                body.append("<p class=\"small\">The first ").append(TABLE_ROWS).append(" of ").append(hot.size())
                        .append(" hot zones; all are in <code>").append(Html.esc(rel(sum))).append("</code>.</p>\n");
            }
        }
    }

    /** Per scenario and statistic, the hot area the programme removes or adds, per district. */
    private void programmeChangeTables() {
        for (Path sc : list(dir.resolve("scenarios"))) {
            for (Path st : list(sc.resolve("hotspots"))) {
                Path sum = st.resolve("summary.json");
                if (!Files.isRegularFile(sum)) {
                    continue;
                }
                JsonNode j;
                try {
                    j = new ObjectMapper().readTree(sum.toFile());
                } catch (IOException e) {
                    throw new UncheckedIOException("cannot read " + sum, e);
                }
                if (!j.has("programme_change")) {
                    continue;
                }
                body.append("<h3>Hot area removed or added by ").append(Html.esc(sc.getFileName().toString()))
                        .append(" (").append(Html.esc(st.getFileName().toString())).append(")</h3>\n")
                        .append("<table class=\"data\"><thead><tr><th>district</th><th>hot before [m²]</th>"
                                + "<th>hot after [m²]</th><th>removed [m²]</th><th>added [m²]</th></tr></thead><tbody>\n");
                for (JsonNode r : j.path("programme_change")) {
                    body.append("<tr><td>").append(Html.esc(r.path("district_name").asText())).append("</td>");
                    for (String k : List.of("baseline_hot_m2", "scenario_hot_m2", "removed_m2", "added_m2")) {
                        body.append("<td class=\"n\">").append(fmtInt(Math.round(r.path(k).asDouble()))).append("</td>");
                    }
                    body.append("</tr>\n");
                }
                body.append("</tbody></table>\n");
            }
        }
    }

    private static List<MapRenderer.Category> categories(float[] values) {
        java.util.TreeSet<Integer> seen = new java.util.TreeSet<>();
        for (float v : values) {
            if (Float.isFinite(v)) {
                seen.add(Math.round(v));
            }
        }
        List<MapRenderer.Category> out = new ArrayList<>();
        for (int k : seen.descendingSet()) {
            String edge = String.format(Locale.ROOT, "%s K", num(Math.abs(k) / 10.0, Math.abs(k) % 10 == 0 ? 0 : 1));
            String label = k > 0 ? "warmer by ≥ " + edge : k < 0 ? "cooler by ≥ " + edge : "not distinct";
            out.add(new MapRenderer.Category(k, label));
        }
        return out;
    }

    /** Colour limits ±max|v| for a ramp centred at zero (±1 when every value is 0 or there is none). */
    static double symmetric(double[] range) {
        if (Double.isNaN(range[0])) {
            return 1;
        }
        double m = Math.max(Math.abs(range[0]), Math.abs(range[1]));
        return m > 0 ? m : 1;
    }

    private static final int TABLE_ROWS = 50;

    private void polygonTable(List<GeoJsonPolygons.Feature> features, Path file) {
        List<String> cols = new ArrayList<>();
        for (GeoJsonPolygons.Feature f : features) {
            f.properties().keySet().forEach(k -> {
                if (!cols.contains(k)) {
                    cols.add(k);
                }
            });
        }
        body.append("<table class=\"data\"><thead><tr>");
        cols.forEach(c -> body.append("<th>").append(Html.esc(c.replace('_', ' '))).append("</th>"));
        body.append("<th>area [m²]</th></tr></thead><tbody>\n");
        for (int i = 0; i < Math.min(TABLE_ROWS, features.size()); i++) {
            GeoJsonPolygons.Feature f = features.get(i);
            body.append("<tr>");
            cols.forEach(c -> body.append("<td>").append(Html.esc(cellText(f.properties().get(c)))).append("</td>"));
            body.append("<td class=\"n\">").append(fmtInt(Math.round(f.geometry().getArea()))).append("</td></tr>\n");
        }
        body.append("</tbody></table>\n");
        if (features.size() > TABLE_ROWS) {
            body.append("<p class=\"small\">The first ").append(TABLE_ROWS).append(" of ").append(features.size())
                    .append(" polygons; all are in <code>").append(Html.esc(rel(file))).append("</code>.</p>\n");
        }
    }

    private static String cellText(Object v) {
        if (v == null) {
            return "";
        }
        if (v instanceof Double || v instanceof Float) {
            double d = ((Number) v).doubleValue();
            return Math.abs(d) >= 1000 || d == Math.rint(d) ? String.format(Locale.ROOT, "%,.0f", d)
                    : String.format(Locale.ROOT, "%.3g", d);
        }
        String s = v.toString();
        try {
            double d = Double.parseDouble(s);
            if (s.contains(".") && Double.isFinite(d)) {
                return cellText(d);
            }
        } catch (NumberFormatException ignored) {
            // text stays text
        }
        return s;
    }

    private Path pngBeside(Path tif) {
        String n = tif.getFileName().toString();
        return tif.resolveSibling(n.substring(0, n.length() - 4) + ".png");
    }

    private String rel(Path p) {
        return dir.relativize(p).toString().replace('\\', '/');
    }

    /** Tables are partitioned by scenario: the report's curves are the baseline's. */
    static Path baselinePartition(Path table) {
        Path b = table.resolve("scenario=baseline");
        return Files.isDirectory(b) ? b : table;
    }

    // ------------------------------------------------------------------------------ scenarios

    private void scenariosSection() {
        Path root = dir.resolve("scenarios");
        List<Path> names = list(root).stream().filter(Files::isDirectory)
                .filter(p -> !p.getFileName().toString().equals("ranking")).toList();
        Optional<Path> ranking = Stream.of(dir.resolve("comparison").resolve("ranking.csv"), root.resolve("ranking"),
                        root.resolve("ranking.parquet"), root.resolve("ranking.csv"))
                .filter(Files::exists).findFirst();
        if (names.isEmpty() && ranking.isEmpty()) {
            return;
        }
        section("scenarios", "Scenarios");
        body.append("<p>Each programme beside the baseline on one shared colour scale, and the change it makes "
                + "(programme − baseline) on the diverging <em>Fulcrum</em> ramp, centred at zero: blue cells are "
                + "cooler, orange cells warmer.</p>\n");
        if (ranking.isPresent()) {
            Path rk = ranking.get();
            Table t = rk.toString().endsWith(".csv") ? Table.readCsv(rk) : Table.readParquet(rk);
            body.append("<h3>Ranking</h3>\n<table class=\"data\" id=\"ranking\"><thead><tr>");
            t.columns().forEach(c -> body.append("<th>").append(Html.esc(heading(c))).append("</th>"));
            body.append("</tr></thead><tbody>\n");
            int districtCol = t.columns().indexOf("district");
            for (Object[] row : t.rows()) {
                if (districtCol >= 0 && !"(all)".equals(String.valueOf(row[districtCol]))) {
                    continue; // the whole grid here; per-district ranks stay in the file
                }
                body.append("<tr>");
                for (Object v : row) {
                    body.append(v instanceof Number ? "<td class=\"n\">" : "<td>").append(Html.esc(cellText(v))).append("</td>");
                }
                body.append("</tr>\n");
            }
            body.append("</tbody></table>\n<p class=\"small\">As written in <code>").append(Html.esc(rel(rk)))
                    .append("</code>, in its order").append(districtCol >= 0 ? " (whole grid; per-district ranks in the file)" : "")
                    .append(".</p>\n");
        }
        for (Path sc : names) {
            String name = sc.getFileName().toString();
            Path mapsDir = Files.isDirectory(sc.resolve("maps")) ? sc.resolve("maps") : sc;
            body.append("<h3>Programme: ").append(Html.esc(name)).append("</h3>\n<div class=\"figs\">\n");
            int shown = 0;
            for (String key : MAP_KEYS) {
                Path prog = mapsDir.resolve(key + ".tif");
                Path base = dir.resolve("maps").resolve(key + ".tif");
                if (!key.equals("peak") || !Files.isRegularFile(prog) || !Files.isRegularFile(base)) {
                    continue;
                }
                Raster b = readRaster(base), p = readRaster(prog);
                double[] rb = MapRenderer.range(b.values()), rp = MapRenderer.range(p.values());
                double lo = Math.min(rb[0], rp[0]), hi = Math.max(rb[1], rp[1]);
                body.append("<div class=\"pair\">\n");
                for (Object[] side : new Object[][] {{"baseline", b, base}, {name, p, prog}}) {
                    Raster r = (Raster) side[1];
                    MapRenderer.Style style = new MapRenderer.Style(mapTitle(key) + ": " + side[0], subtitle,
                            mapUnit(key), ColourRamp.KILN);
                    MapRenderer.Figure f = MapRenderer.render(r.values(), r.grid(), districtOutlines, style, lo, hi,
                            MapRenderer.PAIR_MAP_W, MapRenderer.PAIR_MAP_H);
                    Path png = side[0].equals("baseline") ? mapsDir.resolve("baseline_" + key + ".png")
                            : pngBeside((Path) side[2]);
                    writePng(png, f.png());
                    String mk = "scenarios/" + name + "/" + (side[0].equals("baseline") ? "baseline_" : "") + key;
                    maps.add(new MapEntry(mk, style.title(), mapUnit(key), f, png));
                    figure(mk, f, mapUnit(key), side[0].equals("baseline") ? "Baseline, on the shared scale."
                            : "With the programme, on the shared scale.", rel(png));
                }
                body.append("</div>\n");
                shown++;
            }
            for (Path tif : list(mapsDir)) {
                String n = tif.getFileName().toString();
                if (!n.endsWith(".tif")) {
                    continue;
                }
                String stem = n.substring(0, n.length() - 4);
                String stat = stem.startsWith("delta_") ? stem.substring(6) : stem.endsWith("_delta")
                        ? stem.substring(0, stem.length() - 6) : null;
                if (stat == null) {
                    continue;
                }
                Raster r = readRaster(tif);
                double m = symmetric(MapRenderer.range(r.values()));
                String unit = mapUnit(stat).equals("°C") ? "K" : mapUnit(stat);
                MapRenderer.Style style = new MapRenderer.Style("Change in " + mapTitle(stat).toLowerCase(Locale.ROOT),
                        subtitle + " · " + name + " − baseline", unit, ColourRamp.FULCRUM);
                MapRenderer.Figure f = MapRenderer.render(r.values(), r.grid(), districtOutlines, style, -m, m);
                Path png = pngBeside(tif);
                writePng(png, f.png());
                String mk = "scenarios/" + name + "/" + stem;
                maps.add(new MapEntry(mk, style.title(), unit, f, png));
                figure(mk, f, unit, "Programme − baseline; blue is cooler, orange warmer, white unchanged.", rel(png));
                shown++;
            }
            body.append("</div>\n");
            if (shown == 0) {
                body.append("<p class=\"missing\">No maps found under <code>").append(Html.esc(rel(mapsDir)))
                        .append("</code>.</p>\n");
            }
        }
    }

    // ---------------------------------------------------------------------------------- files

    /** Observed thermal images ({@link ObservationSection}), only when the folder has {@code observed/}. */
    private void observationSection() {
        ObservationSection.Drawn d = ObservationSection.html(dir, districtOutlines);
        if (d != null) {
            section(ObservationSection.ID, "Observed surface temperatures");
            body.append(d.html());
        }
    }

    private void filesSection() {
        section("files", "Files in this folder");
        body.append("<ul class=\"files\">\n");
        for (Path p : list(dir)) {
            String n = p.getFileName().toString();
            if (n.equals(FILE)) {
                continue;
            }
            body.append("<li><code>").append(Html.esc(n)).append(Files.isDirectory(p) ? "/" : "").append("</code>");
            if (Files.isDirectory(p)) {
                List<String> kids = list(p).stream().map(q -> q.getFileName().toString()
                        + (Files.isDirectory(q) ? "/" : "")).toList();
                body.append(" ").append(Html.esc(String.join("  ", kids)));
            }
            body.append("</li>\n");
        }
        body.append("</ul>\n<p class=\"small\">Maps are float32 GeoTIFF in EPSG:").append(manifest.path("grid")
                .path("epsg").asInt()).append(" with no-data −9999 (open them in any GIS); tables are Parquet. "
                + "Made by <code>thermotile report</code> from these files alone; run it again to remake this page.</p>\n");
    }

    // ----------------------------------------------------------------------------------- page

    private void section(String id, String title) {
        if (!nav.isEmpty()) {
            body.append("</section>\n");
        }
        nav.add(new String[] {id, title});
        body.append("<section id=\"").append(id).append("\">\n<h2>").append(Html.esc(title)).append("</h2>\n");
    }

    private String page() {
        StringBuilder b = new StringBuilder(body.length() + 8000);
        b.append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
                .append("<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; img-src data:; "
                        + "style-src 'unsafe-inline'\">\n")
                .append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
                .append("<link rel=\"icon\" href=\"data:,\">\n")
                .append("<title>").append(Html.esc(runName())).append(" · thermotile run report</title>\n")
                .append("<style>\n").append(CSS).append("</style>\n</head>\n<body>\n<header>\n<h1>")
                .append(Html.esc(runName())).append("</h1>\n<p class=\"sub\">Urban surface temperatures, ")
                .append(Html.esc(periodLabel())).append(" · thermotile ")
                .append(Html.esc(manifest.path("versions").path("thermotile").asText("")))
                .append("</p>\n<nav>");
        for (String[] n : nav) {
            b.append("<a href=\"#").append(n[0]).append("\">").append(Html.esc(n[1])).append("</a> ");
        }
        b.append("</nav>\n</header>\n<main>\n<aside class=\"caution\" role=\"note\"><strong>Read with care.</strong> ")
                .append(Html.esc(CAUTION)).append("</aside>\n");
        b.append(body);
        if (!nav.isEmpty()) {
            b.append("</section>\n");
        }
        b.append("</main>\n<footer><p>").append(Html.esc(CAUTION)).append("</p></footer>\n</body>\n</html>\n");
        return b.toString();
    }

    static final String CSS = """
            :root { color-scheme: light; --ink: #1f1f1f; --muted: #555; --rule: #ddd; --accent: #8a3b12; }
            * { box-sizing: border-box; }
            body { margin: 0; font-family: system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial,
              "Noto Sans", "Liberation Sans", sans-serif; color: var(--ink); background: #fff; line-height: 1.45; }
            header { padding: 1.2rem 2rem 0.6rem; border-bottom: 1px solid var(--rule); background: #faf8f5; }
            h1 { margin: 0; font-size: 1.7rem; }
            h2 { margin: 2rem 0 0.6rem; font-size: 1.35rem; border-bottom: 2px solid var(--accent); padding-bottom: 0.2rem; }
            h3 { margin: 1.4rem 0 0.4rem; font-size: 1.08rem; }
            .sub { margin: 0.2rem 0 0.6rem; color: var(--muted); }
            nav a { margin-right: 1rem; color: var(--accent); text-decoration: none; font-weight: 600; }
            main { padding: 0 2rem 2rem; max-width: 1900px; }
            .caution { margin: 1rem 0; padding: 0.7rem 1rem; border-left: 5px solid #b35900; background: #fff4e8; }
            .cols { display: flex; flex-wrap: wrap; gap: 2rem; }
            .cols > div { flex: 1 1 380px; }
            dl { display: grid; grid-template-columns: max-content 1fr; gap: 0.25rem 1rem; margin: 0; }
            dt { font-weight: 600; } dd { margin: 0; }
            table.data { border-collapse: collapse; margin: 0.4rem 0 1rem; font-size: 0.92rem; }
            table.data th, table.data td { border-bottom: 1px solid var(--rule); padding: 0.25rem 0.7rem; text-align: left; }
            table.data th { background: #f3f1ee; } table.data td.n { text-align: right; font-variant-numeric: tabular-nums; }
            .key { display: inline-block; width: 0.9em; height: 0.9em; margin-right: 0.4em; vertical-align: -0.1em; }
            .figs { display: flex; flex-wrap: wrap; gap: 1.5rem; }
            .pair { display: flex; flex-wrap: wrap; gap: 1rem; width: 100%; }
            figure { margin: 0; } figure.map { max-width: 100%; }
            figure.map img { max-width: 100%; height: auto; border: 1px solid var(--rule); }
            figcaption { max-width: 62ch; font-size: 0.9rem; color: var(--muted); margin-top: 0.3rem; }
            .chart svg { max-width: 100%; height: auto; }
            .multiples { display: flex; flex-wrap: wrap; gap: 1rem; }
            .small-chart figcaption { font-weight: 600; color: var(--ink); }
            .small { font-size: 0.9rem; color: var(--muted); }
            .missing { color: #7a4a00; }
            .files { font-size: 0.9rem; } code { font-size: 0.92em; }
            footer { padding: 1rem 2rem; border-top: 1px solid var(--rule); color: var(--muted); font-size: 0.85rem; }
            @media print { header { background: none; } nav { display: none; } figure, table, .chart { break-inside: avoid; } }
            """;

    // -------------------------------------------------------------------------------- formats

    static String num(double v, int decimals) {
        return Double.isFinite(v) ? String.format(Locale.ROOT, "%." + decimals + "f", v) : "–";
    }

    /** "1 day", "2 days". */
    static String plural(long n, String word) {
        return fmtInt(n) + " " + word + (n == 1 ? "" : "s");
    }

    static String fmtInt(long v) {
        return String.format(Locale.ROOT, "%,d", v);
    }

    private static String fileName(String location) {
        int i = Math.max(location.lastIndexOf('/'), location.lastIndexOf('\\'));
        return i >= 0 ? location.substring(i + 1) : location;
    }

    /** Unit suffixes of column names and their symbols, longest first ("_k_h_m2" before "_m2"). */
    private static final String[][] UNIT_SUFFIXES = {
        {"_per_c_km2", "per °C·km²"}, {"_per_degree_hour_m2", "per K·h·m²"}, {"_c_km2", "°C·km²"},
        {"_k_h_m2", "K·h·m²"}, {"_eur", "EUR"},
        {"_km2", "km²"}, {"_m2", "m²"}, {"_wm2", "W/m²"}, {"_c", "°C"}, {"_k", "K"}, {"_m", "m"}, {"_pct", "%"},
    };

    /**
     * A table heading for a column name: words with a capital first letter, the unit suffix as its
     * symbol in brackets ("peak_reduction_c_km2" → "Peak reduction (°C·km²)",
     * "cost_per_c_km2" → "Cost (per °C·km²)", "degree_hours_avoided_k_h_m2" → "Degree hours avoided (K·h·m²)").
     */
    static String heading(String column) {
        String words = column;
        String unit = null;
        for (String[] u : UNIT_SUFFIXES) {
            if (column.endsWith(u[0]) && column.length() > u[0].length()) {
                words = column.substring(0, column.length() - u[0].length());
                unit = u[1];
                break;
            }
        }
        words = words.replace('_', ' ');
        words = words.isEmpty() ? words : Character.toUpperCase(words.charAt(0)) + words.substring(1);
        return unit == null ? words : words + " (" + unit + ")";
    }
}
