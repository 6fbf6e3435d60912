package org.thermotile.jobs.report;

import org.thermotile.jobs.config.RunFile;
import static org.thermotile.jobs.report.CurveSection.hours;

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
import java.util.List;
import java.util.Locale;

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
 *
 * <p>This class assembles the page; each section is its own {@link ReportSection}: {@link RunSection},
 * {@link MapSection}, {@link CurveSection} with {@link DistrictSection}, {@link HotspotSection},
 * {@link ZoneSection}, {@link ScenarioSection}, {@link ObservationSection}, {@link FilesSection}, and
 * {@link PeriodsSection} for the index of a run over several periods.
 */
public final class RunReport extends ReportSection {
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

    /** A drawn map: its statistic key, title, unit, the figure and where its PNG was written. */
    public record MapEntry(String key, String title, String unit, MapRenderer.Figure figure, Path png) {
    }

    /** What {@link #write} produced: the page, the drawn maps and the ids of the sections shown. */
    public record Result(Path html, List<MapEntry> maps, List<String> sections) {
    }

    private RunReport(Path dir, JsonNode manifest) {
        super(dir, manifest);
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
        new PeriodsSection(this).periodsSection();
        new FilesSection(this).filesSection();
        return publish(maps);
    }

    private Result make() {
        subtitle = subtitleText();
        loadDistricts();
        new RunSection(this).runSection();
        new MapSection(this).mapsSection();
        new CurveSection(this).curvesSection();
        new HotspotSection(this).hotspotsSection();
        new ZoneSection(this).zonesSection();
        new ScenarioSection(this).scenariosSection();
        observationSection();
        new FilesSection(this).filesSection();
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

    // ---------------------------------------------------------------------------------- files

    /** Observed thermal images ({@link ObservationSection}), only when the folder has {@code observed/}. */
    private void observationSection() {
        ObservationSection.Drawn d = ObservationSection.html(dir, districtOutlines);
        if (d != null) {
            section(ObservationSection.ID, "Observed surface temperatures");
            body.append(d.html());
        }
    }

    // ----------------------------------------------------------------------------------- page

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

    static String fileName(String location) {
        int i = Math.max(location.lastIndexOf('/'), location.lastIndexOf('\\'));
        return i >= 0 ? location.substring(i + 1) : location;
    }

    /** Unit suffixes of column names and their symbols, longest first ("_k_h_m2" before "_m2"). */
    private static final String[][] UNIT_SUFFIXES = {
        {"_per_c_km2", "per °C·km²"}, {"_per_k_h_m2", "per K·h·m²"}, {"_c_km2", "°C·km²"},
        {"_k_h_m2", "K·h·m²"}, {"_k_m2", "K·m²"}, {"_k_h", "K·h"}, {"_eur", "EUR"},
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
