package org.thermotile.jobs.report;

import org.thermotile.jobs.config.RunFile;
import static org.thermotile.jobs.report.RunReport.MAP_KEYS;
import static org.thermotile.jobs.report.CurveSection.hours;

import java.nio.file.Files;
import java.nio.file.Path;
import org.thermotile.jobs.report.RunReport.MapEntry;

/** The statistic maps of the baseline ({@code maps/STAT.tif}) on the Kiln ramp, with the district outlines. */
final class MapSection extends ReportSection {
    MapSection(ReportSection page) {
        super(page);
    }

    private static String mapExplanation(String key) {
        RunFile.MapKind kind = RunFile.MapKind.fromKey(key);
        return kind != null ? kind.explanation() : "";
    }

    void mapsSection() {
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
}
