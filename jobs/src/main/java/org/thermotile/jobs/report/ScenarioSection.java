package org.thermotile.jobs.report;

import static org.thermotile.jobs.report.RunReport.MAP_KEYS;
import static org.thermotile.jobs.report.RunReport.heading;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.stream.Stream;
import org.thermotile.jobs.report.RunReport.MapEntry;
import org.thermotile.jobs.storage.RunLayout;

/** The scenarios: the ranking table, and per programme its peak map beside the baseline's and its change maps. */
final class ScenarioSection extends ReportSection {
    ScenarioSection(ReportSection page) {
        super(page);
    }

    void scenariosSection() {
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
                String stat = RunLayout.deltaOf(stem);
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
}
