package org.thermotile.jobs.report;

import static org.thermotile.jobs.report.RunReport.num;
import static org.thermotile.jobs.report.RunReport.plural;
import static org.thermotile.jobs.report.RunReport.fmtInt;
import static org.thermotile.jobs.report.RunReport.fileName;
import static org.thermotile.jobs.report.CurveSection.hours;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/** The report's first section: period, weather, site, grid, simulation, inputs and the run's notes, from the manifest. */
final class RunSection extends ReportSection {
    RunSection(ReportSection page) {
        super(page);
    }

    void runSection() {
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
}
