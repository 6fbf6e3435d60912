package org.thermotile.jobs.report;

import org.thermotile.jobs.config.RunFile;
import static org.thermotile.jobs.report.RunReport.num;
import static org.thermotile.jobs.report.RunReport.fmtInt;
import static org.thermotile.jobs.report.RunReport.periodText;
import static org.thermotile.jobs.report.CurveSection.hours;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Base64;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.stream.Stream;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * A part of the run report: the page being written (its body, navigation and drawn maps, shared
 * by every section of one page) and what several sections use to fill it: the run's name and
 * period, GeoTIFF reading, map titles and units, map figures with their PNGs, folder listings and
 * table cells.
 */
abstract class ReportSection {
    final Path dir;
    final JsonNode manifest;
    final List<String> notes;
    final StringBuilder body;
    final List<String[]> nav;
    final List<RunReport.MapEntry> maps;
    List<MapRenderer.Outline> districtOutlines = List.of();
    String subtitle = "";

    /** A new, empty page of the run folder {@code dir}. */
    ReportSection(Path dir, JsonNode manifest) {
        this.dir = dir;
        this.manifest = manifest;
        this.notes = new ArrayList<>();
        this.body = new StringBuilder();
        this.nav = new ArrayList<>();
        this.maps = new ArrayList<>();
    }

    /** A section writing into {@code page}: the same buffer, navigation and drawn maps, its outlines and subtitle. */
    ReportSection(ReportSection page) {
        this.dir = page.dir;
        this.manifest = page.manifest;
        this.notes = page.notes;
        this.body = page.body;
        this.nav = page.nav;
        this.maps = page.maps;
        this.districtOutlines = page.districtOutlines;
        this.subtitle = page.subtitle;
    }

    // ----------------------------------------------------------------------------- run summary

    String runName() {
        return manifest.path("name").asText(dir.getFileName().toString());
    }

    String period() {
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
    String periodLabel() {
        String name = manifest.path("period").asText("");
        return (name.isEmpty() ? "" : "period " + name + ", ") + period();
    }

    // ----------------------------------------------------------------------------------- maps

    record Raster(RasterGrid grid, float[] values) {
    }

    static Raster readRaster(Path tif) {
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(tif)) {
            RasterGrid g = r.grid();
            return new Raster(g, r.readFloatWindow(0, 0, g.width(), g.height()));
        }
    }

    String mapTitle(String key) {
        String th = manifest.path("run_file").path("outputs").has("threshold_c")
                ? num(manifest.path("run_file").path("outputs").path("threshold_c").asDouble(), 0) + " °C" : "the threshold";
        RunFile.MapKind kind = RunFile.MapKind.fromKey(key);
        return kind != null ? kind.title(th) : key.replace('_', ' ');
    }

    /** A map's unit; a file named otherwise (a hot-spot folder of a difference map) in °C. */
    static String mapUnit(String key) {
        RunFile.MapKind kind = RunFile.MapKind.fromKey(key);
        return kind != null ? kind.unit() : "°C";
    }

    void figure(String key, MapRenderer.Figure f, String unit, String explanation, String file) {
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

    static void writePng(Path png, byte[] bytes) {
        try {
            Files.createDirectories(png.getParent());
            Files.write(png, bytes);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + png, e);
        }
    }

    // ---------------------------------------------------------------------------------- files

    static List<Path> list(Path folder) {
        if (!Files.isDirectory(folder)) {
            return List.of();
        }
        try (Stream<Path> s = Files.list(folder)) {
            return s.filter(p -> !p.getFileName().toString().startsWith(".")).sorted().toList();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot list " + folder, e);
        }
    }

    static Optional<Path> firstMatching(Path folder, String contains, String suffix) {
        return list(folder).stream().filter(p -> {
            String n = p.getFileName().toString().toLowerCase(Locale.ROOT);
            return n.endsWith(suffix) && n.contains(contains);
        }).findFirst();
    }

    /** Colour limits ±max|v| for a ramp centred at zero (±1 when every value is 0 or there is none). */
    static double symmetric(double[] range) {
        if (Double.isNaN(range[0])) {
            return 1;
        }
        double m = Math.max(Math.abs(range[0]), Math.abs(range[1]));
        return m > 0 ? m : 1;
    }

    static final int TABLE_ROWS = 50;

    static String cellText(Object v) {
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

    Path pngBeside(Path tif) {
        String n = tif.getFileName().toString();
        return tif.resolveSibling(n.substring(0, n.length() - 4) + ".png");
    }

    String rel(Path p) {
        return dir.relativize(p).toString().replace('\\', '/');
    }

    // ----------------------------------------------------------------------------------- page

    void section(String id, String title) {
        if (!nav.isEmpty()) {
            body.append("</section>\n");
        }
        nav.add(new String[] {id, title});
        body.append("<section id=\"").append(id).append("\">\n<h2>").append(Html.esc(title)).append("</h2>\n");
    }
}
