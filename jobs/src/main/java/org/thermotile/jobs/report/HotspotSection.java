package org.thermotile.jobs.report;

import static org.thermotile.jobs.report.RunReport.num;
import static org.thermotile.jobs.report.RunReport.fmtInt;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.thermotile.jobs.report.RunReport.MapEntry;

/** Hot and cold areas ({@code hotspots/STAT/}): band and excess maps, polygon tables, and each programme's change of hot area. */
final class HotspotSection extends ReportSection {
    HotspotSection(ReportSection page) {
        super(page);
    }

    void hotspotsSection() {
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
}
